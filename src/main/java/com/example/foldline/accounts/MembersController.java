package com.example.foldline.accounts;

import java.util.List;

import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.system.BadRequestException;

import io.swagger.v3.oas.annotations.tags.Tag;

/** Who holds which role on a site (site admins). */
@RestController
@Tag(name = "Sites")
class MembersController {

    /** Grant {@code role} (viewer, editor, admin) to the user or team called {@code name}. */
    record MemberRequest(String type, String name, String role) {
    }

    private final SiteAccess access;

    MembersController(SiteAccess access) {
        this.access = access;
    }

    @GetMapping("/api/v1/sites/{siteId}/members")
    List<SiteAccess.Member> members(@PathVariable long siteId) {
        return access.members(siteId);
    }

    @PostMapping("/api/v1/sites/{siteId}/members")
    ResponseEntity<Void> grant(@PathVariable long siteId, @RequestBody MemberRequest body) {
        SiteRole role = SiteRole.parse(body.role())
                .orElseThrow(() -> new BadRequestException("role", "must be viewer, editor or admin"));
        if ("team".equals(body.type())) {
            access.grantTeam(siteId, body.name(), role);
        } else if (body.type() == null || "user".equals(body.type())) {
            access.grantUser(siteId, body.name(), role);
        } else {
            throw new BadRequestException("type", "must be user or team");
        }
        return ResponseEntity.noContent().build();
    }

    @DeleteMapping("/api/v1/sites/{siteId}/members/{type}/{principalId}")
    ResponseEntity<Void> revoke(@PathVariable long siteId, @PathVariable String type, @PathVariable long principalId) {
        if (!type.equals("user") && !type.equals("team")) {
            throw new BadRequestException("type", "must be user or team");
        }
        access.revoke(siteId, type, principalId);
        return ResponseEntity.noContent().build();
    }
}
