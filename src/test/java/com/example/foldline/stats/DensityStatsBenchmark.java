package com.example.foldline.stats;

import com.example.foldline.stats.AdCapRecommender.EntryStats;
import com.example.foldline.stats.AdCapRecommender.Options;
import com.example.foldline.stats.AdCapRecommender.PageStats;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.SplittableRandom;

/**
 * Benchmark (not a test) of the statistics behind one density answer (issue #4): the segmented logistic fit of bounce
 * on 13 entry-ad counts, and the ad-cap advice on 13 entry caps and 11 later-page caps with B = 1,000 (the single cap
 * and the entry/later pair from one shared set of resamples). Median and p95 after a warm-up, beside a reference
 * loop in the same run (an unweighted logistic IRLS fit of the same points, no breakpoint), and their ratio. Run by
 * {@code mvn -Pbench -Dbench=stats test-compile exec:exec}.
 */
public final class DensityStatsBenchmark {

    private static volatile double sink;

    private DensityStatsBenchmark() {
    }

    public static void main(String[] args) {
        double[] x = new double[13];
        long[] bounces = new long[13];
        long[] sessions = new long[13];
        SplittableRandom r = new SplittableRandom(13);
        for (int k = 0; k <= 12; k++) {
            x[k] = k;
            sessions[k] = 8_000 + r.nextInt(4_000);
            double p = 0.42 + 0.045 * Math.max(0, k - 4);
            bounces[k] = Math.round(sessions[k] * p + (r.nextDouble() - 0.5) * 60);
        }
        List<EntryStats> entry = new ArrayList<>();
        List<PageStats> later = new ArrayList<>();
        for (int k = 0; k <= 12; k++) {
            long rev = Math.round(sessions[k] * 900.0 * k / (1 + 0.06 * k));
            entry.add(new EntryStats(k, sessions[k], bounces[k], rev, (double) rev * rev / sessions[k] * 1.3 + 1));
            if (k <= 10) {
                long pages = 9_000 + 500L * k;
                long exits = Math.round(pages * (0.38 + 0.025 * k));
                long lrev = Math.round(pages * 900.0 * k / (1 + 0.06 * k));
                later.add(new PageStats(k, pages, exits, lrev, (double) lrev * lrev / pages * 1.3 + 1));
            }
        }
        SegmentedOptions fitOptions = SegmentedOptions.defaults().withMaxBreakpoints(1);
        double[] fit = time(20, 200, () -> sink += ((SegmentedLogisticFit) SegmentedLogistic.fit(x, bounces, sessions,
            fitOptions)).deviance());
        double[] advice = time(20, 200, () -> sink += advise(entry, later));
        double[] reference = time(20, 200, () -> sink += logisticLine(x, bounces, sessions));
        System.out.printf(Locale.ROOT, "%nDensity statistics (median / p95 ms; reference: logistic IRLS line on the same "
            + "13 points, %.3f / %.3f ms)%n", reference[0], reference[1]);
        System.out.printf(Locale.ROOT, "  segmented logistic fit, 13 points          %7.3f / %7.3f   ratio p95 %6.1f%n",
            fit[0], fit[1], fit[1] / reference[1]);
        System.out.printf(Locale.ROOT, "  ad-cap advice, 13 entry x 11 later, B=1000 %7.3f / %7.3f   ratio p95 %6.1f%n",
            advice[0], advice[1], advice[1] / reference[1]);
        System.out.printf(Locale.ROOT, "  both (one density answer's statistics)     %7.3f / %7.3f%n", fit[0] + advice[0],
            fit[1] + advice[1]);
    }

    /** The advice as the density answer computes it. */
    static double advise(List<EntryStats> entry, List<PageStats> later) {
        var a = AdCapRecommender.advise(entry, later, OptionalDouble.of(6_000), Options.defaults());
        return a.sameCap().caps().get(3).probabilityBest() + a.pair().pairs().size();
    }

    /** Reference: unweighted-start logistic regression on (1, x) by IRLS with normal equations, to 1e−10. */
    static double logisticLine(double[] x, long[] s, long[] n) {
        double b0 = 0;
        double b1 = 0;
        for (int iter = 0; iter < 50; iter++) {
            double a00 = 0;
            double a01 = 0;
            double a11 = 0;
            double g0 = 0;
            double g1 = 0;
            for (int i = 0; i < x.length; i++) {
                double mu = 1 / (1 + Math.exp(-(b0 + b1 * x[i])));
                double w = n[i] * mu * (1 - mu);
                a00 += w;
                a01 += w * x[i];
                a11 += w * x[i] * x[i];
                g0 += s[i] - n[i] * mu;
                g1 += (s[i] - n[i] * mu) * x[i];
            }
            double det = a00 * a11 - a01 * a01;
            double d0 = (a11 * g0 - a01 * g1) / det;
            double d1 = (a00 * g1 - a01 * g0) / det;
            b0 += d0;
            b1 += d1;
            if (Math.abs(d0) + Math.abs(d1) < 1e-10) {
                break;
            }
        }
        return b0 + b1;
    }

    private static double[] time(int warmup, int runs, Runnable work) {
        for (int i = 0; i < warmup; i++) {
            work.run();
        }
        double[] ms = new double[runs];
        for (int i = 0; i < runs; i++) {
            long t0 = System.nanoTime();
            work.run();
            ms[i] = (System.nanoTime() - t0) / 1e6;
        }
        Arrays.sort(ms);
        return new double[] {AdCapRecommender.quantile7(ms, 0.5), AdCapRecommender.quantile7(ms, 0.95)};
    }
}
