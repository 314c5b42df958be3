package com.example.foldline.stats;

import com.example.foldline.stats.AdCapRecommender.Options;
import com.example.foldline.stats.AdCapRecommender.PageStats;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.SplittableRandom;
import java.util.function.LongSupplier;

/**
 * Benchmark (not a test) of the two heaviest calls of part B: {@link AdCapRecommender} with B = 1,000 resamples on 13
 * caps, and {@link BayesianChangepoint} on 90 days of hourly counts (2,160 points). Each is timed after a warm-up and
 * reported as median and 95th percentile, beside a reference loop measured in the same run (plain loops that compute
 * the same means without the statistics), so figures from different machines can be compared by their ratio.
 *
 * <p>Run after {@code mvn test-compile}:
 * {@code java -cp target/classes:target/test-classes com.example.foldline.stats.StatsBenchmarkB}
 */
public final class StatsBenchmarkB {

    private static volatile double sink;

    private StatsBenchmarkB() {
    }

    public static void main(String[] args) {
        System.out.printf(Locale.ROOT, "Java %s, %d processors available%n", System.getProperty("java.version"),
            Runtime.getRuntime().availableProcessors());

        List<PageStats> caps = thirteenCaps();
        Options options = Options.defaults(); // B = 1000
        Timing adCap = time(30, 100, () -> {
            var r = AdCapRecommender.recommend(caps, OptionalDouble.of(6_000), options);
            sink += r.caps().get(0).probabilityBest();
            return 0;
        });
        Timing adCapReference = time(30, 100, () -> {
            // The same 13 × 1000 value computations from the point estimates, without drawing.
            double s = 0;
            for (int b = 0; b < options.resamples(); b++) {
                for (PageStats c : caps) {
                    double rpp = (double) c.revenueMicros() / c.pages();
                    double q = (double) c.exits() / c.pages();
                    s += rpp / q / 1000 + b * 1e-12;
                }
            }
            sink += s;
            return 0;
        });
        report("AdCapRecommender, 13 caps, B = 1000", adCap, adCapReference);

        long[][] hourly = hourlySeries();
        BayesianChangepoint.Options bocpd = BayesianChangepoint.Options.defaults().withHazard(1.0 / 500);
        Timing full = time(3, 15, () -> {
            var r = BayesianChangepoint.detect(hourly[0], hourly[1], bocpd);
            sink += r.logEvidence();
            return 0;
        });
        Timing fullReference = time(3, 15, () -> {
            // The same triangle of (t, r) cells, updating the posterior mean α/(α + β) of each run length.
            int n = hourly[0].length;
            double[] a = new double[n + 1];
            double[] b = new double[n + 1];
            double s = 0;
            for (int t = 0; t < n; t++) {
                for (int r = t; r >= 0; r--) {
                    a[r + 1] = a[r] + hourly[0][t];
                    b[r + 1] = b[r] + hourly[1][t] - hourly[0][t];
                    s += (a[r + 1] + 1) / (a[r + 1] + b[r + 1] + 2);
                }
                a[0] = 0;
                b[0] = 0;
            }
            sink += s;
            return 0;
        });
        report("BOCPD, 2160 hourly points, no truncation", full, fullReference);

        BayesianChangepoint.Options capped = bocpd.withMaxRunLength(336);
        Timing truncated = time(5, 30, () -> {
            var r = BayesianChangepoint.detect(hourly[0], hourly[1], capped);
            sink += r.logEvidence();
            return 0;
        });
        report("BOCPD, 2160 hourly points, run length truncated at 336 (2 weeks)", truncated, fullReference);
        var check = BayesianChangepoint.detect(hourly[0], hourly[1], bocpd);
        int map = check.steps().get(1529).mapRunLength();
        System.out.printf(Locale.ROOT, "(sanity: at hour 1530 the MAP run length is %d, i.e. a run starting at hour %d;"
            + " the change was simulated from hour 1501)%n", map, 1530 - map + 1);
        if (sink == 42) {
            System.out.println();
        }
    }

    /** 13 caps, 0..12 ads, about 10⁵ pages each, revenue rising and continuation falling with the ad count. */
    static List<PageStats> thirteenCaps() {
        List<PageStats> caps = new ArrayList<>();
        for (int k = 0; k <= 12; k++) {
            long pages = 100_000 + 7_919L * k;
            double q = 0.35 + 0.02 * k + 0.002 * k * k;
            double rpp = 400 + 450 * k - 12 * k * k;
            long exits = Math.round(q * pages);
            long revenue = Math.round(rpp * pages);
            double sd = 1.5 * rpp;
            caps.add(new PageStats(k, pages, exits, revenue, (pages - 1) * sd * sd + (double) revenue * revenue / pages));
        }
        return caps;
    }

    /** 90 days × 24 hours of sessions and bounces, with a daily traffic cycle and a bounce-rate step at hour 1500. */
    static long[][] hourlySeries() {
        SplittableRandom rnd = new SplittableRandom(90);
        int n = 90 * 24;
        long[] bounces = new long[n];
        long[] sessions = new long[n];
        for (int t = 0; t < n; t++) {
            double traffic = 400 + 250 * Math.sin(2 * Math.PI * (t % 24) / 24.0);
            sessions[t] = Math.max(1, Math.round(traffic + 20 * rnd.nextDouble()));
            double p = t < 1500 ? 0.40 : 0.44;
            long k = 0;
            for (long i = 0; i < sessions[t]; i++) {
                if (rnd.nextDouble() < p) {
                    k++;
                }
            }
            bounces[t] = k;
        }
        return new long[][] {bounces, sessions};
    }

    record Timing(double medianMs, double p95Ms, int runs) {
    }

    private static Timing time(int warmup, int runs, LongSupplier work) {
        for (int i = 0; i < warmup; i++) {
            work.getAsLong();
        }
        double[] ms = new double[runs];
        for (int i = 0; i < runs; i++) {
            long t0 = System.nanoTime();
            work.getAsLong();
            ms[i] = (System.nanoTime() - t0) / 1e6;
        }
        Arrays.sort(ms);
        return new Timing(AdCapRecommender.quantile7(ms, 0.5), AdCapRecommender.quantile7(ms, 0.95), runs);
    }

    private static void report(String name, Timing t, Timing reference) {
        System.out.printf(Locale.ROOT, "%-66s median %9.3f ms  p95 %9.3f ms  (%d runs)%n", name, t.medianMs(),
            t.p95Ms(), t.runs());
        System.out.printf(Locale.ROOT, "%-66s median %9.3f ms  p95 %9.3f ms  -> ratio %.1f (median / median)%n",
            "  reference loop, same means", reference.medianMs(), reference.p95Ms(),
            t.medianMs() / reference.medianMs());
    }
}
