package com.example.foldline.sessions;

import java.util.List;

import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@RequestMapping("/api/v1/admin")
@Tag(name = "Administration")
class SessionAdminController {

    private final Sessionizer sessionizer;
    private final RollupRebuild rebuild;

    SessionAdminController(Sessionizer sessionizer, RollupRebuild rebuild) {
        this.sessionizer = sessionizer;
        this.rebuild = rebuild;
    }

    @PostMapping("/sessions/run")
    @Operation(summary = "Build sessions from new events and close idle sessions now (the scheduled job, on demand)")
    List<Sessionizer.Report> run(@RequestParam(required = false) Long siteId) {
        return siteId == null ? sessionizer.runAll() : List.of(sessionizer.run(siteId));
    }

    @PostMapping("/rollups/rebuild")
    @Operation(summary = "Rebuild a site's sessions and rollups from its raw events")
    Sessionizer.Report rebuild(@RequestParam long siteId) {
        return rebuild.rebuild(siteId);
    }
}
