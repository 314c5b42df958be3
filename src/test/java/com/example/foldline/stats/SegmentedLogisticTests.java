package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import org.assertj.core.data.Offset;
import org.junit.jupiter.api.Test;

/**
 * {@link SegmentedLogistic} against checkvalues.md S3 (`down`): R 4.2.2 + segmented 1.6-2 on
 * glm(p ~ age, binomial, weights = births) ("R"), and the independent statsmodels deviance profile ("INDEP").
 */
class SegmentedLogisticTests {

    private static Offset<Double> rel(double expected, double tolerance) {
        return within(Math.abs(expected) * tolerance);
    }

    private static SegmentedLogisticFit fitDown(SegmentedOptions options) {
        ReferenceData d = ReferenceData.load("down.csv");
        SegmentedLogisticResult r = SegmentedLogistic.fit(d.column("age"), d.longColumn("cases"),
            d.longColumn("births"), options);
        assertThat(r).isInstanceOf(SegmentedLogisticFit.class);
        return (SegmentedLogisticFit) r;
    }

    @Test
    void downSyndromeByMaternalAge() {
        SegmentedLogisticFit f = fitDown(SegmentedOptions.defaults());
        assertThat(f.breakpointCount()).isEqualTo(1);
        Breakpoint b = f.breakpoints().get(0);
        // INDEP global ML ψ = 31.08115172 (10 digits) at 1e−7; R 31.081150619 at 1e−5.
        assertThat(b.estimate()).isCloseTo(31.08115172, rel(31.08115172, 1e-7))
            .isCloseTo(31.081150619, rel(31.081150619, 1e-5));
        // R: SE 0.724207408848 (INDEP 0.7242075684), CI (29.5925209705, 32.5697802676) with t₂₆; 1e−5 relative.
        assertThat(b.standardError()).isCloseTo(0.724207408848, rel(0.724207408848, 1e-5));
        assertThat(b.lower()).isCloseTo(29.5925209705, rel(29.5925209705, 1e-5));
        assertThat(b.upper()).isCloseTo(32.5697802676, rel(32.5697802676, 1e-5));
        // R coefficients: (Intercept) −6.7824374875296, age −0.0134103798227, U1.age 0.2742212440366.
        assertThat(f.intercept()).isCloseTo(-6.7824374875296, rel(6.7824374875296, 1e-5));
        assertThat(f.slopes().get(0).estimate()).isCloseTo(-0.0134103798227, rel(0.0134103798227, 1e-4));
        assertThat(b.slopeChange()).isCloseTo(0.2742212440366, rel(0.2742212440366, 1e-5));
        // R slopes on the logit scale with SE (slope() of a GLM uses the normal quantile).
        assertThat(f.slopes().get(0).standardError()).isCloseTo(0.01794710258, rel(0.01794710258, 1e-5));
        assertThat(f.slopes().get(1).estimate()).isCloseTo(0.26081086420, rel(0.26081086420, 1e-5));
        assertThat(f.slopes().get(1).standardError()).isCloseTo(0.01476392442, rel(0.01476392442, 1e-5));
        assertThat(f.slopes().get(1).lower()).isCloseTo(0.23187410410, rel(0.23187410410, 1e-5));
        // R/INDEP: deviance 43.9386752283 on 26 df; logLik −91.4090304625, AIC 190.818060925, BIC 196.422850452.
        assertThat(f.deviance()).isCloseTo(43.9386752283, rel(43.9386752283, 1e-9));
        assertThat(f.residualDf()).isEqualTo(26);
        assertThat(f.logLik()).isCloseTo(-91.4090304625, within(1e-6));
        assertThat(f.aic()).isCloseTo(190.818060925, within(1e-6));
        assertThat(f.bic()).isCloseTo(196.422850452, within(1e-6));
        // R linear-logit fit: deviance 183.86184012.
        assertThat(f.candidates().get(0).fitMeasure()).isCloseTo(183.86184012, rel(183.86184012, 1e-9));
        // R davies.test(glm): p = 3.98025e−30 (6 digits), best at 30.5.
        assertThat(f.davies().pValue()).isCloseTo(3.98025e-30, rel(3.98025e-30, 5e-6));
        assertThat(f.davies().bestAt()).isCloseTo(30.5, within(1e-9));
        assertThat(f.predictProbability(40)).isBetween(0.005, 0.02);
    }

    @Test
    void linearLogitFit() {
        SegmentedLogisticFit line = fitDown(SegmentedOptions.defaults().withBreakpoints(0));
        // R glm(p ~ age, binomial, weights = births): coefficients −10.5622796547, 0.137524028861.
        assertThat(line.intercept()).isCloseTo(-10.5622796547, rel(10.5622796547, 1e-8));
        assertThat(line.slopes().get(0).estimate()).isCloseTo(0.137524028861, rel(0.137524028861, 1e-8));
        assertThat(line.deviance()).isCloseTo(183.86184012, rel(183.86184012, 1e-9));
        assertThat(line.breakpoints()).isEmpty();
    }

    @Test
    void parametricBootstrapIntervalBracketsTheEstimate() {
        SegmentedLogisticFit f = fitDown(SegmentedOptions.defaults().withBootstrap(20).withSeed(5));
        Breakpoint b = f.breakpoints().get(0);
        assertThat(f.bootstrapResamples()).isEqualTo(20);
        assertThat(b.bootstrapLower()).isLessThan(b.estimate());
        assertThat(b.bootstrapUpper()).isGreaterThan(b.estimate());
        // Same seed, same answer.
        SegmentedLogisticFit again = fitDown(SegmentedOptions.defaults().withBootstrap(20).withSeed(5));
        assertThat(again.breakpoints().get(0).bootstrapLower()).isEqualTo(b.bootstrapLower());
    }

    @Test
    void thinDataAndInvalidInput() {
        SegmentedLogisticResult none = SegmentedLogistic.fit(new double[] {1, 2, 3, 4, 5}, new long[] {0, 0, 0, 0, 0},
            new long[] {10, 10, 10, 10, 10}, SegmentedOptions.defaults());
        assertThat(((NoFit) none).reason()).isEqualTo(NoFitReason.NO_VARIATION);
        SegmentedLogisticResult few = SegmentedLogistic.fit(new double[] {1, 2, 3}, new long[] {1, 2, 3},
            new long[] {10, 10, 10}, SegmentedOptions.defaults());
        assertThat(((NoFit) few).reason()).isEqualTo(NoFitReason.TOO_FEW_DISTINCT_X);
        SegmentedLogisticResult empty = SegmentedLogistic.fit(new double[] {1, 2}, new long[] {0, 0},
            new long[] {0, 0}, SegmentedOptions.defaults());
        assertThat(((NoFit) empty).reason()).isEqualTo(NoFitReason.TOO_LITTLE_WEIGHT);
        assertThatIllegalArgumentException().isThrownBy(() -> SegmentedLogistic.fit(new double[] {1},
            new long[] {5}, new long[] {4}, SegmentedOptions.defaults()))
            .withMessageContaining("successes[0] must be in [0, trials[0] = 4], was 5");
        assertThatIllegalArgumentException().isThrownBy(() -> SegmentedLogistic.fit(new double[] {1},
            new long[] {1}, new long[] {4}, SegmentedOptions.defaults().withBreakpoints(2)))
            .withMessageContaining("fixedBreakpoints was 2");
    }
}
