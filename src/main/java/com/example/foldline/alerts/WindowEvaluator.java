package com.example.foldline.alerts;

import java.time.LocalDateTime;
import java.util.List;
import java.util.Locale;

import com.example.foldline.alerts.Evaluation.TestResult;
import com.example.foldline.alerts.Evaluation.Verdict;
import com.example.foldline.alerts.RuleDefinition.ConditionKind;
import com.example.foldline.alerts.RuleDefinition.Direction;
import com.example.foldline.alerts.RuleDefinition.GuardMethod;
import com.example.foldline.metrics.Metric;
import com.example.foldline.sessions.SessionTotals;
import com.example.foldline.stats.Alternative;
import com.example.foldline.stats.Distributions;
import com.example.foldline.stats.ProportionDifference;
import com.example.foldline.stats.ProportionInterval;
import com.example.foldline.stats.Proportions;
import com.example.foldline.stats.WelchResult;
import com.example.foldline.stats.WelchTest;
import com.example.foldline.stats.ZTestResult;

/**
 * Judges one window of one rule from hourly totals: the pure core that the live evaluator and the back-test share
 * (docs/alerts.md, "Conditions" and "The statistical guard"). No I/O, no clock.
 *
 * <p>Guards, each one-sided at confidence c (α = 1 − c):
 * <ul>
 * <li>zTest: pooled two-proportion z test of H₀ p_window = p_baseline against the rule's direction, passed when
 *     p ≤ α (the two-sided version is Pearson's χ² test on the 2×2 table);</li>
 * <li>newcombe: Newcombe's hybrid score interval (method 10) at two-sided level 1 − 2α, whose lower (upper) limit
 *     is a one-sided c bound on the difference; passed when that bound excludes 0;</li>
 * <li>welch: Welch's t test on the per-session values from sums and sums of squares, passed when p ≤ α;</li>
 * <li>wilson: the one-sided Wilson score bound (two-sided level 1 − 2α) beyond the threshold;</li>
 * <li>tBound: mean ∓ t<sub>c, n−1</sub>·s/√n beyond the threshold.</li>
 * </ul>
 * References: Newcombe RG (1998) <i>Stat. Med.</i> 17:873–890; Wilson EB (1927) <i>JASA</i> 22:209–212; Welch BL
 * (1947) <i>Biometrika</i> 34:28–35; Student (1908) <i>Biometrika</i> 6:1–25.
 */
final class WindowEvaluator {

    private WindowEvaluator() {
    }

    static Evaluation evaluate(RuleDefinition rule, LocalDateTime end, HourlySeries series) {
        List<LocalDateTime> slots = Windows.slots(end, rule.windowHours());
        SessionTotals now = series.sum(slots);
        Metric m = rule.metric();
        Double observed = finite(m.value(now));
        Context c = new Context(rule, slots.get(0), end, now, observed, series.readFrom());
        if (rule.condition() == ConditionKind.JUMP) {
            SessionTotals base = series.sum(Windows.baselineSlots(rule, end));
            return jump(c, base);
        }
        if (now.sessions() < rule.minSessions()) {
            return c.verdict(Verdict.THIN, "only " + now.sessions() + " sessions in the window; the guard asks for "
                    + rule.minSessions(), null, null, null, null, null);
        }
        if (observed == null) {
            return c.verdict(Verdict.THIN, "no " + denominatorName(m) + " in the window", null, null, null, null, null);
        }
        boolean above = rule.condition() == ConditionKind.ABOVE;
        boolean meets = above ? observed > rule.threshold() : observed < rule.threshold();
        String comparison = m.apiName() + " " + fmt(observed) + (above ? " above " : " below ") + fmt(rule.threshold());
        if (!meets) {
            return c.verdict(Verdict.NORMAL, "not " + comparison, null, null, null, null, null);
        }
        TestResult test = boundTest(rule, now, above);
        return c.verdict(test.passed() ? Verdict.BREACH : Verdict.UNCONFIRMED, comparison + (test.passed()
                        ? "; " : "; not confident: ") + test.method() + " " + fmt(test.bound()), null, null, null, null,
                test);
    }

    private static Evaluation jump(Context c, SessionTotals base) {
        RuleDefinition rule = c.rule;
        Metric m = rule.metric();
        Double baseline = finite(m.value(base));
        long n = c.now.sessions();
        if (n < rule.minSessions() || base.sessions() < rule.minSessions()) {
            return c.verdict(Verdict.THIN, (n < rule.minSessions() ? "only " + n + " sessions in the window"
                            : "only " + base.sessions() + " sessions in the baseline") + "; the guard asks for "
                            + rule.minSessions(), baseline, base.sessions(), null, null, null);
        }
        if (c.observed == null || baseline == null) {
            return c.verdict(Verdict.THIN, "no " + denominatorName(m) + " in the "
                    + (c.observed == null ? "window" : "baseline"), baseline, base.sessions(), null, null, null);
        }
        double change;
        String unit;
        if (rule.proportion()) {
            change = (c.observed - baseline) * 100;
            unit = "percentage points";
        } else {
            if (baseline == 0) {
                return c.verdict(Verdict.THIN, "the baseline is 0, so a change in percent is undefined", baseline,
                        base.sessions(), null, null, null);
            }
            change = (c.observed - baseline) / baseline * 100;
            unit = "percent";
        }
        boolean up = rule.direction() == Direction.UP;
        double signed = up ? change : -change;
        String what = m.apiName() + " " + fmt(c.observed) + " against " + fmt(baseline) + ", "
                + (change >= 0 ? "up " : "down ") + fmt(Math.abs(change)) + " " + unit;
        if (signed < rule.by()) {
            return c.verdict(Verdict.NORMAL, what + " (the rule asks for " + (up ? "a rise" : "a fall") + " of "
                    + fmt(rule.by()) + ")", baseline, base.sessions(), change, unit, null);
        }
        TestResult test = jumpTest(rule, c.now, base, up);
        String verdictText = test.passed() ? what + "; " + test.method() + describe(test)
                : what + "; not confident: " + test.method() + describe(test);
        return c.verdict(test.passed() ? Verdict.BREACH : Verdict.UNCONFIRMED, verdictText, baseline,
                base.sessions(), change, unit, test);
    }

    private static TestResult jumpTest(RuleDefinition rule, SessionTotals now, SessionTotals base, boolean up) {
        Metric m = rule.metric();
        double alpha = 1 - rule.confidence();
        if (rule.guard() == GuardMethod.Z_TEST || rule.guard() == GuardMethod.NEWCOMBE) {
            long x1 = (long) m.numerator(now);
            long n1 = (long) m.denominator(now);
            long x2 = (long) m.numerator(base);
            long n2 = (long) m.denominator(base);
            if (rule.guard() == GuardMethod.Z_TEST) {
                ZTestResult z = Proportions.twoProportionZTest(x1, n1, x2, n2, up ? Alternative.GREATER : Alternative.LESS);
                return new TestResult(GuardMethod.Z_TEST.description, finite(z.z()), finite(z.pValue()), null,
                        rule.confidence(), z.pValue() <= alpha);
            }
            ProportionDifference d = Proportions.newcombeDifference(x1, n1, x2, n2, 2 * alpha);
            double bound = up ? d.lower() : d.upper();
            return new TestResult(GuardMethod.NEWCOMBE.description, null, null, finite(bound), rule.confidence(),
                    up ? bound > 0 : bound < 0);
        }
        long n1 = now.sessions();
        long n2 = base.sessions();
        double mean1 = m.numerator(now) / n1;
        double mean2 = m.numerator(base) / n2;
        WelchResult w = WelchTest.fromSummary(n1, mean1, variance(sumOfSquares(m, now), mean1, n1), n2, mean2,
                variance(sumOfSquares(m, base), mean2, n2), 2 * alpha, up ? Alternative.GREATER : Alternative.LESS);
        return new TestResult(GuardMethod.WELCH.description, finite(w.t()), finite(w.pValue()), null,
                rule.confidence(), w.pValue() <= alpha);
    }

    private static TestResult boundTest(RuleDefinition rule, SessionTotals now, boolean above) {
        Metric m = rule.metric();
        double alpha = 1 - rule.confidence();
        if (rule.guard() == GuardMethod.WILSON) {
            ProportionInterval w = Proportions.wilson((long) m.numerator(now), (long) m.denominator(now), 2 * alpha);
            double bound = above ? w.lower() : w.upper();
            return new TestResult(GuardMethod.WILSON.description, null, null, bound, rule.confidence(),
                    above ? bound > rule.threshold() : bound < rule.threshold());
        }
        long n = now.sessions();
        if (n < 2) {
            return new TestResult(GuardMethod.T_BOUND.description, null, null, null, rule.confidence(), false);
        }
        double mean = m.numerator(now) / n;
        double se = Math.sqrt(variance(sumOfSquares(m, now), mean, n) / n);
        double t = Distributions.studentTQuantile(rule.confidence(), n - 1);
        double bound = (above ? mean - t * se : mean + t * se) * scale(m);
        return new TestResult(GuardMethod.T_BOUND.description, null, null, bound, rule.confidence(),
                above ? bound > rule.threshold() : bound < rule.threshold());
    }

    /** Sum of squares of the per-session quantity behind a mean metric (docs/metrics.md). */
    private static double sumOfSquares(Metric m, SessionTotals t) {
        return switch (m) {
            case PAGES_PER_SESSION -> t.pageviewsSq();
            case SESSION_RPM -> t.revenueSq();
            case ENGAGED_MS_PER_SESSION -> t.engagedSq();
            default -> throw new IllegalArgumentException(m + " is not a per-session mean");
        };
    }

    /** Session RPM is revenue per session × 1000; the other means are unscaled. */
    private static double scale(Metric m) {
        return m == Metric.SESSION_RPM ? 1000 : 1;
    }

    /** Sample variance from a sum of squares, (Σx² − n·mean²)/(n − 1), never negative. */
    static double variance(double sumSq, double mean, long n) {
        return n < 2 ? 0 : Math.max(0, (sumSq - n * mean * mean) / (n - 1));
    }

    private static String denominatorName(Metric m) {
        return m == Metric.VIEWABILITY_RATE || m == Metric.CTR ? "impressions" : "sessions";
    }

    private static String describe(TestResult t) {
        if (t.pValue() != null) {
            return ", p = " + fmt(t.pValue()) + (t.passed() ? " ≤ " : " > ") + fmt(1 - t.confidence());
        }
        return t.bound() == null ? "" : ", bound " + fmt(t.bound());
    }

    static String fmt(Double x) {
        return x == null ? "n/a" : String.format(Locale.ROOT, "%.4g", x);
    }

    static Double finite(double x) {
        return Double.isFinite(x) ? x : null;
    }

    private record Context(RuleDefinition rule, LocalDateTime start, LocalDateTime end, SessionTotals now,
                           Double observed, String readFrom) {

        Evaluation verdict(Verdict verdict, String reason, Double baseline, Long baselineSessions, Double change,
                           String unit, TestResult test) {
            Metric m = rule.metric();
            return new Evaluation(start, end, verdict, reason, observed, baseline, now.sessions(), baselineSessions,
                    m.numerator(now), m.denominator(now), change, unit, test, readFrom);
        }
    }
}
