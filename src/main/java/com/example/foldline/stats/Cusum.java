package com.example.foldline.stats;

import java.util.Arrays;
import java.util.Objects;
import java.util.Optional;

/**
 * Tabular (two-sided) CUSUM charts for alerting on a shift in a metric: on raw values with a known target and σ, and
 * standardised on daily (or hourly) rates k<sub>t</sub>/n<sub>t</sub> such as the bounce rate, against a baseline
 * rate p<sub>0</sub>. Also the average run length of the chart under normal observations.
 *
 * <p>Recursion (Page 1954 [1]; Montgomery [2], Sec. 9.1), on standardised values z<sub>t</sub>:
 * C⁺<sub>t</sub> = max(0, C⁺<sub>t−1</sub> + z<sub>t</sub> − k), C⁻<sub>t</sub> = max(0, C⁻<sub>t−1</sub> − z<sub>t</sub>
 * − k), C<sub>0</sub> = 0; a signal when C⁺ or C⁻ exceeds h (strictly). N⁺ and N⁻ count the consecutive periods with
 * C &gt; 0; at a signal the shift is dated to start N periods before it. The chart is not reset after a signal.
 * <ul>
 * <li>{@link #tabular}: z<sub>t</sub> = (x<sub>t</sub> − μ<sub>0</sub>)/σ, so K = kσ and H = hσ as in Montgomery's
 *     tables; the estimated new mean at a signal is μ<sub>0</sub> + K + σ·C⁺/N⁺ (upper) or μ<sub>0</sub> − K −
 *     σ·C⁻/N⁻ (lower) [2].</li>
 * <li>{@link #rates}: z<sub>t</sub> = (k<sub>t</sub>/n<sub>t</sub> − p<sub>0</sub>)/√(p<sub>0</sub>(1 −
 *     p<sub>0</sub>)/n<sub>t</sub>), the normal approximation to the binomial (fine when n<sub>t</sub>p<sub>0</sub>
 *     and n<sub>t</sub>(1 − p<sub>0</sub>) are both above about 10; for tiny counts the false-alarm rate is not the
 *     nominal one). The estimated new rate at a signal is the pooled rate Σk/Σn over the N periods of the run. A
 *     period with n<sub>t</sub> = 0 has no information: z is NaN and C⁺, C⁻, N⁺, N⁻ carry over unchanged.</li>
 * <li>{@link #averageRunLength}: the one-sided ARL solves the integral equation of Page [1] / Brook &amp; Evans [3]
 *     by Nyström's method with Gauss–Legendre nodes on [0, h] plus the atom at 0; the two-sided ARL combines the two
 *     one-sided ones as 1/L = 1/L⁺ + 1/L⁻ (Lucas &amp; Crosier [4]).</li>
 * </ul>
 * Non-finite values, σ ≤ 0, negative counts, successes above trials or p<sub>0</sub> outside (0, 1) throw
 * {@link IllegalArgumentException}; an empty series gives empty arrays and no signal.
 *
 * <p>References: [1] Page ES (1954) Continuous inspection schemes. <i>Biometrika</i> 41:100–115,
 * doi:10.1093/biomet/41.1-2.100. [2] Montgomery DC (2013) <i>Introduction to Statistical Quality Control</i>, 7th ed.,
 * Wiley, Sec. 9.1 (Example 9.1). [3] Brook D, Evans DA (1972) An approach to the probability distribution of CUSUM run
 * length. <i>Biometrika</i> 59:539–549, doi:10.1093/biomet/59.3.539. [4] Lucas JM, Crosier RB (1982) Fast initial
 * response for CUSUM quality-control schemes: give your CUSUM a head start. <i>Technometrics</i> 24:199–205,
 * doi:10.1080/00401706.1982.10487759.
 */
public final class Cusum {

    /** Which one-sided chart signalled. */
    public enum Side {
        /** C⁺: the level went up. */
        UPPER,
        /** C⁻: the level went down. */
        LOWER
    }

    /**
     * Immutable options; {@link #defaults()}: k = 0.5, h = 5 (in σ units; Montgomery's usual design, in-control
     * two-sided ARL ≈ 465).
     *
     * @param k reference value (allowance), half the shift to detect, in σ units, ≥ 0
     * @param h decision interval in σ units, &gt; 0
     */
    public record Options(double k, double h) {

        public Options {
            if (!(k >= 0) || Double.isInfinite(k)) {
                throw new IllegalArgumentException("k must be finite and >= 0, was " + k);
            }
            if (!(h > 0) || Double.isInfinite(h)) {
                throw new IllegalArgumentException("h must be finite and > 0, was " + h);
            }
        }

        public static Options defaults() {
            return new Options(0.5, 5);
        }

        public Options withK(double value) {
            return new Options(value, h);
        }

        public Options withH(double value) {
            return new Options(k, value);
        }
    }

    /**
     * The first signal of a chart.
     *
     * @param index            0-based index of the period that signalled
     * @param side             which side
     * @param runLength        N⁺ or N⁻ at the signal
     * @param changeStartIndex 0-based index of the first period of the run (index − runLength + 1 when no period in
     *                         between had zero trials)
     * @param estimatedLevel   estimated new mean ({@link #tabular}) or new rate ({@link #rates})
     */
    public record Signal(int index, Side side, int runLength, int changeStartIndex, double estimatedLevel) {
    }

    /**
     * The chart. Arrays are indexed like the input.
     *
     * @param z          standardised values (NaN for a rate period with no trials)
     * @param upper      C⁺ after each period
     * @param lower      C⁻ after each period
     * @param upperCount N⁺ after each period
     * @param lowerCount N⁻ after each period
     * @param firstSignal the first period where C⁺ &gt; h or C⁻ &gt; h, if any (upper wins a tie)
     */
    public record Result(double[] z, double[] upper, double[] lower, int[] upperCount, int[] lowerCount,
                         Optional<Signal> firstSignal) {

        public Result {
            z = z.clone();
            upper = upper.clone();
            lower = lower.clone();
            upperCount = upperCount.clone();
            lowerCount = lowerCount.clone();
        }

        @Override
        public double[] z() {
            return z.clone();
        }

        @Override
        public double[] upper() {
            return upper.clone();
        }

        @Override
        public double[] lower() {
            return lower.clone();
        }

        @Override
        public int[] upperCount() {
            return upperCount.clone();
        }

        @Override
        public int[] lowerCount() {
            return lowerCount.clone();
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Result r && Arrays.equals(z, r.z) && Arrays.equals(upper, r.upper)
                && Arrays.equals(lower, r.lower) && Arrays.equals(upperCount, r.upperCount)
                && Arrays.equals(lowerCount, r.lowerCount) && firstSignal.equals(r.firstSignal);
        }

        @Override
        public int hashCode() {
            return Objects.hash(Arrays.hashCode(z), Arrays.hashCode(upper), Arrays.hashCode(lower),
                Arrays.hashCode(upperCount), Arrays.hashCode(lowerCount), firstSignal);
        }

        @Override
        public String toString() {
            return "Result[n=" + z.length + ", firstSignal=" + firstSignal + "]";
        }
    }

    private Cusum() {
    }

    /**
     * Tabular CUSUM of raw values against a target μ<sub>0</sub> with known σ.
     *
     * @throws IllegalArgumentException if a value, the target or σ is not finite, or σ ≤ 0
     */
    public static Result tabular(double[] x, double target, double sigma, Options options) {
        Objects.requireNonNull(x, "x");
        Objects.requireNonNull(options, "options");
        if (!Double.isFinite(target)) {
            throw new IllegalArgumentException("target must be finite, was " + target);
        }
        if (!(sigma > 0) || Double.isInfinite(sigma)) {
            throw new IllegalArgumentException("sigma must be finite and > 0, was " + sigma);
        }
        double[] z = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            if (!Double.isFinite(x[i])) {
                throw new IllegalArgumentException("x[" + i + "] must be finite, was " + x[i]);
            }
            z[i] = (x[i] - target) / sigma;
        }
        return run(z, options, (side, start, end, runLength, c) -> side == Side.UPPER
            ? target + sigma * (options.k() + c / runLength)
            : target - sigma * (options.k() + c / runLength));
    }

    /**
     * Standardised CUSUM of the rates successes/trials against a baseline rate p<sub>0</sub>.
     *
     * @throws IllegalArgumentException on unequal lengths, negative counts, successes above trials, or p<sub>0</sub>
     *                                  outside (0, 1)
     */
    public static Result rates(long[] successes, long[] trials, double baselineRate, Options options) {
        Objects.requireNonNull(successes, "successes");
        Objects.requireNonNull(trials, "trials");
        Objects.requireNonNull(options, "options");
        if (successes.length != trials.length) {
            throw new IllegalArgumentException("successes and trials must have equal lengths, were "
                + successes.length + " and " + trials.length);
        }
        if (!(baselineRate > 0 && baselineRate < 1)) {
            throw new IllegalArgumentException("baselineRate must be in (0, 1), was " + baselineRate);
        }
        double[] z = new double[successes.length];
        for (int i = 0; i < z.length; i++) {
            checkCounts(i, successes[i], trials[i]);
            z[i] = trials[i] == 0 ? Double.NaN
                : ((double) successes[i] / trials[i] - baselineRate)
                    / Math.sqrt(baselineRate * (1 - baselineRate) / trials[i]);
        }
        return run(z, options, (side, start, end, runLength, c) -> {
            long k = 0;
            long n = 0;
            for (int i = start; i <= end; i++) {
                k += successes[i];
                n += trials[i];
            }
            return (double) k / n;
        });
    }

    static void checkCounts(int i, long successes, long trials) {
        if (trials < 0) {
            throw new IllegalArgumentException("trials[" + i + "] must be >= 0, was " + trials);
        }
        if (successes < 0) {
            throw new IllegalArgumentException("successes[" + i + "] must be >= 0, was " + successes);
        }
        if (successes > trials) {
            throw new IllegalArgumentException("successes[" + i + "] = " + successes + " exceeds trials[" + i + "] = "
                + trials);
        }
    }

    @FunctionalInterface
    private interface LevelEstimate {
        double at(Side side, int start, int end, int runLength, double statistic);
    }

    private static Result run(double[] z, Options options, LevelEstimate estimate) {
        int n = z.length;
        double[] up = new double[n];
        double[] lo = new double[n];
        int[] nu = new int[n];
        int[] nl = new int[n];
        double cp = 0;
        double cm = 0;
        int np = 0;
        int nm = 0;
        Signal first = null;
        for (int i = 0; i < n; i++) {
            if (!Double.isNaN(z[i])) {
                cp = Math.max(0, cp + z[i] - options.k());
                cm = Math.max(0, cm - z[i] - options.k());
                np = cp > 0 ? np + 1 : 0;
                nm = cm > 0 ? nm + 1 : 0;
            }
            up[i] = cp;
            lo[i] = cm;
            nu[i] = np;
            nl[i] = nm;
            if (first == null && (cp > options.h() || cm > options.h())) {
                Side side = cp > options.h() ? Side.UPPER : Side.LOWER;
                int runLength = side == Side.UPPER ? np : nm;
                double c = side == Side.UPPER ? cp : cm;
                int start = i;
                for (int seen = 1; seen < runLength; ) { // count back informative (non-NaN) periods only
                    start--;
                    if (!Double.isNaN(z[start])) {
                        seen++;
                    }
                }
                first = new Signal(i, side, runLength, start, estimate.at(side, start, i, runLength, c));
            }
        }
        return new Result(z, up, lo, nu, nl, Optional.ofNullable(first));
    }

    // ------------------------------------------------------------------ average run length

    /** Default number of Gauss–Legendre nodes for {@link #averageRunLength}. */
    static final int ARL_NODES = 48;

    /**
     * Average run length of the CUSUM chart with reference value k and decision interval h (σ units) when the
     * observations are N(shift, 1), i.e. the mean is {@code shift} σ away from the target.
     *
     * @param twoSided both charts (1/L = 1/L⁺ + 1/L⁻) or only the upper one
     * @throws IllegalArgumentException for non-finite arguments, k &lt; 0 or h ≤ 0
     */
    public static double averageRunLength(double k, double h, double shift, boolean twoSided) {
        new Options(k, h); // argument checks
        if (!Double.isFinite(shift)) {
            throw new IllegalArgumentException("shift must be finite, was " + shift);
        }
        double upper = oneSidedArl(k, h, shift, ARL_NODES);
        if (!twoSided) {
            return upper;
        }
        double lower = oneSidedArl(k, h, -shift, ARL_NODES);
        return 1 / (1 / upper + 1 / lower);
    }

    /**
     * ARL of the upper chart from L(u) = 1 + Φ(k − u − μ)·L(0) + ∫<sub>0</sub><sup>h</sup> φ(y + k − u − μ) L(y) dy,
     * discretised at u = 0 and the Gauss–Legendre nodes (the atom at 0 makes L(0) a separate unknown).
     */
    static double oneSidedArl(double k, double h, double mu, int nodes) {
        double[][] gl = GaussLegendre.rule(nodes, 0, h);
        double[] z = gl[0];
        double[] w = gl[1];
        int size = nodes + 1;
        double[][] a = new double[size][size + 1];
        for (int row = 0; row < size; row++) {
            double u = row == 0 ? 0 : z[row - 1];
            a[row][0] = (row == 0 ? 1 : 0) - Distributions.normalCdf(k - u - mu);
            for (int j = 0; j < nodes; j++) {
                a[row][j + 1] = (row == j + 1 ? 1 : 0) - w[j] * Distributions.normalDensity(z[j] + k - u - mu);
            }
            a[row][size] = 1;
        }
        return solve(a)[0];
    }

    /** Solves the augmented system by Gaussian elimination with partial pivoting. */
    private static double[] solve(double[][] a) {
        int n = a.length;
        for (int c = 0; c < n; c++) {
            int p = c;
            for (int r = c + 1; r < n; r++) {
                if (Math.abs(a[r][c]) > Math.abs(a[p][c])) {
                    p = r;
                }
            }
            double[] tmp = a[c];
            a[c] = a[p];
            a[p] = tmp;
            for (int r = c + 1; r < n; r++) {
                double f = a[r][c] / a[c][c];
                for (int j = c; j <= n; j++) {
                    a[r][j] -= f * a[c][j];
                }
            }
        }
        double[] x = new double[n];
        for (int r = n - 1; r >= 0; r--) {
            double s = a[r][n];
            for (int j = r + 1; j < n; j++) {
                s -= a[r][j] * x[j];
            }
            x[r] = s / a[r][r];
        }
        return x;
    }
}
