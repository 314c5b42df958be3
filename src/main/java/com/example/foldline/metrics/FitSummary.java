package com.example.foldline.metrics;

import java.util.List;

/**
 * A knee fit as the API reports it (docs/methods.md, docs/metrics.md): the model and why that number of breakpoints
 * was chosen (BIC of each candidate), each breakpoint with its standard error and 95% intervals (delta method after
 * Muggeo 2003; bootstrap when computed), the slopes, the residual measure, the break test, and a verdict in words.
 * {@code curve} holds fitted values for drawing. When there is too little data, only {@code notice} is set.
 */
public record FitSummary(String model, Integer breakpointCount, String reason, List<Candidate> candidates,
                         List<BreakpointEstimate> breakpoints, List<SlopeEstimate> slopes, Double residual,
                         String residualKind, BreakTest breakTest, String verdict, List<CurvePoint> curve,
                         String notice) {

    public record Candidate(int breakpoints, double bic) {
    }

    public record BreakpointEstimate(double estimate, Double standardError, Double lower, Double upper,
                                     Double bootstrapLower, Double bootstrapUpper) {
    }

    /** A segment's slope; {@code unit} says whether it is on the log-odds scale or in y units per x. */
    public record SlopeEstimate(double estimate, Double standardError, Double lower, Double upper, String unit) {
    }

    public record BreakTest(String method, Double pValue, boolean breakFound) {
    }

    public record CurvePoint(double x, double y) {
    }

    static FitSummary none(String notice) {
        return new FitSummary(null, null, null, List.of(), List.of(), List.of(), null, null, null, null, List.of(),
                notice);
    }
}
