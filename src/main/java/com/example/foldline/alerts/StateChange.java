package com.example.foldline.alerts;

import java.time.Instant;
import java.time.LocalDateTime;

/**
 * One entry of a rule's history: a state change with the values that caused it.
 *
 * @param windowEnd  local end of the window that caused it (null for pause and resume)
 * @param notice     RAISED or CLEARED when the change sent a notification, else null
 * @param evaluation the whole evaluation of that window
 * @param changedAt  when the evaluator recorded it
 */
public record StateChange(long id, long ruleId, LocalDateTime windowEnd, RuleState from, RuleState to, String reason,
                          Double observed, Double baseline, Long sessions, Long baselineSessions, String testMethod,
                          Double pValue, String notice, Evaluation evaluation, Instant changedAt) {
}
