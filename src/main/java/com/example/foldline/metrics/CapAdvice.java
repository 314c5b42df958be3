package com.example.foldline.metrics;

import java.util.List;

/**
 * The ad-cap recommendation of a segment (docs/methods.md, "Recommended ad cap"): the single cap k that maximises
 * session RPM (revenue per 1,000 sessions, micro-units) when every page carries k ads, read from the entry/later
 * model at equal caps, the probability that it is best among bootstrap resamples, the expected gain against the
 * current mix with its interval, the value of every cap, the best pair of separate caps for the entry page and later
 * pages (from the same resamples), and the caution that observational data can be confounded.
 *
 * @param model           how the single cap was valued ({@link #MODEL})
 * @param pairExpectedGainMicros session RPM of the best pair minus the current one (micro-units), or null
 */
public record CapAdvice(Integer cap, Double probabilityBest, Double currentSessionRpmMicros, Double expectedGainMicros,
                        Double expectedGainLower, Double expectedGainUpper, String summary, List<CapOption> caps,
                        Integer entryCap, Integer laterCap, Double pairProbabilityBest, Double pairSessionRpmMicros,
                        String pairSummary, int resamples, String caution, String model,
                        Double pairExpectedGainMicros) {

    public CapAdvice {
        caps = caps == null ? null : List.copyOf(caps); // answers are shared through the fit cache: keep them immutable
    }

    /** The model behind {@code cap} and {@code caps}. */
    public static final String MODEL = "entry/later model at equal caps: V(k) = revenue per entry page(k) + "
            + "(1 - bounce(k)) * revenue per later page(k) / later exit rate(k)";

    /**
     * One cap: whether it had enough data (on both entry and later pages), the pooled exit rate and revenue per page
     * of all pages with that many ads (descriptive), the session RPM with a 95% interval and the probability of being
     * best from the entry/later model, and that model's inputs: entry sessions and bounce rate, later pages and exit
     * rate, expected pages per session.
     */
    public record CapOption(int ads, String status, String note, long pages, Double exitRate,
                            Double revenuePerPageMicros, Double sessionRpmMicros, Double lower, Double upper,
                            Double probabilityBest, long entrySessions, long laterPages, Double bounceRate,
                            Double laterExitRate, Double expectedPagesPerSession) {
    }
}
