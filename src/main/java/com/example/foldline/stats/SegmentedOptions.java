package com.example.foldline.stats;

/**
 * Immutable options for {@link SegmentedRegression} and {@link SegmentedLogistic}. Start from {@link #defaults()} and
 * change one thing at a time with the {@code with…} methods.
 *
 * @param maxBreakpoints         largest number of breakpoints considered, 0..3 (default 3; the logistic fit supports 1)
 * @param fixedBreakpoints       if ≥ 0, fit exactly this many breakpoints instead of choosing by BIC (default −1)
 * @param minDistinctPerSegment  minimum number of distinct x values in every segment, ≥ 2 (default 2)
 * @param alpha                  1 − confidence level of the intervals, in (0, 1) (default 0.05)
 * @param bootstrapResamples     number of bootstrap resamples for the percentile interval of ψ; 0 = none (default 0)
 * @param bootstrapScheme        how resamples are drawn (default {@link BootstrapScheme#AUTO})
 * @param seed                   seed of the {@link java.util.SplittableRandom} used by the bootstrap (default 20240501)
 * @param daviesPoints           number of evaluation points of the Davies test, ≥ 2 (default 10, as segmented)
 * @param daviesAlternative      alternative of the Davies test (default two-sided)
 * @param exactSearchLimit       largest number of interval combinations searched exhaustively for k ≥ 2 (default 20000)
 * @param minTotalWeight         minimum total weight (e.g. sessions) below which no fit is made (default 0)
 */
public record SegmentedOptions(int maxBreakpoints, int fixedBreakpoints, int minDistinctPerSegment, double alpha,
                               int bootstrapResamples, BootstrapScheme bootstrapScheme, long seed, int daviesPoints,
                               Alternative daviesAlternative, double exactSearchLimit, double minTotalWeight) {

    public SegmentedOptions {
        if (maxBreakpoints < 0 || maxBreakpoints > 3) {
            throw new IllegalArgumentException("maxBreakpoints must be in 0..3, was " + maxBreakpoints);
        }
        if (fixedBreakpoints < -1 || fixedBreakpoints > 3) {
            throw new IllegalArgumentException("fixedBreakpoints must be -1 (choose by BIC) or 0..3, was "
                + fixedBreakpoints);
        }
        if (minDistinctPerSegment < 2) {
            throw new IllegalArgumentException("minDistinctPerSegment must be >= 2, was " + minDistinctPerSegment);
        }
        if (!(alpha > 0 && alpha < 1)) {
            throw new IllegalArgumentException("alpha must be in (0, 1), was " + alpha);
        }
        if (bootstrapResamples < 0) {
            throw new IllegalArgumentException("bootstrapResamples must be >= 0, was " + bootstrapResamples);
        }
        if (bootstrapScheme == null) {
            throw new IllegalArgumentException("bootstrapScheme must not be null");
        }
        if (daviesPoints < 2) {
            throw new IllegalArgumentException("daviesPoints must be >= 2, was " + daviesPoints);
        }
        if (daviesAlternative == null) {
            throw new IllegalArgumentException("daviesAlternative must not be null");
        }
        if (!(exactSearchLimit >= 1)) {
            throw new IllegalArgumentException("exactSearchLimit must be >= 1, was " + exactSearchLimit);
        }
        if (!(minTotalWeight >= 0) || Double.isInfinite(minTotalWeight)) {
            throw new IllegalArgumentException("minTotalWeight must be finite and >= 0, was " + minTotalWeight);
        }
    }

    /** The defaults listed above. */
    public static SegmentedOptions defaults() {
        return new SegmentedOptions(3, -1, 2, 0.05, 0, BootstrapScheme.AUTO, 20240501L, 10, Alternative.TWO_SIDED,
            20000, 0);
    }

    public SegmentedOptions withMaxBreakpoints(int value) {
        return new SegmentedOptions(value, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    /** Fit exactly k breakpoints (no BIC choice); −1 restores the BIC choice. */
    public SegmentedOptions withBreakpoints(int k) {
        return new SegmentedOptions(Math.max(maxBreakpoints, k), k, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withMinDistinctPerSegment(int value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, value, alpha, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withAlpha(double value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, value, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withBootstrap(int resamples) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, resamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withBootstrapScheme(BootstrapScheme value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            value, seed, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withSeed(long value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, value, daviesPoints, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withDaviesPoints(int value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, seed, value, daviesAlternative, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withDaviesAlternative(Alternative value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, value, exactSearchLimit, minTotalWeight);
    }

    public SegmentedOptions withExactSearchLimit(double value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, value, minTotalWeight);
    }

    public SegmentedOptions withMinTotalWeight(double value) {
        return new SegmentedOptions(maxBreakpoints, fixedBreakpoints, minDistinctPerSegment, alpha, bootstrapResamples,
            bootstrapScheme, seed, daviesPoints, daviesAlternative, exactSearchLimit, value);
    }
}
