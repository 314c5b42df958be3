package com.example.foldline.stats;

/**
 * The slope of one segment of a segmented fit, with its standard error and t-based confidence interval (as R's
 * {@code segmented::slope}).
 *
 * @param estimate      slope b₁ + Σ_{j ≤ s} dⱼ of segment s
 * @param standardError from the covariance of the augmented-design fit
 * @param lower         lower limit estimate − t·SE
 * @param upper         upper limit estimate + t·SE
 */
public record Slope(double estimate, double standardError, double lower, double upper) {
}
