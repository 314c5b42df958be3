package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;

/**
 * Seeded, deterministic simulation checks of {@link SegmentedRegression} on the product's own kind of data: bounce
 * rate against ads per page (0..12) with about 2,000 sessions per value and binomial noise. Also the bootstrap.
 */
class SegmentedRegressionCoverageTests {

    private static final int REPLICATES = 200;
    private static final double TRUE_KNEE = 6.4;

    /** Bounce probability with a clear knee: flat-ish, then climbing 5 points per extra ad. */
    private static double kneeProbability(int ads) {
        return kneeProbability(ads, 0.05);
    }

    private static double kneeProbability(int ads, double change) {
        return 0.38 + 0.003 * ads + (ads > TRUE_KNEE ? change * (ads - TRUE_KNEE) : 0);
    }

    private static double lineProbability(int ads) {
        return 0.40 + 0.004 * ads;
    }

    /** One replicate: per ads value, sessions ~ 2,000 ± 200 and bounces ~ Binomial(sessions, p). */
    private static double[][] replicate(SplittableRandom random, java.util.function.IntToDoubleFunction p) {
        double[] x = new double[13];
        double[] y = new double[13];
        double[] w = new double[13];
        for (int ads = 0; ads <= 12; ads++) {
            long sessions = 1800 + random.nextInt(401);
            long bounces = Binomial.draw(random, sessions, p.applyAsDouble(ads));
            x[ads] = ads;
            y[ads] = bounces / (double) sessions;
            w[ads] = sessions;
        }
        return new double[][] {x, y, w};
    }

    private static int covered(long seed, double change, int replicates) {
        SplittableRandom random = new SplittableRandom(seed);
        SegmentedOptions options = SegmentedOptions.defaults().withBreakpoints(1);
        int covered = 0;
        for (int r = 0; r < replicates; r++) {
            double[][] d = replicate(random, ads -> kneeProbability(ads, change));
            SegmentedFit f = (SegmentedFit) SegmentedRegression.fit(d[0], d[1], d[2], options);
            Breakpoint b = f.breakpoints().get(0);
            if (b.lower() <= TRUE_KNEE && TRUE_KNEE <= b.upper()) {
                covered++;
            }
        }
        return covered;
    }

    @Test
    void deltaIntervalCoversTheTrueKnee() {
        // Nominal 95 %. In a 2,000-replicate run of this design the delta interval covered 92.0 % (slope change 0.05
        // per ad), so "at least 90 % of 200" holds with margin; it is not exact because ψ̂ is not normal with 13 points.
        assertThat(covered(20240501, 0.05, REPLICATES)).isGreaterThanOrEqualTo(180);
    }

    @Test
    void deltaIntervalUndercoversWeakKnees() {
        // Known limitation, pinned so that it is visible: with a weaker knee (2.5 points per ad, ~2,000 sessions per
        // value) the delta interval covered only 88.1 % in 2,000 replicates (76 % at 1 point per ad). Use the
        // bootstrap interval, or more sessions, before trusting the delta interval for faint knees.
        int covered = covered(3, 0.025, REPLICATES);
        assertThat(covered).isBetween(160, 192);
    }

    @Test
    void daviesFindsNoBreakOnStraightLines() {
        SplittableRandom random = new SplittableRandom(77);
        int quiet = 0;
        for (int r = 0; r < REPLICATES; r++) {
            double[][] d = replicate(random, SegmentedRegressionCoverageTests::lineProbability);
            DaviesTest t = SegmentedRegression.daviesTest(d[0], d[1], d[2], Alternative.TWO_SIDED, 10);
            if (!t.rejects(0.05)) {
                quiet++;
            }
        }
        assertThat(quiet).isGreaterThanOrEqualTo(180);
    }

    @Test
    void daviesFindsTheKnee() {
        SplittableRandom random = new SplittableRandom(99);
        int found = 0;
        for (int r = 0; r < 50; r++) {
            double[][] d = replicate(random, SegmentedRegressionCoverageTests::kneeProbability);
            if (SegmentedRegression.daviesTest(d[0], d[1], d[2], Alternative.TWO_SIDED, 10).rejects(0.05)) {
                found++;
            }
        }
        assertThat(found).isGreaterThanOrEqualTo(45);
    }

    @Test
    void bootstrapIntervalsAreSeededAndBracketTheEstimate() {
        ReferenceData d = ReferenceData.load("ads_bounce_weighted.csv");
        double[] x = d.column("ads");
        double[] y = d.column("bounce");
        double[] w = d.column("sessions");
        SegmentedOptions options = SegmentedOptions.defaults().withBreakpoints(1).withBootstrap(300);
        SegmentedFit f = (SegmentedFit) SegmentedRegression.fit(x, y, w, options);
        Breakpoint b = f.breakpoints().get(0);
        // y are rates and w whole session counts, so AUTO picks the parametric binomial scheme.
        assertThat(f.bootstrapScheme()).isEqualTo(BootstrapScheme.BINOMIAL);
        assertThat(f.bootstrapResamples()).isEqualTo(300);
        assertThat(b.bootstrapLower()).isLessThan(b.estimate()).isGreaterThan(x[0]);
        assertThat(b.bootstrapUpper()).isGreaterThan(b.estimate()).isLessThan(x[x.length - 1]);
        SegmentedFit again = (SegmentedFit) SegmentedRegression.fit(x, y, w, options);
        assertThat(again.breakpoints().get(0).bootstrapLower()).isEqualTo(b.bootstrapLower());
        SegmentedFit otherSeed = (SegmentedFit) SegmentedRegression.fit(x, y, w, options.withSeed(1));
        assertThat(otherSeed.breakpoints().get(0).bootstrapLower()).isNotEqualTo(b.bootstrapLower());
        // Case resampling on data that are not rates (stagnant, 28 rows).
        ReferenceData s = ReferenceData.load("stagnant.csv");
        SegmentedFit cases = (SegmentedFit) SegmentedRegression.fit(s.column("x"), s.column("y"), null,
            SegmentedOptions.defaults().withBreakpoints(1).withBootstrap(200));
        assertThat(cases.bootstrapScheme()).isEqualTo(BootstrapScheme.CASES);
        Breakpoint cb = cases.breakpoints().get(0);
        assertThat(cb.bootstrapLower()).isLessThan(cb.estimate());
        assertThat(cb.bootstrapUpper()).isGreaterThan(cb.estimate());
    }

    @Test
    void binomialSamplerHasTheRightMoments() {
        // Mean n·p and variance n·p·(1 − p) on both branches (inversion below n·p·q = 100, normal above).
        SplittableRandom random = new SplittableRandom(1);
        long[][] cases = {{50, 30}, {2000, 400}, {1_000_000, 10}};
        double[] ps = {0.3, 0.4, 0.00002};
        for (int c = 0; c < cases.length; c++) {
            long n = cases[c][0];
            double p = ps[c];
            int draws = 20000;
            double sum = 0;
            double sumSq = 0;
            for (int i = 0; i < draws; i++) {
                double k = Binomial.draw(random, n, p);
                sum += k;
                sumSq += k * k;
            }
            double mean = sum / draws;
            double var = sumSq / draws - mean * mean;
            double sd = Math.sqrt(n * p * (1 - p));
            assertThat(mean).as("mean n=%d p=%s", n, p).isCloseTo(n * p, org.assertj.core.api.Assertions.within(
                5 * sd / Math.sqrt(draws)));
            assertThat(var).as("var n=%d p=%s", n, p).isCloseTo(sd * sd,
                org.assertj.core.api.Assertions.within(0.06 * sd * sd));
        }
        assertThat(Binomial.draw(random, 10, 1.0)).isEqualTo(10);
        assertThat(Binomial.draw(random, 10, 0.0)).isZero();
        assertThat(Binomial.draw(random, 0, 0.5)).isZero();
        assertThat(Binomial.draw(random, 10, 0.97)).isBetween(0L, 10L);
    }
}
