package com.example.foldline.stats;

import java.util.Arrays;

/**
 * A (weighted) linear least-squares fit made by {@link LeastSquares#fit}. Conventions follow R's {@code lm}:
 * weights w minimise Σ wᵢrᵢ²; σ² = Σ wᵢrᵢ²/(n − p) with n the number of rows with positive weight (not Σw);
 * R² is centred with an intercept and uncentred (1 − RSS/Σ wᵢyᵢ²) without one.
 *
 * @param coefficients           estimates; with an intercept, index 0 is the intercept
 * @param standardErrors         σ·sqrt(diag((XᵀWX)⁻¹)); NaN when there are no residual degrees of freedom
 * @param residualSumOfSquares   Σ wᵢrᵢ²
 * @param regressionSumOfSquares explained (weighted) sum of squares, centred with an intercept
 * @param sigma                  residual standard error sqrt(RSS/(n − p))
 * @param rSquared               coefficient of determination (see above)
 * @param fStatistic             overall F statistic against the intercept-only (or, without intercept, the zero) model
 * @param observations           n, rows with positive weight
 * @param residualDf             n − p
 * @param intercept              whether the first coefficient is an intercept
 * @param unscaledCovariance     (XᵀWX)⁻¹; the covariance of the estimates is σ² times this
 */
public record LinearFit(double[] coefficients, double[] standardErrors, double residualSumOfSquares,
                        double regressionSumOfSquares, double sigma, double rSquared, double fStatistic,
                        int observations, int residualDf, boolean intercept, double[][] unscaledCovariance) {

    public LinearFit {
        coefficients = coefficients.clone();
        standardErrors = standardErrors.clone();
        unscaledCovariance = deepCopy(unscaledCovariance);
    }

    @Override
    public double[] coefficients() {
        return coefficients.clone();
    }

    @Override
    public double[] standardErrors() {
        return standardErrors.clone();
    }

    @Override
    public double[][] unscaledCovariance() {
        return deepCopy(unscaledCovariance);
    }

    /** Coefficient i. */
    public double coefficient(int i) {
        return coefficients[i];
    }

    /** Standard error of coefficient i. */
    public double standardError(int i) {
        return standardErrors[i];
    }

    /** Estimated covariance σ²·[(XᵀWX)⁻¹]ᵢⱼ. */
    public double covariance(int i, int j) {
        return sigma * sigma * unscaledCovariance[i][j];
    }

    /** p-value of the overall F test; NaN without residual degrees of freedom. */
    public double fPValue() {
        int df1 = coefficients.length - (intercept ? 1 : 0);
        if (residualDf <= 0 || df1 <= 0 || Double.isNaN(fStatistic)) {
            return Double.NaN;
        }
        return Distributions.fSurvival(fStatistic, df1, residualDf);
    }

    private static double[][] deepCopy(double[][] m) {
        double[][] c = new double[m.length][];
        for (int i = 0; i < m.length; i++) {
            c[i] = m[i].clone();
        }
        return c;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof LinearFit f && Arrays.equals(coefficients, f.coefficients)
            && Arrays.equals(standardErrors, f.standardErrors)
            && Double.compare(residualSumOfSquares, f.residualSumOfSquares) == 0
            && observations == f.observations && intercept == f.intercept;
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(coefficients) + Double.hashCode(residualSumOfSquares);
    }

    @Override
    public String toString() {
        return "LinearFit[coefficients=" + Arrays.toString(coefficients) + ", standardErrors="
            + Arrays.toString(standardErrors) + ", rss=" + residualSumOfSquares + ", sigma=" + sigma + ", rSquared="
            + rSquared + ", n=" + observations + ", df=" + residualDf + "]";
    }
}
