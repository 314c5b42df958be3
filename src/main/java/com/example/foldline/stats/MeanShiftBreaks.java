package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * Multiple breaks in the mean of a series (for example a daily bounce rate that steps up when a layout changes), found
 * by the dynamic programme of Bai and Perron [1] over cumulative sums, with the number of breaks chosen by BIC.
 *
 * <p>Model: y<sub>t</sub> = μ<sub>j</sub> + ε<sub>t</sub> for t in segment j, m breaks, m + 1 segments, each at least h
 * observations long. For each m = 0..M the partition with the smallest residual sum of squares RSS<sub>m</sub> is found
 * exactly (O(M·n²) time from cumulative sums of y and y², computed on y minus its mean to avoid cancellation).
 * Optional weights w<sub>t</sub> &gt; 0 (for example sessions per day) minimise Σ w<sub>t</sub>(y<sub>t</sub> −
 * μ<sub>j</sub>)² with weighted segment means.
 *
 * <p>Conventions follow R's strucchange {@code breakpoints()} [2]:
 * <ul>
 * <li>a breakpoint is the 1-based index of the <b>last</b> observation of a segment (equivalently the 0-based index of
 *     the first observation of the next one);</li>
 * <li>h = floor(trimming · n) with trimming 0.15 unless set; M = ceil(n/h) − 2 unless set (and never more breaks than
 *     fit: (m + 1)·h ≤ n);</li>
 * <li>logLik = −n/2 · (ln(2π·RSS/n) + 1) and BIC = −2 logLik + ln(n)·((m + 1)·k + m + 1) with k = 1 regressor (the
 *     mean) per segment; the m + 1 counts the break dates and σ². With weights (not in strucchange) logLik is R's
 *     {@code logLik.lm} for a weighted fit: ½ Σ ln w<sub>t</sub> − n/2 · (ln(2π·RSS<sub>w</sub>/n) + 1), n the number
 *     of observations;</li>
 * <li>ties in RSS (differences below 1e−11 of the total sum of squares, i.e. rounding) are broken toward the
 *     earliest last break date (which reproduces strucchange on the tied partitions of check case BP2), and ties in
 *     BIC toward fewer breaks.</li>
 * </ul>
 *
 * <p>Caveats: the model assumes independent errors with a common variance; autocorrelated series (typical for daily
 * web metrics) make BIC pick too many breaks. A perfectly fitting partition (RSS = 0) gives logLik = +∞ and BIC = −∞.
 * Empty input, non-finite values, non-positive weights or an h that leaves no room for one segment throw
 * {@link IllegalArgumentException}.
 *
 * <p>References: [1] Bai J, Perron P (2003) Computation and analysis of multiple structural change models.
 * <i>Journal of Applied Econometrics</i> 18:1–22, doi:10.1002/jae.659. [2] Zeileis A, Kleiber C, Krämer W, Hornik K
 * (2003) Testing and dating of structural changes in practice. <i>Computational Statistics &amp; Data Analysis</i>
 * 44:109–123, doi:10.1016/S0167-9473(03)00030-6.
 */
public final class MeanShiftBreaks {

    /**
     * Immutable options; {@link #defaults()}: trimming 0.15, h and M derived from n.
     *
     * @param trimming         fraction of n used for h when {@code minSegmentLength} is 0; in (0, 0.5]
     * @param minSegmentLength h ≥ 1, or 0 to derive it from {@code trimming}
     * @param maxBreaks        largest m to fit, or −1 for ceil(n/h) − 2
     */
    public record Options(double trimming, int minSegmentLength, int maxBreaks) {

        public Options {
            if (!(trimming > 0 && trimming <= 0.5)) {
                throw new IllegalArgumentException("trimming must be in (0, 0.5], was " + trimming);
            }
            if (minSegmentLength < 0) {
                throw new IllegalArgumentException("minSegmentLength must be >= 0 (0 = from trimming), was "
                    + minSegmentLength);
            }
            if (maxBreaks < -1) {
                throw new IllegalArgumentException("maxBreaks must be >= 0 (or -1 = as many as fit), was " + maxBreaks);
            }
        }

        public static Options defaults() {
            return new Options(0.15, 0, -1);
        }

        public Options withTrimming(double t) {
            return new Options(t, minSegmentLength, maxBreaks);
        }

        public Options withMinSegmentLength(int h) {
            return new Options(trimming, h, maxBreaks);
        }

        public Options withMaxBreaks(int m) {
            return new Options(trimming, minSegmentLength, m);
        }
    }

    /**
     * The best partition with a given number of breaks.
     *
     * @param breakCount   m
     * @param breakpoints  1-based index of the last observation of each of the first m segments, increasing
     * @param segmentMeans the (weighted) mean of each of the m + 1 segments
     * @param rss          (weighted) residual sum of squares
     * @param logLik       Gaussian log-likelihood (see the class documentation)
     * @param bic          Bayesian information criterion
     */
    public record Fit(int breakCount, int[] breakpoints, double[] segmentMeans, double rss, double logLik,
                      double bic) {

        public Fit {
            breakpoints = breakpoints.clone();
            segmentMeans = segmentMeans.clone();
        }

        @Override
        public int[] breakpoints() {
            return breakpoints.clone();
        }

        @Override
        public double[] segmentMeans() {
            return segmentMeans.clone();
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Fit f && breakCount == f.breakCount && Arrays.equals(breakpoints, f.breakpoints)
                && Arrays.equals(segmentMeans, f.segmentMeans) && Double.compare(rss, f.rss) == 0
                && Double.compare(logLik, f.logLik) == 0 && Double.compare(bic, f.bic) == 0;
        }

        @Override
        public int hashCode() {
            return Objects.hash(breakCount, Arrays.hashCode(breakpoints), Arrays.hashCode(segmentMeans), rss, logLik,
                bic);
        }

        @Override
        public String toString() {
            return "Fit[m=" + breakCount + ", breakpoints=" + Arrays.toString(breakpoints) + ", rss=" + rss
                + ", bic=" + bic + "]";
        }
    }

    /**
     * All fits m = 0..M and the one BIC selects.
     *
     * @param n                number of observations
     * @param minSegmentLength h used
     * @param fits             best fit per m, index = m
     * @param selected         the fit with the smallest BIC
     */
    public record Result(int n, int minSegmentLength, List<Fit> fits, Fit selected) {

        public Result {
            fits = List.copyOf(fits);
        }
    }

    private MeanShiftBreaks() {
    }

    /** Unweighted fit with {@link Options#defaults()}. */
    public static Result fit(double[] y) {
        return fit(y, null, Options.defaults());
    }

    /** Unweighted fit. */
    public static Result fit(double[] y, Options options) {
        return fit(y, null, options);
    }

    /**
     * Fits m = 0..M mean shifts.
     *
     * @param y       the series, finite values
     * @param weights positive finite weights of the same length, or {@code null} for equal weights
     * @throws IllegalArgumentException on empty or non-finite input, bad weights, or h &gt; n
     */
    public static Result fit(double[] y, double[] weights, Options options) {
        Objects.requireNonNull(y, "y");
        Objects.requireNonNull(options, "options");
        int n = y.length;
        if (n == 0) {
            throw new IllegalArgumentException("y must not be empty");
        }
        if (weights != null && weights.length != n) {
            throw new IllegalArgumentException("y and weights must have equal lengths, were " + n + " and "
                + weights.length);
        }
        for (int i = 0; i < n; i++) {
            if (!Double.isFinite(y[i])) {
                throw new IllegalArgumentException("y[" + i + "] must be finite, was " + y[i]);
            }
            if (weights != null && !(weights[i] > 0 && Double.isFinite(weights[i]))) {
                throw new IllegalArgumentException("weights[" + i + "] must be finite and > 0, was " + weights[i]);
            }
        }
        int h = options.minSegmentLength() > 0 ? options.minSegmentLength()
            : Math.max(1, (int) Math.floor(options.trimming() * n));
        if (h > n) {
            throw new IllegalArgumentException("minSegmentLength h = " + h + " exceeds the number of observations " + n);
        }
        int fitting = n / h - 1; // (m + 1)·h ≤ n
        int maxBreaks = options.maxBreaks() >= 0 ? Math.min(options.maxBreaks(), fitting)
            : Math.max(0, Math.min((int) Math.ceil((double) n / h) - 2, fitting));

        // Cumulative sums of w, w·y, w·y² on y centred at its weighted mean (RSS is shift-invariant).
        double sw = 0;
        double swy = 0;
        for (int i = 0; i < n; i++) {
            double w = weights == null ? 1 : weights[i];
            sw += w;
            swy += w * y[i];
        }
        double centre = swy / sw;
        double[] cw = new double[n + 1];
        double[] c1 = new double[n + 1];
        double[] c2 = new double[n + 1];
        double sumLogW = 0;
        for (int i = 0; i < n; i++) {
            double w = weights == null ? 1 : weights[i];
            double d = y[i] - centre;
            cw[i + 1] = cw[i] + w;
            c1[i + 1] = c1[i] + w * d;
            c2[i + 1] = c2[i] + w * d * d;
            sumLogW += Math.log(w);
        }
        SegmentCost cost = new SegmentCost(cw, c1, c2);
        // Partitions whose RSS differ by rounding only are ties (exact ties happen with rounded data, e.g. BP2 m = 3).
        double tie = 1e-11 * c2[n];

        // best[m][j]: smallest RSS of y[0, j) split into m + 1 segments of length ≥ h; from[m][j] the last break.
        double[][] best = new double[maxBreaks + 1][n + 1];
        int[][] from = new int[maxBreaks + 1][n + 1];
        for (double[] row : best) {
            Arrays.fill(row, Double.POSITIVE_INFINITY);
        }
        for (int j = h; j <= n; j++) {
            best[0][j] = cost.rss(0, j);
        }
        for (int m = 1; m <= maxBreaks; m++) {
            for (int j = (m + 1) * h; j <= n; j++) {
                double bestValue = Double.POSITIVE_INFINITY;
                int bestB = -1;
                for (int b = m * h; b <= j - h; b++) {
                    double v = best[m - 1][b] + cost.rss(b, j);
                    if (v < bestValue - tie) { // the earliest break date wins a tie
                        bestValue = v;
                        bestB = b;
                    }
                }
                best[m][j] = bestValue;
                from[m][j] = bestB;
            }
        }

        List<Fit> fits = new ArrayList<>(maxBreaks + 1);
        Fit selected = null;
        for (int m = 0; m <= maxBreaks; m++) {
            int[] bps = new int[m];
            int j = n;
            for (int k = m; k >= 1; k--) {
                j = from[k][j];
                bps[k - 1] = j;
            }
            double[] means = new double[m + 1];
            int start = 0;
            for (int s = 0; s <= m; s++) {
                int end = s < m ? bps[s] : n;
                means[s] = centre + cost.mean(start, end);
                start = end;
            }
            double rss = Math.max(0, best[m][n]);
            double logLik = -n / 2.0 * (Math.log(2 * Math.PI * rss / n) + 1) + (weights == null ? 0 : 0.5 * sumLogW);
            double bic = -2 * logLik + Math.log(n) * ((m + 1) + m + 1);
            Fit fit = new Fit(m, bps, means, rss, logLik, bic);
            fits.add(fit);
            if (selected == null || bic < selected.bic()) {
                selected = fit;
            }
        }
        return new Result(n, h, fits, selected);
    }

    /** Weighted RSS and mean of y[i, j) from cumulative sums. */
    private record SegmentCost(double[] cw, double[] c1, double[] c2) {

        double rss(int i, int j) {
            double w = cw[j] - cw[i];
            double s = c1[j] - c1[i];
            return (c2[j] - c2[i]) - s * s / w;
        }

        double mean(int i, int j) {
            return (c1[j] - c1[i]) / (cw[j] - cw[i]);
        }
    }
}
