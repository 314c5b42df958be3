package com.example.foldline.stats;

/**
 * Outcome of {@link SegmentedRegression#fit}: either a {@link SegmentedFit} or a {@link NoFit} saying why the data
 * were too thin.
 */
public sealed interface SegmentedResult permits SegmentedFit, NoFit {
}
