package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import com.example.foldline.stats.Kneedle.Curve;
import com.example.foldline.stats.Kneedle.Direction;
import com.example.foldline.stats.Kneedle.Options;
import com.example.foldline.stats.Kneedle.Result;
import com.example.foldline.stats.Kneedle.Smoothing;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Check values: checkvalues.md section 4 (K1–K8). Source of the expected knees: the test suite of kneed 0.8.6
 * ({@code tests/test_sample.py}, commit ad1449ff, PUB-2), reproduced by kneed itself and by
 * {@code scripts/kneedle.py} (INDEP), see {@code out/kneedle_py.txt}. Knees are data points, so they are compared
 * exactly (x values are small integers or 2/9 to 1e−12).
 */
class KneedleTests {

    private static final Options CONCAVE_INCREASING = Options.defaults().withShape(Curve.CONCAVE, Direction.INCREASING);
    private static final Options CONCAVE_DECREASING = Options.defaults().withShape(Curve.CONCAVE, Direction.DECREASING);
    private static final Options CONVEX_INCREASING = Options.defaults().withShape(Curve.CONVEX, Direction.INCREASING);
    private static final Options CONVEX_DECREASING = Options.defaults().withShape(Curve.CONVEX, Direction.DECREASING);

    private static double[] range(int n) {
        return IntStream.range(0, n).asDoubleStream().toArray();
    }

    /** K1: the paper's Figure 2 as recreated by kneed's DataGenerator.figure2(): x = linspace(0, 1, 10). */
    private static double[][] figure2() {
        double[] x = new double[10];
        double[] y = new double[10];
        for (int i = 0; i < 10; i++) {
            x[i] = i * (1.0 / 9); // numpy.linspace computes start + i·step
            y[i] = -1 / (x[i] + 0.1) + 5;
        }
        return new double[][] {x, y};
    }

    private static final double[] K2_Y = {0, 60, 80, 85, 90, 95, 96, 97, 98, 99};

    @Test
    void k1PaperFigure2KneeAndDifferenceCurve() {
        double[][] c = figure2();
        // y as printed in out/kneedle_py.txt (6 decimals): checks the test data itself; tolerance 5e-7 (rounding).
        double[] yPrinted = {-5, 0.263158, 1.896552, 2.692308, 3.163265, 3.474576, 3.695652, 3.860759, 3.988764,
            4.090909};
        for (int i = 0; i < 10; i++) {
            assertThat(c[1][i]).as("y[%d]", i).isCloseTo(yPrinted[i], within(5e-7));
        }
        Result r = Kneedle.find(c[0], c[1], CONCAVE_INCREASING);
        // K1 (PUB-2 kneed test 0.22 ± 5%; INDEP + kneed run: exactly x = 2/9): tolerance 1e-12.
        assertThat(r.found()).isTrue();
        assertThat(r.kneeX()).isCloseTo(2.0 / 9, within(1e-12));
        assertThat(r.kneeIndex()).isEqualTo(2);
        assertThat(r.allKneeX()).hasSize(1);
        // Intermediate D for K1 (checkvalues.md section 4, INDEP, printed to 6 decimals): tolerance 5e-7.
        double[] d = {0, 0.467836, 0.536398, 0.512821, 0.453515, 0.376648, 0.289855, 0.196906, 0.099875, 0};
        for (int i = 0; i < 10; i++) {
            assertThat(r.differenceCurve().get(i)).as("D[%d]", i).isCloseTo(d[i], within(5e-7));
        }
    }

    @Test
    void k2ConcaveIncreasingKneeAndDifferenceCurve() {
        Result r = Kneedle.find(range(10), K2_Y, CONCAVE_INCREASING);
        // K2 (PUB-2 kneed test_concave_increasing, INDEP): knee 2, exact.
        assertThat(r.kneeX()).isEqualTo(2.0);
        assertThat(r.kneeY()).isEqualTo(80.0);
        // Intermediate D for K2 (INDEP, 6 decimals): tolerance 5e-7.
        double[] d = {0, 0.494949, 0.585859, 0.525253, 0.464646, 0.404040, 0.303030, 0.202020, 0.101010, 0};
        for (int i = 0; i < 10; i++) {
            assertThat(r.differenceCurve().get(i)).as("D[%d]", i).isCloseTo(d[i], within(5e-7));
        }
    }

    @Test
    void k3ConcaveDecreasing() {
        double[] y = {99, 98, 97, 96, 95, 90, 85, 80, 60, 0};
        // K3 (PUB-2 kneed test_concave_decreasing, INDEP): knee 7, exact.
        Result r = Kneedle.find(range(10), y, CONCAVE_DECREASING);
        assertThat(r.kneeX()).isEqualTo(7.0);
        assertThat(r.allKneeX()).containsExactly(7.0);
        // The difference curve is reported per input point: the reflected curve of K2, read backwards.
        assertThat(r.differenceCurve().get(7)).isCloseTo(0.585859, within(5e-7));
    }

    @Test
    void k4ConvexIncreasing() {
        double[] y = {1, 2, 3, 4, 5, 10, 15, 20, 40, 100};
        // K4 (PUB-2 kneed test_convex_increasing, INDEP): knee 7, exact.
        assertThat(Kneedle.find(range(10), y, CONVEX_INCREASING).kneeX()).isEqualTo(7.0);
    }

    @Test
    void k5ConvexDecreasing() {
        double[] y = {100, 40, 20, 15, 10, 5, 4, 3, 2, 1};
        // K5 (PUB-2 kneed test_convex_decreasing, INDEP): knee 2, exact.
        assertThat(Kneedle.find(range(10), y, CONVEX_DECREASING).kneeX()).isEqualTo(2.0);
    }

    @Test
    void k6BumpyCurveFirstKneeAndAllKnees() {
        ReferenceCsv csv = ReferenceCsv.load("kneed_bumpy.csv");
        Result r = Kneedle.find(csv.doubles("x"), csv.doubles("y"), CONVEX_DECREASING);
        // K6 (PUB-2 kneed test_all_knees / bumpy, INDEP): first knee 26; all {26, 31, 41, 46, 53}; exact.
        assertThat(r.kneeX()).isEqualTo(26.0);
        assertThat(r.allKneeX()).containsExactly(26.0, 31.0, 41.0, 46.0, 53.0);
    }

    @Test
    void k7SaturatingRevenue() {
        double[] x = range(16);
        double[] y = new double[16];
        for (int i = 0; i < 16; i++) {
            y[i] = Math.round((1 - Math.exp(-x[i] / 3)) * 1e6) / 1e6; // round(1 − exp(−x/3), 6) as in the script
        }
        // K7 (INDEP + kneed 0.8.6 run; no test-suite value): knee 5, exact.
        assertThat(Kneedle.find(x, y, CONCAVE_INCREASING).kneeX()).isEqualTo(5.0);
    }

    @Test
    void k8FlatMaximaDependsOnSensitivity() {
        ReferenceCsv csv = ReferenceCsv.load("kneed_flat_maxima.csv");
        double[] x = csv.doubles("x");
        double[] y = csv.doubles("y");
        // K8 (PUB-2 kneed test_flat_maxima, INDEP): S = 0 -> 1 (INDEP all knees {1, 8}); S = 1 -> 8; exact.
        Result s0 = Kneedle.find(x, y, CONVEX_DECREASING.withSensitivity(0));
        assertThat(s0.kneeX()).isEqualTo(1.0);
        assertThat(s0.allKneeX()).containsExactly(1.0, 8.0);
        Result s1 = Kneedle.find(x, y, CONVEX_DECREASING.withSensitivity(1));
        assertThat(s1.kneeX()).isEqualTo(8.0);
        assertThat(s1.allKneeX()).containsExactly(8.0);
    }

    @Test
    void automaticShapeMatchesTheStatedShapeOfEveryCheckCase() {
        // Own check: the curve/direction stated in checkvalues.md for K1–K8 is what AUTO chooses, and so the knee.
        double[][] f = figure2();
        assertAuto(f[0], f[1], Curve.CONCAVE, Direction.INCREASING, 2.0 / 9);
        assertAuto(range(10), K2_Y, Curve.CONCAVE, Direction.INCREASING, 2);
        assertAuto(range(10), new double[] {99, 98, 97, 96, 95, 90, 85, 80, 60, 0}, Curve.CONCAVE,
            Direction.DECREASING, 7);
        assertAuto(range(10), new double[] {1, 2, 3, 4, 5, 10, 15, 20, 40, 100}, Curve.CONVEX,
            Direction.INCREASING, 7);
        assertAuto(range(10), new double[] {100, 40, 20, 15, 10, 5, 4, 3, 2, 1}, Curve.CONVEX,
            Direction.DECREASING, 2);
        ReferenceCsv bumpy = ReferenceCsv.load("kneed_bumpy.csv");
        assertAuto(bumpy.doubles("x"), bumpy.doubles("y"), Curve.CONVEX, Direction.DECREASING, 26);
        ReferenceCsv flat = ReferenceCsv.load("kneed_flat_maxima.csv");
        assertAuto(flat.doubles("x"), flat.doubles("y"), Curve.CONVEX, Direction.DECREASING, 8);
    }

    private static void assertAuto(double[] x, double[] y, Curve curve, Direction direction, double knee) {
        Result r = Kneedle.find(x, y);
        assertThat(r.curve()).isEqualTo(curve);
        assertThat(r.direction()).isEqualTo(direction);
        assertThat(r.kneeX()).isCloseTo(knee, within(1e-12));
    }

    @ParameterizedTest
    @EnumSource(value = Curve.class, names = {"CONCAVE", "CONVEX"})
    void unevenSpacingUsesAGeometricReflection(Curve curve) {
        // Own convention check (no outside value): mirroring an unevenly spaced curve left-right (x -> -x) turns
        // "increasing" into "decreasing"; with a geometric reflection the knee stays at the same point.
        double[] x = {0, 0.5, 1, 2, 3.5, 5, 7.5, 10, 14, 20};
        double[] y = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            y[i] = curve == Curve.CONCAVE ? 1 - Math.exp(-x[i] / 3) : Math.exp(x[i] / 4);
        }
        Result inc = Kneedle.find(x, y, Options.defaults().withShape(curve, Direction.INCREASING));
        int n = x.length;
        double[] xm = new double[n];
        double[] ym = new double[n];
        for (int i = 0; i < n; i++) {
            xm[i] = -x[n - 1 - i];
            ym[i] = y[n - 1 - i];
        }
        Result dec = Kneedle.find(xm, ym, Options.defaults().withShape(curve, Direction.DECREASING));
        assertThat(inc.found()).isTrue();
        assertThat(dec.kneeX()).isEqualTo(-inc.kneeX());
        for (int i = 0; i < n; i++) {
            assertThat(dec.differenceCurve().get(i)).isCloseTo(inc.differenceCurve().get(n - 1 - i), within(1e-15));
        }
    }

    @Test
    void movingAverageSmoothingStillFindsTheKneeOfANoisyCurve() {
        // Own check: a saturating curve with alternating noise; the moving average recovers the noise-free knee.
        double[] x = range(16);
        double[] clean = new double[16];
        double[] noisy = new double[16];
        for (int i = 0; i < 16; i++) {
            clean[i] = 1 - Math.exp(-x[i] / 3);
            noisy[i] = clean[i] + (i % 2 == 0 ? 0.01 : -0.01);
        }
        Result smooth = Kneedle.find(x, noisy, CONCAVE_INCREASING.withSmoothing(Smoothing.MOVING_AVERAGE));
        double cleanKnee = Kneedle.find(x, clean, CONCAVE_INCREASING).kneeX();
        assertThat(smooth.kneeX()).isCloseTo(cleanKnee, within(1.0));
        assertThat(smooth.kneeY()).isEqualTo(noisy[smooth.kneeIndex()]);
    }

    @Test
    void tooShortConstantOrKneelessInputSaysNoKneeWithAReason() {
        Result empty = Kneedle.find(new double[0], new double[0]);
        assertThat(empty.found()).isFalse();
        assertThat(empty.reason()).contains("at least 3 points");
        assertThat(empty.kneeX()).isNaN();
        assertThat(Kneedle.find(new double[] {1, 2}, new double[] {3, 4}).found()).isFalse();
        Result constant = Kneedle.find(range(5), new double[] {2, 2, 2, 2, 2});
        assertThat(constant.found()).isFalse();
        assertThat(constant.reason()).contains("constant");
        Result straight = Kneedle.find(range(5), new double[] {0, 1, 2, 3, 4}, CONCAVE_INCREASING);
        assertThat(straight.found()).isFalse();
        assertThat(straight.reason()).startsWith("no knee");
        assertThat(straight.allKneeX()).isEmpty();
    }

    @Test
    void rejectsBadArgumentsNamingTheValue() {
        assertThatIllegalArgumentException().isThrownBy(() -> Kneedle.find(new double[] {1, 2, 3}, new double[] {1, 2}))
            .withMessageContaining("equal lengths").withMessageContaining("3 and 2");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Kneedle.find(new double[] {1, 2, 3}, new double[] {1, Double.NaN, 2}))
            .withMessageContaining("y[1]").withMessageContaining("NaN");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Kneedle.find(new double[] {1, 3, 2}, new double[] {1, 2, 3}))
            .withMessageContaining("strictly increasing").withMessageContaining("x[2] = 2.0");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withSensitivity(-1))
            .withMessageContaining("-1");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withSmoothingWindow(4))
            .withMessageContaining("4");
    }
}
