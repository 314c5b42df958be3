package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import com.example.foldline.stats.Cusum.Options;
import com.example.foldline.stats.Cusum.Result;
import com.example.foldline.stats.Cusum.Side;
import com.example.foldline.stats.Cusum.Signal;
import org.junit.jupiter.api.Test;

/**
 * Check values: checkvalues.md section 6 (C1, C2, C3).
 */
class CusumTests {

    @Test
    void c1MontgomeryExample91() {
        double[] x = ReferenceCsv.load("montgomery_cusum.csv").doubles("x");
        Result r = Cusum.tabular(x, 10, 1, Options.defaults().withK(0.5).withH(5));
        // C+ for i = 1..30: PUB-2 (Montgomery Table 9.2, 2 decimals, via public copies) = COMP scripts/cusum_check.py.
        // The data have 2 decimals and K = 0.5, so every C+ is an exact 2-decimal number: tolerance 1e-9.
        double[] cPlus = {0, 0, 0, 1.16, 2.82, 2.50, 0.04, 1.00, 0, 0, 0, 0.97, 0.98, 0, 0, 0, 0.12, 0, 0, 0.34, 0.74,
            0, 1.79, 2.79, 2.89, 3.47, 3.35, 4.47, 5.28, 5.30};
        double[] upper = r.upper();
        for (int i = 0; i < 30; i++) {
            assertThat(upper[i]).as("C+ at i=%d", i + 1).isCloseTo(cPlus[i], within(1e-9));
        }
        // C-: 0.05, 1.56, 1.77, then 0 at i = 4; max 1.77 (checkvalues.md C1, COMP); exact 2-decimal numbers, 1e-9.
        double[] lower = r.lower();
        assertThat(lower[0]).isCloseTo(0.05, within(1e-9));
        assertThat(lower[1]).isCloseTo(1.56, within(1e-9));
        assertThat(lower[2]).isCloseTo(1.77, within(1e-9));
        assertThat(lower[3]).isZero();
        assertThat(java.util.Arrays.stream(lower).max().orElseThrow()).isCloseTo(1.77, within(1e-9));
        // First signal at i = 29 (0-based 28), N+ = 7, shift began after period 22 (PUB-2 + COMP), exact.
        Signal s = r.firstSignal().orElseThrow();
        assertThat(s.index()).isEqualTo(28);
        assertThat(s.side()).isEqualTo(Side.UPPER);
        assertThat(s.runLength()).isEqualTo(7);
        assertThat(s.changeStartIndex()).isEqualTo(22); // period 23 = first period after 22
        assertThat(r.upperCount()[28]).isEqualTo(7);
        // Estimated new mean mu0 + K + C+/N+ = 11.2543 (COMP, 4 decimals): tolerance 5e-5; the exact value
        // 10.5 + 5.28/7 to 1e-9.
        assertThat(s.estimatedLevel()).isCloseTo(11.2543, within(5e-5));
        assertThat(s.estimatedLevel()).isCloseTo(10.5 + 5.28 / 7, within(1e-9));
    }

    @Test
    void c3StandardisedCusumOnDailyBounceRates() {
        ReferenceCsv csv = ReferenceCsv.load("daily_bounce.csv");
        Result r = Cusum.rates(csv.longs("bounces"), csv.longs("sessions"), 0.40, Options.defaults().withH(4));
        // C+ per day: INDEP only (scripts/cusum_check.py, out/cusum_py.txt, 4 decimals): tolerance 5e-5.
        double[] cPlus = {0, 0, 0, 0.2100, 0.9530, 0, 0.1197, 1.0246, 0, 0, 0.0929, 0, 0, 0, 0, 0, 0.6191, 0.8916,
            5.0742, 8.9480, 11.4482, 15.2067, 18.2468, 20.0004, 23.6930, 26.6332, 30.8984, 34.5260, 40.2931,
            43.4930};
        double[] upper = r.upper();
        for (int i = 0; i < cPlus.length; i++) {
            assertThat(upper[i]).as("C+ day %d", i + 1).isCloseTo(cPlus[i], within(5e-5));
        }
        // C- on day 16 = 2.5659 (INDEP, 4 decimals), tolerance 5e-5.
        assertThat(r.lower()[15]).isCloseTo(2.5659, within(5e-5));
        // z on day 19 = 4.6825 (INDEP, 4 decimals), tolerance 5e-5.
        assertThat(r.z()[18]).isCloseTo(4.6825, within(5e-5));
        // First signal day 19 (INDEP), exact. C+ > 0 since day 17 (table above), so N+ = 3 and the run starts on
        // day 17 (0-based 16).
        Signal s = r.firstSignal().orElseThrow();
        assertThat(s.index()).isEqualTo(18);
        assertThat(s.side()).isEqualTo(Side.UPPER);
        assertThat(s.runLength()).isEqualTo(3);
        assertThat(s.changeStartIndex()).isEqualTo(16);
        // Estimated new rate = pooled bounces/sessions over days 17–19 (own definition; computed from the CSV).
        long[] b = csv.longs("bounces");
        long[] n = csv.longs("sessions");
        double pooled = (double) (b[16] + b[17] + b[18]) / (n[16] + n[17] + n[18]);
        assertThat(s.estimatedLevel()).isCloseTo(pooled, within(1e-15));
    }

    @Test
    void periodsWithoutTrialsCarryTheChartOver() {
        long[] k = {40, 0, 60, 60};
        long[] n = {100, 0, 100, 100};
        Result r = Cusum.rates(k, n, 0.4, Options.defaults().withH(3));
        assertThat(r.z()[1]).isNaN();
        assertThat(r.upper()[1]).isEqualTo(r.upper()[0]);
        assertThat(r.upperCount()[1]).isEqualTo(r.upperCount()[0]);
        // z = 0.2/sqrt(0.24/100) = 4.0825 on days 3 and 4 → C+ = 3.58 > 3 on day 3 (hand computation), run of 1.
        Signal s = r.firstSignal().orElseThrow();
        assertThat(s.index()).isEqualTo(2);
        assertThat(s.changeStartIndex()).isEqualTo(2);
        assertThat(s.estimatedLevel()).isEqualTo(0.6);
    }

    @Test
    void lowerSideSignalsADrop() {
        double[] x = {10, 10, 7, 7, 7};
        Result r = Cusum.tabular(x, 10, 1, Options.defaults());
        // Hand computation: C- = 0, 0, 2.5, 5.0, 7.5 → first C- > 5 at index 4, N- = 3, level 10 − 0.5 − 7.5/3 = 7.
        Signal s = r.firstSignal().orElseThrow();
        assertThat(s.side()).isEqualTo(Side.LOWER);
        assertThat(s.index()).isEqualTo(4);
        assertThat(s.changeStartIndex()).isEqualTo(2);
        assertThat(s.estimatedLevel()).isCloseTo(7.0, within(1e-12));
        assertThat(Cusum.tabular(new double[0], 0, 1, Options.defaults()).firstSignal()).isEmpty();
    }

    @Test
    void c2AverageRunLengths() {
        // COMP: R spc 0.6.7 xcusum.arl(k = 0.5, h, mu, sided), printed to 4 decimals (out/cusum_arl_R.txt);
        // tolerance relative 1e-5 (the 4th decimal of the smallest value, 3.3428, is ~1.5e-5 relative).
        double[][] twoSided = {
            {4, 0, 167.6838}, {4, 0.5, 26.6302}, {4, 1, 8.3831}, {4, 2, 3.3428},
            {5, 0, 465.4435}, {5, 0.5, 37.9961}, {5, 1, 10.3760}, {5, 2, 4.0089}};
        for (double[] c : twoSided) {
            assertThat(Cusum.averageRunLength(0.5, c[0], c[1], true)).as("two-sided h=%s shift=%s", c[0], c[1])
                .isCloseTo(c[2], within(Math.max(5e-5, c[2] * 1e-6)));
        }
        double[][] oneSided = {
            {4, 0, 335.3676}, {4, 0.5, 26.6792}, {4, 1, 8.3832}, {4, 2, 3.3428},
            {5, 0, 930.8870}, {5, 0.5, 38.0096}, {5, 1, 10.3760}, {5, 2, 4.0089}};
        for (double[] c : oneSided) {
            assertThat(Cusum.averageRunLength(0.5, c[0], c[1], false)).as("one-sided h=%s shift=%s", c[0], c[1])
                .isCloseTo(c[2], within(Math.max(5e-5, c[2] * 1e-6)));
        }
        // MEM: Montgomery's ARL table for k = 1/2 quotes 168 (h = 4) and 465 (h = 5) in control; rounding, 0.5.
        assertThat(Cusum.averageRunLength(0.5, 4, 0, true)).isCloseTo(168, within(0.5));
    }

    @Test
    void rejectsBadArgumentsNamingTheValue() {
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Cusum.rates(new long[] {5}, new long[] {4}, 0.4, Options.defaults()))
            .withMessageContaining("successes[0] = 5").withMessageContaining("trials[0] = 4");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Cusum.rates(new long[] {1}, new long[] {-4}, 0.4, Options.defaults()))
            .withMessageContaining("trials[0]").withMessageContaining("-4");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Cusum.rates(new long[] {1, 2}, new long[] {4}, 0.4, Options.defaults()))
            .withMessageContaining("2 and 1");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Cusum.rates(new long[] {1}, new long[] {4}, 1.0, Options.defaults()))
            .withMessageContaining("baselineRate").withMessageContaining("1.0");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Cusum.tabular(new double[] {Double.POSITIVE_INFINITY}, 0, 1, Options.defaults()))
            .withMessageContaining("x[0]").withMessageContaining("Infinity");
        assertThatIllegalArgumentException().isThrownBy(() -> Cusum.tabular(new double[] {1}, 0, 0, Options.defaults()))
            .withMessageContaining("sigma").withMessageContaining("0.0");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withH(-1))
            .withMessageContaining("-1");
    }
}
