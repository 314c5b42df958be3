package com.example.foldline.stats;

/**
 * Result of the pooled two-proportion z test made by {@link Proportions#twoProportionZTest}.
 *
 * @param difference  observed p₁ − p₂ (NaN when a group has no trials)
 * @param z           the z statistic (p₁ − p₂)/SE₀ with the pooled standard error; 0 when both groups are all
 *                    successes or all failures; NaN when a group has no trials
 * @param pValue      p-value for the chosen alternative; NaN when a group has no trials
 * @param alternative the alternative hypothesis
 */
public record ZTestResult(double difference, double z, double pValue, Alternative alternative) {
}
