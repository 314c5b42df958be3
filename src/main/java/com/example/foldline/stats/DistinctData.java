package com.example.foldline.stats;

import java.util.Arrays;

/**
 * Weighted data aggregated to sufficient statistics per distinct x value: for every distinct uⱼ the total weight Wⱼ,
 * the weighted mean ȳⱼ and the row count. A weighted least-squares fit whose design depends on x only gives the same
 * coefficients on (uⱼ, ȳⱼ, Wⱼ) as on the raw rows, and RSS(raw) = RSS(aggregated) + Σ wᵢ(yᵢ − ȳ_{j(i)})², so the
 * breakpoint search costs O(distinct x), not O(rows) — 100,000 sessions with 13 distinct ad counts fit as 13 points.
 * Rows with weight 0 are dropped here (and are not counted in n), as R's lm does.
 */
final class DistinctData {

    final double[] u;
    final double[] weight;
    final double[] mean;
    final int[] rows;
    final double withinSumOfSquares;
    /** Number of rows with positive weight. */
    final int n;
    /** Σ ln wᵢ over rows with positive weight (enters R's logLik for weighted lm). */
    final double sumLogWeights;
    final double totalWeight;

    private DistinctData(double[] u, double[] weight, double[] mean, int[] rows, double within, int n,
                         double sumLogWeights) {
        this.u = u;
        this.weight = weight;
        this.mean = mean;
        this.rows = rows;
        this.withinSumOfSquares = within;
        this.n = n;
        this.sumLogWeights = sumLogWeights;
        double t = 0;
        for (double w : weight) {
            t += w;
        }
        this.totalWeight = t;
    }

    int size() {
        return u.length;
    }

    /** Aggregates validated arrays (see {@link SegmentedRegression#fit} for the checks). */
    static DistinctData of(double[] x, double[] y, double[] w) {
        int len = x.length;
        Integer[] order = new Integer[len];
        int kept = 0;
        for (int i = 0; i < len; i++) {
            if (w == null || w[i] > 0) {
                order[kept++] = i;
            }
        }
        Integer[] idx = Arrays.copyOf(order, kept);
        Arrays.sort(idx, (a, b) -> Double.compare(x[a], x[b]));
        double[] u = new double[kept];
        double[] wt = new double[kept];
        double[] mean = new double[kept];
        int[] rows = new int[kept];
        double within = 0;
        double sumLog = 0;
        int m = -1;
        for (int r = 0; r < kept; r++) {
            int i = idx[r];
            double wi = w == null ? 1 : w[i];
            sumLog += Math.log(wi);
            if (m < 0 || x[i] != u[m]) {
                m++;
                u[m] = x[i];
            }
            // West's weighted running mean and sum of squares: stable for 1e5 rows per distinct x.
            double newWeight = wt[m] + wi;
            double delta = y[i] - mean[m];
            mean[m] += delta * wi / newWeight;
            within += wt[m] * wi * delta * delta / newWeight;
            wt[m] = newWeight;
            rows[m]++;
        }
        m++;
        return new DistinctData(Arrays.copyOf(u, m), Arrays.copyOf(wt, m), Arrays.copyOf(mean, m),
            Arrays.copyOf(rows, m), within, kept, sumLog);
    }

    /** Same x and weights, new per-x means (for the parametric bootstrap); within-x scatter is kept. */
    DistinctData withMeans(double[] newMeans) {
        return new DistinctData(u, weight, newMeans, rows, withinSumOfSquares, n, sumLogWeights);
    }

    /** The r-th smallest x among all rows (1-based, duplicates counted), as R's sort(x)[r]. */
    double orderStatistic(int r) {
        int seen = 0;
        for (int j = 0; j < u.length; j++) {
            seen += rows[j];
            if (seen >= r) {
                return u[j];
            }
        }
        return u[u.length - 1];
    }
}
