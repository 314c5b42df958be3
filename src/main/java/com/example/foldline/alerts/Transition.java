package com.example.foldline.alerts;

import java.time.LocalDateTime;

/**
 * One state change of a rule, with the evaluation that caused it (null for pause and resume).
 *
 * @param windowEnd  the local end of the window that caused it
 * @param notice     the message it sends, or null
 */
record Transition(long ruleId, long siteId, RuleState from, RuleState to, LocalDateTime windowEnd, String reason,
                  AlertRule.Notice notice, Evaluation evaluation) {
}
