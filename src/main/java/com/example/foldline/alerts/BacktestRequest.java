package com.example.foldline.alerts;

import java.time.LocalDate;

/**
 * "Try this rule on history": the rule (as it would be saved) and the local days to replay, inclusive. Without
 * dates, the last 30 days up to the newest complete hour; at most 92 days.
 */
public record BacktestRequest(RuleRequest rule, LocalDate from, LocalDate to) {
}
