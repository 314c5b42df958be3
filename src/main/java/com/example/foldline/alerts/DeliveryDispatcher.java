package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Service;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Sends pending webhook and e-mail deliveries, logging every attempt. A failed attempt is retried after
 * first-retry × 2^(attempt − 1), at most max-retry-delay, until max-attempts; a target the guard refuses is given up at
 * once. Several instances may run: each delivery is claimed with a lease before its attempt (docs/alerts.md,
 * "Delivery").
 */
@Service
public class DeliveryDispatcher {

    private static final Logger log = LoggerFactory.getLogger(DeliveryDispatcher.class);
    private static final int BATCH = 100;

    private final NotificationRepository repository;
    private final WebhookSender webhooks;
    private final MailNotifier mail;
    private final AlertProperties properties;
    private final ObjectMapper json;
    private final Clock clock;

    DeliveryDispatcher(NotificationRepository repository, WebhookSender webhooks, MailNotifier mail,
                       AlertProperties properties, ObjectMapper json, Clock clock) {
        this.repository = repository;
        this.webhooks = webhooks;
        this.mail = mail;
        this.properties = properties;
        this.json = json;
        this.clock = clock;
    }

    @Scheduled(fixedDelayString = "${foldline.alerts.dispatch-interval:PT10S}", initialDelayString = "PT20S")
    void scheduled() {
        if (!properties.schedulerEnabled()) {
            return;
        }
        try {
            dispatchDue(clock.instant());
        } catch (RuntimeException e) {
            log.error("alert delivery run failed; it will be retried", e);
        }
    }

    /** Makes one attempt for every delivery due at {@code now}; returns how many attempts were made. */
    public int dispatchDue(Instant now) {
        Duration lease = properties.webhooks().requestTimeout().multipliedBy(4).plusMinutes(1);
        int attempts = 0;
        for (long id : repository.due(now, BATCH)) {
            if (!repository.claim(id, now, now.plus(lease))) {
                continue; // another instance has it
            }
            NotificationRepository.Due d = repository.load(id);
            DeliveryAttempt a = attempt(d);
            attempts++;
            repository.logAttempt(id, d.attempts(), now, a);
            if (a.ok()) {
                repository.finish(id, NotificationRepository.SENT, now);
            } else if (DeliveryAttempt.REFUSED.equals(a.outcome())
                    || d.attempts() >= properties.webhooks().maxAttempts()) {
                repository.finish(id, NotificationRepository.FAILED, now);
                log.warn("alert delivery {} to {} given up after {} attempts: {}", id, d.channel(), d.attempts(),
                        a.error());
            } else {
                repository.retryAt(id, now.plus(backoff(d.attempts())));
            }
        }
        return attempts;
    }

    /** Delay after the given (1-based) failed attempt. */
    Duration backoff(int attempt) {
        Duration first = properties.webhooks().firstRetry();
        Duration max = properties.webhooks().maxRetryDelay();
        Duration delay = first;
        for (int i = 1; i < attempt && delay.compareTo(max) < 0; i++) {
            delay = delay.multipliedBy(2);
        }
        return delay.compareTo(max) > 0 ? max : delay;
    }

    private DeliveryAttempt attempt(NotificationRepository.Due d) {
        String event = "RAISED".equals(d.kind()) ? "alert.raised" : "alert.cleared";
        if ("webhook".equals(d.channel())) {
            if (d.url() == null || !d.webhookEnabled()) {
                return new DeliveryAttempt(DeliveryAttempt.REFUSED, null, "the webhook was deleted or disabled", 0);
            }
            return webhooks.send(d.url(), d.secret(), d.payload(), event, d.id());
        }
        return mail.send(d.recipient(), "[Foldline] " + d.title(), mailText(d));
    }

    private String mailText(NotificationRepository.Due d) {
        JsonNode p = json.readTree(d.payload());
        StringBuilder text = new StringBuilder(d.title()).append("\n\n");
        text.append(p.path("verdict").asString("")).append("\n\n");
        text.append("Rule: ").append(p.path("rule").path("condition").asString("")).append('\n');
        text.append("Window: ").append(p.path("window").path("start").asString("")).append(" to ")
                .append(p.path("window").path("end").asString("")).append(" (")
                .append(p.path("site").path("timezone").asString("")).append(")\n");
        if (p.has("test")) {
            text.append("Test: ").append(p.path("test").path("method").asString("")).append('\n');
        }
        text.append("State: ").append(p.path("state").path("from").asString("")).append(" → ")
                .append(p.path("state").path("to").asString("")).append('\n');
        text.append("\nOpen the matching view: ").append(p.path("link").asString("")).append('\n');
        return text.toString();
    }
}
