package com.example.foldline.metrics;

/**
 * A metric against the previous period: the earlier value, the change (current − previous, in the metric's unit),
 * a 95% interval for the change where a test applies, whether the change is statistically meaningful at 95%, and
 * the method used.
 */
public record Change(String metric, Double previous, Double change, Double lower, Double upper, Boolean significant,
                     Double pValue, String method) {
}
