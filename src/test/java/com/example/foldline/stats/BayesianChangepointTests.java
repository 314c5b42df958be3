package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import com.example.foldline.stats.BayesianChangepoint.Options;
import com.example.foldline.stats.BayesianChangepoint.Result;
import com.example.foldline.stats.BayesianChangepoint.Step;
import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Check values: checkvalues.md section 6, C4 (INDEP only: {@code scripts/bocpd_check.py}, exact rational arithmetic,
 * a log-space float implementation and brute-force enumeration of segmentations agree to ≤ 4e−16;
 * {@code out/bocpd_py.txt}).
 */
class BayesianChangepointTests {

    private static final long[] C4A_X = {0, 0, 1, 0, 1, 1, 1, 1};
    private static final long[] ONES = {1, 1, 1, 1, 1, 1, 1, 1};

    @Test
    void c4aExactPosteriorAndEvidenceOnAShortBernoulliSequence() {
        Options options = Options.defaults().withPrior(1, 1).withHazard(0.2).withKeepPosteriors(true);
        Result r = BayesianChangepoint.detect(C4A_X, ONES, options);
        // Hand check t = 1 and t = 2 (checkvalues.md C4a): 0.2, 0.8; then 0.2, 12/95, 64/95 exactly. Tolerance 1e-12.
        assertThat(r.steps().get(0).runLengthPosterior()).containsExactly(new double[] {0.2, 0.8}, within(1e-12));
        assertThat(r.steps().get(1).runLengthPosterior())
            .containsExactly(new double[] {0.2, 12.0 / 95, 64.0 / 95}, within(1e-12));
        // Posterior at t = 8, exact fractions (INDEP, exact arithmetic): tolerance 1e-12.
        double d = 1173141143.0;
        double[] expected = {1.0 / 5, 141866988 / d, 124147264 / d, 141192576 / d, 1142894592 / 5865705715.0,
            60899328 / d, 112066560 / d, 35389440 / d, 94371840 / d};
        assertThat(r.steps().get(7).runLengthPosterior()).containsExactly(expected, within(1e-12));
        assertThat(r.finalPosterior()).containsExactly(expected, within(1e-12));
        // Evidence 1173141143/283500000000 (exact), log −5.487527234222: tolerance 1e-9 on the log (checkvalues.md),
        // and 1e-12 relative on the evidence itself.
        assertThat(r.logEvidence()).isCloseTo(-5.487527234222, within(1e-9));
        double evidence = 1173141143.0 / 283500000000.0;
        assertThat(Math.exp(r.logEvidence())).isCloseTo(evidence, within(evidence * 1e-12));
    }

    @Test
    void c4bDailyBounceSeries() {
        ReferenceCsv csv = ReferenceCsv.load("daily_bounce.csv");
        long[] k = csv.longs("bounces");
        long[] n = csv.longs("sessions");
        Options options = Options.defaults().withPrior(1, 1).withHazard(1.0 / 50);
        Result r = BayesianChangepoint.detect(k, n, options);
        // Log evidence −136.3655984093 (INDEP, 10 decimals): tolerance 1e-9.
        assertThat(r.logEvidence()).isCloseTo(-136.3655984093, within(1e-9));
        // MAP run length on days 18, 19, 20, 30 and its probability (INDEP, 6 decimals): exact / tolerance 5e-7.
        assertMap(r.steps().get(17), 18, 0.968453);
        assertMap(r.steps().get(18), 1, 0.899968);
        assertMap(r.steps().get(19), 2, 0.964685);
        assertMap(r.steps().get(29), 12, 0.962839);
        // MAP = day number on days 1–18, then growing by one per day from day 19 (INDEP), exact.
        for (int t = 0; t < 30; t++) {
            assertThat(r.steps().get(t).mapRunLength()).as("day %d", t + 1).isEqualTo(t < 18 ? t + 1 : t - 17);
        }
        // Day 19: P(r <= 2) = 0.944041, E[r] = 1.639128 (out/bocpd_py.txt, INDEP, 6 decimals): tolerance 5e-7.
        assertThat(r.steps().get(18).recentChangeProbability()).isCloseTo(0.944041, within(5e-7));
        assertThat(r.steps().get(18).expectedRunLength()).isCloseTo(1.639128, within(5e-7));
        // First 12 days: log evidence −52.2707315293 (INDEP, recursion and enumeration over 2^11): tolerance 1e-9.
        Result first12 = BayesianChangepoint.detect(Arrays.copyOf(k, 12), Arrays.copyOf(n, 12), options);
        assertThat(first12.logEvidence()).isCloseTo(-52.2707315293, within(1e-9));
    }

    private static void assertMap(Step step, int runLength, double probability) {
        assertThat(step.mapRunLength()).as("MAP at index %d", step.index()).isEqualTo(runLength);
        assertThat(step.mapProbability()).as("P(MAP) at index %d", step.index()).isCloseTo(probability, within(5e-7));
    }

    @Test
    void evidenceAndFinalPosteriorMatchBruteForceEnumerationWithUnequalTrials() {
        // Own check, same method as the reference script: enumerate all 2^(T−1) segmentations (product-partition
        // form, no recursion); tolerance 1e-10 relative / absolute.
        SplittableRandom rnd = new SplittableRandom(11);
        int steps = 10;
        long[] n = new long[steps];
        long[] k = new long[steps];
        for (int t = 0; t < steps; t++) {
            n[t] = t == 4 ? 0 : 5 + rnd.nextInt(40);
            k[t] = n[t] == 0 ? 0 : rnd.nextInt((int) n[t] + 1);
        }
        double h = 0.1;
        Options options = Options.defaults().withPrior(2, 3).withHazard(h).withKeepPosteriors(true);
        Result r = BayesianChangepoint.detect(k, n, options);
        double logZ = enumerateEvidence(k, n, 0, steps, 2, 3, h);
        assertThat(r.logEvidence()).isCloseTo(logZ, within(1e-10));
        double[] post = r.finalPosterior();
        assertThat(post[0]).isCloseTo(h, within(1e-12));
        for (int runLength = 1; runLength <= steps; runLength++) {
            int s = steps - runLength;
            double lj = s == 0
                ? (steps - 1) * Math.log(1 - h) + segment(k, n, 0, steps, 2, 3) + Math.log(1 - h)
                : enumerateEvidence(k, n, 0, s, 2, 3, h) + Math.log(h) + (runLength - 1) * Math.log(1 - h)
                    + segment(k, n, s, steps, 2, 3) + Math.log(1 - h);
            assertThat(post[runLength]).as("r=%d", runLength).isCloseTo(Math.exp(lj - logZ), within(1e-10));
        }
    }

    /** ln P(x[from, to)) summed over all segmentations (cut probability h, first segment free). */
    private static double enumerateEvidence(long[] k, long[] n, int from, int to, double a0, double b0, double h) {
        int gaps = to - from - 1;
        double max = Double.NEGATIVE_INFINITY;
        double[] terms = new double[1 << gaps];
        for (int mask = 0; mask < (1 << gaps); mask++) {
            double lw = 0;
            int start = from;
            for (int g = 0; g < gaps; g++) {
                boolean cut = (mask & (1 << g)) != 0;
                lw += Math.log(cut ? h : 1 - h);
                if (cut) {
                    lw += segment(k, n, start, from + g + 1, a0, b0);
                    start = from + g + 1;
                }
            }
            lw += segment(k, n, start, to, a0, b0);
            terms[mask] = lw;
            max = Math.max(max, lw);
        }
        double s = 0;
        for (double term : terms) {
            s += Math.exp(term - max);
        }
        return max + Math.log(s);
    }

    /** ln marginal likelihood of one segment with binomial coefficients. */
    private static double segment(long[] k, long[] n, int from, int to, double a0, double b0) {
        double lc = 0;
        long sk = 0;
        long sn = 0;
        for (int t = from; t < to; t++) {
            lc += Distributions.logGamma(n[t] + 1.0) - Distributions.logGamma(k[t] + 1.0)
                - Distributions.logGamma(n[t] - k[t] + 1.0);
            sk += k[t];
            sn += n[t];
        }
        return lc + Distributions.logBeta(a0 + sk, b0 + sn - sk) - Distributions.logBeta(a0, b0);
    }

    @Test
    void changeProbabilityIsTheHazardAndPosteriorsSumToOne() {
        ReferenceCsv csv = ReferenceCsv.load("daily_bounce.csv");
        Result r = BayesianChangepoint.detect(csv.longs("bounces"), csv.longs("sessions"),
            Options.defaults().withHazard(0.03).withKeepPosteriors(true));
        for (Step s : r.steps()) {
            double[] p = s.runLengthPosterior();
            assertThat(p).hasSize(s.index() + 2);
            assertThat(p[0]).isCloseTo(0.03, within(1e-12)); // a consequence of the convention (checkvalues.md C4)
            assertThat(Arrays.stream(p).sum()).isCloseTo(1, within(1e-12));
        }
        assertThat(BayesianChangepoint.detect(csv.longs("bounces"), csv.longs("sessions")).steps().get(0)
            .runLengthPosterior()).isEmpty();
    }

    @Test
    void truncationIsExactBeforeTheCapAndKeepsAProperPosteriorAfterIt() {
        ReferenceCsv csv = ReferenceCsv.load("daily_bounce.csv");
        long[] k = csv.longs("bounces");
        long[] n = csv.longs("sessions");
        Options base = Options.defaults().withHazard(1.0 / 50).withKeepPosteriors(true);
        Result full = BayesianChangepoint.detect(k, n, base);
        // A cap at least the series length changes nothing.
        Result loose = BayesianChangepoint.detect(k, n, base.withMaxRunLength(30));
        assertThat(loose).isEqualTo(full);
        // Cap 10: identical for the first 10 steps (t < R), then 11 states, a proper posterior, and the change on
        // day 19 is still found.
        Result capped = BayesianChangepoint.detect(k, n, base.withMaxRunLength(10));
        for (int t = 0; t < 10; t++) {
            assertThat(capped.steps().get(t)).isEqualTo(full.steps().get(t));
        }
        for (int t = 10; t < 30; t++) {
            double[] p = capped.steps().get(t).runLengthPosterior();
            assertThat(p).hasSize(11);
            assertThat(Arrays.stream(p).sum()).isCloseTo(1, within(1e-12));
            assertThat(p[0]).isCloseTo(1.0 / 50, within(1e-12));
        }
        assertThat(capped.steps().get(17).mapRunLength()).isEqualTo(10); // "10 or longer"
        assertThat(capped.steps().get(18).mapRunLength()).isEqualTo(1);
        assertThat(capped.steps().get(18).mapProbability()).isGreaterThan(0.8);
    }

    @Test
    void emptySeriesAndEmptyStepsAreHandled() {
        Result empty = BayesianChangepoint.detect(new long[0], new long[0]);
        assertThat(empty.steps()).isEmpty();
        assertThat(empty.logEvidence()).isZero();
        assertThat(empty.finalPosterior()).containsExactly(1.0);
        // A step with no trials has predictive 1 and only shifts the run lengths.
        Result r = BayesianChangepoint.detect(new long[] {3, 0}, new long[] {10, 0},
            Options.defaults().withKeepPosteriors(true));
        assertThat(r.steps().get(1).logPredictive()).isCloseTo(0, within(1e-15));
    }

    @Test
    void rejectsBadArgumentsNamingTheValue() {
        assertThatIllegalArgumentException()
            .isThrownBy(() -> BayesianChangepoint.detect(new long[] {3}, new long[] {2}))
            .withMessageContaining("successes[0] = 3").withMessageContaining("trials[0] = 2");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> BayesianChangepoint.detect(new long[] {1, -1}, new long[] {2, 2}))
            .withMessageContaining("successes[1]").withMessageContaining("-1");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> BayesianChangepoint.detect(new long[] {1}, new long[] {2, 2}))
            .withMessageContaining("1 and 2");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withHazard(1.5))
            .withMessageContaining("hazard").withMessageContaining("1.5");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withPrior(0, 1))
            .withMessageContaining("priorAlpha").withMessageContaining("0.0");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withMaxRunLength(-2))
            .withMessageContaining("-2");
    }
}
