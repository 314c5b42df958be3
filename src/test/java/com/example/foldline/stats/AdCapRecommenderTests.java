package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import com.example.foldline.stats.AdCapRecommender.CapValue;
import com.example.foldline.stats.AdCapRecommender.DataStatus;
import com.example.foldline.stats.AdCapRecommender.EntryCapValue;
import com.example.foldline.stats.AdCapRecommender.EntryStats;
import com.example.foldline.stats.AdCapRecommender.Options;
import com.example.foldline.stats.AdCapRecommender.PageStats;
import com.example.foldline.stats.AdCapRecommender.PairValue;
import com.example.foldline.stats.AdCapRecommender.Recommendation;
import com.example.foldline.stats.AdCapRecommender.TwoCapRecommendation;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * No outside reference exists for this model (it is Foldline's own): the checks are hand computations written out
 * below, brute-force agreement with the analytic optimum, and properties of the resampling.
 */
class AdCapRecommenderTests {

    /** Σr² for n pages with revenue sum s and per-page standard deviation sd: (n − 1)·sd² + s²/n. */
    private static double squares(long n, long s, double sd) {
        return (n - 1) * sd * sd + (double) s * s / n;
    }

    private static PageStats page(int ads, long pages, long exits, long revenue, double sd) {
        return new PageStats(ads, pages, exits, revenue, squares(pages, revenue, sd));
    }

    /*
     * Hand-computed example (revenue in micros; session RPM = RPP / exit rate / 1000 in currency units):
     *   k = 2: 10,000 pages, 4,000 exits -> q = 0.4,   E[pages] = 2.5; RPP = 20,000,000 / 10,000 = 2,000
     *          -> 2,000 / 0.4   = 5,000 micros per session -> session RPM 5.0
     *   k = 4: 10,000 pages, 5,000 exits -> q = 0.5,   E[pages] = 2;   RPP = 3,000 -> 6,000 -> RPM 6.0  (best)
     *   k = 6: 10,000 pages, 6,250 exits -> q = 0.625, E[pages] = 1.6; RPP = 3,500 -> 5,600 -> RPM 5.6
     *   k = 8:    300 pages,    30 exits -> q = 0.1;   RPP = 10,000 -> 100,000 -> RPM 100, but 300 < 1,000 pages
     *          -> not enough data, never recommended.
     *   Per-page revenue sd 1,000 micros -> standard error 1,000 / sqrt(10,000) = 10 micros.
     *   Current revenue per session 5,500 micros -> current RPM 5.5 -> expected gain 6.0 − 5.5 = 0.5.
     *   Delta method for k = 4: Var(RPP/q) ≈ (1/q)²·10² + (RPP/q²)²·q(1−q)/n = 400 + 12,000²·0.000025 = 4,000
     *   -> sd 63.25 micros = 0.06325 RPM -> 95% interval ≈ 6.0 ± 0.124.
     */
    private static List<PageStats> handExample() {
        return List.of(
            page(6, 10_000, 6_250, 35_000_000, 1000),
            page(2, 10_000, 4_000, 20_000_000, 1000),
            page(8, 300, 30, 3_000_000, 1000),
            page(4, 10_000, 5_000, 30_000_000, 1000));
    }

    @Test
    void handComputedSingleCapExample() {
        Recommendation r = AdCapRecommender.recommend(handExample(), OptionalDouble.of(5_500),
            Options.defaults().withResamples(20_000));
        assertThat(r.recommendedCap()).contains(4);
        List<CapValue> caps = r.caps();
        assertThat(caps).extracting(CapValue::adCount).containsExactly(2, 4, 6, 8);
        // Point estimates: exact arithmetic above, tolerance 1e-12.
        assertThat(caps.get(0).sessionRpm().estimate()).isCloseTo(5.0, within(1e-12));
        assertThat(caps.get(1).sessionRpm().estimate()).isCloseTo(6.0, within(1e-12));
        assertThat(caps.get(2).sessionRpm().estimate()).isCloseTo(5.6, within(1e-12));
        assertThat(caps.get(1).exitRate()).isEqualTo(0.5);
        assertThat(caps.get(1).expectedPagesPerSession()).isEqualTo(2.0);
        assertThat(caps.get(1).revenuePerPageMicros()).isEqualTo(3000.0);
        assertThat(caps.get(1).revenuePerPageSeMicros()).isCloseTo(10.0, within(1e-9));
        // The thin cap: reported, not enough data, never best.
        CapValue thin = caps.get(3);
        assertThat(thin.status()).isEqualTo(DataStatus.NOT_ENOUGH_DATA);
        assertThat(thin.note()).contains("300 pages").contains("1000");
        assertThat(thin.sessionRpm().estimate()).isCloseTo(100.0, within(1e-12));
        assertThat(thin.sessionRpm().lower()).isNaN();
        assertThat(thin.probabilityBest()).isZero();
        // Interval for k = 4 against the delta-method width above: ±0.124; Monte Carlo with B = 20,000 -> the
        // percentile's own error is ~0.02 sd, the delta method's ~1% of the width; tolerance 0.01 RPM.
        assertThat(caps.get(1).sessionRpm().lower()).isCloseTo(6.0 - 0.124, within(0.01));
        assertThat(caps.get(1).sessionRpm().upper()).isCloseTo(6.0 + 0.124, within(0.01));
        // Gap to k = 6 is 0.4 RPM, about 5 sd of the difference: k = 4 is best in (almost) every resample.
        assertThat(caps.get(1).probabilityBest()).isGreaterThan(0.999);
        // Gain: 6.0 − 5.5 = 0.5 (exact), interval = the k = 4 interval shifted by −5.5 (same draws), 1e-12.
        assertThat(r.currentSessionRpm()).hasValue(5.5);
        assertThat(r.expectedGainRpm()).isPresent();
        assertThat(r.expectedGainRpm().get().estimate()).isCloseTo(0.5, within(1e-12));
        assertThat(r.expectedGainRpm().get().lower()).isCloseTo(caps.get(1).sessionRpm().lower() - 5.5, within(1e-12));
        assertThat(r.summary()).startsWith("Recommended cap: 4 ads per page, session RPM 6.00");
        assertThat(r.caution()).isEqualTo(AdCapRecommender.CAUTION).contains("confounded")
            .contains("layout-variant test");
    }

    /*
     * Two-cap hand example (micros):
     *   entry k = 1: 5,000 sessions, 2,000 bounces -> bounce 0.40, RPP_entry = 5,000,000 / 5,000 = 1,000
     *   entry k = 3: 5,000 sessions, 2,600 bounces -> bounce 0.52, RPP_entry = 2,000
     *   later k = 2: 8,000 pages, 2,000 exits -> q = 0.25, RPP = 2,000 -> 2,000 / 0.25 = 8,000 per continuing session
     *   later k = 5: 8,000 pages, 3,200 exits -> q = 0.40, RPP = 4,000 -> 10,000
     *   pairs: (1,2) 1,000 + 0.60·8,000 = 5,800; (1,5) 1,000 + 0.60·10,000 = 7,000 (best);
     *          (3,2) 2,000 + 0.48·8,000 = 5,840; (3,5) 2,000 + 0.48·10,000 = 6,800   -> RPM 5.8, 7.0, 5.84, 6.8
     */
    @Test
    void handComputedEntryAndLaterExample() {
        List<EntryStats> entry = List.of(
            new EntryStats(3, 5_000, 2_600, 10_000_000, squares(5_000, 10_000_000, 500)),
            new EntryStats(1, 5_000, 2_000, 5_000_000, squares(5_000, 5_000_000, 500)));
        List<PageStats> later = List.of(page(2, 8_000, 2_000, 16_000_000, 1000), page(5, 8_000, 3_200, 32_000_000,
            1000));
        TwoCapRecommendation r = AdCapRecommender.recommendEntryAndLater(entry, later, OptionalDouble.of(6_000),
            Options.defaults());
        assertThat(r.recommended()).isPresent();
        assertThat(r.recommended().get().entryAdCount()).isEqualTo(1);
        assertThat(r.recommended().get().laterAdCount()).isEqualTo(5);
        double[] expected = {5.8, 7.0, 5.84, 6.8};
        for (int p = 0; p < 4; p++) {
            assertThat(r.pairs().get(p).sessionRpm().estimate()).as("pair %d", p).isCloseTo(expected[p], within(1e-12));
        }
        assertThat(r.pairs()).extracting(PairValue::entryAdCount).containsExactly(1, 1, 3, 3);
        assertThat(r.pairs()).extracting(PairValue::laterAdCount).containsExactly(2, 5, 2, 5);
        assertThat(r.entryCaps().get(0).bounceRate()).isEqualTo(0.4);
        assertThat(r.laterCaps().get(1).sessionRpm().estimate()).isCloseTo(10.0, within(1e-12));
        // Gain 7.0 − 6.0 = 1.0 (exact), tolerance 1e-12.
        assertThat(r.expectedGainRpm().orElseThrow().estimate()).isCloseTo(1.0, within(1e-12));
        // Probabilities over pairs sum to 1; the marginal shares of entry and later caps too (tolerance 1e-12).
        assertThat(r.pairs().stream().mapToDouble(PairValue::probabilityBest).sum()).isCloseTo(1, within(1e-12));
        assertThat(r.entryCaps().stream().mapToDouble(EntryCapValue::probabilityBest).sum()).isCloseTo(1,
            within(1e-12));
        assertThat(r.laterCaps().stream().mapToDouble(CapValue::probabilityBest).sum()).isCloseTo(1, within(1e-12));
        // (1,5) beats (3,5) by 0.2 RPM: with these counts that is several sd, so it wins most resamples.
        assertThat(r.recommended().get().probabilityBest()).isGreaterThan(0.9);
        assertThat(r.summary()).contains("1 ads on the entry page and 5 on later pages");
    }

    @Test
    void probabilitiesSumToOneAndTheSeedFixesTheAnswer() {
        // Two caps within noise of each other, so the shares are far from 0 and 1.
        List<PageStats> close = List.of(
            page(3, 5_000, 2_000, 10_000_000, 2000),
            page(4, 5_000, 2_050, 10_300_000, 2000),
            page(5, 5_000, 2_100, 10_400_000, 2000));
        Options options = Options.defaults().withSeed(42);
        Recommendation a = AdCapRecommender.recommend(close, OptionalDouble.empty(), options);
        Recommendation b = AdCapRecommender.recommend(close, OptionalDouble.empty(), options);
        assertThat(a).isEqualTo(b);
        assertThat(a.caps().stream().mapToDouble(CapValue::probabilityBest).sum()).isCloseTo(1, within(1e-12));
        assertThat(a.caps()).allSatisfy(c -> assertThat(c.probabilityBest()).isBetween(0.05, 0.95));
        assertThat(a.expectedGainRpm()).isEmpty();
        Recommendation other = AdCapRecommender.recommend(close, OptionalDouble.empty(), options.withSeed(43));
        assertThat(other.caps().get(0).probabilityBest()).isNotEqualTo(a.caps().get(0).probabilityBest());
        assertThat(other.recommendedCap()).isEqualTo(a.recommendedCap()); // the point estimate does not depend on it
    }

    @Test
    void withNoiseFreeLargeCountsTheRecommendationIsTheAnalyticArgmax() {
        // Brute force over random scenarios: true exit rates and revenues per page, 10^9 pages per cap, so the
        // estimates equal the truth to ~1e-9; the recommended cap must be argmax RPP/q of the truth.
        SplittableRandom rnd = new SplittableRandom(2024);
        int checked = 0;
        for (int scenario = 0; scenario < 200; scenario++) {
            List<PageStats> caps = new ArrayList<>();
            double bestValue = Double.NEGATIVE_INFINITY;
            double second = Double.NEGATIVE_INFINITY;
            int argmax = -1;
            for (int k = 0; k <= 12; k++) {
                double q = 0.2 + 0.6 * rnd.nextDouble();
                double rpp = 500 + 4500 * rnd.nextDouble();
                long pages = 1_000_000_000L;
                long exits = Math.round(q * pages);
                long revenue = Math.round(rpp * pages);
                caps.add(new PageStats(k, pages, exits, revenue, squares(pages, revenue, rpp)));
                double v = ((double) revenue / pages) / ((double) exits / pages); // the analytic value of the truth
                if (v > bestValue) {
                    second = bestValue;
                    bestValue = v;
                    argmax = k;
                } else if (v > second) {
                    second = v;
                }
            }
            if (bestValue - second < 1e-6 * bestValue) {
                continue; // a near tie: either answer is right
            }
            Recommendation r = AdCapRecommender.recommend(caps, OptionalDouble.empty(),
                Options.defaults().withResamples(50).withSeed(scenario));
            assertThat(r.recommendedCap()).as("scenario %d", scenario).contains(argmax);
            if (bestValue - second > 1e-3 * bestValue) {
                assertThat(r.caps().get(argmax).probabilityBest()).as("scenario %d", scenario).isEqualTo(1.0);
            }
            checked++;
        }
        assertThat(checked).isGreaterThan(190);
    }

    @Test
    void withNoiseFreeLargeCountsTheBestPairIsTheAnalyticArgmax() {
        SplittableRandom rnd = new SplittableRandom(7);
        for (int scenario = 0; scenario < 50; scenario++) {
            List<EntryStats> entry = new ArrayList<>();
            List<PageStats> later = new ArrayList<>();
            double[] entryRpp = new double[6];
            double[] bounce = new double[6];
            double[] laterValue = new double[6];
            long n = 1_000_000_000L;
            for (int k = 0; k < 6; k++) {
                double b = 0.3 + 0.4 * rnd.nextDouble();
                double rpp = 500 + 4500 * rnd.nextDouble();
                long bounces = Math.round(b * n);
                long revenue = Math.round(rpp * n);
                entry.add(new EntryStats(k, n, bounces, revenue, squares(n, revenue, rpp)));
                entryRpp[k] = (double) revenue / n;
                bounce[k] = (double) bounces / n;
                double q = 0.2 + 0.6 * rnd.nextDouble();
                double lr = 500 + 4500 * rnd.nextDouble();
                long exits = Math.round(q * n);
                long lrev = Math.round(lr * n);
                later.add(new PageStats(k, n, exits, lrev, squares(n, lrev, lr)));
                laterValue[k] = ((double) lrev / n) / ((double) exits / n);
            }
            int bestE = -1;
            int bestL = -1;
            double best = Double.NEGATIVE_INFINITY;
            for (int e = 0; e < 6; e++) {
                for (int l = 0; l < 6; l++) {
                    double v = entryRpp[e] + (1 - bounce[e]) * laterValue[l];
                    if (v > best) {
                        best = v;
                        bestE = e;
                        bestL = l;
                    }
                }
            }
            TwoCapRecommendation r = AdCapRecommender.recommendEntryAndLater(entry, later, OptionalDouble.empty(),
                Options.defaults().withResamples(20));
            assertThat(r.recommended().orElseThrow().entryAdCount()).as("scenario %d", scenario).isEqualTo(bestE);
            assertThat(r.recommended().orElseThrow().laterAdCount()).as("scenario %d", scenario).isEqualTo(bestL);
        }
    }

    @Test
    void thinCapsAreExcludedAndAnAllThinInputGetsNoRecommendation() {
        List<PageStats> thin = List.of(page(1, 999, 400, 2_000_000, 500), page(2, 50, 20, 200_000, 500),
            new PageStats(3, 5_000, 0, 10_000_000, squares(5_000, 10_000_000, 500)));
        Recommendation r = AdCapRecommender.recommend(thin, OptionalDouble.of(1000), Options.defaults());
        assertThat(r.recommendedCap()).isEmpty();
        assertThat(r.expectedGainRpm()).isEmpty();
        assertThat(r.summary()).startsWith("No recommendation").contains("1000 pages");
        assertThat(r.caps()).allSatisfy(c -> {
            assertThat(c.status()).isEqualTo(DataStatus.NOT_ENOUGH_DATA);
            assertThat(c.probabilityBest()).isZero();
        });
        assertThat(r.caps().get(2).note()).contains("no exits");
        assertThat(r.caps().get(2).sessionRpm().estimate()).isNaN();
        assertThat(r.caution()).isEqualTo(AdCapRecommender.CAUTION);
        // Lowering the threshold lets cap 1 (999 pages) qualify; cap 3 (no exits) never does.
        Recommendation lower = AdCapRecommender.recommend(thin, OptionalDouble.empty(),
            Options.defaults().withMinPages(500));
        assertThat(lower.recommendedCap()).contains(1);
        assertThat(AdCapRecommender.recommend(List.of()).recommendedCap()).isEmpty();
        TwoCapRecommendation two = AdCapRecommender.recommendEntryAndLater(
            List.of(new EntryStats(1, 10, 4, 10_000, squares(10, 10_000, 10))), List.of(page(2, 8_000, 2_000,
                16_000_000, 1000)), OptionalDouble.empty(), Options.defaults());
        assertThat(two.recommended()).isEmpty();
        assertThat(two.pairs()).isEmpty();
        assertThat(two.summary()).startsWith("No recommendation");
    }

    @Test
    void betaDrawsHaveTheRightMoments() {
        // Own check of the Marsaglia–Tsang sampler: mean and variance of Beta(a, b) draws within 5 standard errors.
        SplittableRandom rnd = new SplittableRandom(1);
        double[][] shapes = {{2.5, 7}, {0.5, 0.5}, {401, 9601}};
        int n = 200_000;
        for (double[] s : shapes) {
            double sum = 0;
            double sumSq = 0;
            for (int i = 0; i < n; i++) {
                double x = AdCapRecommender.gamma(rnd, s[0]);
                double y = AdCapRecommender.gamma(rnd, s[1]);
                double p = x / (x + y);
                sum += p;
                sumSq += p * p;
            }
            double mean = s[0] / (s[0] + s[1]);
            double var = s[0] * s[1] / ((s[0] + s[1]) * (s[0] + s[1]) * (s[0] + s[1] + 1));
            double m = sum / n;
            double v = sumSq / n - m * m;
            assertThat(m).as("mean Beta(%s, %s)", s[0], s[1]).isCloseTo(mean, within(5 * Math.sqrt(var / n)));
            assertThat(v).as("variance Beta(%s, %s)", s[0], s[1]).isCloseTo(var, within(var * 0.02));
        }
    }

    @Test
    void rejectsBadArgumentsNamingTheValue() {
        assertThatIllegalArgumentException().isThrownBy(() -> new PageStats(3, 10, 11, 100, 1e4))
            .withMessageContaining("exits").withMessageContaining("pages = 10").withMessageContaining("11");
        assertThatIllegalArgumentException().isThrownBy(() -> new PageStats(-1, 10, 1, 100, 1e4))
            .withMessageContaining("adCount").withMessageContaining("-1");
        assertThatIllegalArgumentException().isThrownBy(() -> new EntryStats(1, 10, -2, 100, 1e4))
            .withMessageContaining("bounces").withMessageContaining("-2");
        assertThatIllegalArgumentException().isThrownBy(() -> new PageStats(1, 10, 1, 100, 10))
            .withMessageContaining("revenueSquaredMicros = 10.0").withMessageContaining("1000.0");
        assertThatIllegalArgumentException().isThrownBy(() -> new PageStats(1, 10, 1, 100, Double.NaN))
            .withMessageContaining("revenueSquaredMicros").withMessageContaining("NaN");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> AdCapRecommender.recommend(List.of(page(2, 10, 1, 10, 1), page(2, 20, 2, 20, 1))))
            .withMessageContaining("2 appears twice");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> AdCapRecommender.recommend(handExample(), OptionalDouble.of(-5), Options.defaults()))
            .withMessageContaining("currentRevenuePerSessionMicros").withMessageContaining("-5.0");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withResamples(0))
            .withMessageContaining("resamples").withMessageContaining("0");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withLevel(1.0))
            .withMessageContaining("level").withMessageContaining("1.0");
    }
}
