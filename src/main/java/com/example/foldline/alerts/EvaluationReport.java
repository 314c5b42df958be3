package com.example.foldline.alerts;

/**
 * What one evaluator run did.
 *
 * @param rules         enabled rules looked at
 * @param skipped       rules another evaluator held (or that were paused meanwhile)
 * @param windows       windows judged
 * @param transitions   state changes recorded
 * @param notifications new notifications (a window already notified is not notified again)
 * @param failed        rules whose evaluation failed (logged; retried on the next run)
 * @param queries       rollup queries made
 * @param readMillis    time spent in them
 */
public record EvaluationReport(int rules, int skipped, int windows, int transitions, int notifications, int failed,
                               int queries, long readMillis) {
}
