package com.example.foldline.accounts;

import java.util.List;
import java.util.Map;

import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.security.core.Authentication;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RestController;

import io.swagger.v3.oas.annotations.tags.Tag;

/** The signed-in user: who am I, my password, my API tokens. */
@RestController
@Tag(name = "Me")
class AccountController {

    record Me(String username, boolean globalAdmin, Map<Long, SiteRole> sites) {
    }

    record PasswordChange(String currentPassword, String newPassword) {
    }

    record TokenRequest(String name) {
    }

    private final Accounts accounts;
    private final SiteAccess access;
    private final ApiTokens tokens;

    AccountController(Accounts accounts, SiteAccess access, ApiTokens tokens) {
        this.accounts = accounts;
        this.access = access;
        this.tokens = tokens;
    }

    @GetMapping("/api/v1/me")
    Me me(Authentication auth) {
        AccountPrincipal p = (AccountPrincipal) auth.getPrincipal();
        return new Me(p.username(), p.globalAdmin(), access.visibleSites(auth));
    }

    @PostMapping("/api/v1/me/password")
    ResponseEntity<Void> password(Authentication auth, @RequestBody PasswordChange body) {
        accounts.changePassword(auth.getName(), body.currentPassword(), body.newPassword());
        return ResponseEntity.noContent().build();
    }

    @GetMapping("/api/v1/me/tokens")
    List<ApiTokens.Token> tokens(Authentication auth) {
        return tokens.list(((AccountPrincipal) auth.getPrincipal()).id());
    }

    @PostMapping("/api/v1/me/tokens")
    ResponseEntity<ApiTokens.NewToken> createToken(Authentication auth, @RequestBody TokenRequest body) {
        return ResponseEntity.status(HttpStatus.CREATED)
                .body(tokens.create(((AccountPrincipal) auth.getPrincipal()).id(), body.name()));
    }

    @DeleteMapping("/api/v1/me/tokens/{tokenId}")
    ResponseEntity<Void> revokeToken(Authentication auth, @PathVariable long tokenId) {
        tokens.revoke(((AccountPrincipal) auth.getPrincipal()).id(), tokenId);
        return ResponseEntity.noContent().build();
    }
}
