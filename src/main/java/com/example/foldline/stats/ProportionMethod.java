package com.example.foldline.stats;

/**
 * Methods for a confidence interval of a single binomial proportion, as compared by Newcombe (1998a).
 *
 * <p>References: [1] Wilson EB (1927) Probable inference, the law of succession, and statistical inference.
 * <i>J. Am. Stat. Assoc.</i> 22:209–212, doi:10.1080/01621459.1927.10502953. [2] Clopper CJ, Pearson ES (1934) The use
 * of confidence or fiducial limits illustrated in the case of the binomial. <i>Biometrika</i> 26:404–413,
 * doi:10.1093/biomet/26.4.404. [3] Agresti A, Coull BA (1998) Approximate is better than "exact" for interval estimation
 * of binomial proportions. <i>Am. Stat.</i> 52:119–126, doi:10.1080/00031305.1998.10480550. [4] Newcombe RG (1998)
 * Two-sided confidence intervals for the single proportion: comparison of seven methods. <i>Stat. Med.</i>
 * 17:857–872, doi:10.1002/(SICI)1097-0258(19980430)17:8&lt;857::AID-SIM777&gt;3.0.CO;2-E.
 */
public enum ProportionMethod {
    /** Score interval without continuity correction [1]; the recommended default. */
    WILSON,
    /** "Exact" interval from beta quantiles [2]; conservative (coverage ≥ 1 − α). */
    CLOPPER_PEARSON,
    /** Wald interval after adding z²/2 successes and z²/2 failures [3], clipped to [0, 1]. */
    AGRESTI_COULL
}
