package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Segmented (continuous piecewise-linear, "hinge") least-squares regression with 0–3 breakpoints, for finding the
 * number of ads per page beyond which bounce rate starts to climb.
 *
 * <p>Model: y = b₀ + b₁x + Σⱼ dⱼ(x − ψⱼ)₊ with weights w (sessions). Conventions follow R's {@code segmented} 1.6
 * (Muggeo 2003, 2008) so that results can be checked against it:
 * <ul>
 * <li><b>Breakpoints</b> are the global weighted least-squares optimum over all positions between data points, found
 *     exactly (see {@link HingeSearch}: closed form per interval for k = 1, exhaustive search over interval combinations
 *     for k = 2, 3 up to {@link SegmentedOptions#exactSearchLimit()} combinations, a documented heuristic above it).
 *     segmented's own iterative algorithm can stop at a local optimum; this one does not.</li>
 * <li><b>Segments</b> must each hold at least {@link SegmentedOptions#minDistinctPerSegment()} distinct x values
 *     (default 2): with ψ in [uⱼ, uⱼ₊₁], the left segment is u₁..uⱼ and the right one uⱼ₊₁..u_m.</li>
 * <li><b>Number of breakpoints</b>: the k in 0..maxBreakpoints with the smallest BIC = −2 logLik + ln(n)·(2 + 2k + 1)
 *     (R's logLik counts every ψ and σ). logLik = ½Σ ln wᵢ − n/2·(ln 2π + 1 − ln n + ln RSS) as R's logLik.lm.</li>
 * <li><b>SE(ψ)</b> (Muggeo 2003): refit weighted LS at the estimate with design [1, x, (x − ψ̂ⱼ)₊…, −d̂ⱼ·1{x &gt; ψ̂ⱼ}…];
 *     σ² = RSS/(n − 2 − 2k); SE(ψ̂ⱼ) is the standard error of the coefficient of −d̂ⱼ·1{x &gt; ψ̂ⱼ}. Delta interval
 *     ψ̂ ± t_{1−α/2, n−2−2k}·SE. Slope SEs come from the covariance of the same fit.</li>
 * <li><b>Bootstrap</b> percentile interval for each ψ (optional; Efron &amp; Tibshirani 1993): resamples drawn with a
 *     seeded {@link SplittableRandom} by the {@link BootstrapScheme}, refit with the same k; the α/2 and 1 − α/2
 *     sample quantiles (R type 7). For {@link BootstrapScheme#BINOMIAL} the count at each distinct x is drawn from
 *     Binomial(Σw, ŷ(x)) — exactly by inversion when Σw·p(1 − p) &lt; 100, otherwise from the normal approximation
 *     rounded to a whole count (its error is negligible for a percentile interval).</li>
 * <li><b>Davies test</b> (Davies 2002; segmented's davies.test for lm): see {@link #daviesTest}.</li>
 * <li><b>Naive F test</b> of the best one-breakpoint fit against the line, on (2, n − 4) df (for reporting only).</li>
 * </ul>
 *
 * <p>Input: x, y finite; w null (all 1) or finite and ≥ 0 (rows with w = 0 are ignored); equal lengths. Violations
 * throw {@link IllegalArgumentException} naming the field, index and value. Thin data is not an error: the result is
 * a {@link NoFit} when there are fewer than 2·minDistinctPerSegment distinct x values, fewer than 5 rows, or too little
 * total weight. A requested k that the data cannot support is also answered with {@link NoFit}.
 *
 * <p>Cost: the data are aggregated per distinct x first, so 100,000 rows with 13 distinct x values cost as much as 13
 * rows. With m distinct x values, k = 1 costs O(m²) (O(m) screening plus exact re-evaluation beyond ~2,000 values);
 * k = 2, 3 cost O(C·m) for C interval combinations (C ≈ m²/2 and m³/6).
 *
 * <p>References: [1] Muggeo VMR (2003) Estimating regression models with unknown break-points. <i>Stat. Med.</i>
 * 22:3055–3071, doi:10.1002/sim.1545. [2] Muggeo VMR (2008) segmented: an R package to fit regression models with
 * broken-line relationships. <i>R News</i> 8(1):20–25. [3] Davies RB (2002) Hypothesis testing when a nuisance
 * parameter is present only under the alternative: linear model case. <i>Biometrika</i> 89:484–489,
 * doi:10.1093/biomet/89.2.484. [4] Schwarz G (1978) Estimating the dimension of a model. <i>Ann. Stat.</i> 6:461–464,
 * doi:10.1214/aos/1176344136. [5] Efron B, Tibshirani RJ (1993) <i>An Introduction to the Bootstrap</i>. Chapman &amp;
 * Hall, doi:10.1007/978-1-4899-4541-9. [6] Bacon DW, Watts DG (1971) Estimating the transition between two
 * intersecting straight lines. <i>Biometrika</i> 58:525–534, doi:10.1093/biomet/58.3.525.
 */
public final class SegmentedRegression {

    private SegmentedRegression() {
    }

    /**
     * Fits the segmented model.
     *
     * @param x       predictor (e.g. ads per page), finite
     * @param y       response (e.g. bounce rate), finite
     * @param w       weights (e.g. sessions), finite and ≥ 0, or null for all 1
     * @param options options, see {@link SegmentedOptions#defaults()}
     */
    public static SegmentedResult fit(double[] x, double[] y, double[] w, SegmentedOptions options) {
        validate(x, y, w, options);
        DistinctData data = DistinctData.of(x, y, w);
        int h = options.minDistinctPerSegment();
        if (data.n == 0 || !(data.totalWeight > 0) || data.totalWeight < options.minTotalWeight()) {
            return new NoFit(NoFitReason.TOO_LITTLE_WEIGHT, "total weight " + data.totalWeight
                + " is below the minimum " + Math.max(options.minTotalWeight(), Double.MIN_VALUE));
        }
        if (data.size() < 2 * h) {
            return new NoFit(NoFitReason.TOO_FEW_DISTINCT_X, "only " + data.size()
                + " distinct x values; need at least " + 2 * h + " (" + h + " per segment)");
        }
        if (data.n < 5) {
            return new NoFit(NoFitReason.TOO_FEW_OBSERVATIONS, "only " + data.n
                + " rows with positive weight; need at least 5 for one breakpoint");
        }
        int fixed = options.fixedBreakpoints();
        if (fixed >= 0) {
            NoFit why = infeasible(data, fixed, h);
            if (why != null) {
                return why;
            }
        }
        HingeSearch search = new HingeSearch(data);
        List<CandidateModel> candidates = new ArrayList<>();
        int kMax = fixed >= 0 ? Math.max(fixed, Math.min(1, options.maxBreakpoints())) : options.maxBreakpoints();
        HingeSearch.Result[] results = new HingeSearch.Result[kMax + 1];
        for (int k = 0; k <= kMax; k++) {
            if (infeasible(data, k, h) != null) {
                break;
            }
            results[k] = search.search(k, h, options.exactSearchLimit());
            double rss = results[k].rss() + data.withinSumOfSquares;
            int params = 3 + 2 * k;
            double ll = logLik(data, rss);
            candidates.add(new CandidateModel(k, results[k].psi(), rss, params, ll, -2 * ll + 2 * params,
                -2 * ll + Math.log(data.n) * params, results[k].exact()));
        }
        int chosen;
        String reason;
        if (fixed >= 0) {
            chosen = fixed;
            reason = "number of breakpoints fixed by the options (k = " + fixed + ")";
        } else {
            CandidateModel best = candidates.get(0);
            for (CandidateModel c : candidates) {
                if (c.bic() < best.bic()) {
                    best = c;
                }
            }
            chosen = best.breakpoints();
            reason = selectionReason(candidates, chosen, options.maxBreakpoints());
        }
        FTest fTest = null;
        if (results.length > 1 && results[1] != null) {
            double rss0 = candidates.get(0).fitMeasure();
            double rss1 = candidates.get(1).fitMeasure();
            int df2 = data.n - 4;
            double f = ((rss0 - rss1) / 2) / (rss1 / df2);
            fTest = new FTest(f, 2, df2, Distributions.fSurvival(f, 2, df2));
        }
        DaviesTest davies = daviesTest(data, options.daviesAlternative(), options.daviesPoints());
        return details(data, search, results[chosen], chosen, reason, candidates, davies, fTest, options, x, y, w);
    }

    private static NoFit infeasible(DistinctData data, int k, int h) {
        if (!HingeSearch.feasible(data.size(), k, h)) {
            return new NoFit(NoFitReason.TOO_FEW_DISTINCT_X, "only " + data.size() + " distinct x values; "
                + k + " breakpoint(s) need at least " + (k + 1) * h + " (" + h + " per segment)");
        }
        if (data.n - (2 + 2 * k) < 1) {
            return new NoFit(NoFitReason.TOO_FEW_OBSERVATIONS, "only " + data.n + " rows with positive weight; "
                + k + " breakpoint(s) need at least " + (3 + 2 * k));
        }
        return null;
    }

    private static String selectionReason(List<CandidateModel> candidates, int chosen, int maxBreakpoints) {
        StringBuilder sb = new StringBuilder("BIC is smallest for k = ").append(chosen).append(" (BIC by k:");
        for (CandidateModel c : candidates) {
            sb.append(' ').append(c.breakpoints()).append(": ").append(String.format("%.4f", c.bic()));
        }
        sb.append(')');
        int considered = candidates.get(candidates.size() - 1).breakpoints();
        if (considered < maxBreakpoints) {
            sb.append("; k > ").append(considered).append(" not considered: too few distinct x values or rows");
        }
        return sb.toString();
    }

    /** R's logLik.lm with weights: ½Σ ln w − n/2·(ln 2π + 1 − ln n + ln RSS). */
    static double logLik(DistinctData data, double rss) {
        int n = data.n;
        return 0.5 * data.sumLogWeights - n / 2.0 * (Math.log(2 * Math.PI) + 1 - Math.log(n) + Math.log(rss));
    }

    private static SegmentedFit details(DistinctData data, HingeSearch search, HingeSearch.Result result, int k,
                                        String reason, List<CandidateModel> candidates, DaviesTest davies,
                                        FTest fTest, SegmentedOptions options, double[] x, double[] y, double[] w) {
        double[] psi = result.psi();
        double[] yv = search.scaledResponse();
        double[][] cols = search.columns(psi);
        HouseholderQr qr = new HouseholderQr(cols);
        double[] beta = qr.solve(yv);
        double rss = qr.residualSumOfSquares(yv) + data.withinSumOfSquares;
        int p = 2 + 2 * k;
        int df = data.n - p;
        double sigma = Math.sqrt(rss / df);
        double tq = Distributions.studentTQuantile(1 - options.alpha() / 2, df);
        // Muggeo's augmented design: the extra columns −dⱼ·1{x > ψⱼ} carry the information about ψⱼ.
        double[][] cov = null;
        if (k > 0) {
            double[][] aug = Arrays.copyOf(cols, 2 + 2 * k);
            for (int j = 0; j < k; j++) {
                double[] v = new double[data.size()];
                for (int i = 0; i < v.length; i++) {
                    v[i] = data.u[i] > psi[j] ? -beta[2 + j] * cols[0][i] : 0;
                }
                aug[2 + k + j] = v;
            }
            HouseholderQr augQr = new HouseholderQr(aug);
            if (augQr.isFullRank()) {
                cov = augQr.unscaledCovariance();
            }
        } else {
            cov = qr.unscaledCovariance();
        }
        double s2 = sigma * sigma;
        double[][] boot = k > 0 && options.bootstrapResamples() > 0
            ? bootstrap(data, beta, psi, k, options, x, y, w) : null;
        BootstrapScheme scheme = boot == null ? null : resolveScheme(options.bootstrapScheme(), y, w);
        List<Breakpoint> breakpoints = new ArrayList<>();
        for (int j = 0; j < k; j++) {
            double se = cov == null ? Double.NaN : Math.sqrt(s2 * cov[2 + k + j][2 + k + j]);
            double bl = Double.NaN;
            double bu = Double.NaN;
            if (boot != null && boot[j].length > 0) {
                bl = quantile(boot[j], options.alpha() / 2);
                bu = quantile(boot[j], 1 - options.alpha() / 2);
            }
            breakpoints.add(new Breakpoint(psi[j], beta[2 + j], se, psi[j] - tq * se, psi[j] + tq * se, bl, bu));
        }
        List<Slope> slopes = new ArrayList<>();
        for (int s = 0; s <= k; s++) {
            double slope = beta[1];
            for (int j = 0; j < s; j++) {
                slope += beta[2 + j];
            }
            double var = Double.NaN;
            if (cov != null) {
                // Var(b₁ + d₁ + … + d_s) from the covariance block of (b₁, d₁, …, d_k)
                var = 0;
                for (int a = 0; a <= s; a++) {
                    int ia = a == 0 ? 1 : 1 + a;
                    for (int b = 0; b <= s; b++) {
                        int ib = b == 0 ? 1 : 1 + b;
                        var += cov[ia][ib];
                    }
                }
                var *= s2;
            }
            double se = Math.sqrt(var);
            slopes.add(new Slope(slope, se, slope - tq * se, slope + tq * se));
        }
        CandidateModel chosen = candidates.stream().filter(c -> c.breakpoints() == k).findFirst().orElseThrow();
        int used = boot == null ? 0 : boot[0].length;
        return new SegmentedFit(k, reason, beta[0], breakpoints, slopes, rss, sigma, df, data.n, data.size(),
            chosen.logLik(), chosen.aic(), chosen.bic(), candidates, davies, fTest, result.exact(), used, scheme);
    }

    // ------------------------------------------------------------------ Davies test

    /**
     * Davies' test of "no change in slope" for the weighted linear model, as segmented's {@code davies.test} for lm
     * (n ≤ 300 branch, used for every n here). With K evaluation points equally spaced from the 2nd smallest to the 2nd
     * largest x (duplicates counted, as R's {@code sort(x)[2]}), fit y ~ (x − p)₊ + 1 + x at each point p (points whose
     * design is singular are dropped); t = b/SE(b) on df = n − 3; Z = b/sqrt([(XᵀWX)⁻¹]₁₁); r² = Z²/(Z² + RSS);
     * V = Σ|Δ asin(√r²)|; M = max|t| (two-sided), max t (greater) or min t (less); u = M²/(n − 3 + M²);
     * p = c·[P(T_df &gt; |M|) + V·(1 − u)^{(df−1)/2}·Γ(df/2 + ½)/(2Γ(df/2)√π)] with c = 2 for two-sided, 1 otherwise,
     * capped at 1.
     */
    public static DaviesTest daviesTest(double[] x, double[] y, double[] w, Alternative alternative, int points) {
        validate(x, y, w, SegmentedOptions.defaults());
        if (alternative == null) {
            throw new IllegalArgumentException("alternative must not be null");
        }
        if (points < 2) {
            throw new IllegalArgumentException("points must be >= 2, was " + points);
        }
        return daviesTest(DistinctData.of(x, y, w), alternative, points);
    }

    static DaviesTest daviesTest(DistinctData data, Alternative alternative, int k) {
        int n = data.n;
        int df = n - 3;
        if (df < 1 || data.size() < 3) {
            return new DaviesTest(Double.NaN, Double.NaN, Double.NaN, new double[0], new double[0], alternative);
        }
        double lo = data.orderStatistic(2);
        double hi = data.orderStatistic(n - 1);
        HingeSearch search = new HingeSearch(data);
        double[] yv = search.scaledResponse();
        double[][] base = search.columns(new double[0]);
        List<double[]> used = new ArrayList<>();
        for (int i = 0; i < k; i++) {
            double p = lo + (hi - lo) * i / (k - 1);
            double[] hinge = new double[data.size()];
            for (int j = 0; j < hinge.length; j++) {
                hinge[j] = data.u[j] > p ? base[0][j] * (data.u[j] - p) : 0;
            }
            HouseholderQr qr = new HouseholderQr(new double[][] {hinge, base[0], base[1]});
            if (!qr.isFullRank()) {
                continue;
            }
            double[] beta = qr.solve(yv);
            double rss = qr.residualSumOfSquares(yv) + data.withinSumOfSquares;
            double inv00 = qr.unscaledCovariance()[0][0];
            double sig = Math.sqrt(rss / df);
            double t = beta[0] / (sig * Math.sqrt(inv00));
            double z = beta[0] / Math.sqrt(inv00);
            used.add(new double[] {p, t, z * z / (z * z + rss)});
        }
        double[] pts = used.stream().mapToDouble(a -> a[0]).toArray();
        double[] ts = used.stream().mapToDouble(a -> a[1]).toArray();
        if (pts.length == 0) {
            return new DaviesTest(Double.NaN, Double.NaN, Double.NaN, pts, ts, alternative);
        }
        double v = 0;
        for (int i = 1; i < used.size(); i++) {
            v += Math.abs(Math.asin(Math.sqrt(used.get(i)[2])) - Math.asin(Math.sqrt(used.get(i - 1)[2])));
        }
        int best = argBest(ts, alternative);
        double m = alternative == Alternative.TWO_SIDED ? Math.abs(ts[best]) : ts[best];
        double naive = alternative == Alternative.LESS ? Distributions.studentTCdf(m, df)
            : Distributions.studentTSurvival(m, df);
        double u = m * m / ((n - 3) + m * m);
        double approx = v * Math.pow(1 - u, (df - 1) / 2.0)
            * Math.exp(Distributions.logGamma(df / 2.0 + 0.5) - Distributions.logGamma(df / 2.0)) / (2 * Math.sqrt(Math.PI));
        double mult = alternative == Alternative.TWO_SIDED ? 2 : 1;
        return new DaviesTest(Math.min(1, mult * (naive + approx)), m, pts[best], pts, ts, alternative);
    }

    static int argBest(double[] stats, Alternative alternative) {
        int best = 0;
        for (int i = 1; i < stats.length; i++) {
            boolean better = switch (alternative) {
                case TWO_SIDED -> Math.abs(stats[i]) > Math.abs(stats[best]);
                case GREATER -> stats[i] > stats[best];
                case LESS -> stats[i] < stats[best];
            };
            if (better) {
                best = i;
            }
        }
        return best;
    }

    // ------------------------------------------------------------------ bootstrap

    static BootstrapScheme resolveScheme(BootstrapScheme scheme, double[] y, double[] w) {
        if (scheme != BootstrapScheme.AUTO) {
            return scheme;
        }
        for (int i = 0; i < y.length; i++) {
            double wi = w == null ? 1 : w[i];
            if (y[i] < 0 || y[i] > 1 || wi != Math.rint(wi)) {
                return BootstrapScheme.CASES;
            }
        }
        return BootstrapScheme.BINOMIAL;
    }

    /** ψ* of every successful refit, one sorted array per breakpoint. */
    private static double[][] bootstrap(DistinctData data, double[] beta, double[] psi, int k, SegmentedOptions options,
                                         double[] x, double[] y, double[] w) {
        BootstrapScheme scheme = resolveScheme(options.bootstrapScheme(), y, w);
        SplittableRandom random = new SplittableRandom(options.seed());
        int h = options.minDistinctPerSegment();
        int resamples = options.bootstrapResamples();
        double[][] draws = new double[k][resamples];
        int ok = 0;
        int[] kept = null;
        if (scheme == BootstrapScheme.CASES) {
            kept = new int[data.n];
            for (int i = 0, c = 0; i < x.length; i++) {
                if (w == null || w[i] > 0) {
                    kept[c++] = i;
                }
            }
        } else {
            for (double wj : data.weight) {
                if (wj != Math.rint(wj)) {
                    throw new IllegalArgumentException("the BINOMIAL bootstrap needs whole-number weights (trials), got "
                        + wj);
                }
            }
        }
        double[] bx = kept == null ? null : new double[kept.length];
        double[] by = kept == null ? null : new double[kept.length];
        double[] bw = kept == null ? null : new double[kept.length];
        for (int r = 0; r < resamples; r++) {
            DistinctData sample;
            if (scheme == BootstrapScheme.BINOMIAL) {
                double[] means = new double[data.size()];
                for (int j = 0; j < means.length; j++) {
                    double fitted = beta[0] + beta[1] * data.u[j];
                    for (int l = 0; l < k; l++) {
                        fitted += data.u[j] > psi[l] ? beta[2 + l] * (data.u[j] - psi[l]) : 0;
                    }
                    long trials = (long) data.weight[j];
                    means[j] = Binomial.draw(random, trials, Math.min(1, Math.max(0, fitted))) / (double) trials;
                }
                sample = data.withMeans(means);
            } else {
                for (int i = 0; i < kept.length; i++) {
                    int pick = kept[random.nextInt(kept.length)];
                    bx[i] = x[pick];
                    by[i] = y[pick];
                    bw[i] = w == null ? 1 : w[pick];
                }
                sample = DistinctData.of(bx, by, bw);
                if (!HingeSearch.feasible(sample.size(), k, h)) {
                    continue;
                }
            }
            HingeSearch.Result res = new HingeSearch(sample).search(k, h, options.exactSearchLimit());
            for (int j = 0; j < k; j++) {
                draws[j][ok] = res.psi()[j];
            }
            ok++;
        }
        for (int j = 0; j < k; j++) {
            draws[j] = Arrays.copyOf(draws[j], ok);
            Arrays.sort(draws[j]);
        }
        return draws;
    }

    /** Sample quantile of sorted values, R type 7 (linear interpolation between order statistics). */
    static double quantile(double[] sorted, double prob) {
        if (sorted.length == 0) {
            return Double.NaN;
        }
        double h = (sorted.length - 1) * prob;
        int lo = (int) Math.floor(h);
        int hi = Math.min(lo + 1, sorted.length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    // ------------------------------------------------------------------ validation

    static void validate(double[] x, double[] y, double[] w, SegmentedOptions options) {
        if (x == null || y == null) {
            throw new IllegalArgumentException("x and y must not be null");
        }
        if (options == null) {
            throw new IllegalArgumentException("options must not be null (use SegmentedOptions.defaults())");
        }
        if (x.length != y.length) {
            throw new IllegalArgumentException("x and y must have equal lengths, were " + x.length + " and " + y.length);
        }
        if (w != null && w.length != x.length) {
            throw new IllegalArgumentException("w must have the length of x, " + x.length + ", was " + w.length);
        }
        for (int i = 0; i < x.length; i++) {
            if (!Double.isFinite(x[i])) {
                throw new IllegalArgumentException("x[" + i + "] must be finite, was " + x[i]);
            }
            if (!Double.isFinite(y[i])) {
                throw new IllegalArgumentException("y[" + i + "] must be finite, was " + y[i]);
            }
            if (w != null && (!(w[i] >= 0) || Double.isInfinite(w[i]))) {
                throw new IllegalArgumentException("w[" + i + "] must be finite and >= 0, was " + w[i]);
            }
        }
    }
}
