package com.example.foldline.stats;

/**
 * Outcome of {@link SegmentedLogistic#fit}: either a {@link SegmentedLogisticFit} or a {@link NoFit} saying why the
 * data were too thin.
 */
public sealed interface SegmentedLogisticResult permits SegmentedLogisticFit, NoFit {
}
