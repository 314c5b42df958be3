package com.example.foldline.metrics;

import java.util.List;

/**
 * The ad-cap recommendation of a segment (docs/methods.md, "Recommended ad cap"): the cap that maximises session RPM
 * (revenue per 1,000 sessions, micro-units), the probability that it is best among bootstrap resamples, the
 * expected gain against the current mix with its interval, the value of every cap, the best pair of separate caps
 * for the entry page and later pages, and the caution that observational data can be confounded.
 */
public record CapAdvice(Integer cap, Double probabilityBest, Double currentSessionRpmMicros, Double expectedGainMicros,
                        Double expectedGainLower, Double expectedGainUpper, String summary, List<CapOption> caps,
                        Integer entryCap, Integer laterCap, Double pairProbabilityBest, Double pairSessionRpmMicros,
                        String pairSummary, int resamples, String caution) {

    /** One cap: whether it had enough data, its exit rate, revenue per page and session RPM with a 95% interval. */
    public record CapOption(int ads, String status, String note, long pages, Double exitRate,
                            Double revenuePerPageMicros, Double sessionRpmMicros, Double lower, Double upper,
                            Double probabilityBest) {
    }
}
