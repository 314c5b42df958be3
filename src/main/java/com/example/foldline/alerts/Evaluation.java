package com.example.foldline.alerts;

import java.time.LocalDateTime;

/**
 * What one evaluation of one window found: the values, the baseline, the statistical guard, and the verdict. Stored
 * with every state change, shown as a rule's last evaluation, and sent in notifications.
 *
 * @param windowStart       first local hour of the window (site time zone)
 * @param windowEnd         exclusive local end of the window
 * @param verdict           see {@link Verdict}
 * @param reason            the verdict in words, with the numbers
 * @param observed          the metric over the window (null when it has no denominator)
 * @param baseline          the metric over the pooled baseline hours (jump conditions)
 * @param sessions          sessions in the window
 * @param baselineSessions  sessions in the baseline hours
 * @param numerator         e.g. bounces
 * @param denominator       e.g. sessions (impressions for viewability rate and CTR)
 * @param change            observed − baseline, in percentage points (proportions) or percent (means)
 * @param changeUnit        "percentage points" or "percent"
 * @param test              the guard's test, when one was run
 * @param readFrom          which rollup view answered
 */
public record Evaluation(LocalDateTime windowStart, LocalDateTime windowEnd, Verdict verdict, String reason,
                         Double observed, Double baseline, long sessions, Long baselineSessions, double numerator,
                         double denominator, Double change, String changeUnit, TestResult test, String readFrom) {

    /** The four answers an evaluation can give. */
    public enum Verdict {
        /** the condition holds and the guard is satisfied */
        BREACH,
        /** the condition does not hold */
        NORMAL,
        /** too few sessions (or no denominator) to judge: neither raises nor clears */
        THIN,
        /** the condition holds on the face of it, but the guard's test is not confident: neither raises nor clears */
        UNCONFIRMED
    }

    /**
     * @param method     the test by name, e.g. "one-sided pooled two-proportion z test"
     * @param statistic  z or t, where the method has one
     * @param pValue     one-sided p-value, where the method has one
     * @param bound      the one-sided confidence bound compared with 0 or the threshold, where the method has one
     * @param confidence the confidence asked for
     * @param passed     whether the guard is satisfied
     */
    public record TestResult(String method, Double statistic, Double pValue, Double bound, double confidence,
                             boolean passed) {
    }
}
