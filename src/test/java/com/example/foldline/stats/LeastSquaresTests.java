package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import org.assertj.core.data.Offset;
import org.junit.jupiter.api.Test;

/**
 * {@link LeastSquares} (and {@link LinearFit}) against checkvalues.md §7: NIST StRD certified values (PUB) and
 * R 4.2.2 lm / statsmodels 0.13.5 WLS (COMP).
 */
class LeastSquaresTests {

    private static Offset<Double> rel(double expected, double tolerance) {
        return within(Math.abs(expected) * tolerance);
    }

    private static double[][] asRows(double[]... columns) {
        double[][] rows = new double[columns[0].length][columns.length];
        for (int i = 0; i < rows.length; i++) {
            for (int j = 0; j < columns.length; j++) {
                rows[i][j] = columns[j][i];
            }
        }
        return rows;
    }

    @Test
    void nistNorris() {
        ReferenceData d = ReferenceData.load("norris.csv");
        LinearFit fit = LeastSquares.fit(asRows(d.column("x")), d.column("y"));
        // NIST StRD Norris.dat certified values (O1), relative 1e−9.
        double tol = 1e-9;
        assertThat(fit.coefficient(0)).isCloseTo(-0.262323073774029, rel(-0.262323073774029, tol));
        assertThat(fit.coefficient(1)).isCloseTo(1.00211681802045, rel(1.00211681802045, tol));
        assertThat(fit.standardError(0)).isCloseTo(0.232818234301152, rel(0.232818234301152, tol));
        assertThat(fit.standardError(1)).isCloseTo(0.429796848199937E-03, rel(0.429796848199937E-03, tol));
        assertThat(fit.sigma()).isCloseTo(0.884796396144373, rel(0.884796396144373, tol));
        assertThat(fit.rSquared()).isCloseTo(0.999993745883712, rel(0.999993745883712, tol));
        assertThat(fit.regressionSumOfSquares()).isCloseTo(4255954.13232369, rel(4255954.13232369, tol));
        assertThat(fit.residualSumOfSquares()).isCloseTo(26.6173985294224, rel(26.6173985294224, tol));
        assertThat(fit.fStatistic()).isCloseTo(5436385.54079785, rel(5436385.54079785, tol));
        assertThat(fit.residualDf()).isEqualTo(34);
    }

    @Test
    void nistLongley() {
        ReferenceData d = ReferenceData.load("longley.csv");
        double[][] x = asRows(d.column("x1"), d.column("x2"), d.column("x3"), d.column("x4"), d.column("x5"),
            d.column("x6"));
        LinearFit fit = LeastSquares.fit(x, d.column("y"));
        // NIST StRD Longley.dat certified values (O2), relative 1e−8 for every coefficient and SD.
        double[] b = {-3482258.63459582, 15.0618722713733, -0.358191792925910E-01, -2.02022980381683,
            -1.03322686717359, -0.511041056535807E-01, 1829.15146461355};
        double[] sd = {890420.383607373, 84.9149257747669, 0.334910077722432E-01, 0.488399681651699,
            0.214274163161675, 0.226073200069370, 455.478499142212};
        for (int j = 0; j < 7; j++) {
            assertThat(fit.coefficient(j)).as("B%d", j).isCloseTo(b[j], rel(b[j], 1e-8));
            assertThat(fit.standardError(j)).as("SD(B%d)", j).isCloseTo(sd[j], rel(sd[j], 1e-8));
        }
        assertThat(fit.sigma()).isCloseTo(304.854073561965, rel(304.854073561965, 1e-8));
        assertThat(fit.rSquared()).isCloseTo(0.995479004577296, rel(0.995479004577296, 1e-8));
        assertThat(fit.regressionSumOfSquares()).isCloseTo(184172401.944494, rel(184172401.944494, 1e-8));
        assertThat(fit.residualSumOfSquares()).isCloseTo(836424.055505915, rel(836424.055505915, 1e-8));
        assertThat(fit.fStatistic()).isCloseTo(330.285339234588, rel(330.285339234588, 1e-8));
    }

    @Test
    void nistNoIntercept() {
        // NIST StRD NoInt1 (O3): x = 60..70, y = 130..140; certified B1, SD, residual SS; R lm for uncentred R².
        double[][] x1 = new double[11][1];
        double[] y1 = new double[11];
        for (int i = 0; i < 11; i++) {
            x1[i][0] = 60 + i;
            y1[i] = 130 + i;
        }
        LinearFit fit1 = LeastSquares.fit(x1, y1, null, false);
        assertThat(fit1.coefficient(0)).isCloseTo(2.07438016528926, rel(2.07438016528926, 1e-9));
        assertThat(fit1.standardError(0)).isCloseTo(0.165289256198347E-01, rel(0.165289256198347E-01, 1e-9));
        assertThat(fit1.residualSumOfSquares()).isCloseTo(127.272727272727, rel(127.272727272727, 1e-9));
        assertThat(fit1.rSquared()).isCloseTo(0.999365492298663, rel(0.999365492298663, 1e-9));
        // NIST StRD NoInt2 (O3): x = 4, 5, 6; y = 3, 4, 4.
        LinearFit fit2 = LeastSquares.fit(new double[][] {{4}, {5}, {6}}, new double[] {3, 4, 4}, null, false);
        assertThat(fit2.coefficient(0)).isCloseTo(0.727272727272727, rel(0.727272727272727, 1e-9));
        assertThat(fit2.standardError(0)).isCloseTo(0.420827318078432E-01, rel(0.420827318078432E-01, 1e-9));
        assertThat(fit2.residualSumOfSquares()).isCloseTo(0.272727272727273, rel(0.272727272727273, 1e-9));
        assertThat(fit2.rSquared()).isCloseTo(0.993348115299335, rel(0.993348115299335, 1e-9));
    }

    @Test
    void weightedSmall() {
        ReferenceData d = ReferenceData.load("wls_small.csv");
        LinearFit fit = LeastSquares.fit(asRows(d.column("x")), d.column("y"), d.column("w"), true);
        // checkvalues.md O4: R lm(y ~ x, weights = w) and statsmodels WLS agree; relative 1e−9.
        assertThat(fit.coefficient(0)).isCloseTo(0.6408505545321974, rel(0.6408505545321974, 1e-9));
        assertThat(fit.standardError(0)).isCloseTo(0.01165106903959083, rel(0.01165106903959083, 1e-9));
        assertThat(fit.coefficient(1)).isCloseTo(-0.0437285574487681, rel(0.0437285574487681, 1e-9));
        assertThat(fit.standardError(1)).isCloseTo(0.00215366993370038, rel(0.00215366993370038, 1e-9));
        assertThat(fit.residualSumOfSquares()).isCloseTo(0.297513033425435, rel(0.297513033425435, 1e-9));
        assertThat(fit.sigma()).isCloseTo(0.222678031181583, rel(0.222678031181583, 1e-9));
        assertThat(fit.rSquared()).isCloseTo(0.985654882277404, rel(0.985654882277404, 1e-9));
        assertThat(fit.observations()).isEqualTo(8);
    }

    @Test
    void zeroWeightRowsDropOutAsInR() {
        double[][] x = {{1}, {2}, {3}, {4}, {100}};
        double[] y = {1.1, 1.9, 3.2, 3.9, -50};
        LinearFit withZero = LeastSquares.fit(x, y, new double[] {1, 1, 1, 1, 0}, true);
        LinearFit without = LeastSquares.fit(new double[][] {{1}, {2}, {3}, {4}}, new double[] {1.1, 1.9, 3.2, 3.9});
        assertThat(withZero.coefficient(1)).isCloseTo(without.coefficient(1), within(1e-14));
        assertThat(withZero.residualDf()).isEqualTo(2);
        // Covariance accessor: σ²·(XᵀWX)⁻¹
        assertThat(withZero.covariance(1, 1)).isCloseTo(withZero.standardError(1) * withZero.standardError(1),
            within(1e-15));
        assertThat(withZero.fPValue()).isBetween(0.0, 0.01);
    }

    @Test
    void invalidInputNamesTheProblem() {
        assertThatIllegalArgumentException()
            .isThrownBy(() -> LeastSquares.fit(new double[][] {{1}, {2}}, new double[] {1, Double.NaN}))
            .withMessageContaining("y[1] must be finite, was NaN");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> LeastSquares.fit(new double[][] {{1}, {2}, {3}}, new double[] {1, 2, 3},
                new double[] {1, -1, 1}, true))
            .withMessageContaining("weights[1] must be finite and >= 0, was -1.0");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> LeastSquares.fit(new double[][] {{1}, {1}, {1}}, new double[] {1, 2, 3}))
            .withMessageContaining("rank deficient");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> LeastSquares.fit(new double[][] {{1}}, new double[] {1, 2}))
            .withMessageContaining("predictors has 1 rows but y has 2");
    }
}
