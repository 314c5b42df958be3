package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Instant;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/**
 * Keeps alert history for {@code foldline.alerts.history-retention} (default 400 days): older state changes and
 * notifications, with their deliveries and delivery attempts, are deleted daily. A rule's current state, episode and
 * mute live on the rule itself, so evaluation carries on unchanged.
 */
@Component
class AlertHistoryRetention {

    private static final Logger log = LoggerFactory.getLogger(AlertHistoryRetention.class);

    /** What one run deleted. */
    record Purged(int stateChanges, int notifications) {
    }

    private final RuleRepository rules;
    private final NotificationRepository notifications;
    private final AlertProperties properties;
    private final Clock clock;

    AlertHistoryRetention(RuleRepository rules, NotificationRepository notifications, AlertProperties properties,
                          Clock clock) {
        this.rules = rules;
        this.notifications = notifications;
        this.properties = properties;
        this.clock = clock;
    }

    @Scheduled(cron = "${foldline.alerts.history-cron:0 45 3 * * *}")
    void daily() {
        if (!properties.schedulerEnabled()) {
            return;
        }
        try {
            Purged purged = purge(clock.instant());
            log.info("alert history older than {} deleted: {}", properties.historyRetention(), purged);
        } catch (RuntimeException e) {
            log.error("alert history retention failed; it runs again tomorrow", e);
        }
    }

    /** Deletes what was recorded more than the retention period before {@code now}. */
    @Transactional
    Purged purge(Instant now) {
        Instant cutoff = now.minus(properties.historyRetention());
        return new Purged(rules.deleteHistoryBefore(cutoff), notifications.deleteBefore(cutoff));
    }
}
