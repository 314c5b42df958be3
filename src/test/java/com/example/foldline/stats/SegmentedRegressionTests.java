package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;

import org.assertj.core.data.Offset;
import org.junit.jupiter.api.Test;

/**
 * {@link SegmentedRegression} against checkvalues.md §1 (R 4.2.2 + segmented 1.6-2 = "R"; the independent exhaustive
 * profile scripts/seg_profile.py / segmented_independent.py = "INDEP"). Tolerances as suggested there: ψ 1e−7
 * relative against the global-LS (INDEP) value, 1e−5 against segmented's; SE/CI 1e−5 relative; Davies p 1e−6
 * relative; logLik/AIC/BIC 1e−6 absolute.
 */
class SegmentedRegressionTests {

    private static Offset<Double> rel(double expected, double tolerance) {
        return within(Math.abs(expected) * tolerance);
    }

    private static SegmentedFit fit(double[] x, double[] y, double[] w, SegmentedOptions options) {
        SegmentedResult r = SegmentedRegression.fit(x, y, w, options);
        assertThat(r).isInstanceOf(SegmentedFit.class);
        return (SegmentedFit) r;
    }

    // ------------------------------------------------------------------ S1 stagnant

    @Test
    void stagnantGlobalLeastSquares() {
        ReferenceData d = ReferenceData.load("stagnant.csv");
        SegmentedFit f = fit(d.column("x"), d.column("y"), null, SegmentedOptions.defaults().withBreakpoints(1));
        Breakpoint b = f.breakpoints().get(0);
        // INDEP global LS ψ = 0.0411057840 (10 digits printed); R 0.0411057801908 (its stopping rule), 1e−5.
        assertThat(b.estimate()).isCloseTo(0.0411057840, rel(0.0411057840, 1e-7))
            .isCloseTo(0.0411057801908, rel(0.0411057801908, 1e-5));
        // R: SE 0.0228348067981, CI (−0.00602294471476, 0.0882345050964) — 1e−5 relative.
        assertThat(b.standardError()).isCloseTo(0.0228348067981, rel(0.0228348067981, 1e-5));
        assertThat(b.lower()).isCloseTo(-0.00602294471476, rel(0.00602294471476, 1e-5));
        assertThat(b.upper()).isCloseTo(0.0882345050964, rel(0.0882345050964, 1e-5));
        // R: coefficients and slopes (global LS values agree to 1e−8), 1e−7 relative.
        assertThat(f.intercept()).isCloseTo(0.544661079679, rel(0.544661079679, 1e-7));
        assertThat(b.slopeChange()).isCloseTo(-0.598490730188, rel(0.598490730188, 1e-7));
        assertThat(f.slopes().get(0).estimate()).isCloseTo(-0.4220768131, rel(0.4220768131, 1e-7));
        assertThat(f.slopes().get(1).estimate()).isCloseTo(-1.0205675430, rel(1.0205675430, 1e-7));
        assertThat(f.slopes().get(0).standardError()).isCloseTo(0.01148730657, rel(0.01148730657, 1e-5));
        assertThat(f.slopes().get(1).standardError()).isCloseTo(0.01506793866, rel(0.01506793866, 1e-5));
        // R slope CIs (t₂₄): slope1 (−0.4457854486, −0.3983681776).
        assertThat(f.slopes().get(0).lower()).isCloseTo(-0.4457854486, rel(0.4457854486, 1e-5));
        // R and INDEP: RSS 0.00914019723209, σ 0.0195151620884; global LS at 1e−7.
        assertThat(f.residualSumOfSquares()).isCloseTo(0.00914019723209, rel(0.00914019723209, 1e-7));
        assertThat(f.sigma()).isCloseTo(0.0195151620884, rel(0.0195151620884, 1e-7));
        assertThat(f.residualDf()).isEqualTo(24);
        // R logLik/AIC/BIC with df 5, 1e−6 absolute.
        assertThat(f.logLik()).isCloseTo(72.6516106192, within(1e-6));
        assertThat(f.aic()).isCloseTo(-135.303221238, within(1e-6));
        assertThat(f.bic()).isCloseTo(-128.642198687, within(1e-6));
        // R linear fit: RSS 0.393922870839, logLik 19.9629862867, AIC −33.9259725733, BIC −29.9293590428.
        CandidateModel line = f.candidate(0);
        assertThat(line.fitMeasure()).isCloseTo(0.393922870839, rel(0.393922870839, 1e-9));
        assertThat(line.logLik()).isCloseTo(19.9629862867, within(1e-6));
        assertThat(line.aic()).isCloseTo(-33.9259725733, within(1e-6));
        assertThat(line.bic()).isCloseTo(-29.9293590428, within(1e-6));
        // R anova: F = 505.17423 on (2, 24), p < 2.2e−16.
        assertThat(f.naiveFTest().f()).isCloseTo(505.17423, within(5e-5));
        assertThat(f.naiveFTest().df2()).isEqualTo(24);
        assertThat(f.naiveFTest().pValue()).isLessThan(2.2e-16);
        // R davies.test(o, ~x): p = 1.29088e−17 (6 digits; Python port 1.290880123e−17), best at −0.0677777777778,
        // 9 points.
        DaviesTest davies = f.davies();
        assertThat(davies.pValue()).isCloseTo(1.290880123e-17, rel(1.290880123e-17, 1e-6));
        assertThat(davies.bestAt()).isCloseTo(-0.0677777777778, within(1e-12));
        assertThat(davies.points()).hasSize(9);
        assertThat(f.exactSearch()).isTrue();
    }

    @Test
    void stagnantTrapsAreAvoided() {
        // checkvalues.md S1 traps: segmented with n.boot = 0 stops at ψ = 0.00847884534552 (RSS 0.00983727344409) or
        // 0.112255992346 (RSS 0.0126461626712). The exact search must find the global 0.0411… with a smaller RSS.
        ReferenceData d = ReferenceData.load("stagnant.csv");
        // (With up to 3 breakpoints BIC prefers 2 on these data; the trap concerns the one-breakpoint search.)
        SegmentedFit f = fit(d.column("x"), d.column("y"), null, SegmentedOptions.defaults().withMaxBreakpoints(1));
        assertThat(f.breakpointCount()).isEqualTo(1);
        double psi = f.breakpoints().get(0).estimate();
        assertThat(psi).isBetween(0.01, 0.11);
        assertThat(Math.abs(psi - 0.00847884534552)).isGreaterThan(0.03);
        assertThat(Math.abs(psi - 0.112255992346)).isGreaterThan(0.07);
        assertThat(f.residualSumOfSquares()).isLessThan(0.00983727344409).isLessThan(0.0126461626712);
        assertThat(f.selectionReason()).contains("BIC").contains("k = 1");
    }

    // ------------------------------------------------------------------ S2 cars

    @Test
    void carsDaviesTestIsNotSignificant() {
        ReferenceData d = ReferenceData.load("cars.csv");
        double[] x = d.column("speed");
        double[] y = d.column("dist");
        // R davies.test(o2, ~speed): p = 0.1541018935, best at 21.7777777778, 9 points; process values below.
        DaviesTest two = SegmentedRegression.daviesTest(x, y, null, Alternative.TWO_SIDED, 10);
        assertThat(two.pValue()).isCloseTo(0.1541018935, rel(0.1541018935, 1e-6));
        assertThat(two.bestAt()).isCloseTo(21.7777777778, within(1e-9));
        double[] points = {6.22222222222, 8.44444444444, 10.66666666667, 12.88888888889, 15.11111111111,
            17.33333333333, 19.55555555556, 21.77777777778, 24.0};
        double[] t = {0.819589446667, 0.963515911428, 1.034298858687, 0.972271076698, 1.229934409360, 1.473611084276,
            1.988607634598, 2.258371220263, 0.287745294141};
        assertThat(two.points()).hasSize(9);
        for (int i = 0; i < 9; i++) {
            assertThat(two.points()[i]).isCloseTo(points[i], within(1e-10));
            assertThat(two.statistics()[i]).as("t at %s", points[i]).isCloseTo(t[i], rel(t[i], 1e-9));
        }
        // R alternative = "greater": p = 0.07705094673.
        DaviesTest greater = SegmentedRegression.daviesTest(x, y, null, Alternative.GREATER, 10);
        assertThat(greater.pValue()).isCloseTo(0.07705094673, rel(0.07705094673, 1e-6));
        assertThat(two.rejects(0.05)).isFalse();
    }

    @Test
    void carsOneBreakpointFit() {
        ReferenceData d = ReferenceData.load("cars.csv");
        SegmentedFit f = fit(d.column("speed"), d.column("dist"), null,
            SegmentedOptions.defaults().withBreakpoints(1));
        Breakpoint b = f.breakpoints().get(0);
        // INDEP global LS ψ = 22.669902851; R 22.6699028963.
        assertThat(b.estimate()).isCloseTo(22.669902851, rel(22.669902851, 1e-7))
            .isCloseTo(22.6699028963, rel(22.6699028963, 1e-5));
        assertThat(b.standardError()).isCloseTo(1.31351843273, rel(1.31351843273, 1e-5));
        assertThat(b.lower()).isCloseTo(20.025927424, rel(20.025927424, 1e-5));
        assertThat(b.upper()).isCloseTo(25.3138783686, rel(25.3138783686, 1e-5));
        assertThat(f.slopes().get(0).estimate()).isCloseTo(3.303599628, rel(3.303599628, 1e-7));
        assertThat(f.slopes().get(0).standardError()).isCloseTo(0.5068825273, rel(0.5068825273, 1e-5));
        assertThat(f.slopes().get(1).estimate()).isCloseTo(15.500000470, rel(15.500000470, 1e-7));
        assertThat(f.slopes().get(1).standardError()).isCloseTo(10.5336925800, rel(10.5336925800, 1e-5));
        assertThat(f.intercept()).isCloseTo(-9.84212196466, rel(9.84212196466, 1e-7));
        assertThat(f.residualSumOfSquares()).isCloseTo(10208.1985054, rel(10208.1985054, 1e-9));
        assertThat(f.sigma()).isCloseTo(14.896890911, rel(14.896890911, 1e-8));
        assertThat(f.logLik()).isCloseTo(-203.920012811, within(1e-6));
        assertThat(f.aic()).isCloseTo(417.840025622, within(1e-6));
        assertThat(f.bic()).isCloseTo(427.400140649, within(1e-6));
        // R anova: RSS 11353.52105 → 10208.19851, F = 2.58052 on (2, 46), p = 0.086662.
        assertThat(f.naiveFTest().f()).isCloseTo(2.58052, within(5e-6));
        assertThat(f.naiveFTest().pValue()).isCloseTo(0.086662, within(5e-7));
        // Left to BIC, the straight line wins on these data (BIC 424.9 < 427.4), matching Davies p = 0.154.
        SegmentedFit chosen = fit(d.column("speed"), d.column("dist"), null, SegmentedOptions.defaults());
        assertThat(chosen.breakpointCount()).isZero();
        assertThat(chosen.slopes()).hasSize(1);
    }

    // ------------------------------------------------------------------ S4 weighted

    @Test
    void weightedAdsBounce() {
        ReferenceData d = ReferenceData.load("ads_bounce_weighted.csv");
        double[] x = d.column("ads");
        double[] y = d.column("bounce");
        double[] w = d.column("sessions");
        SegmentedFit f = fit(x, y, w, SegmentedOptions.defaults().withBreakpoints(1));
        Breakpoint b = f.breakpoints().get(0);
        // INDEP weighted profile ψ = 5.398723239; R 5.3987232072.
        assertThat(b.estimate()).isCloseTo(5.398723239, rel(5.398723239, 1e-7))
            .isCloseTo(5.3987232072, rel(5.3987232072, 1e-5));
        assertThat(b.standardError()).isCloseTo(0.255284440467, rel(0.255284440467, 1e-5));
        assertThat(b.lower()).isCloseTo(4.83684594213, rel(4.83684594213, 1e-5));
        assertThat(b.upper()).isCloseTo(5.96060047227, rel(5.96060047227, 1e-5));
        assertThat(f.intercept()).isCloseTo(0.40152094410178, rel(0.40152094410178, 1e-7));
        assertThat(f.slopes().get(0).estimate()).isCloseTo(0.00295337499, rel(0.00295337499, 1e-6));
        assertThat(f.slopes().get(0).standardError()).isCloseTo(0.001119494292, rel(0.001119494292, 1e-5));
        assertThat(f.slopes().get(1).estimate()).isCloseTo(0.02874920438, rel(0.02874920438, 1e-7));
        assertThat(f.slopes().get(1).standardError()).isCloseTo(0.001193360653, rel(0.001193360653, 1e-5));
        assertThat(f.residualSumOfSquares()).isCloseTo(0.911770528811, rel(0.911770528811, 1e-9));
        assertThat(f.sigma()).isCloseTo(0.287903160615, rel(0.287903160615, 1e-8));
        assertThat(f.residualDf()).isEqualTo(11);
        assertThat(f.logLik()).isCloseTo(55.5156533491, within(1e-6));
        assertThat(f.aic()).isCloseTo(-101.031306698, within(1e-6));
        assertThat(f.bic()).isCloseTo(-97.4910556927, within(1e-6));
        // R davies.test (weighted): p = 2.01479e−07 (6 digits), best at 5, 10 points.
        assertThat(f.davies().pValue()).isCloseTo(2.01479e-07, rel(2.01479e-07, 5e-6));
        assertThat(f.davies().bestAt()).isCloseTo(5, within(1e-12));
        assertThat(f.davies().points()).hasSize(10);
        // R: unweighted fit gives ψ̂ = 5.37589330435 (SE 0.344357137108) — proves the weights are used.
        SegmentedFit unweighted = fit(x, y, null, SegmentedOptions.defaults().withBreakpoints(1));
        assertThat(unweighted.breakpoints().get(0).estimate()).isCloseTo(5.37589330435, rel(5.37589330435, 1e-5));
        assertThat(unweighted.breakpoints().get(0).standardError()).isCloseTo(0.344357137108,
            rel(0.344357137108, 1e-5));
        assertThat(unweighted.breakpoints().get(0).estimate()).isNotCloseTo(b.estimate(), within(0.01));
    }

    // ------------------------------------------------------------------ S5 two breakpoints

    @Test
    void plantTwoBreakpointsChosenByBic() {
        ReferenceData d = ReferenceData.load("plant.csv").where("group", "RKV");
        assertThat(d.size()).isEqualTo(32);
        SegmentedFit f = fit(d.column("time"), d.column("y"), null, SegmentedOptions.defaults().withMaxBreakpoints(2));
        // R BIC by k: −36.9983053943 / −117.272229006 / −121.770781062 → 2 (INDEP recomputation agrees).
        assertThat(f.breakpointCount()).isEqualTo(2);
        assertThat(f.candidate(0).bic()).isCloseTo(-36.9983053943, within(1e-6));
        assertThat(f.candidate(1).bic()).isCloseTo(-117.272229006, within(1e-6));
        assertThat(f.candidate(2).bic()).isCloseTo(-121.770781062, within(1e-6));
        // One breakpoint: R ψ̂ = 383.765138319, RSS 0.0279197890991.
        assertThat(f.candidate(1).psi()[0]).isCloseTo(383.765138319, rel(383.765138319, 1e-5));
        assertThat(f.candidate(1).fitMeasure()).isCloseTo(0.0279197890991, rel(0.0279197890991, 1e-9));
        // Two breakpoints: R (299.877082362, 441.923333076); INDEP (299.877042, 441.923683): flat surface, 1e−3 rel.
        assertThat(f.breakpoints().get(0).estimate()).isCloseTo(299.877082362, rel(299.877082362, 1e-3));
        assertThat(f.breakpoints().get(1).estimate()).isCloseTo(441.923333076, rel(441.923333076, 1e-3));
        assertThat(f.residualSumOfSquares()).isCloseTo(0.0195338230504, rel(0.0195338230504, 1e-9));
        assertThat(f.logLik()).isCloseTo(73.0154661909, within(1e-6));
        assertThat(f.sigma()).isCloseTo(0.0274098684155, rel(0.0274098684155, 1e-7));
        // R SEs (16.8761684394, 15.6732158577) and slopes; the flat surface moves ψ by ~1e−6, hence 1e−3.
        assertThat(f.breakpoints().get(0).standardError()).isCloseTo(16.8761684394, rel(16.8761684394, 1e-3));
        assertThat(f.breakpoints().get(1).standardError()).isCloseTo(15.6732158577, rel(15.6732158577, 1e-3));
        double[] slopes = {0.0025829848800, 0.0010694385750, -0.0005096065863};
        double[] slopeSe = {0.0001655424355, 0.0002178526280, 0.0001102710419};
        for (int s = 0; s < 3; s++) {
            assertThat(f.slopes().get(s).estimate()).isCloseTo(slopes[s], rel(slopes[s], 1e-4));
            assertThat(f.slopes().get(s).standardError()).isCloseTo(slopeSe[s], rel(slopeSe[s], 1e-3));
        }
        assertThat(f.exactSearch()).isTrue();
    }

    // ------------------------------------------------------------------ properties (seeded loops, no jqwik)

    @Test
    void shiftingYChangesOnlyTheIntercept() {
        ReferenceData d = ReferenceData.load("ads_bounce_weighted.csv");
        double[] x = d.column("ads");
        double[] y = d.column("bounce");
        double[] w = d.column("sessions");
        SegmentedOptions options = SegmentedOptions.defaults().withMaxBreakpoints(2);
        SegmentedFit base = fit(x, y, w, options);
        SplittableRandom random = new SplittableRandom(7);
        for (int rep = 0; rep < 20; rep++) {
            double c = random.nextDouble(-5, 5);
            double[] shifted = y.clone();
            for (int i = 0; i < shifted.length; i++) {
                shifted[i] += c;
            }
            SegmentedFit f = fit(x, shifted, w, options);
            assertThat(f.intercept()).isCloseTo(base.intercept() + c, within(1e-9));
            assertThat(f.breakpointCount()).isEqualTo(base.breakpointCount());
            for (int j = 0; j < f.breakpointCount(); j++) {
                assertThat(f.breakpoints().get(j).estimate()).isCloseTo(base.breakpoints().get(j).estimate(),
                    within(1e-7));
            }
            assertThat(f.slopes().get(0).estimate()).isCloseTo(base.slopes().get(0).estimate(), within(1e-9));
            assertThat(f.residualSumOfSquares()).isCloseTo(base.residualSumOfSquares(),
                rel(base.residualSumOfSquares(), 1e-7));
        }
    }

    @Test
    void permutingThePointsChangesNothing() {
        ReferenceData d = ReferenceData.load("stagnant.csv");
        double[] x = d.column("x");
        double[] y = d.column("y");
        SegmentedFit base = fit(x, y, null, SegmentedOptions.defaults());
        SplittableRandom random = new SplittableRandom(11);
        for (int rep = 0; rep < 20; rep++) {
            int[] perm = permutation(x.length, random);
            double[] px = new double[x.length];
            double[] py = new double[x.length];
            for (int i = 0; i < perm.length; i++) {
                px[i] = x[perm[i]];
                py[i] = y[perm[i]];
            }
            SegmentedFit f = fit(px, py, null, SegmentedOptions.defaults());
            assertThat(f.breakpointCount()).isEqualTo(base.breakpointCount());
            assertThat(f.breakpoints().get(0).estimate()).isCloseTo(base.breakpoints().get(0).estimate(),
                within(1e-12));
            assertThat(f.residualSumOfSquares()).isCloseTo(base.residualSumOfSquares(), within(1e-15));
            assertThat(f.davies().pValue()).isCloseTo(base.davies().pValue(), rel(base.davies().pValue(), 1e-9));
        }
    }

    static int[] permutation(int n, SplittableRandom random) {
        int[] p = new int[n];
        for (int i = 0; i < n; i++) {
            p[i] = i;
        }
        for (int i = n - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            int t = p[i];
            p[i] = p[j];
            p[j] = t;
        }
        return p;
    }

    @Test
    void aggregatedAndRawRowsGiveTheSameFit() {
        // 100,000 Bernoulli sessions vs the same data aggregated to 13 rows with weights: same ψ and (weighted) RSS
        // between-x part; the raw fit counts n = 100,000 rows, so σ and logLik differ by design.
        SplittableRandom random = new SplittableRandom(3);
        int n = 100_000;
        double[] x = new double[n];
        double[] y = new double[n];
        long[] s = new long[13];
        long[] t = new long[13];
        for (int i = 0; i < n; i++) {
            int ads = random.nextInt(13);
            double p = 0.35 + 0.004 * ads + (ads > 6 ? 0.03 * (ads - 6) : 0);
            x[i] = ads;
            y[i] = random.nextDouble() < p ? 1 : 0;
            s[ads] += (long) y[i];
            t[ads]++;
        }
        double[] ax = new double[13];
        double[] ay = new double[13];
        double[] aw = new double[13];
        for (int a = 0; a < 13; a++) {
            ax[a] = a;
            ay[a] = s[a] / (double) t[a];
            aw[a] = t[a];
        }
        SegmentedOptions options = SegmentedOptions.defaults().withBreakpoints(1);
        SegmentedFit raw = fit(x, y, null, options);
        SegmentedFit agg = fit(ax, ay, aw, options);
        assertThat(raw.breakpoints().get(0).estimate()).isCloseTo(agg.breakpoints().get(0).estimate(), within(1e-9));
        assertThat(raw.observations()).isEqualTo(n);
        assertThat(raw.distinctX()).isEqualTo(13);
        assertThat(raw.breakpoints().get(0).estimate()).isBetween(4.5, 8.5);
    }

    // ------------------------------------------------------------------ thin data and validation

    @Test
    void thinDataIsAnAnswer() {
        SegmentedResult few = SegmentedRegression.fit(new double[] {1, 2, 3, 1, 2, 3}, new double[] {1, 2, 3, 1, 2, 4},
            null, SegmentedOptions.defaults());
        assertThat(few).isInstanceOf(NoFit.class);
        assertThat(((NoFit) few).reason()).isEqualTo(NoFitReason.TOO_FEW_DISTINCT_X);
        assertThat(((NoFit) few).message()).contains("3 distinct x values").contains("at least 4");
        SegmentedResult noWeight = SegmentedRegression.fit(new double[] {1, 2, 3, 4}, new double[] {1, 2, 3, 4},
            new double[] {0, 0, 0, 0}, SegmentedOptions.defaults());
        assertThat(((NoFit) noWeight).reason()).isEqualTo(NoFitReason.TOO_LITTLE_WEIGHT);
        SegmentedResult empty = SegmentedRegression.fit(new double[0], new double[0], null,
            SegmentedOptions.defaults());
        assertThat(empty).isInstanceOf(NoFit.class);
        SegmentedResult tooManyAsked = SegmentedRegression.fit(new double[] {1, 2, 3, 4, 5, 6},
            new double[] {1, 2, 3, 5, 8, 13}, null, SegmentedOptions.defaults().withBreakpoints(3));
        assertThat(((NoFit) tooManyAsked).reason()).isEqualTo(NoFitReason.TOO_FEW_DISTINCT_X);
        // 6 distinct x with the default maximum of 3: k = 2 is the most the data allow, and the reason says so.
        SegmentedFit capped = fit(new double[] {1, 2, 3, 4, 5, 6}, new double[] {1, 2, 3, 5, 8, 13.5}, null,
            SegmentedOptions.defaults());
        assertThat(capped.candidates()).hasSizeLessThanOrEqualTo(3);
        assertThat(capped.selectionReason()).contains("not considered");
    }

    @Test
    void invalidInputNamesTheProblem() {
        assertThatIllegalArgumentException().isThrownBy(() -> SegmentedRegression.fit(new double[] {1, 2},
            new double[] {1}, null, SegmentedOptions.defaults())).withMessageContaining("equal lengths, were 2 and 1");
        assertThatIllegalArgumentException().isThrownBy(() -> SegmentedRegression.fit(new double[] {1, Double.NaN},
            new double[] {1, 2}, null, SegmentedOptions.defaults())).withMessageContaining("x[1] must be finite, was NaN");
        assertThatIllegalArgumentException().isThrownBy(() -> SegmentedRegression.fit(new double[] {1, 2},
            new double[] {1, 2}, new double[] {1, -3}, SegmentedOptions.defaults()))
            .withMessageContaining("w[1] must be finite and >= 0, was -3.0");
        assertThatIllegalArgumentException().isThrownBy(() -> SegmentedRegression.fit(new double[] {1, 2},
            new double[] {1, 2}, null, null)).withMessageContaining("options");
    }
}
