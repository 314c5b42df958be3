package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.example.foldline.stats.AdCapRecommender.Advice;
import com.example.foldline.stats.AdCapRecommender.DataStatus;
import com.example.foldline.stats.AdCapRecommender.EntryStats;
import com.example.foldline.stats.AdCapRecommender.Options;
import com.example.foldline.stats.AdCapRecommender.PageStats;
import com.example.foldline.stats.AdCapRecommender.PairValue;
import com.example.foldline.stats.AdCapRecommender.Recommendation;
import com.example.foldline.stats.AdCapRecommender.SameCapRecommendation;
import com.example.foldline.stats.AdCapRecommender.SameCapValue;
import com.example.foldline.stats.AdCapRecommender.TwoCapRecommendation;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The single cap read from the entry/later model at equal caps (docs/methods.md §11). No outside reference exists
 * for this model (it is Foldline's own); the reference here is the known optimum of a simulation whose rules are
 * written out below, computed in closed form from those rules, not from the recommender.
 */
class SameCapAdviceTests {

    // ---------------------------------------------------------------- the simulated site
    // Each session enters on a page with kₑ ads, kₑ = 0..10 with weights 0.2 + 0.16·kₑ (article pages are heavy
    // with ads), and bounces with probability b(kₑ) = 0.30 + 0.01·kₑ. A session that stays draws one later-page
    // ad load kₗ = 0..10 with weights 0.7^kₗ (later pages mostly light) and then reads later pages, leaving after
    // each with probability q(kₗ) = 0.2 + 0.08·kₗ. Revenue of a page with k ads is R(k)·(0.5 + U), U uniform on
    // [0, 1), R(k) = 1000·k/(1 + 0.6·k) micros (more ads pay less each).
    //
    // With one cap k on every page a session is worth V(k) = R(k)·(1 + (1 − b(k))/q(k)) (one entry page, then a
    // geometric number of later pages with mean 1/q(k) when it stays). Relative to its maximum:
    //   k    1     2     3     4     5     6     7     8     9    10
    //   V  0.801 0.972 1.000 0.988 0.963 0.937 0.911 0.887 0.865 0.846     -> the optimum is k = 3.
    // One exit rate per ad count over all pages mixes bounce (0.30–0.40) with later exits (0.20–1.00): at high k
    // almost every page is an entry page (164,000 entry pages and 5,500 later pages with 10 ads per million
    // sessions), whose readers leave less often than later-page readers would, so the pooled exit rate at 10 ads is
    // 0.42 instead of the 1.00 that later pages would show, and the pooled model picks k = 10, worth 15% less.

    static final int MAX_ADS = 10;

    static double bounce(int k) {
        return 0.30 + 0.01 * k;
    }

    static double laterExit(int k) {
        return 0.2 + 0.08 * k;
    }

    static double revenue(int k) {
        return 1000.0 * k / (1 + 0.6 * k);
    }

    static double trueValue(int k) {
        return revenue(k) * (1 + (1 - bounce(k)) / laterExit(k));
    }

    static int trueOptimum() {
        int best = 0;
        for (int k = 1; k <= MAX_ADS; k++) {
            if (trueValue(k) > trueValue(best)) {
                best = k;
            }
        }
        return best;
    }

    /** Totals per ad count of {@code sessions} simulated sessions: entry pages and later pages apart. */
    record Site(List<EntryStats> entry, List<PageStats> later, List<PageStats> pooled, double revenuePerSession) {
    }

    static Site simulate(int sessions, long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        long[] es = new long[MAX_ADS + 1];
        long[] eb = new long[MAX_ADS + 1];
        long[] er = new long[MAX_ADS + 1];
        double[] er2 = new double[MAX_ADS + 1];
        long[] lp = new long[MAX_ADS + 1];
        long[] lx = new long[MAX_ADS + 1];
        long[] lr = new long[MAX_ADS + 1];
        double[] lr2 = new double[MAX_ADS + 1];
        double[] entryWeights = new double[MAX_ADS + 1];
        double[] laterWeights = new double[MAX_ADS + 1];
        for (int k = 0; k <= MAX_ADS; k++) {
            entryWeights[k] = 0.2 + 0.16 * k;
            laterWeights[k] = Math.pow(0.7, k);
        }
        long total = 0;
        for (int s = 0; s < sessions; s++) {
            int ke = pick(r, entryWeights);
            long rev = Math.round(revenue(ke) * (0.5 + r.nextDouble()));
            es[ke]++;
            er[ke] += rev;
            er2[ke] += (double) rev * rev;
            total += rev;
            if (r.nextDouble() < bounce(ke)) {
                eb[ke]++;
                continue;
            }
            int kl = pick(r, laterWeights);
            while (true) {
                long lrev = Math.round(revenue(kl) * (0.5 + r.nextDouble()));
                lp[kl]++;
                lr[kl] += lrev;
                lr2[kl] += (double) lrev * lrev;
                total += lrev;
                if (r.nextDouble() < laterExit(kl)) {
                    lx[kl]++;
                    break;
                }
            }
        }
        List<EntryStats> entry = new ArrayList<>();
        List<PageStats> later = new ArrayList<>();
        List<PageStats> pooled = new ArrayList<>();
        for (int k = 0; k <= MAX_ADS; k++) {
            entry.add(new EntryStats(k, es[k], eb[k], er[k], er2[k]));
            later.add(new PageStats(k, lp[k], lx[k], lr[k], lr2[k]));
            pooled.add(new PageStats(k, es[k] + lp[k], eb[k] + lx[k], er[k] + lr[k], er2[k] + lr2[k]));
        }
        return new Site(entry, later, pooled, (double) total / sessions);
    }

    private static int pick(SplittableRandom r, double[] weights) {
        double sum = 0;
        for (double w : weights) {
            sum += w;
        }
        double u = r.nextDouble() * sum;
        for (int i = 0; i < weights.length; i++) {
            u -= weights[i];
            if (u < 0) {
                return i;
            }
        }
        return weights.length - 1;
    }

    @Test
    void theClosedFormOptimumOfTheSimulationIsThree() {
        // the table in the comment above, from the rules alone
        assertThat(trueOptimum()).isEqualTo(3);
        assertThat(trueValue(10) / trueValue(3)).isCloseTo(0.846, within(0.001));
        assertThat(trueValue(2) / trueValue(3)).isCloseTo(0.972, within(0.001));
        assertThat(trueValue(4) / trueValue(3)).isCloseTo(0.988, within(0.001));
    }

    @Test
    void theEqualCapModelFindsTheOptimumWhereThePooledModelIsFooledByTheEntryLaterMix() {
        Site site = simulate(1_000_000, 20240501L);
        OptionalDouble current = OptionalDouble.of(site.revenuePerSession());

        Recommendation pooled = AdCapRecommender.recommend(site.pooled(), current, Options.defaults());
        int fooled = pooled.recommendedCap().orElseThrow();
        assertThat(fooled).as("the pooled exit rate makes heavy pages look cheap").isGreaterThanOrEqualTo(8);
        assertThat(trueValue(fooled) / trueValue(3)).isLessThan(0.9);

        SameCapRecommendation same = AdCapRecommender.recommendSameCap(site.entry(), site.later(), current,
            Options.defaults());
        assertThat(same.recommendedCap()).contains(trueOptimum());
        SameCapValue three = same.caps().get(3);
        assertThat(three.adCount()).isEqualTo(3);
        assertThat(three.probabilityBest()).as("k = 3 is best in most resamples").isGreaterThan(0.8);
        assertThat(three.sessionRpm().lower()).isLessThan(three.sessionRpm().estimate());
        // the point estimate is close to the truth: V(3) in micros per session -> session RPM V/1000
        assertThat(three.sessionRpm().estimate()).isCloseTo(trueValue(3) / 1000, within(0.01 * trueValue(3) / 1000));
        assertThat(three.sessionRpm().lower()).isLessThan(trueValue(3) / 1000);
        assertThat(three.sessionRpm().upper()).isGreaterThan(trueValue(3) / 1000);
        // expected pages per session at k = 3: 1 + (1 − 0.33)/0.44
        assertThat(three.expectedPagesPerSession()).isCloseTo(1 + 0.67 / 0.44, within(0.02));
        // expected gain against the current mix: V(3) minus what the simulated sessions earned, and it is positive
        // (the mix spends most entry pages on heavy caps)
        assertThat(same.expectedGainRpm().orElseThrow().estimate())
            .isCloseTo(three.sessionRpm().estimate() - site.revenuePerSession() / 1000, within(1e-12));
        assertThat(same.expectedGainRpm().orElseThrow().lower()).isGreaterThan(0);
        double share = same.caps().stream().mapToDouble(SameCapValue::probabilityBest).sum();
        assertThat(share).isCloseTo(1.0, within(1e-9));
    }

    @Test
    void theDiagonalIsThePairModelAtEqualCapsFromTheSameResamples() {
        Site site = simulate(200_000, 11L);
        Options options = Options.defaults().withResamples(300);
        Advice advice = AdCapRecommender.advise(site.entry(), site.later(), OptionalDouble.of(site.revenuePerSession()),
            options);
        TwoCapRecommendation alone = AdCapRecommender.recommendEntryAndLater(site.entry(), site.later(),
            OptionalDouble.of(site.revenuePerSession()), options);
        // the pair answer is unchanged by computing the diagonal alongside it
        assertThat(advice.pair()).isEqualTo(alone);
        for (SameCapValue c : advice.sameCap().caps()) {
            if (c.status() != DataStatus.ENOUGH_DATA) {
                continue;
            }
            PairValue pair = advice.pair().pairs().stream()
                .filter(p -> p.entryAdCount() == c.adCount() && p.laterAdCount() == c.adCount()).findFirst()
                .orElseThrow();
            assertThat(c.sessionRpm()).isEqualTo(pair.sessionRpm());
            // hand formula: (RPP_e + (1 − b)·RPP_l/q)/1000
            double v = (c.revenuePerEntryMicros() + (1 - c.bounceRate()) * c.revenuePerLaterPageMicros()
                / c.laterExitRate()) / 1000;
            assertThat(c.sessionRpm().estimate()).isCloseTo(v, within(1e-12));
        }
        // the best pair is at least as good as the best single cap (the diagonal is a subset of the pairs)
        SameCapValue bestSingle = advice.sameCap().caps().stream()
            .filter(c -> advice.sameCap().recommendedCap().orElseThrow() == c.adCount()).findFirst().orElseThrow();
        assertThat(advice.pair().recommended().orElseThrow().sessionRpm().estimate())
            .isGreaterThanOrEqualTo(bestSingle.sessionRpm().estimate());
    }

    @Test
    void anAdCountSeenOnOneKindOfPageOnlyIsNotEnoughData() {
        // entry pages up to 12 ads, later pages up to 10: 11 and 12 cannot be valued as caps for every page
        List<EntryStats> entry = new ArrayList<>();
        List<PageStats> later = new ArrayList<>();
        for (int k = 0; k <= 12; k++) {
            long rev = 1000L * k * 5000;
            entry.add(new EntryStats(k, 5000, 1500, rev, (double) rev * rev / 5000 + 1e6));
            if (k <= 10) {
                later.add(new PageStats(k, 5000, 2000, rev, (double) rev * rev / 5000 + 1e6));
            }
        }
        later.add(new PageStats(13, 5000, 2000, 1, 1)); // later only
        SameCapRecommendation r = AdCapRecommender.recommendSameCap(entry, later, OptionalDouble.empty(),
            Options.defaults().withResamples(50));
        assertThat(r.caps()).extracting(SameCapValue::adCount).containsExactly(0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12,
            13);
        assertThat(r.caps().get(11).status()).isEqualTo(DataStatus.NOT_ENOUGH_DATA);
        assertThat(r.caps().get(11).note()).contains("no later page carried 11 ads");
        assertThat(r.caps().get(13).note()).contains("no session entered on a page with 13 ads");
        assertThat(r.caps().get(11).probabilityBest()).isZero();
        // entry and later identical per k, revenue rising: the highest cap with both kinds of page wins
        assertThat(r.recommendedCap()).contains(10);
        // thin later pages at one count make that cap thin, with the side named
        List<PageStats> thinLater = new ArrayList<>(later);
        thinLater.set(10, new PageStats(10, 500, 200, 1000L * 10 * 500, 1e12));
        SameCapRecommendation thin = AdCapRecommender.recommendSameCap(entry, thinLater, OptionalDouble.empty(),
            Options.defaults().withResamples(50));
        assertThat(thin.caps().get(10).note()).startsWith("later pages: not enough data: 500 pages");
        assertThat(thin.recommendedCap()).contains(9);
        // nothing with both sides: no recommendation, said so
        SameCapRecommendation none = AdCapRecommender.recommendSameCap(entry.subList(0, 2), later.subList(5, 8),
            OptionalDouble.empty(), Options.defaults().withResamples(10));
        assertThat(none.recommendedCap()).isEmpty();
        assertThat(none.summary()).startsWith("No recommendation");
    }

    @Test
    void selectionGivesTheSameQuantilesAsSorting() {
        // type-7 quantiles (Hyndman & Fan 1996) from a sorted copy are the reference
        SplittableRandom r = new SplittableRandom(3);
        for (int trial = 0; trial < 200; trial++) {
            int n = 1 + r.nextInt(1500);
            double[] a = new double[n];
            for (int i = 0; i < n; i++) {
                a[i] = trial % 3 == 0 ? r.nextInt(4) : trial % 3 == 1 ? 0 : r.nextDouble() * 100 - 50;
            }
            double[] sorted = a.clone();
            java.util.Arrays.sort(sorted);
            for (double p : new double[] {0, 0.025, 0.5, 0.975, 1}) {
                assertThat(AdCapRecommender.selectQuantile7(a.clone(), p)).as("n %d p %s", n, p)
                    .isEqualTo(AdCapRecommender.quantile7(sorted, p));
            }
        }
    }
}
