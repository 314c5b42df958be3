package com.example.foldline.alerts;

import java.security.Principal;
import java.util.List;
import java.util.Map;

import org.springframework.security.core.Authentication;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.accounts.SiteAccess;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@Tag(name = "Alert notifications", description = "The bell: unread alerts, the list, acknowledging")
class AlertNotificationsController {

    private final AlertInbox inbox;
    private final SiteAccess access;

    AlertNotificationsController(AlertInbox inbox, SiteAccess access) {
        this.inbox = inbox;
        this.access = access;
    }

    @GetMapping("/api/v1/alerts/unread")
    @Operation(summary = "Unread alert notifications over the sites the caller may see, and per site (for the bell)")
    AlertInbox.Unread unreadEverywhere(Authentication auth) {
        return inbox.unread(access.visibleSiteIds(auth));
    }

    @GetMapping("/api/v1/sites/{siteId}/alerts/notifications")
    List<Notification> list(@PathVariable long siteId, @RequestParam(defaultValue = "false") boolean unread,
                            @RequestParam(defaultValue = "50") int limit) {
        return inbox.list(siteId, unread, limit);
    }

    @GetMapping("/api/v1/sites/{siteId}/alerts/notifications/unread-count")
    Map<String, Long> unread(@PathVariable long siteId) {
        return Map.of("unread", inbox.unread(siteId));
    }

    @PostMapping("/api/v1/sites/{siteId}/alerts/notifications/{id}/acknowledge")
    Map<String, Long> acknowledge(@PathVariable long siteId, @PathVariable long id, Principal user) {
        inbox.acknowledge(siteId, id, user == null ? null : user.getName());
        return Map.of("unread", inbox.unread(siteId));
    }

    @PostMapping("/api/v1/sites/{siteId}/alerts/notifications/acknowledge-all")
    Map<String, Long> acknowledgeAll(@PathVariable long siteId, Principal user) {
        long done = inbox.acknowledgeAll(siteId, user == null ? null : user.getName());
        return Map.of("acknowledged", done, "unread", inbox.unread(siteId));
    }
}
