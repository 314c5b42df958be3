package com.example.foldline.alerts;

import java.time.Instant;
import java.time.LocalDateTime;
import java.util.List;

/**
 * When a rule would have been raised and cleared over history, replayed hour by hour with the live evaluator's code.
 *
 * @param rule           the rule replayed, defaults filled in
 * @param from           local end of the first window judged minus one hour
 * @param to             local end of the last window judged
 * @param windows        windows judged
 * @param raised         raises that would have sent a notification (the count to tune the threshold by)
 * @param raisedQuietly  raises the cool-down would have kept quiet
 * @param cleared        recoveries that would have sent a notification
 * @param changes        every state change, in order
 * @param points         every window's values, for the time series chart
 */
public record BacktestResult(RuleRequest rule, String description, LocalDateTime from, LocalDateTime to,
                             String timezone, int windows, int raised, int raisedQuietly, int cleared,
                             List<Change> changes, List<Point> points, String readFrom) {

    /** A state change the rule would have made. */
    public record Change(LocalDateTime windowEnd, Instant windowEndUtc, RuleState from, RuleState to, String notice,
                         String reason, Double observed, Double baseline, Long sessions, Double pValue) {
    }

    /** One judged window. */
    public record Point(LocalDateTime windowEnd, Double observed, Double baseline, long sessions,
                        Evaluation.Verdict verdict) {
    }
}
