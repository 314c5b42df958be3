package com.example.foldline.alerts;

import java.net.URI;
import java.util.List;

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
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.ResponseStatus;
import org.springframework.web.bind.annotation.RestController;
import org.springframework.web.server.ResponseStatusException;

import com.example.foldline.accounts.SiteAccess;
import com.example.foldline.accounts.SiteRole;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

/** Webhooks make the server send requests, so changing them is for administrators of the site. */
@RestController
@RequestMapping("/api/v1/sites/{siteId}/alerts")
@Tag(name = "Alert webhooks", description = "Signed webhook targets and the delivery log")
class AlertWebhooksController {

    private final AlertWebhooks webhooks;
    private final AlertInbox inbox;
    private final SiteAccess access;

    AlertWebhooksController(AlertWebhooks webhooks, AlertInbox inbox, SiteAccess access) {
        this.webhooks = webhooks;
        this.inbox = inbox;
        this.access = access;
    }

    @GetMapping("/webhooks")
    List<Webhook> list(@PathVariable long siteId) {
        return webhooks.list(siteId);
    }

    @PostMapping("/webhooks")
    @Operation(summary = "Add a webhook", description = "The answer holds the signing secret, shown this once")
    ResponseEntity<NewWebhook> create(@PathVariable long siteId, @RequestBody WebhookRequest request,
                                      Authentication auth) {
        requireAdmin(auth, siteId);
        NewWebhook created = webhooks.create(siteId, request);
        return ResponseEntity.created(URI.create("/api/v1/sites/" + siteId + "/alerts/webhooks/"
                + created.webhook().id())).body(created);
    }

    @PutMapping("/webhooks/{id}")
    Webhook update(@PathVariable long siteId, @PathVariable long id, @RequestBody WebhookRequest request,
                   Authentication auth) {
        requireAdmin(auth, siteId);
        return webhooks.update(siteId, id, request);
    }

    @PostMapping("/webhooks/{id}/secret")
    @Operation(summary = "Replace the signing secret", description = "The new secret is shown this once")
    NewWebhook replaceSecret(@PathVariable long siteId, @PathVariable long id, Authentication auth) {
        requireAdmin(auth, siteId);
        return webhooks.replaceSecret(siteId, id);
    }

    @DeleteMapping("/webhooks/{id}")
    @ResponseStatus(HttpStatus.NO_CONTENT)
    void delete(@PathVariable long siteId, @PathVariable long id, Authentication auth) {
        requireAdmin(auth, siteId);
        webhooks.delete(siteId, id);
    }

    @GetMapping("/deliveries")
    @Operation(summary = "Every delivery attempt (webhooks and e-mail), newest first")
    List<DeliveryLogEntry> deliveries(@PathVariable long siteId, @RequestParam(required = false) Long webhookId,
                                      @RequestParam(defaultValue = "100") int limit) {
        return inbox.attempts(siteId, webhookId, limit);
    }

    private void requireAdmin(Authentication auth, long siteId) {
        if (!access.allows(auth, siteId, SiteRole.ADMIN)) {
            throw new ResponseStatusException(HttpStatus.FORBIDDEN, "only administrators may change webhooks");
        }
    }
}
