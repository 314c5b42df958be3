package com.example.foldline.stats;

import java.util.List;

/**
 * A fitted segmented logistic model logit p = b₀ + b₁x + d(x − ψ)₊ for proportions such as bounce rate, made by
 * {@link SegmentedLogistic#fit}. Conventions are those of R's {@code segmented} on a binomial {@code glm}
 * (Muggeo 2003, <i>Stat. Med.</i> 22:3055–3071, doi:10.1002/sim.1545), with ψ the global maximum-likelihood estimate.
 *
 * @param breakpointCount  the chosen number of breakpoints (0 or 1)
 * @param selectionReason  why this number was chosen
 * @param intercept        b₀ on the logit scale
 * @param breakpoints      the breakpoint, if any (SE from the augmented design with dispersion 1; delta interval with
 *                         the t quantile on the residual df, as segmented does)
 * @param slopes           the segment slopes on the logit scale (intervals with the normal quantile, as segmented)
 * @param deviance         residual deviance
 * @param residualDf       n − (2 + 2k), n the number of rows with trials
 * @param observations     n
 * @param distinctX        number of distinct x values
 * @param logLik           binomial log-likelihood including the binomial coefficients (R's logLik.glm)
 * @param aic              −2 logLik + 2(2 + 2k)
 * @param bic              −2 logLik + ln(n)(2 + 2k)
 * @param candidates       every k considered, with deviance and BIC
 * @param davies           Davies' test for the GLM (signed root of the deviance drop)
 * @param bootstrapResamples number of successful parametric-bootstrap refits (0 when none was run)
 */
public record SegmentedLogisticFit(int breakpointCount, String selectionReason, double intercept,
                                   List<Breakpoint> breakpoints, List<Slope> slopes, double deviance, int residualDf,
                                   int observations, int distinctX, double logLik, double aic, double bic,
                                   List<CandidateModel> candidates, DaviesTest davies, int bootstrapResamples)
    implements SegmentedLogisticResult {

    public SegmentedLogisticFit {
        breakpoints = List.copyOf(breakpoints);
        slopes = List.copyOf(slopes);
        candidates = List.copyOf(candidates);
    }

    /** Fitted linear predictor (log-odds) at x. */
    public double predictLogit(double x) {
        double eta = intercept + slopes.get(0).estimate() * x;
        for (Breakpoint b : breakpoints) {
            if (x > b.estimate()) {
                eta += b.slopeChange() * (x - b.estimate());
            }
        }
        return eta;
    }

    /** Fitted probability at x. */
    public double predictProbability(double x) {
        return 1 / (1 + Math.exp(-predictLogit(x)));
    }
}
