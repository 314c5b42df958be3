package com.example.foldline.stats;

/**
 * Result of Welch's unequal-variance t test made by {@link WelchTest#fromSummary}.
 *
 * @param difference    mean₁ − mean₂
 * @param standardError sqrt(s₁²/n₁ + s₂²/n₂)
 * @param t             difference / standardError
 * @param df            Welch–Satterthwaite degrees of freedom (not an integer in general)
 * @param pValue        p-value for the chosen alternative
 * @param lower         lower limit of the two-sided 1 − α confidence interval for the difference
 * @param upper         upper limit of that interval
 * @param alternative   the alternative hypothesis the p-value belongs to
 */
public record WelchResult(double difference, double standardError, double t, double df, double pValue,
                          double lower, double upper, Alternative alternative) {
}
