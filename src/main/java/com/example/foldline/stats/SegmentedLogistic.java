package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Segmented logistic regression for proportions (bounced sessions out of sessions per ads-per-page value): a binomial
 * GLM with logit link and one hinge term, logit p = b₀ + b₁x + d(x − ψ)₊.
 *
 * <ul>
 * <li><b>Fit</b>: iteratively reweighted least squares (McCullagh &amp; Nelder 1989, §4.4), each step a Householder-QR
 *     weighted LS, converged to a relative deviance change of 1e−13.</li>
 * <li><b>Breakpoint</b>: profile likelihood. The deviance D(ψ) is minimised separately on every interval between
 *     consecutive distinct x values (Brent's method inside the interval, plus both ends), the global minimum wins.
 *     Unlike the linear case there is no closed form inside an interval; Brent finds the interval's minimum when D is
 *     unimodal there, which it is in every case we have seen (it is smooth and nearly quadratic). Segments need at
 *     least {@link SegmentedOptions#minDistinctPerSegment()} distinct x values.</li>
 * <li><b>Number of breakpoints</b>: 0 or 1 (this implementation does not fit 2 or 3 logistic breakpoints), chosen by
 *     BIC = −2 logLik + ln(n)·(2 + 2k), ψ counted as in R's logLik for segmented GLMs.</li>
 * <li><b>SE(ψ)</b>: IRLS on the augmented design [1, x, (x − ψ̂)₊, −d̂·1{x &gt; ψ̂}] with dispersion 1; SE is that of the
 *     last coefficient. Interval ψ̂ ± t_{1−α/2, n−4}·SE (segmented uses the t quantile even for a GLM); slope intervals
 *     use the normal quantile, as segmented's slope() does for a GLM.</li>
 * <li><b>Davies test</b> (GLM version of segmented's davies.test): at each of K evaluation points (as the linear
 *     version) the signed root r = sign(d̂)·sqrt(D₀ − D(p)) of the deviance drop; V = Σ|Δr|; M = max|r|;
 *     p = 2·[Φ̄(M) + V·exp(−M²/2)/√(8π)] (two-sided; one-sided uses max r or min r without the factor 2), capped at 1.</li>
 * <li><b>Bootstrap</b> (optional): parametric, successes at each distinct x drawn from Binomial(trials, p̂(x)) under the
 *     fitted model, refit, percentile interval (see {@link Binomial} for the sampler).</li>
 * </ul>
 * logLik = Σ [ln C(nᵢ, sᵢ) + sᵢ ln p̂ᵢ + (nᵢ − sᵢ) ln(1 − p̂ᵢ)] over rows (R's logLik.glm for binomial with trials as
 * weights); rows with 0 trials are ignored. Thin data gives a {@link NoFit}: fewer than 2·minDistinctPerSegment
 * distinct x, fewer than 5 rows, no trials, or all successes / all failures.
 *
 * <p>References: [1] Muggeo VMR (2003) <i>Stat. Med.</i> 22:3055–3071, doi:10.1002/sim.1545. [2] McCullagh P, Nelder JA
 * (1989) <i>Generalized Linear Models</i>, 2nd ed., Chapman &amp; Hall, doi:10.1007/978-1-4899-3242-6. [3] Davies RB
 * (1987) <i>Biometrika</i> 74:33–43, doi:10.1093/biomet/74.1.33. [4] Brent RP (1973) <i>Algorithms for Minimization
 * without Derivatives</i>, Prentice-Hall, ch. 5.
 */
public final class SegmentedLogistic {

    private SegmentedLogistic() {
    }

    /** Aggregated binomial data per distinct x plus the rows (for logLik). */
    private record Data(double[] u, double[] s, double[] n, double[] rowX, double[] rowS, double[] rowN) {
        int size() {
            return u.length;
        }

        int rows() {
            return rowX.length;
        }
    }

    private record Glm(double[] beta, double deviance, double[] mu, double[][] unscaledCovariance, boolean fullRank) {
    }

    /**
     * Fits the segmented logistic model.
     *
     * @param x         predictor (e.g. ads per page), finite
     * @param successes successes per row (e.g. bounced sessions), 0 ≤ sᵢ ≤ nᵢ
     * @param trials    trials per row (e.g. sessions), ≥ 0; rows with 0 trials are ignored
     * @param options   options; maxBreakpoints above 1 is treated as 1, fixedBreakpoints must be −1, 0 or 1
     */
    public static SegmentedLogisticResult fit(double[] x, long[] successes, long[] trials, SegmentedOptions options) {
        Data data = validateAndAggregate(x, successes, trials, options);
        int h = options.minDistinctPerSegment();
        double totalTrials = Arrays.stream(data.n).sum();
        double totalSuccesses = Arrays.stream(data.s).sum();
        if (totalTrials == 0) {
            return new NoFit(NoFitReason.TOO_LITTLE_WEIGHT, "no trials");
        }
        if (totalTrials < options.minTotalWeight()) {
            return new NoFit(NoFitReason.TOO_LITTLE_WEIGHT, "total trials " + totalTrials + " below the minimum "
                + options.minTotalWeight());
        }
        if (data.size() < 2 * h) {
            return new NoFit(NoFitReason.TOO_FEW_DISTINCT_X, "only " + data.size()
                + " distinct x values; need at least " + 2 * h + " (" + h + " per segment)");
        }
        if (data.rows() < 5) {
            return new NoFit(NoFitReason.TOO_FEW_OBSERVATIONS, "only " + data.rows()
                + " rows with trials; need at least 5 for one breakpoint");
        }
        if (totalSuccesses == 0 || totalSuccesses == totalTrials) {
            return new NoFit(NoFitReason.NO_VARIATION, "all " + (long) totalTrials + " trials are "
                + (totalSuccesses == 0 ? "failures" : "successes") + "; the logistic fit has no finite maximum");
        }
        int fixed = options.fixedBreakpoints();
        int kMax = fixed >= 0 ? 1 : Math.min(1, options.maxBreakpoints());
        List<CandidateModel> candidates = new ArrayList<>();
        Glm line = irls(design(data, new double[0]), data, null);
        candidates.add(candidate(data, 0, new double[0], line));
        Profile best = null;
        if (kMax >= 1) {
            best = profile(data, h, line.beta());
            candidates.add(candidate(data, 1, new double[] {best.psi}, best.glm));
        }
        int chosen;
        String reason;
        if (fixed >= 0) {
            chosen = fixed;
            reason = "number of breakpoints fixed by the options (k = " + fixed + ")";
        } else {
            chosen = candidates.size() > 1 && candidates.get(1).bic() < candidates.get(0).bic() ? 1 : 0;
            StringBuilder sb = new StringBuilder("BIC is smallest for k = ").append(chosen).append(" (BIC by k:");
            for (CandidateModel c : candidates) {
                sb.append(' ').append(c.breakpoints()).append(": ").append(String.format("%.4f", c.bic()));
            }
            sb.append(')');
            if (options.maxBreakpoints() > 1) {
                sb.append("; the logistic fit considers at most 1 breakpoint");
            }
            reason = sb.toString();
        }
        DaviesTest davies = daviesTest(data, line.deviance(), options.daviesAlternative(), options.daviesPoints());
        CandidateModel chosenModel = candidates.get(chosen);
        int df = data.rows() - (2 + 2 * chosen);
        double z = Distributions.normalQuantile(1 - options.alpha() / 2);
        if (chosen == 0) {
            double[][] cov = line.unscaledCovariance();
            double se = Math.sqrt(cov[1][1]);
            List<Slope> slopes = List.of(new Slope(line.beta()[1], se, line.beta()[1] - z * se,
                line.beta()[1] + z * se));
            return new SegmentedLogisticFit(0, reason, line.beta()[0], List.of(), slopes, line.deviance(), df,
                data.rows(), data.size(), chosenModel.logLik(), chosenModel.aic(), chosenModel.bic(), candidates,
                davies, 0);
        }
        double psi = best.psi;
        double[] beta = best.glm.beta();
        // Augmented design [1, x, (x − ψ)₊, −d·1{x > ψ}], refit by IRLS with dispersion 1.
        double[][] aug = Arrays.copyOf(design(data, new double[] {psi}), 4);
        aug[3] = new double[data.size()];
        for (int j = 0; j < data.size(); j++) {
            aug[3][j] = data.u[j] > psi ? -beta[2] : 0;
        }
        Glm augFit = irls(aug, data, new double[] {beta[0], beta[1], beta[2], 0});
        double[][] cov = augFit.fullRank() ? augFit.unscaledCovariance() : null;
        double tq = Distributions.studentTQuantile(1 - options.alpha() / 2, df);
        double sePsi = cov == null ? Double.NaN : Math.sqrt(cov[3][3]);
        double[] boot = options.bootstrapResamples() > 0 ? bootstrap(data, best.glm.mu(), h, options) : null;
        double bl = boot == null || boot.length == 0 ? Double.NaN
            : SegmentedRegression.quantile(boot, options.alpha() / 2);
        double bu = boot == null || boot.length == 0 ? Double.NaN
            : SegmentedRegression.quantile(boot, 1 - options.alpha() / 2);
        Breakpoint bp = new Breakpoint(psi, beta[2], sePsi, psi - tq * sePsi, psi + tq * sePsi, bl, bu);
        double se1 = cov == null ? Double.NaN : Math.sqrt(cov[1][1]);
        double se2 = cov == null ? Double.NaN : Math.sqrt(cov[1][1] + cov[2][2] + 2 * cov[1][2]);
        double s1 = beta[1];
        double s2 = beta[1] + beta[2];
        List<Slope> slopes = List.of(new Slope(s1, se1, s1 - z * se1, s1 + z * se1),
            new Slope(s2, se2, s2 - z * se2, s2 + z * se2));
        return new SegmentedLogisticFit(1, reason, beta[0], List.of(bp), slopes, best.glm.deviance(), df,
            data.rows(), data.size(), chosenModel.logLik(), chosenModel.aic(), chosenModel.bic(), candidates, davies,
            boot == null ? 0 : boot.length);
    }

    private static CandidateModel candidate(Data data, int k, double[] psi, Glm glm) {
        double[] eta = linearPredictor(design(data, psi), glm.beta());
        double ll = 0;
        double dev = 0;
        for (int i = 0; i < data.rows(); i++) {
            double e = etaAt(data, eta, data.rowX[i]);
            double s = data.rowS[i];
            double n = data.rowN[i];
            double logP = -Math.log1p(Math.exp(-e));
            double log1mP = -Math.log1p(Math.exp(e));
            ll += Distributions.logGamma(n + 1) - Distributions.logGamma(s + 1) - Distributions.logGamma(n - s + 1)
                + s * logP + (n - s) * log1mP;
            dev += devianceTerm(s, n, 1 / (1 + Math.exp(-e)));
        }
        int params = 2 + 2 * k;
        return new CandidateModel(k, psi, dev, params, ll, -2 * ll + 2 * params,
            -2 * ll + Math.log(data.rows()) * params, true);
    }

    private static double etaAt(Data data, double[] eta, double x) {
        int j = Arrays.binarySearch(data.u, x);
        return eta[j];
    }

    // ------------------------------------------------------------------ profile likelihood over ψ

    private record Profile(double psi, Glm glm) {
    }

    private static Profile profile(Data data, int h, double[] start) {
        int m = data.size();
        Profile best = null;
        double[] warm = new double[] {start[0], start[1], 0};
        for (int j = h - 1; j <= m - 1 - h; j++) {
            double lo = data.u[j];
            double hi = data.u[j + 1];
            double[] w = warm;
            Minimum min = brent(psi -> irls(design(data, new double[] {psi}), data, w, false).deviance(), lo, hi);
            double[] cands = {lo, hi, min.x};
            for (double c : cands) {
                Glm g = irls(design(data, new double[] {c}), data, w, false);
                if (best == null || g.deviance() < best.glm.deviance()) {
                    best = new Profile(c, g);
                }
            }
            warm = best.glm.beta();
        }
        return best;
    }

    private record Minimum(double x, double f) {
    }

    /** Brent's minimisation on [a, b] (Brent 1973, ch. 5), absolute tolerance ~1e−10 of the interval scale. */
    private static Minimum brent(java.util.function.DoubleUnaryOperator f, double a, double b) {
        final double golden = 0.3819660112501051;
        double tolAbs = 1e-12 * Math.max(1, Math.max(Math.abs(a), Math.abs(b)));
        double x = a + golden * (b - a);
        double w = x;
        double v = x;
        double fx = f.applyAsDouble(x);
        double fw = fx;
        double fv = fx;
        double d = 0;
        double e = 0;
        for (int iter = 0; iter < 200; iter++) {
            double xm = 0.5 * (a + b);
            double tol1 = 1e-10 * Math.abs(x) + tolAbs;
            double tol2 = 2 * tol1;
            if (Math.abs(x - xm) <= tol2 - 0.5 * (b - a)) {
                break;
            }
            boolean golden_step = true;
            if (Math.abs(e) > tol1) {
                double r = (x - w) * (fx - fv);
                double q = (x - v) * (fx - fw);
                double p = (x - v) * q - (x - w) * r;
                q = 2 * (q - r);
                if (q > 0) {
                    p = -p;
                }
                q = Math.abs(q);
                double etemp = e;
                e = d;
                if (!(Math.abs(p) >= Math.abs(0.5 * q * etemp) || p <= q * (a - x) || p >= q * (b - x))) {
                    d = p / q;
                    double u = x + d;
                    if (u - a < tol2 || b - u < tol2) {
                        d = Math.copySign(tol1, xm - x);
                    }
                    golden_step = false;
                }
            }
            if (golden_step) {
                e = x >= xm ? a - x : b - x;
                d = golden * e;
            }
            double u = Math.abs(d) >= tol1 ? x + d : x + Math.copySign(tol1, d);
            double fu = f.applyAsDouble(u);
            if (fu <= fx) {
                if (u >= x) {
                    a = x;
                } else {
                    b = x;
                }
                v = w;
                fv = fw;
                w = x;
                fw = fx;
                x = u;
                fx = fu;
            } else {
                if (u < x) {
                    a = u;
                } else {
                    b = u;
                }
                if (fu <= fw || w == x) {
                    v = w;
                    fv = fw;
                    w = u;
                    fw = fu;
                } else if (fu <= fv || v == x || v == w) {
                    v = u;
                    fv = fu;
                }
            }
        }
        return new Minimum(x, fx);
    }

    // ------------------------------------------------------------------ IRLS

    /** Unscaled design columns [1, x, (x − ψ)₊…] on the distinct x values. */
    private static double[][] design(Data data, double[] psi) {
        int m = data.size();
        double[][] c = new double[2 + psi.length][m];
        for (int j = 0; j < m; j++) {
            c[0][j] = 1;
            c[1][j] = data.u[j];
            for (int l = 0; l < psi.length; l++) {
                c[2 + l][j] = data.u[j] > psi[l] ? data.u[j] - psi[l] : 0;
            }
        }
        return c;
    }

    private static double[] linearPredictor(double[][] cols, double[] beta) {
        double[] eta = new double[cols[0].length];
        for (int c = 0; c < cols.length; c++) {
            for (int j = 0; j < eta.length; j++) {
                eta[j] += beta[c] * cols[c][j];
            }
        }
        return eta;
    }

    private static double devianceTerm(double s, double n, double mu) {
        double d = 0;
        if (s > 0) {
            d += s * Math.log(s / (n * mu));
        }
        if (n - s > 0) {
            d += (n - s) * Math.log((n - s) / (n * (1 - mu)));
        }
        return 2 * d;
    }

    private static Glm irls(double[][] cols, Data data, double[] start) {
        return irls(cols, data, start, true);
    }

    /**
     * IRLS from {@code start} (or from the empirical logits). With {@code covariance} false the closing QR at the
     * estimate is skipped and the fit carries no covariance: the profile search and the Davies test need only the
     * deviance and the coefficients, and that QR is about a fifth of their cost. Rank deficiency is still detected by
     * the QR of the iterations.
     */
    private static Glm irls(double[][] cols, Data data, double[] start, boolean covariance) {
        int m = data.size();
        int p = cols.length;
        double[] eta;
        if (start != null && start.length == p) {
            eta = linearPredictor(cols, start);
        } else {
            eta = new double[m];
            for (int j = 0; j < m; j++) {
                double mu = (data.s[j] + 0.5) / (data.n[j] + 1);
                eta[j] = Math.log(mu / (1 - mu));
            }
        }
        double[] beta = start != null && start.length == p ? start.clone() : new double[p];
        double dev = deviance(data, eta);
        HouseholderQr qr = null;
        for (int iter = 0; iter < 100; iter++) {
            double[][] wc = new double[p][m];
            double[] wz = new double[m];
            for (int j = 0; j < m; j++) {
                double mu = 1 / (1 + Math.exp(-eta[j]));
                double var = Math.max(mu * (1 - mu), 1e-300);
                double sw = Math.sqrt(data.n[j] * var);
                double z = eta[j] + (data.s[j] / data.n[j] - mu) / var;
                for (int c = 0; c < p; c++) {
                    wc[c][j] = sw * cols[c][j];
                }
                wz[j] = sw * z;
            }
            qr = new HouseholderQr(wc);
            if (!qr.isFullRank()) {
                return new Glm(beta, dev, mus(eta), null, false);
            }
            beta = qr.solve(wz);
            eta = linearPredictor(cols, beta);
            double newDev = deviance(data, eta);
            boolean done = Math.abs(newDev - dev) <= 1e-13 * (Math.abs(newDev) + 0.1);
            dev = newDev;
            if (done) {
                break;
            }
        }
        if (!covariance) {
            return new Glm(beta, dev, mus(eta), null, true);
        }
        // Covariance at the final estimate (dispersion 1).
        double[][] wc = new double[p][m];
        for (int j = 0; j < m; j++) {
            double mu = 1 / (1 + Math.exp(-eta[j]));
            double sw = Math.sqrt(data.n[j] * Math.max(mu * (1 - mu), 1e-300));
            for (int c = 0; c < p; c++) {
                wc[c][j] = sw * cols[c][j];
            }
        }
        HouseholderQr last = new HouseholderQr(wc);
        boolean full = last.isFullRank();
        return new Glm(beta, dev, mus(eta), full ? last.unscaledCovariance() : null, full);
    }

    private static double[] mus(double[] eta) {
        double[] mu = new double[eta.length];
        for (int j = 0; j < eta.length; j++) {
            mu[j] = 1 / (1 + Math.exp(-eta[j]));
        }
        return mu;
    }

    private static double deviance(Data data, double[] eta) {
        double d = 0;
        for (int j = 0; j < eta.length; j++) {
            d += devianceTerm(data.s[j], data.n[j], 1 / (1 + Math.exp(-eta[j])));
        }
        return d;
    }

    // ------------------------------------------------------------------ Davies test (GLM)

    private static DaviesTest daviesTest(Data data, double dev0, Alternative alternative, int k) {
        int rows = data.rows();
        double[] sortedX = data.rowX.clone();
        Arrays.sort(sortedX);
        double lo = sortedX[1];
        double hi = sortedX[rows - 2];
        List<double[]> used = new ArrayList<>();
        for (int i = 0; i < k; i++) {
            double p = lo + (hi - lo) * i / (k - 1);
            double[][] base = design(data, new double[] {p});
            double[][] cols = {base[2], base[0], base[1]};
            Glm g = irls(cols, data, null, false);
            if (!g.fullRank()) {
                continue;
            }
            double r = Math.signum(g.beta()[0]) * Math.sqrt(Math.max(dev0 - g.deviance(), 0));
            used.add(new double[] {p, r});
        }
        double[] pts = used.stream().mapToDouble(a -> a[0]).toArray();
        double[] rs = used.stream().mapToDouble(a -> a[1]).toArray();
        if (pts.length == 0) {
            return new DaviesTest(Double.NaN, Double.NaN, Double.NaN, pts, rs, alternative);
        }
        double v = 0;
        for (int i = 1; i < rs.length; i++) {
            v += Math.abs(rs[i] - rs[i - 1]);
        }
        int best = SegmentedRegression.argBest(rs, alternative);
        double m = alternative == Alternative.TWO_SIDED ? Math.abs(rs[best]) : rs[best];
        double naive = alternative == Alternative.LESS ? Distributions.normalCdf(m) : Distributions.normalSurvival(m);
        double approx = v * Math.exp(-m * m / 2) / Math.sqrt(8 * Math.PI);
        double mult = alternative == Alternative.TWO_SIDED ? 2 : 1;
        return new DaviesTest(Math.min(1, mult * (naive + approx)), m, pts[best], pts, rs, alternative);
    }

    // ------------------------------------------------------------------ bootstrap

    private static double[] bootstrap(Data data, double[] mu, int h, SegmentedOptions options) {
        SplittableRandom random = new SplittableRandom(options.seed());
        double[] draws = new double[options.bootstrapResamples()];
        int ok = 0;
        for (int r = 0; r < draws.length; r++) {
            double[] s = new double[data.size()];
            double total = 0;
            for (int j = 0; j < s.length; j++) {
                s[j] = Binomial.draw(random, (long) data.n[j], mu[j]);
                total += s[j];
            }
            double trials = Arrays.stream(data.n).sum();
            if (total == 0 || total == trials) {
                continue;
            }
            // Rows are not needed for the profile; the aggregated counts stand in for them.
            Data sample = new Data(data.u, s, data.n, data.u, s, data.n);
            Glm line = irls(design(sample, new double[0]), sample, null, false);
            draws[ok++] = profile(sample, h, line.beta()).psi;
        }
        double[] result = Arrays.copyOf(draws, ok);
        Arrays.sort(result);
        return result;
    }

    // ------------------------------------------------------------------ validation

    private static Data validateAndAggregate(double[] x, long[] successes, long[] trials, SegmentedOptions options) {
        if (x == null || successes == null || trials == null) {
            throw new IllegalArgumentException("x, successes and trials must not be null");
        }
        if (options == null) {
            throw new IllegalArgumentException("options must not be null (use SegmentedOptions.defaults())");
        }
        if (options.fixedBreakpoints() > 1) {
            throw new IllegalArgumentException("the logistic fit supports 0 or 1 breakpoints, fixedBreakpoints was "
                + options.fixedBreakpoints());
        }
        if (successes.length != x.length || trials.length != x.length) {
            throw new IllegalArgumentException("x, successes and trials must have equal lengths, were " + x.length
                + ", " + successes.length + " and " + trials.length);
        }
        int rows = 0;
        for (int i = 0; i < x.length; i++) {
            if (!Double.isFinite(x[i])) {
                throw new IllegalArgumentException("x[" + i + "] must be finite, was " + x[i]);
            }
            if (trials[i] < 0) {
                throw new IllegalArgumentException("trials[" + i + "] must be >= 0, was " + trials[i]);
            }
            if (successes[i] < 0 || successes[i] > trials[i]) {
                throw new IllegalArgumentException("successes[" + i + "] must be in [0, trials[" + i + "] = "
                    + trials[i] + "], was " + successes[i]);
            }
            if (trials[i] > 0) {
                rows++;
            }
        }
        double[] rx = new double[rows];
        double[] rs = new double[rows];
        double[] rn = new double[rows];
        for (int i = 0, c = 0; i < x.length; i++) {
            if (trials[i] > 0) {
                rx[c] = x[i];
                rs[c] = successes[i];
                rn[c] = trials[i];
                c++;
            }
        }
        double[] u = Arrays.stream(rx).sorted().distinct().toArray();
        double[] s = new double[u.length];
        double[] n = new double[u.length];
        for (int i = 0; i < rows; i++) {
            int j = Arrays.binarySearch(u, rx[i]);
            s[j] += rs[i];
            n[j] += rn[i];
        }
        return new Data(u, s, n, rx, rs, rn);
    }
}
