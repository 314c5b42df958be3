package com.example.foldline.metrics;

import java.util.List;

/**
 * Knee of a saturating curve (revenue per session by pages, revenue per pageview by engaged time): Kneedle
 * (Satopää et al. 2011) and, as a second opinion, the segmented fit.
 */
public record KneeReport(Kneedle kneedle, FitSummary segmented) {

    /** Kneedle's answer: the knee's x when found, else the reason. */
    public record Kneedle(boolean found, Double knee, List<Double> allKnees, double sensitivity, String curve,
                          String direction, String reason) {
    }
}
