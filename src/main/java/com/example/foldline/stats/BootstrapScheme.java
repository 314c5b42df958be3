package com.example.foldline.stats;

/**
 * How bootstrap resamples are drawn for the percentile confidence interval of a breakpoint.
 *
 * <p>Reference: Efron B, Tibshirani RJ (1993) <i>An Introduction to the Bootstrap</i>, Chapman &amp; Hall, ch. 6
 * (parametric bootstrap) and ch. 9 (resampling cases in regression), doi:10.1007/978-1-4899-4541-9.
 */
public enum BootstrapScheme {
    /** {@link #BINOMIAL} when every y is in [0, 1] and every weight is a whole number (aggregated rates), else {@link #CASES}. */
    AUTO,
    /** Resample the rows (x, y, w) with replacement (Efron &amp; Tibshirani ch. 9.5). */
    CASES,
    /**
     * Parametric: y is a proportion and w its number of trials; for each distinct x draw successes from
     * Binomial(Σw, ŷ(x)) under the fitted model and refit (Efron &amp; Tibshirani ch. 6.5).
     */
    BINOMIAL
}
