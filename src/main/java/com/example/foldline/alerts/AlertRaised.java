package com.example.foldline.alerts;

import java.time.Instant;
import java.time.LocalDateTime;

/**
 * Published when a rule was raised and its notification recorded (also when the cool-down kept the notice back:
 * {@code notified} is then false).
 *
 * @param windowEnd local end of the window in breach (site time zone)
 */
public record AlertRaised(long siteId, long ruleId, String ruleName, String metric, LocalDateTime windowEnd,
                          Instant windowEndAt, Double observed, Double baseline, String method, boolean notified) {
}
