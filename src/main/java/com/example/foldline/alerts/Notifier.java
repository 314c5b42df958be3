package com.example.foldline.alerts;

import java.time.Instant;
import java.util.Optional;

import org.springframework.context.ApplicationEventPublisher;
import org.springframework.stereotype.Component;

import com.example.foldline.alerts.AlertRule.Notice;
import com.example.foldline.sites.Site;

/**
 * Records a transition inside the evaluator's transaction: the history entry, and for a notice the in-app
 * notification (once per rule, window and kind: the idempotency key) with one pending delivery per webhook and
 * e-mail address. Deliveries are sent afterwards by {@link DeliveryDispatcher}, so a slow receiver never holds a rule
 * lock, and a crash between commit and sending loses nothing.
 */
@Component
class Notifier {

    private final RuleRepository rules;
    private final NotificationRepository notifications;
    private final Payloads payloads;
    private final MailNotifier mail;
    private final ApplicationEventPublisher events;

    Notifier(RuleRepository rules, NotificationRepository notifications, Payloads payloads, MailNotifier mail,
             ApplicationEventPublisher events) {
        this.rules = rules;
        this.notifications = notifications;
        this.payloads = payloads;
        this.mail = mail;
        this.events = events;
    }

    /** Records the transition; returns true when it created a new notification. */
    boolean record(Site site, AlertRule rule, Transition t, Instant now) {
        rules.insertStateChange(t, now);
        Evaluation e = t.evaluation();
        boolean created = false;
        if (t.notice() != null) {
            boolean muted = rule.mutedAt(now);
            Optional<Long> id = notifications.insertOnce(site.id(), rule.id(), t.notice().name(),
                    Payloads.key(rule.id(), t.windowEnd(), t.notice()), t.windowEnd(),
                    payloads.title(site, rule, t.notice()), payloads.json(site, rule, t, now), muted, now);
            created = id.isPresent();
            if (created && !muted) {
                for (long webhook : rules.webhookIds(rule.id())) {
                    notifications.insertDelivery(id.get(), "webhook", webhook, null, "webhook:" + webhook, now);
                }
                if (mail.available()) {
                    for (String address : rule.emails()) {
                        notifications.insertDelivery(id.get(), "email", null, address, "mailto:" + address, now);
                    }
                }
            }
        }
        if (e != null && t.to() == RuleState.RAISED && t.from() == RuleState.CALM) {
            events.publishEvent(new AlertRaised(site.id(), rule.id(), rule.definition().name(),
                    rule.definition().metric().apiName(), t.windowEnd(), Windows.instant(t.windowEnd(),
                    site.timezone()), e.observed(), e.baseline(), e.test() == null ? null : e.test().method(),
                    t.notice() == Notice.RAISED));
        } else if (e != null && t.to() == RuleState.CALM) {
            events.publishEvent(new AlertCleared(site.id(), rule.id(), rule.definition().name(),
                    rule.definition().metric().apiName(), t.windowEnd(), Windows.instant(t.windowEnd(),
                    site.timezone()), e.observed(), t.notice() == Notice.CLEARED));
        }
        return created;
    }
}
