package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

/** {@link WelchTest} (and its {@link WelchResult}). */
class WelchTestTests {

    // R datasets::sleep, column extra by group (from memory; the means 0.75 and 2.33 are the well-known ones).
    private static final double[] GROUP1 = {0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0};
    private static final double[] GROUP2 = {1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4};

    @Test
    void sleepDataAsInRsTTestExample() {
        WelchResult r = WelchTest.fromSummary(10, mean(GROUP1), variance(GROUP1), 10, mean(GROUP2), variance(GROUP2),
            0.05, Alternative.TWO_SIDED);
        // From memory: R `t.test(extra ~ group, data = sleep)` prints t = -1.8608, df = 17.776, p-value = 0.07939,
        // 95 percent CI -3.3654832 0.2054832 (the printed digits are the tolerance).
        assertThat(r.difference()).isCloseTo(-1.58, within(1e-12));
        assertThat(r.t()).isCloseTo(-1.8608, within(5e-5));
        assertThat(r.df()).isCloseTo(17.776, within(5e-4));
        assertThat(r.pValue()).isCloseTo(0.07939, within(5e-6));
        assertThat(r.lower()).isCloseTo(-3.3654832, within(5e-8));
        assertThat(r.upper()).isCloseTo(0.2054832, within(5e-8));
    }

    @Test
    void formulasHoldExactly() {
        // Exact: equal n and equal variances give df = 2(n − 1) and t = d / sqrt(2v/n).
        WelchResult r = WelchTest.fromSummary(25, 3.0, 4.0, 25, 2.0, 4.0, 0.05, Alternative.TWO_SIDED);
        assertThat(r.df()).isCloseTo(48, within(1e-12));
        assertThat(r.t()).isCloseTo(1 / Math.sqrt(8.0 / 25), within(1e-14));
        assertThat(r.pValue()).isCloseTo(2 * Distributions.studentTSurvival(r.t(), 48), within(1e-15));
        double q = Distributions.studentTQuantile(0.975, 48);
        assertThat(r.lower()).isCloseTo(1 - q * r.standardError(), within(1e-14));
        // One-sided p-values split the two-sided one.
        WelchResult greater = WelchTest.fromSummary(25, 3.0, 4.0, 25, 2.0, 4.0, 0.05, Alternative.GREATER);
        WelchResult less = WelchTest.fromSummary(25, 3.0, 4.0, 25, 2.0, 4.0, 0.05, Alternative.LESS);
        assertThat(greater.pValue() * 2).isCloseTo(r.pValue(), within(1e-15));
        assertThat(greater.pValue() + less.pValue()).isCloseTo(1, within(1e-15));
        // Huge groups (sessions): df ≈ 2e9 uses the large-df branch and the t test becomes the z test.
        WelchResult big = WelchTest.fromSummary(1_000_000_000L, 1.001, 1.0, 1_000_000_000L, 1.0, 1.0, 0.05,
            Alternative.TWO_SIDED);
        double z = 0.001 / Math.sqrt(2e-9);
        assertThat(big.t()).isCloseTo(z, within(1e-9));
        assertThat(big.pValue()).isCloseTo(2 * Distributions.normalSurvival(z), within(1e-15));
    }

    @Test
    void thinDataIsAnAnswer() {
        WelchResult one = WelchTest.fromSummary(1, 3.0, 0.0, 10, 2.0, 1.0, 0.05, Alternative.TWO_SIDED);
        assertThat(one.difference()).isEqualTo(1.0);
        assertThat(one.t()).isNaN();
        assertThat(one.pValue()).isNaN();
        WelchResult empty = WelchTest.fromSummary(0, 0.0, 0.0, 0, 0.0, 0.0, 0.05, Alternative.TWO_SIDED);
        assertThat(empty.difference()).isNaN();
        WelchResult constant = WelchTest.fromSummary(5, 2.0, 0.0, 5, 1.0, 0.0, 0.05, Alternative.LESS);
        assertThat(constant.t()).isEqualTo(Double.POSITIVE_INFINITY);
        assertThat(constant.pValue()).isEqualTo(1);
    }

    @Test
    void invalidArgumentsNameTheBadValue() {
        assertThatIllegalArgumentException()
            .isThrownBy(() -> WelchTest.fromSummary(5, 1, -1, 5, 1, 1, 0.05, Alternative.TWO_SIDED))
            .withMessageContaining("variance1 must be finite and >= 0, was -1.0");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> WelchTest.fromSummary(5, 1, 1, -5, 1, 1, 0.05, Alternative.TWO_SIDED))
            .withMessageContaining("n2 must be >= 0, was -5");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> WelchTest.fromSummary(5, Double.NaN, 1, 5, 1, 1, 0.05, Alternative.TWO_SIDED))
            .withMessageContaining("mean1");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> WelchTest.fromSummary(5, 1, 1, 5, 1, 1, 0, Alternative.TWO_SIDED))
            .withMessageContaining("alpha");
    }

    private static double mean(double[] v) {
        double s = 0;
        for (double x : v) {
            s += x;
        }
        return s / v.length;
    }

    private static double variance(double[] v) {
        double m = mean(v);
        double s = 0;
        for (double x : v) {
            s += (x - m) * (x - m);
        }
        return s / (v.length - 1);
    }
}
