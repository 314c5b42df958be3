package com.example.foldline.alerts;

import java.time.Instant;
import java.time.LocalDateTime;

/**
 * Published when a raised rule became calm again.
 *
 * @param windowEnd local end of the window that completed "clears after" (site time zone)
 * @param notified  whether a recovery notification was recorded (only when the raise was notified)
 */
public record AlertCleared(long siteId, long ruleId, String ruleName, String metric, LocalDateTime windowEnd,
                           Instant windowEndAt, Double observed, boolean notified) {
}
