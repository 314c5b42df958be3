package com.example.foldline.stats;

/**
 * The answer "no segmented model was fitted", with the reason and a message for people (for example
 * "only 3 distinct ads-per-page values; need at least 4 (2 per segment)").
 *
 * @param reason  machine-readable reason
 * @param message human-readable explanation naming the numbers involved
 */
public record NoFit(NoFitReason reason, String message) implements SegmentedResult, SegmentedLogisticResult {
}
