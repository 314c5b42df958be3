package com.example.foldline.stats;

import java.util.Arrays;
import java.util.SplittableRandom;
import java.util.function.Supplier;

/**
 * Timing of the segmented fits (not a test; run with
 * {@code java -cp target/classes:target/test-classes com.example.foldline.stats.StatsBenchmark}). Prints median and
 * 95th percentile over repeated runs after warm-up, with a plain OLS on the same data as the in-run reference, so the
 * ratio stays meaningful on a loaded machine. Goals: (1) 1-breakpoint weighted fit with 1,000 bootstrap resamples on 13
 * points well under 100 ms; (2) 3-breakpoint fit on 100,000 points under 1 s.
 */
public final class StatsBenchmark {

    private StatsBenchmark() {
    }

    public static void main(String[] args) {
        int warmup = 5;
        int runs = args.length > 0 ? Integer.parseInt(args[0]) : 21;
        SplittableRandom random = new SplittableRandom(42);

        // (1) 13 aggregated points, ads 0..12, ~2,000 sessions each, knee at 6.4
        double[] x13 = new double[13];
        double[] y13 = new double[13];
        double[] w13 = new double[13];
        for (int ads = 0; ads <= 12; ads++) {
            long sessions = 1800 + random.nextInt(401);
            double p = 0.38 + 0.003 * ads + (ads > 6.4 ? 0.03 * (ads - 6.4) : 0);
            x13[ads] = ads;
            y13[ads] = Binomial.draw(random, sessions, p) / (double) sessions;
            w13[ads] = sessions;
        }
        double[][] rows13 = new double[13][];
        for (int i = 0; i < 13; i++) {
            rows13[i] = new double[] {x13[i]};
        }
        SegmentedOptions boot = SegmentedOptions.defaults().withBreakpoints(1).withBootstrap(1000);
        report("1 breakpoint, 13 weighted points, 1,000 bootstrap resamples",
            time(warmup, runs, () -> SegmentedRegression.fit(x13, y13, w13, boot)),
            "OLS on the same 13 points", time(warmup, runs, () -> LeastSquares.fit(rows13, y13, w13, true)));

        // (2) 100,000 raw sessions (0/1 bounce), ads 0..12, two knees
        int n = 100_000;
        double[] x = new double[n];
        double[] y = new double[n];
        double[][] rows = new double[n][];
        for (int i = 0; i < n; i++) {
            int ads = random.nextInt(13);
            double p = 0.35 + 0.004 * ads + (ads > 4 ? 0.02 * (ads - 4) : 0) + (ads > 9 ? 0.03 * (ads - 9) : 0);
            x[i] = ads;
            y[i] = random.nextDouble() < p ? 1 : 0;
            rows[i] = new double[] {ads};
        }
        SegmentedOptions three = SegmentedOptions.defaults().withBreakpoints(3);
        report("3 breakpoints, 100,000 points (13 distinct x)",
            time(warmup, runs, () -> SegmentedRegression.fit(x, y, null, three)),
            "OLS on the same 100,000 points", time(warmup, runs, () -> LeastSquares.fit(rows, y)));
        SegmentedOptions chosen = SegmentedOptions.defaults();
        report("k = 0..3 chosen by BIC, 100,000 points", time(warmup, runs, () -> SegmentedRegression.fit(x, y, null,
            chosen)), "OLS on the same 100,000 points", time(warmup, runs, () -> LeastSquares.fit(rows, y)));
    }

    private static double[] time(int warmup, int runs, Supplier<?> task) {
        Object sink = null;
        for (int i = 0; i < warmup; i++) {
            sink = task.get();
        }
        double[] ms = new double[runs];
        for (int i = 0; i < runs; i++) {
            long t0 = System.nanoTime();
            sink = task.get();
            ms[i] = (System.nanoTime() - t0) / 1e6;
        }
        if (sink == null) {
            throw new IllegalStateException("no result");
        }
        Arrays.sort(ms);
        return ms;
    }

    private static void report(String what, double[] ms, String reference, double[] refMs) {
        double median = SegmentedRegression.quantile(ms, 0.5);
        double p95 = SegmentedRegression.quantile(ms, 0.95);
        double refMedian = SegmentedRegression.quantile(refMs, 0.5);
        System.out.printf("%-62s median %9.3f ms  p95 %9.3f ms%n", what, median, p95);
        System.out.printf("  reference: %-50s median %9.3f ms  p95 %9.3f ms  ratio %.1fx%n", reference, refMedian,
            SegmentedRegression.quantile(refMs, 0.95), median / refMedian);
    }
}
