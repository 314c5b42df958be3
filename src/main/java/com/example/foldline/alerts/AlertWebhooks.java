package com.example.foldline.alerts;

import java.net.URI;
import java.security.SecureRandom;
import java.time.Clock;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;

import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.sites.Sites;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;
import com.example.foldline.system.NotFoundException;

/** Webhooks of a site: created with a random signing secret, checked by the guard when saved. */
@Service
class AlertWebhooks {

    private final WebhookRepository webhooks;
    private final WebhookGuard guard;
    private final Sites sites;
    private final Clock clock;
    private final SecureRandom random = new SecureRandom();

    AlertWebhooks(WebhookRepository webhooks, WebhookGuard guard, Sites sites, Clock clock) {
        this.webhooks = webhooks;
        this.guard = guard;
        this.sites = sites;
        this.clock = clock;
    }

    List<Webhook> list(long siteId) {
        sites.require(siteId);
        return webhooks.findBySite(siteId);
    }

    @Transactional
    NewWebhook create(long siteId, WebhookRequest request) {
        sites.require(siteId);
        WebhookRequest r = validated(request);
        String secret = newSecret();
        long id = webhooks.insert(siteId, r.name(), r.url(), secret, r.enabled(), clock.instant());
        return new NewWebhook(webhooks.find(siteId, id).orElseThrow(), secret);
    }

    @Transactional
    Webhook update(long siteId, long id, WebhookRequest request) {
        WebhookRequest r = validated(request);
        if (!webhooks.update(siteId, id, r.name(), r.url(), r.enabled())) {
            throw notFound(siteId, id);
        }
        return webhooks.find(siteId, id).orElseThrow();
    }

    @Transactional
    NewWebhook replaceSecret(long siteId, long id) {
        String secret = newSecret();
        if (!webhooks.replaceSecret(siteId, id, secret)) {
            throw notFound(siteId, id);
        }
        return new NewWebhook(webhooks.find(siteId, id).orElseThrow(), secret);
    }

    @Transactional
    void delete(long siteId, long id) {
        if (!webhooks.delete(siteId, id)) {
            throw notFound(siteId, id);
        }
    }

    private WebhookRequest validated(WebhookRequest r) {
        List<FieldError> errors = new ArrayList<>();
        if (r == null) {
            throw new BadRequestException("body", "a webhook is required");
        }
        String name = r.name() == null ? "" : r.name().strip();
        if (name.isEmpty() || name.length() > 200) {
            errors.add(new FieldError("name", "must be 1 to 200 characters"));
        }
        String url = r.url() == null ? "" : r.url().strip();
        if (url.isEmpty() || url.length() > 2048) {
            errors.add(new FieldError("url", "must be an http or https address of at most 2048 characters"));
        } else {
            try {
                String problem = guard.problem(new URI(url));
                if (problem != null) {
                    errors.add(new FieldError("url", problem));
                }
            } catch (java.net.URISyntaxException e) {
                errors.add(new FieldError("url", "is not a valid address: " + e.getReason()));
            }
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return new WebhookRequest(name, url, r.enabled() == null || r.enabled());
    }

    private String newSecret() {
        byte[] bytes = new byte[32];
        random.nextBytes(bytes);
        return "whsec_" + Base64.getUrlEncoder().withoutPadding().encodeToString(bytes);
    }

    private static NotFoundException notFound(long siteId, long id) {
        return new NotFoundException("no webhook " + id + " on site " + siteId);
    }
}
