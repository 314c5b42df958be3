package com.example.foldline.stats;

import java.util.List;

/**
 * A fitted continuous piecewise-linear ("broken-stick") model y = b₀ + b₁x + Σ dⱼ(x − ψⱼ)₊, made by
 * {@link SegmentedRegression#fit}; conventions are those of R's {@code segmented} (Muggeo 2003, <i>Stat. Med.</i>
 * 22:3055–3071, doi:10.1002/sim.1545), except that the breakpoints are the global least-squares optimum.
 *
 * @param breakpointCount   the chosen number of breakpoints k (0 = straight line)
 * @param selectionReason   why this k was chosen (BIC comparison, or fixed by the options)
 * @param intercept         b₀
 * @param breakpoints       the k breakpoints in increasing order
 * @param slopes            the k + 1 segment slopes, left to right
 * @param residualSumOfSquares weighted RSS Σ wᵢrᵢ²
 * @param sigma             sqrt(RSS/residualDf)
 * @param residualDf        n − (2 + 2k)
 * @param observations      n, rows with positive weight
 * @param distinctX         number of distinct x values
 * @param logLik            R's logLik for (weighted) lm, ψ counted as a parameter
 * @param aic               −2 logLik + 2(2 + 2k + 1)
 * @param bic               −2 logLik + ln(n)(2 + 2k + 1)
 * @param candidates        every k that was considered, with its breakpoints, RSS and BIC
 * @param davies            Davies' test for a change in slope (decide "is there a knee?" with this)
 * @param naiveFTest        the one-breakpoint fit against the straight line (for reporting); null when k = 1 is not
 *                          feasible
 * @param exactSearch       false when the search for the chosen k was the large-problem heuristic (see
 *                          {@link SegmentedRegression})
 * @param bootstrapResamples number of bootstrap resamples whose refit succeeded (0 when no bootstrap was run)
 * @param bootstrapScheme   scheme used for the bootstrap (null when none was run)
 */
public record SegmentedFit(int breakpointCount, String selectionReason, double intercept,
                           List<Breakpoint> breakpoints, List<Slope> slopes, double residualSumOfSquares,
                           double sigma, int residualDf, int observations, int distinctX, double logLik, double aic,
                           double bic, List<CandidateModel> candidates, DaviesTest davies, FTest naiveFTest,
                           boolean exactSearch, int bootstrapResamples, BootstrapScheme bootstrapScheme)
    implements SegmentedResult {

    public SegmentedFit {
        breakpoints = List.copyOf(breakpoints);
        slopes = List.copyOf(slopes);
        candidates = List.copyOf(candidates);
    }

    /** The fitted value at x. */
    public double predict(double x) {
        double y = intercept + slopes.get(0).estimate() * x;
        for (Breakpoint b : breakpoints) {
            if (x > b.estimate()) {
                y += b.slopeChange() * (x - b.estimate());
            }
        }
        return y;
    }

    /** The candidate model with k breakpoints, if it was considered. */
    public CandidateModel candidate(int k) {
        return candidates.stream().filter(c -> c.breakpoints() == k).findFirst()
            .orElseThrow(() -> new IllegalArgumentException("no candidate with " + k + " breakpoints; considered "
                + candidates.stream().map(CandidateModel::breakpoints).toList()));
    }
}
