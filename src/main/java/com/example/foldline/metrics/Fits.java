package com.example.foldline.metrics;

import com.example.foldline.stats.Kneedle;
import com.example.foldline.system.BadRequestException;

/** Fits on an analyst's own curve: the segmented fit (linear or binomial) and the knee of a saturating curve. */
public final class Fits {

    private Fits() {
    }

    /** Segmented fit with 0..maxBreakpoints breakpoints chosen by BIC; binomial when trials are given. */
    public static FitSummary segmented(CurveData raw, int maxBreakpoints) {
        if (maxBreakpoints < 0 || maxBreakpoints > 3) {
            throw new BadRequestException("maxBreakpoints", "must be from 0 to 3, got " + maxBreakpoints);
        }
        CurveData d = raw.sorted();
        if (d.trials() != null) {
            long[] successes = new long[d.y().length];
            long[] trials = new long[d.y().length];
            for (int i = 0; i < successes.length; i++) {
                successes[i] = (long) d.y()[i];
                trials[i] = (long) d.trials()[i];
            }
            return KneeAnalysis.logistic(d.x(), successes, trials, "the rate");
        }
        double[] w = d.weights();
        if (w == null) {
            w = new double[d.x().length];
            java.util.Arrays.fill(w, 1.0);
        }
        return KneeAnalysis.linear(d.x(), d.y(), w, "y per x", maxBreakpoints, d.x().length <= 10_000);
    }

    /** Kneedle with the given sensitivity, and the one-breakpoint segmented fit as a second opinion. */
    public static KneeReport knee(CurveData raw, double sensitivity) {
        if (!(sensitivity >= 0) || sensitivity > 100) {
            throw new BadRequestException("sensitivity", "must be from 0 to 100, got " + sensitivity);
        }
        CurveData d = raw.sorted();
        double[] w = d.weights();
        if (w == null) {
            w = new double[d.x().length];
            java.util.Arrays.fill(w, 1.0);
        }
        return KneeAnalysis.curve(d.x(), d.y(), w, "y per x", Kneedle.Options.defaults().withSensitivity(sensitivity));
    }
}
