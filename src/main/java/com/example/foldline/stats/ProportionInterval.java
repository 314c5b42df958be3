package com.example.foldline.stats;

/**
 * A two-sided confidence interval for a binomial proportion (for example a bounce rate: bounced sessions out of
 * sessions), made by {@link Proportions#interval}.
 *
 * @param lower    lower limit, in [0, 1]
 * @param upper    upper limit, in [0, 1]
 * @param estimate the observed proportion x/n; NaN when there were no trials (then the interval is [0, 1])
 * @param method   the method that made the interval
 */
public record ProportionInterval(double lower, double upper, double estimate, ProportionMethod method) {

    /** Width of the interval (1 when there were no trials). */
    public double width() {
        return upper - lower;
    }

    /** Whether the interval contains p (limits included). */
    public boolean contains(double p) {
        return p >= lower && p <= upper;
    }
}
