package com.example.foldline.metrics;

import java.util.ArrayList;
import java.util.List;

import com.example.foldline.sessions.SessionTotals;
import com.example.foldline.stats.Alternative;
import com.example.foldline.stats.ProportionDifference;
import com.example.foldline.stats.Proportions;
import com.example.foldline.stats.WelchResult;
import com.example.foldline.stats.WelchTest;

/**
 * Compares each overview metric with the previous period. Proportions use Newcombe's hybrid score interval for a
 * difference (Newcombe 1998, method 10); per-session means use Welch's t test from sums and sums of squares;
 * ratios of totals and counts are reported without a test. Meaningful at 95% = the interval excludes 0.
 */
final class Comparisons {

    static final double ALPHA = 0.05;
    static final String NEWCOMBE = "Newcombe hybrid score interval for a difference of proportions (1998), 95%";
    static final String WELCH = "Welch's t test on per-session values (1947), 95%";
    static final String NONE = "not tested: a ratio of totals or a count";

    private Comparisons() {
    }

    static List<Change> compare(SessionTotals now, SessionTotals before) {
        List<Change> changes = new ArrayList<>();
        for (Metric m : Metric.values()) {
            changes.add(change(m, now, before));
        }
        return changes;
    }

    static Change change(Metric m, SessionTotals now, SessionTotals before) {
        double current = m.value(now);
        double previous = m.value(before);
        Double diff = Money.finite(current - previous);
        return switch (m.kind()) {
            case PROPORTION -> {
                long x1 = (long) m.numerator(now);
                long n1 = (long) m.denominator(now);
                long x2 = (long) m.numerator(before);
                long n2 = (long) m.denominator(before);
                if (n1 == 0 || n2 == 0) {
                    yield new Change(m.apiName(), Money.finite(previous), diff, null, null, null, null, NEWCOMBE);
                }
                ProportionDifference d = Proportions.newcombeDifference(x1, n1, x2, n2, ALPHA);
                yield new Change(m.apiName(), previous, diff, d.lower(), d.upper(), d.excludesZero(), null, NEWCOMBE);
            }
            case MEAN -> {
                long n1 = now.sessions();
                long n2 = before.sessions();
                if (n1 < 2 || n2 < 2) {
                    yield new Change(m.apiName(), Money.finite(previous), diff, null, null, null, null, WELCH);
                }
                double scale = m.scale();
                double mean1 = m.numerator(now) / n1;
                double mean2 = m.numerator(before) / n2;
                WelchResult w = WelchTest.fromSummary(n1, mean1, variance(m.sumOfSquares(now), mean1, n1), n2, mean2,
                        variance(m.sumOfSquares(before), mean2, n2), ALPHA, Alternative.TWO_SIDED);
                Double lower = Money.finite(w.lower() * scale);
                Double upper = Money.finite(w.upper() * scale);
                Boolean significant = lower == null || upper == null ? null : lower > 0 || upper < 0;
                yield new Change(m.apiName(), previous, diff, lower, upper, significant, Money.finite(w.pValue()), WELCH);
            }
            default -> new Change(m.apiName(), Money.finite(previous), diff, null, null, null, null, NONE);
        };
    }

    /** Sample variance from a sum of squares: (Σx² − n·mean²)/(n − 1), never negative. */
    static double variance(double sumSq, double mean, long n) {
        return Math.max(0, (sumSq - n * mean * mean) / (n - 1));
    }
}
