package com.example.foldline.stats;

import java.util.Arrays;

/**
 * One candidate number of breakpoints considered when choosing k by BIC.
 *
 * @param breakpoints number of breakpoints k
 * @param psi         the breakpoints found for this k
 * @param fitMeasure  residual sum of squares (linear model) or deviance (logistic model)
 * @param parameters  number of parameters counted for logLik/AIC/BIC (R's convention, ψ included)
 * @param logLik      log-likelihood (R's {@code logLik})
 * @param aic         −2 logLik + 2·parameters
 * @param bic         −2 logLik + ln(n)·parameters
 * @param exact       whether the breakpoint search for this k was exhaustive (see {@link SegmentedRegression})
 */
public record CandidateModel(int breakpoints, double[] psi, double fitMeasure, int parameters, double logLik,
                             double aic, double bic, boolean exact) {

    public CandidateModel {
        psi = psi.clone();
    }

    @Override
    public double[] psi() {
        return psi.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof CandidateModel c && breakpoints == c.breakpoints && Arrays.equals(psi, c.psi)
            && Double.compare(fitMeasure, c.fitMeasure) == 0 && parameters == c.parameters && exact == c.exact;
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(psi) + Double.hashCode(fitMeasure);
    }

    @Override
    public String toString() {
        return "CandidateModel[k=" + breakpoints + ", psi=" + Arrays.toString(psi) + ", fit=" + fitMeasure
            + ", bic=" + bic + ", exact=" + exact + "]";
    }
}
