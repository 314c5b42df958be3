package com.example.foldline.stats;

/**
 * A confidence interval for the difference p₁ − p₂ of two independent binomial proportions, made by
 * {@link Proportions#newcombeDifference}.
 *
 * @param difference the observed difference x₁/n₁ − x₂/n₂; NaN when either group has no trials
 * @param lower      lower limit, in [−1, 1]
 * @param upper      upper limit, in [−1, 1]
 * @param method     name of the method, e.g. "Newcombe hybrid score (method 10)"
 */
public record ProportionDifference(double difference, double lower, double upper, String method) {

    /** Whether the interval excludes 0, i.e. the two proportions differ at the chosen level. */
    public boolean excludesZero() {
        return lower > 0 || upper < 0;
    }
}
