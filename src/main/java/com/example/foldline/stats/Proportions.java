package com.example.foldline.stats;

/**
 * Confidence intervals and tests for binomial proportions such as bounce rates, taken as counts (successes x out of
 * trials n), never as pre-divided rates.
 *
 * <p>Formulas, with z = Φ⁻¹(1 − α/2) and p̂ = x/n:
 * <ul>
 * <li>Wilson [1]: (p̂ + z²/2n ± z·sqrt(p̂(1 − p̂)/n + z²/4n²)) / (1 + z²/n).</li>
 * <li>Clopper–Pearson [2]: lower = B⁻¹(α/2; x, n − x + 1) (0 when x = 0), upper = B⁻¹(1 − α/2; x + 1, n − x)
 *     (1 when x = n), with B⁻¹ the beta quantile.</li>
 * <li>Agresti–Coull [3]: ñ = n + z², p̃ = (x + z²/2)/ñ, p̃ ± z·sqrt(p̃(1 − p̃)/ñ), clipped to [0, 1] (as statsmodels does;
 *     the raw formula can leave [0, 1] for x near 0 or n).</li>
 * <li>Newcombe's hybrid score interval for p₁ − p₂ [4, method 10], from the Wilson limits (lᵢ, uᵢ):
 *     lower = d − sqrt((p̂₁ − l₁)² + (u₂ − p̂₂)²), upper = d + sqrt((u₁ − p̂₁)² + (p̂₂ − l₂)²).</li>
 * <li>Pooled two-proportion z test: z = (p̂₁ − p̂₂)/sqrt(p̄(1 − p̄)(1/n₁ + 1/n₂)), p̄ = (x₁ + x₂)/(n₁ + n₂); the
 *     two-sided version is Pearson's χ² test of the 2×2 table without continuity correction (z² = χ²).</li>
 * </ul>
 *
 * <p>Behaviour on thin data: n = 0 is an answer, not an error: single-proportion intervals are [0, 1] with a NaN
 * estimate, the difference interval is [−1, 1] with a NaN difference, the z test returns NaN z and p-value. Invalid
 * input (negative counts, x &gt; n, α outside (0, 1)) throws {@link IllegalArgumentException} naming the values.
 *
 * <p>References: [1] Wilson EB (1927) <i>J. Am. Stat. Assoc.</i> 22:209–212, doi:10.1080/01621459.1927.10502953.
 * [2] Clopper CJ, Pearson ES (1934) <i>Biometrika</i> 26:404–413, doi:10.1093/biomet/26.4.404. [3] Agresti A, Coull BA
 * (1998) Approximate is better than "exact" for interval estimation of binomial proportions. <i>Am. Stat.</i>
 * 52:119–126, doi:10.1080/00031305.1998.10480550. [4] Newcombe RG (1998) Interval estimation for the difference between
 * independent proportions: comparison of eleven methods. <i>Stat. Med.</i> 17:873–890,
 * doi:10.1002/(SICI)1097-0258(19980430)17:8&lt;873::AID-SIM779&gt;3.0.CO;2-I. [5] Newcombe RG (1998) Two-sided confidence
 * intervals for the single proportion: comparison of seven methods. <i>Stat. Med.</i> 17:857–872,
 * doi:10.1002/(SICI)1097-0258(19980430)17:8&lt;857::AID-SIM777&gt;3.0.CO;2-E.
 */
public final class Proportions {

    private static final String NEWCOMBE = "Newcombe hybrid score (method 10)";

    private Proportions() {
    }

    /**
     * A two-sided 1 − α confidence interval for a single proportion by the given method.
     *
     * @param successes number of successes x, 0 ≤ x ≤ n
     * @param trials    number of trials n ≥ 0; n = 0 gives [0, 1] with a NaN estimate
     * @param alpha     1 − confidence level, in (0, 1)
     */
    public static ProportionInterval interval(ProportionMethod method, long successes, long trials, double alpha) {
        if (method == null) {
            throw new IllegalArgumentException("method must not be null");
        }
        return switch (method) {
            case WILSON -> wilson(successes, trials, alpha);
            case CLOPPER_PEARSON -> clopperPearson(successes, trials, alpha);
            case AGRESTI_COULL -> agrestiCoull(successes, trials, alpha);
        };
    }

    /** Wilson score interval without continuity correction (see the class comment). */
    public static ProportionInterval wilson(long successes, long trials, double alpha) {
        checkCounts("successes", successes, "trials", trials);
        double z = zFor(alpha);
        if (trials == 0) {
            return new ProportionInterval(0, 1, Double.NaN, ProportionMethod.WILSON);
        }
        double n = trials;
        double p = successes / n;
        double z2 = z * z;
        double centre = (p + z2 / (2 * n)) / (1 + z2 / n);
        double half = z * Math.sqrt(p * (1 - p) / n + z2 / (4 * n * n)) / (1 + z2 / n);
        // At x = 0 or x = n one limit is exactly 0 or 1 mathematically; avoid a rounding residue like 1e−17.
        double lower = successes == 0 ? 0 : Math.max(0, centre - half);
        double upper = successes == trials ? 1 : Math.min(1, centre + half);
        return new ProportionInterval(lower, upper, p, ProportionMethod.WILSON);
    }

    /** Clopper–Pearson ("exact") interval from beta quantiles (see the class comment). */
    public static ProportionInterval clopperPearson(long successes, long trials, double alpha) {
        checkCounts("successes", successes, "trials", trials);
        checkAlpha(alpha);
        if (trials == 0) {
            return new ProportionInterval(0, 1, Double.NaN, ProportionMethod.CLOPPER_PEARSON);
        }
        double x = successes;
        double n = trials;
        // x = 0 and x = n have closed forms, (α/2)^{1/n}; expm1 keeps them exact for n of size 1e9, where the general
        // beta quantile is only good to ~1e−8 relative (see Distributions).
        double lower;
        if (successes == 0) {
            lower = 0;
        } else if (successes == trials) {
            lower = Math.exp(Math.log(alpha / 2) / n);
        } else {
            lower = Distributions.betaQuantile(alpha / 2, x, n - x + 1);
        }
        double upper;
        if (successes == trials) {
            upper = 1;
        } else if (successes == 0) {
            upper = -Math.expm1(Math.log(alpha / 2) / n);
        } else {
            upper = Distributions.betaQuantile(1 - alpha / 2, x + 1, n - x);
        }
        return new ProportionInterval(lower, upper, x / n, ProportionMethod.CLOPPER_PEARSON);
    }

    /** Agresti–Coull interval, clipped to [0, 1] (see the class comment). */
    public static ProportionInterval agrestiCoull(long successes, long trials, double alpha) {
        checkCounts("successes", successes, "trials", trials);
        double z = zFor(alpha);
        if (trials == 0) {
            return new ProportionInterval(0, 1, Double.NaN, ProportionMethod.AGRESTI_COULL);
        }
        double z2 = z * z;
        double nTilde = trials + z2;
        double pTilde = (successes + z2 / 2) / nTilde;
        double half = z * Math.sqrt(pTilde * (1 - pTilde) / nTilde);
        double lower = Math.max(0, pTilde - half);
        double upper = Math.min(1, pTilde + half);
        return new ProportionInterval(lower, upper, (double) successes / trials, ProportionMethod.AGRESTI_COULL);
    }

    /**
     * Newcombe's hybrid score interval (method 10 of Newcombe 1998b) for p₁ − p₂. A group with no trials contributes
     * its whole Wilson interval [0, 1], so with n₁ = 0 or n₂ = 0 the result is still a valid (wide) interval and the
     * difference is NaN; with both empty it is [−1, 1].
     */
    public static ProportionDifference newcombeDifference(long x1, long n1, long x2, long n2, double alpha) {
        checkCounts("x1", x1, "n1", n1);
        checkCounts("x2", x2, "n2", n2);
        ProportionInterval w1 = wilson(x1, n1, alpha);
        ProportionInterval w2 = wilson(x2, n2, alpha);
        if (n1 == 0 || n2 == 0) {
            // No point estimate: fall back to the set of differences compatible with both intervals.
            return new ProportionDifference(Double.NaN, w1.lower() - w2.upper(), w1.upper() - w2.lower(), NEWCOMBE);
        }
        double p1 = w1.estimate();
        double p2 = w2.estimate();
        double d = p1 - p2;
        double lower = d - Math.hypot(p1 - w1.lower(), w2.upper() - p2);
        double upper = d + Math.hypot(w1.upper() - p1, p2 - w2.lower());
        return new ProportionDifference(d, Math.max(-1, lower), Math.min(1, upper), NEWCOMBE);
    }

    /**
     * Pooled two-proportion z test of H₀: p₁ = p₂ (see the class comment). When both groups are all successes or all
     * failures the difference is exactly 0 and the result is z = 0, p = 1; when a group has no trials z and p are NaN.
     */
    public static ZTestResult twoProportionZTest(long x1, long n1, long x2, long n2, Alternative alternative) {
        checkCounts("x1", x1, "n1", n1);
        checkCounts("x2", x2, "n2", n2);
        if (alternative == null) {
            throw new IllegalArgumentException("alternative must not be null");
        }
        if (n1 == 0 || n2 == 0) {
            return new ZTestResult(Double.NaN, Double.NaN, Double.NaN, alternative);
        }
        double p1 = (double) x1 / n1;
        double p2 = (double) x2 / n2;
        double pooled = (double) (x1 + x2) / ((double) n1 + n2);
        double se = Math.sqrt(pooled * (1 - pooled) * (1.0 / n1 + 1.0 / n2));
        double d = p1 - p2;
        if (se == 0) {
            return new ZTestResult(d, 0, 1, alternative);
        }
        double z = d / se;
        return new ZTestResult(d, z, normalPValue(z, alternative), alternative);
    }

    /** p-value of a standard normal statistic for the given alternative. */
    static double normalPValue(double z, Alternative alternative) {
        return switch (alternative) {
            case TWO_SIDED -> Math.min(1, 2 * Distributions.normalSurvival(Math.abs(z)));
            case GREATER -> Distributions.normalSurvival(z);
            case LESS -> Distributions.normalCdf(z);
        };
    }

    private static double zFor(double alpha) {
        checkAlpha(alpha);
        return Distributions.normalQuantile(1 - alpha / 2);
    }

    static void checkAlpha(double alpha) {
        if (!(alpha > 0 && alpha < 1)) {
            throw new IllegalArgumentException("alpha must be in (0, 1), was " + alpha);
        }
    }

    private static void checkCounts(String xName, long x, String nName, long n) {
        if (n < 0) {
            throw new IllegalArgumentException(nName + " must be >= 0, was " + n);
        }
        if (x < 0) {
            throw new IllegalArgumentException(xName + " must be >= 0, was " + x);
        }
        if (x > n) {
            throw new IllegalArgumentException(xName + " must be <= " + nName + ", was " + xName + " = " + x + ", "
                + nName + " = " + n);
        }
    }
}
