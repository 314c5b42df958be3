package com.example.foldline.stats;

/**
 * Householder QR factorisation of a tall matrix, the numerical core of every least-squares fit in this package.
 * Package-private: callers use {@link LeastSquares} or the segmented fits.
 *
 * <p>Why QR and not the normal equations: forming XᵀX squares the condition number, and NIST's Longley data (condition
 * number ≈ 10⁹ after scaling) then loses most digits; Householder QR keeps about 12 (Golub &amp; Van Loan, <i>Matrix
 * Computations</i>, 4th ed. 2013, §5.3).
 *
 * <p>The matrix is stored by column; rows are expected to be pre-multiplied by √w for weighted fits.
 */
final class HouseholderQr {

    /** A column whose new part |R_jj| is below this fraction of its own norm counts as linearly dependent. */
    static final double RANK_TOLERANCE = 1e-10;

    private final int n;
    private final int p;
    private final double[][] qr;     // column-major: Householder vectors below the diagonal, R on and above
    private final double[] rDiag;
    private final boolean fullRank;

    /**
     * @param columns p columns of length n (copied; not modified)
     */
    HouseholderQr(double[][] columns) {
        this.p = columns.length;
        this.n = p == 0 ? 0 : columns[0].length;
        this.qr = new double[p][];
        for (int j = 0; j < p; j++) {
            qr[j] = columns[j].clone();
        }
        this.rDiag = new double[p];
        boolean rankOk = n >= p;
        for (int k = 0; k < p; k++) {
            double[] colK = qr[k];
            double originalNorm = norm(colK, 0);
            double nrm = k < n ? norm(colK, k) : 0;
            if (nrm == 0 || nrm <= RANK_TOLERANCE * originalNorm) {
                rankOk = false;
            }
            if (nrm != 0) {
                if (colK[k] < 0) {
                    nrm = -nrm;
                }
                for (int i = k; i < n; i++) {
                    colK[i] /= nrm;
                }
                colK[k] += 1;
                for (int j = k + 1; j < p; j++) {
                    double[] colJ = qr[j];
                    double s = 0;
                    for (int i = k; i < n; i++) {
                        s += colK[i] * colJ[i];
                    }
                    s = -s / colK[k];
                    for (int i = k; i < n; i++) {
                        colJ[i] += s * colK[i];
                    }
                }
            }
            rDiag[k] = -nrm;
        }
        this.fullRank = rankOk;
    }

    private static double norm(double[] v, int from) {
        double scale = 0;
        for (int i = from; i < v.length; i++) {
            scale = Math.max(scale, Math.abs(v[i]));
        }
        if (scale == 0) {
            return 0;
        }
        double s = 0;
        for (int i = from; i < v.length; i++) {
            double t = v[i] / scale;
            s += t * t;
        }
        return scale * Math.sqrt(s);
    }

    boolean isFullRank() {
        return fullRank;
    }

    int rows() {
        return n;
    }

    int columns() {
        return p;
    }

    /** Qᵀv, in place. */
    void applyQt(double[] v) {
        for (int k = 0; k < p; k++) {
            double[] colK = qr[k];
            if (colK[k] == 0) {
                continue;
            }
            double s = 0;
            for (int i = k; i < n; i++) {
                s += colK[i] * v[i];
            }
            s = -s / colK[k];
            for (int i = k; i < n; i++) {
                v[i] += s * colK[i];
            }
        }
    }

    /** Qv, in place. */
    void applyQ(double[] v) {
        for (int k = p - 1; k >= 0; k--) {
            double[] colK = qr[k];
            if (colK[k] == 0) {
                continue;
            }
            double s = 0;
            for (int i = k; i < n; i++) {
                s += colK[i] * v[i];
            }
            s = -s / colK[k];
            for (int i = k; i < n; i++) {
                v[i] += s * colK[i];
            }
        }
    }

    /** The part of v orthogonal to the column space (a new array): (I − QQᵀ)v. */
    double[] residual(double[] v) {
        double[] r = v.clone();
        applyQt(r);
        for (int i = 0; i < p; i++) {
            r[i] = 0;
        }
        applyQ(r);
        return r;
    }

    /** Least-squares coefficients for the right-hand side y (requires full rank). */
    double[] solve(double[] y) {
        double[] qty = y.clone();
        applyQt(qty);
        double[] b = new double[p];
        for (int k = p - 1; k >= 0; k--) {
            double s = qty[k];
            for (int j = k + 1; j < p; j++) {
                s -= r(k, j) * b[j];
            }
            b[k] = s / rDiag[k];
        }
        return b;
    }

    /** Residual sum of squares for y: the squared norm of the last n − p entries of Qᵀy. */
    double residualSumOfSquares(double[] y) {
        double[] qty = y.clone();
        applyQt(qty);
        double s = 0;
        for (int i = p; i < n; i++) {
            s += qty[i] * qty[i];
        }
        return s;
    }

    private double r(int i, int j) {
        return i == j ? rDiag[i] : qr[j][i];
    }

    /** (XᵀX)⁻¹ = R⁻¹R⁻ᵀ (requires full rank). */
    double[][] unscaledCovariance() {
        double[][] rInv = new double[p][p];
        for (int j = 0; j < p; j++) {
            rInv[j][j] = 1 / rDiag[j];
            for (int i = j - 1; i >= 0; i--) {
                double s = 0;
                for (int k = i + 1; k <= j; k++) {
                    s += r(i, k) * rInv[k][j];
                }
                rInv[i][j] = -s / rDiag[i];
            }
        }
        double[][] cov = new double[p][p];
        for (int i = 0; i < p; i++) {
            for (int j = i; j < p; j++) {
                double s = 0;
                for (int k = Math.max(i, j); k < p; k++) {
                    s += rInv[i][k] * rInv[j][k];
                }
                cov[i][j] = s;
                cov[j][i] = s;
            }
        }
        return cov;
    }
}
