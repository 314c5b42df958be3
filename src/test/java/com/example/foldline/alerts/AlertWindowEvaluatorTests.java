package com.example.foldline.alerts;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.time.LocalDate;
import java.time.LocalDateTime;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;

import com.example.foldline.alerts.Evaluation.Verdict;
import com.example.foldline.sessions.SessionTotals;

/**
 * Issue #7: the statistical guard of {@link WindowEvaluator} against outside references. Published: Newcombe (1998)
 * Stat. Med. 17:873–890, example (a) 56/70 vs 48/80, method 10 interval 0.0524 to 0.3339 (4 dp); Newcombe (1998)
 * Stat. Med. 17:857–872 Table II, 81/263, Wilson 0.2553 to 0.3662. Computed: SciPy 1.17.1,
 * {@code scipy.stats.chi2_contingency(table, correction=False)} (one-sided p = two-sided p / 2 when the difference
 * has the tested sign, z = √χ²), {@code scipy.stats.ttest_ind_from_stats(..., equal_var=False, alternative=...)} and
 * {@code scipy.stats.t.ppf}.
 */
class AlertWindowEvaluatorTests {

    private static final LocalDateTime END = LocalDateTime.of(2026, 11, 9, 13, 0);
    private static final double PUBLISHED = 5e-5;
    private static final double COMPUTED = 1e-9;

    static RuleDefinition rule(String metric, RuleRequest.Condition condition, RuleRequest.Guard guard) {
        return RuleDefinition.from(new RuleRequest("test", metric, Map.of(), "PT1H", condition, guard, null, null,
                null, null, null));
    }

    static SessionTotals bounces(long bounces, long sessions) {
        return new SessionTotals(sessions, bounces, sessions, sessions, 0, 0, 0, 0, 0, 0, 0, 0);
    }

    static SessionTotals pages(long sessions, double pageviews, double sumOfSquares) {
        return new SessionTotals(sessions, 0, (long) pageviews, sumOfSquares, 0, 0, 0, 0, 0, 0, 0, 0);
    }

    /** The window hour holds {@code now}; the baseline hour one day earlier holds {@code base}. */
    static HourlySeries series(SessionTotals now, SessionTotals base) {
        Map<LocalDateTime, SessionTotals> byHour = new HashMap<>();
        byHour.put(END.minusHours(1), now);
        if (base != null) {
            byHour.put(END.minusHours(1).minusDays(1), base);
        }
        return new HourlySeries(LocalDate.of(2026, 10, 1), LocalDate.of(2026, 11, 30), byHour, "test");
    }

    @Test
    void zTestGuardMatchesPearsonChiSquaredWithoutCorrection() {
        RuleDefinition r = rule("bounceRate", new RuleRequest.Condition("jump", null, "up", 5.0, null, null),
                new RuleRequest.Guard(50, 0.99, "zTest"));
        Evaluation e = WindowEvaluator.evaluate(r, END, series(bounces(56, 70), bounces(48, 80)));
        // SciPy 1.17.1 chi2_contingency([[56,14],[48,32]], correction=False): chi2 7.0234113712, p 0.0080450813682
        assertThat(e.test().statistic()).isCloseTo(2.6501719513, within(COMPUTED));
        assertThat(e.test().pValue()).isCloseTo(0.0080450813682 / 2, within(1e-12));
        assertThat(e.verdict()).isEqualTo(Verdict.BREACH);           // p 0.0040 ≤ 0.01
        assertThat(e.change()).isCloseTo(20.0, within(1e-9));         // 0.8 − 0.6 = 20 percentage points
        assertThat(e.test().method()).contains("two-proportion z test");
        // the same counts at 99.9 %: not confident (p 0.0040 > 0.001), so the guard holds the rule back
        RuleDefinition strict = rule("bounceRate", new RuleRequest.Condition("jump", null, "up", 5.0, null, null),
                new RuleRequest.Guard(50, 0.999, "zTest"));
        assertThat(WindowEvaluator.evaluate(strict, END, series(bounces(56, 70), bounces(48, 80))).verdict())
                .isEqualTo(Verdict.UNCONFIRMED);
    }

    @Test
    void newcombeGuardUsesThePublishedLowerLimit() {
        // confidence 0.975 one-sided = the lower limit of the two-sided 95 % interval, Newcombe (1998) example (a)
        RuleDefinition r = rule("bounceRate", new RuleRequest.Condition("jump", null, "up", 5.0, null, null),
                new RuleRequest.Guard(50, 0.975, "newcombe"));
        Evaluation e = WindowEvaluator.evaluate(r, END, series(bounces(56, 70), bounces(48, 80)));
        assertThat(e.test().bound()).isCloseTo(0.0524, within(PUBLISHED));
        assertThat(e.test().passed()).isTrue();
        assertThat(e.test().method()).contains("Newcombe");
    }

    @Test
    void aFallIsTestedOnTheOtherSide() {
        RuleDefinition r = rule("bounceRate", new RuleRequest.Condition("jump", null, "down", 5.0, null, null),
                new RuleRequest.Guard(50, 0.99, "zTest"));
        Evaluation e = WindowEvaluator.evaluate(r, END, series(bounces(48, 80), bounces(56, 70)));
        assertThat(e.test().pValue()).isCloseTo(0.0080450813682 / 2, within(1e-12));   // same table, LESS
        assertThat(e.verdict()).isEqualTo(Verdict.BREACH);
        // a rise does not meet a "down" rule at all
        assertThat(WindowEvaluator.evaluate(r, END, series(bounces(56, 70), bounces(48, 80))).verdict())
                .isEqualTo(Verdict.NORMAL);
    }

    @Test
    void welchGuardForPagesPerSession() {
        // group 1: n 400, mean 2.4, variance 1.9; group 2: n 2800, mean 2.1, variance 1.6; Σx² = v(n − 1) + n·mean²
        SessionTotals now = pages(400, 960, 1.9 * 399 + 400 * 2.4 * 2.4);
        SessionTotals base = pages(2800, 5880, 1.6 * 2799 + 2800 * 2.1 * 2.1);
        RuleDefinition up = rule("pagesPerSession", new RuleRequest.Condition("jump", null, "up", 10.0, null, null),
                new RuleRequest.Guard(100, 0.95, null));
        Evaluation e = WindowEvaluator.evaluate(up, END, series(now, base));
        // SciPy 1.17.1 ttest_ind_from_stats(2.4, √1.9, 400, 2.1, √1.6, 2800, equal_var=False, alternative='greater')
        assertThat(e.test().statistic()).isCloseTo(4.1125116022, within(1e-8));
        assertThat(e.test().pValue()).isCloseTo(2.2878355833e-05, within(1e-10));
        assertThat(e.change()).isCloseTo((2.4 - 2.1) / 2.1 * 100, within(1e-9));      // percent for means
        assertThat(e.verdict()).isEqualTo(Verdict.BREACH);
        assertThat(e.test().method()).contains("Welch");
    }

    @Test
    void wilsonBoundForAnAbsoluteThreshold() {
        // 81/263 = 0.308; Wilson 95 % (Newcombe 1998, Table II) 0.2553 to 0.3662: at confidence 0.975 the one-sided
        // bound is the published lower limit
        RuleDefinition above25 = rule("bounceRate", new RuleRequest.Condition("above", 0.25, null, null, null, null),
                new RuleRequest.Guard(100, 0.975, null));
        Evaluation e = WindowEvaluator.evaluate(above25, END, series(bounces(81, 263), null));
        assertThat(e.test().bound()).isCloseTo(0.2553, within(PUBLISHED));
        assertThat(e.verdict()).isEqualTo(Verdict.BREACH);
        RuleDefinition above26 = rule("bounceRate", new RuleRequest.Condition("above", 0.26, null, null, null, null),
                new RuleRequest.Guard(100, 0.975, null));
        assertThat(WindowEvaluator.evaluate(above26, END, series(bounces(81, 263), null)).verdict())
                .isEqualTo(Verdict.UNCONFIRMED);                          // 0.308 > 0.26, but the bound 0.2553 is not
        RuleDefinition below = rule("bounceRate", new RuleRequest.Condition("below", 0.37, null, null, null, null),
                new RuleRequest.Guard(100, 0.975, null));
        Evaluation b = WindowEvaluator.evaluate(below, END, series(bounces(81, 263), null));
        assertThat(b.test().bound()).isCloseTo(0.3662, within(PUBLISHED));
        assertThat(b.verdict()).isEqualTo(Verdict.BREACH);
    }

    @Test
    void studentBoundForAMeanThreshold() {
        SessionTotals now = pages(400, 960, 1.9 * 399 + 400 * 2.4 * 2.4);
        RuleDefinition r = rule("pagesPerSession", new RuleRequest.Condition("below", 2.6, null, null, null, null),
                new RuleRequest.Guard(100, 0.95, null));
        Evaluation e = WindowEvaluator.evaluate(r, END, series(now, null));
        // SciPy 1.17.1 t.ppf(0.95, 399) = 1.648681533555; bound = 2.4 + 1.6487·√(1.9/400)
        assertThat(e.test().bound()).isCloseTo(2.4 + 1.648681533555 * Math.sqrt(1.9 / 400), within(1e-9));
        assertThat(e.verdict()).isEqualTo(Verdict.BREACH);
    }

    @Test
    void tooFewSessionsIsThinWhateverTheJump() {
        RuleDefinition r = rule("bounceRate", new RuleRequest.Condition("jump", null, "up", 5.0, null, null),
                new RuleRequest.Guard(200, 0.95, null));
        Evaluation e = WindowEvaluator.evaluate(r, END, series(bounces(29, 30), bounces(84, 210)));
        assertThat(e.verdict()).isEqualTo(Verdict.THIN);
        assertThat(e.reason()).contains("only 30 sessions");
        assertThat(e.test()).isNull();
        // no impressions: CTR has no denominator, so nothing can be judged
        RuleDefinition ctr = rule("ctr", new RuleRequest.Condition("above", 0.01, null, null, null, null),
                new RuleRequest.Guard(1, 0.95, null));
        assertThat(WindowEvaluator.evaluate(ctr, END, series(bounces(10, 300), null)).verdict())
                .isEqualTo(Verdict.THIN);
    }

    @Test
    void baselineHoursAreTheSameWindowOnEarlierDaysOrWeeks() {
        RuleDefinition days = rule("bounceRate", new RuleRequest.Condition("jump", null, "up", 5.0, "trailingDays", 2),
                null);
        RuleDefinition weeks = RuleDefinition.from(new RuleRequest("w", null, Map.of(), "PT2H",
                new RuleRequest.Condition("jump", null, null, 5.0, "sameHourOfWeek", 2), null, null, null, null, null,
                null));
        assertThat(Windows.baselineSlots(days, END)).containsExactly(END.minusDays(1).minusHours(1),
                END.minusDays(2).minusHours(1));
        assertThat(Windows.baselineSlots(weeks, END)).containsExactly(END.minusDays(7).minusHours(2),
                END.minusDays(7).minusHours(1), END.minusDays(14).minusHours(2), END.minusDays(14).minusHours(1));
        assertThat(Windows.firstDay(weeks, END)).isEqualTo(LocalDate.of(2026, 10, 26));
        assertThat(Windows.slots(END, 3)).isEqualTo(List.of(END.minusHours(3), END.minusHours(2), END.minusHours(1)));
    }
}
