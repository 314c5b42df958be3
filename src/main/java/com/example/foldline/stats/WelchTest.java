package com.example.foldline.stats;

/**
 * Welch's unequal-variance t test for the difference of two means, from summary statistics (count, mean, sample
 * variance per group), so that it can run on rollups such as pages per session without the raw sessions.
 *
 * <p>Formulas: d = m₁ − m₂, SE = sqrt(v₁/n₁ + v₂/n₂), t = d/SE, Welch–Satterthwaite
 * df = SE⁴ / [(v₁/n₁)²/(n₁ − 1) + (v₂/n₂)²/(n₂ − 1)]; p-value from Student's t with that (fractional) df; the
 * confidence interval d ± t<sub>1−α/2, df</sub>·SE is always two-sided, whatever the alternative of the p-value.
 *
 * <p>Behaviour on thin data: a group with fewer than 2 observations has no variance estimate; the result then has NaN
 * t, degrees of freedom, p-value and limits (the difference is still reported when both groups have n ≥ 1). When both variances are 0,
 * SE = 0: a zero difference gives NaN t and p; a non-zero one gives t = ±∞, p = 0 (for the matching alternative) and a
 * zero-width interval. Negative counts or variances, non-finite input and α outside (0, 1) throw
 * {@link IllegalArgumentException}.
 *
 * <p>References: [1] Welch BL (1947) The generalization of "Student's" problem when several different population
 * variances are involved. <i>Biometrika</i> 34:28–35, doi:10.1093/biomet/34.1-2.28. [2] Satterthwaite FE (1946) An
 * approximate distribution of estimates of variance components. <i>Biometrics Bulletin</i> 2:110–114,
 * doi:10.2307/3002019.
 */
public final class WelchTest {

    private WelchTest() {
    }

    /**
     * Welch's t test from summary statistics.
     *
     * @param n1        observations in group 1
     * @param mean1     sample mean of group 1
     * @param variance1 sample variance (denominator n₁ − 1) of group 1
     * @param alpha     1 − confidence level of the interval, in (0, 1)
     */
    public static WelchResult fromSummary(long n1, double mean1, double variance1, long n2, double mean2,
                                          double variance2, double alpha, Alternative alternative) {
        checkGroup("1", n1, mean1, variance1);
        checkGroup("2", n2, mean2, variance2);
        Proportions.checkAlpha(alpha);
        if (alternative == null) {
            throw new IllegalArgumentException("alternative must not be null");
        }
        double d = n1 > 0 && n2 > 0 ? mean1 - mean2 : Double.NaN;
        if (n1 < 2 || n2 < 2) {
            return new WelchResult(d, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
                alternative);
        }
        double a = variance1 / n1;
        double b = variance2 / n2;
        double se = Math.sqrt(a + b);
        double df = (a + b) * (a + b) / (a * a / (n1 - 1) + b * b / (n2 - 1));
        if (se == 0) {
            if (d == 0) {
                return new WelchResult(0, 0, Double.NaN, Double.NaN, Double.NaN, 0, 0, alternative);
            }
            double t = Math.copySign(Double.POSITIVE_INFINITY, d);
            double p = switch (alternative) {
                case TWO_SIDED -> 0;
                case GREATER -> d > 0 ? 0 : 1;
                case LESS -> d < 0 ? 0 : 1;
            };
            return new WelchResult(d, 0, t, Double.NaN, p, d, d, alternative);
        }
        double t = d / se;
        double p = switch (alternative) {
            case TWO_SIDED -> Math.min(1, 2 * Distributions.studentTSurvival(Math.abs(t), df));
            case GREATER -> Distributions.studentTSurvival(t, df);
            case LESS -> Distributions.studentTCdf(t, df);
        };
        double q = Distributions.studentTQuantile(1 - alpha / 2, df);
        double pValue = p;
        return new WelchResult(d, se, t, df, pValue, d - q * se, d + q * se, alternative);
    }

    private static void checkGroup(String group, long n, double mean, double variance) {
        if (n < 0) {
            throw new IllegalArgumentException("n" + group + " must be >= 0, was " + n);
        }
        if (!Double.isFinite(mean)) {
            throw new IllegalArgumentException("mean" + group + " must be finite, was " + mean);
        }
        if (!(variance >= 0) || Double.isInfinite(variance)) {
            throw new IllegalArgumentException("variance" + group + " must be finite and >= 0, was " + variance);
        }
    }
}
