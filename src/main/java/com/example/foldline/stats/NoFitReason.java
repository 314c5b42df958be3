package com.example.foldline.stats;

/** Why a segmented fit was not made: thin data is an answer, not an exception. */
public enum NoFitReason {
    /** Fewer distinct x values than two segments of the required minimum size need. */
    TOO_FEW_DISTINCT_X,
    /** Too few rows (with positive weight) to leave residual degrees of freedom for a one-breakpoint model. */
    TOO_FEW_OBSERVATIONS,
    /** The total weight (sessions, trials) is zero or below the configured minimum. */
    TOO_LITTLE_WEIGHT,
    /** Every trial is a success, or every trial a failure: the logistic fit has no finite maximum. */
    NO_VARIATION
}
