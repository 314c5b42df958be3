package com.example.foldline.views;

import java.util.List;

import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.security.core.Authentication;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RestController;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@RequestMapping("/api/v1/sites/{siteId}/views")
@Tag(name = "Views", description = "Saved, shareable views; a view opens at /v/{slug}")
class ViewController {

    /** {@code state} is the screen's query string; relative ranges (no from/to) stay relative. */
    record ViewRequest(String name, String screen, String state, Boolean shared) {
    }

    record PinRequest(boolean pinned) {
    }

    private final Views views;

    ViewController(Views views) {
        this.views = views;
    }

    @GetMapping
    @Operation(summary = "Views of the site visible to the caller (shared ones and their own), pinned first")
    List<SavedView> list(@PathVariable long siteId, Authentication auth) {
        return views.list(siteId, auth);
    }

    @PostMapping
    ResponseEntity<SavedView> save(@PathVariable long siteId, @RequestBody ViewRequest body, Authentication auth) {
        return ResponseEntity.status(HttpStatus.CREATED).body(views.save(siteId, auth, body.name(), body.screen(),
                body.state(), body.shared() == null || body.shared()));
    }

    @GetMapping("/{viewId}")
    SavedView get(@PathVariable long siteId, @PathVariable long viewId, Authentication auth) {
        return views.get(siteId, viewId, auth);
    }

    @PostMapping("/{viewId}/pin")
    SavedView pin(@PathVariable long siteId, @PathVariable long viewId, @RequestBody PinRequest body,
                  Authentication auth) {
        return views.pin(siteId, viewId, body.pinned(), auth);
    }

    @DeleteMapping("/{viewId}")
    ResponseEntity<Void> delete(@PathVariable long siteId, @PathVariable long viewId, Authentication auth) {
        views.delete(siteId, viewId, auth);
        return ResponseEntity.noContent().build();
    }
}
