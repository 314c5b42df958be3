package com.example.foldline.sites;

import java.util.List;
import java.util.Set;

import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.security.core.Authentication;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.PutMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.accounts.SiteAccess;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@RequestMapping("/api/v1/sites")
@Tag(name = "Sites", description = "Sites, their settings and ingest keys")
class SiteController {

    private final Sites sites;
    private final SiteAccess access;

    SiteController(Sites sites, SiteAccess access) {
        this.sites = sites;
        this.access = access;
    }

    @PostMapping
    @Operation(summary = "Create a site", description = "timezone is an IANA zone id, currency an ISO 4217 code")
    ResponseEntity<Site> create(@RequestBody SiteSettings settings) {
        return ResponseEntity.status(HttpStatus.CREATED).body(sites.create(settings));
    }

    @GetMapping
    @Operation(summary = "The sites the caller can see")
    List<Site> list(Authentication auth) {
        Set<Long> visible = access.visibleSiteIds(auth);
        return sites.all().stream().filter(s -> visible == null || visible.contains(s.id())).toList();
    }

    @GetMapping("/{siteId}")
    Site get(@PathVariable long siteId) {
        return sites.require(siteId);
    }

    @PutMapping("/{siteId}")
    Site update(@PathVariable long siteId, @RequestBody SiteSettings settings) {
        return sites.update(siteId, settings);
    }

    @PostMapping("/{siteId}/ingest-keys")
    @Operation(summary = "Create an ingest key", description = "The key is in the answer once and stored only as a hash")
    ResponseEntity<NewIngestKey> createKey(@PathVariable long siteId, @RequestBody(required = false) KeyRequest request) {
        String label = request == null ? null : request.label();
        return ResponseEntity.status(HttpStatus.CREATED).body(sites.createIngestKey(siteId, label));
    }

    @GetMapping("/{siteId}/ingest-keys")
    List<IngestKey> keys(@PathVariable long siteId) {
        return sites.ingestKeys(siteId);
    }

    @DeleteMapping("/{siteId}/ingest-keys/{keyId}")
    ResponseEntity<Void> revoke(@PathVariable long siteId, @PathVariable long keyId) {
        sites.revokeIngestKey(siteId, keyId);
        return ResponseEntity.noContent().build();
    }

    record KeyRequest(String label) {
    }
}
