package com.example.foldline.stats;

/**
 * Weighted linear least squares by Householder QR (never the normal equations), with R's {@code lm} conventions; see
 * {@link LinearFit} for what is reported.
 *
 * <p>Input: {@code predictors[i]} is row i (without the intercept column, which {@code intercept = true} adds);
 * {@code weights} may be null (all 1). Rows with weight 0 take no part in the fit and are not counted in n, as in R.
 * All values must be finite and weights non-negative; the design must have full column rank on the rows with positive
 * weight, otherwise {@link IllegalArgumentException} is thrown (a rank-deficient design has no unique answer).
 * With n = p the fit is exact and σ, the standard errors and F are NaN.
 *
 * <p>References: [1] Golub GH (1965) Numerical methods for solving linear least squares problems. <i>Numer. Math.</i>
 * 7:206–216, doi:10.1007/BF01436075. [2] Longley JW (1967) An appraisal of least squares programs for the electronic
 * computer from the point of view of the user. <i>J. Am. Stat. Assoc.</i> 62:819–841, doi:10.1080/01621459.1967.10500896
 * (the test problem that defeats the normal equations).
 */
public final class LeastSquares {

    private LeastSquares() {
    }

    /** Unweighted fit with an intercept. */
    public static LinearFit fit(double[][] predictors, double[] y) {
        return fit(predictors, y, null, true);
    }

    /**
     * Weighted least squares.
     *
     * @param predictors n rows of q predictor values
     * @param y          n responses
     * @param weights    n non-negative weights, or null for all 1
     * @param intercept  whether to add an intercept column
     */
    public static LinearFit fit(double[][] predictors, double[] y, double[] weights, boolean intercept) {
        if (predictors == null || y == null) {
            throw new IllegalArgumentException("predictors and y must not be null");
        }
        int rows = y.length;
        if (predictors.length != rows) {
            throw new IllegalArgumentException("predictors has " + predictors.length + " rows but y has " + rows);
        }
        if (weights != null && weights.length != rows) {
            throw new IllegalArgumentException("weights has " + weights.length + " entries but y has " + rows);
        }
        int q = rows == 0 ? 0 : predictors[0].length;
        int p = q + (intercept ? 1 : 0);
        int n = 0;
        for (int i = 0; i < rows; i++) {
            requireFinite("y", i, y[i]);
            if (predictors[i].length != q) {
                throw new IllegalArgumentException("predictors[" + i + "] has " + predictors[i].length
                    + " values, expected " + q);
            }
            for (int j = 0; j < q; j++) {
                requireFinite("predictors[" + i + "]", j, predictors[i][j]);
            }
            double w = weights == null ? 1 : weights[i];
            if (!(w >= 0) || Double.isInfinite(w)) {
                throw new IllegalArgumentException("weights[" + i + "] must be finite and >= 0, was " + w);
            }
            if (w > 0) {
                n++;
            }
        }
        if (p == 0) {
            throw new IllegalArgumentException("the model has no columns (no predictors and no intercept)");
        }
        if (n < p) {
            throw new IllegalArgumentException("need at least " + p + " rows with positive weight for " + p
                + " coefficients, got " + n);
        }
        double[][] columns = new double[p][n];
        double[] yw = new double[n];
        double[] w = new double[n];
        int r = 0;
        for (int i = 0; i < rows; i++) {
            double wi = weights == null ? 1 : weights[i];
            if (wi == 0) {
                continue;
            }
            double sw = Math.sqrt(wi);
            int c = 0;
            if (intercept) {
                columns[c++][r] = sw;
            }
            for (int j = 0; j < q; j++) {
                columns[c++][r] = sw * predictors[i][j];
            }
            yw[r] = sw * y[i];
            w[r] = wi;
            r++;
        }
        return fitScaled(columns, yw, w, intercept);
    }

    /**
     * Fit on columns and response already multiplied by √w (package-private: the segmented fits build their designs
     * this way). {@code w} are the weights themselves, needed for the centred total sum of squares.
     */
    static LinearFit fitScaled(double[][] columns, double[] yw, double[] w, boolean intercept) {
        int p = columns.length;
        int n = yw.length;
        HouseholderQr qr = new HouseholderQr(columns);
        if (!qr.isFullRank()) {
            throw new IllegalArgumentException("design matrix is rank deficient (" + p + " columns, " + n
                + " rows with positive weight): a column is a linear combination of the others");
        }
        double[] beta = qr.solve(yw);
        double rss = qr.residualSumOfSquares(yw);
        double[][] unscaled = qr.unscaledCovariance();
        int df = n - p;
        double sigma = df > 0 ? Math.sqrt(rss / df) : Double.NaN;
        double[] se = new double[p];
        for (int j = 0; j < p; j++) {
            se[j] = sigma * Math.sqrt(unscaled[j][j]);
        }
        double tss;
        if (intercept) {
            double sw = 0;
            double swy = 0;
            for (int i = 0; i < n; i++) {
                sw += w[i];
                swy += Math.sqrt(w[i]) * yw[i];
            }
            double mean = swy / sw;
            tss = 0;
            for (int i = 0; i < n; i++) {
                double d = yw[i] - Math.sqrt(w[i]) * mean;
                tss += d * d;
            }
        } else {
            tss = 0;
            for (double v : yw) {
                tss += v * v;
            }
        }
        double ssr = tss - rss;
        int df1 = p - (intercept ? 1 : 0);
        double f = df > 0 && df1 > 0 ? (ssr / df1) / (rss / df) : Double.NaN;
        return new LinearFit(beta, se, rss, ssr, sigma, 1 - rss / tss, f, n, df, intercept, unscaled);
    }

    private static void requireFinite(String name, int index, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(name + "[" + index + "] must be finite, was " + value);
        }
    }
}
