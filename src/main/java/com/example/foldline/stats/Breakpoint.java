package com.example.foldline.stats;

/**
 * One estimated breakpoint ψ of a segmented fit (Muggeo 2003, <i>Stat. Med.</i> 22:3055–3071,
 * doi:10.1002/sim.1545).
 *
 * @param estimate       ψ̂, where the slope changes
 * @param slopeChange    d̂, the change in slope at ψ̂ (slope after minus slope before)
 * @param standardError  SE(ψ̂) from Muggeo's augmented design (see {@link SegmentedRegression})
 * @param lower          lower limit of the delta-method interval ψ̂ − t·SE
 * @param upper          upper limit ψ̂ + t·SE
 * @param bootstrapLower lower percentile-bootstrap limit; NaN when no bootstrap was run
 * @param bootstrapUpper upper percentile-bootstrap limit; NaN when no bootstrap was run
 */
public record Breakpoint(double estimate, double slopeChange, double standardError, double lower, double upper,
                         double bootstrapLower, double bootstrapUpper) {
}
