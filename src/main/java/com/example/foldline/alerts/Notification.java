package com.example.foldline.alerts;

import java.time.Instant;
import java.time.LocalDateTime;

/**
 * An in-app notification (the bell): a rule was raised or cleared.
 *
 * @param kind           RAISED or CLEARED
 * @param windowEnd      local end of the window that caused it
 * @param payload        the same JSON document the webhooks receive
 * @param muted          created while the rule was muted: kept here, not counted as unread, not sent out
 * @param acknowledgedAt when someone acknowledged it (unread while null)
 */
public record Notification(long id, long siteId, long ruleId, String kind, LocalDateTime windowEnd, String title,
                           String payload, boolean muted, Instant createdAt, Instant acknowledgedAt,
                           String acknowledgedBy) {
}
