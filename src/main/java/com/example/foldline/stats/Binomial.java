package com.example.foldline.stats;

import java.util.SplittableRandom;

/**
 * Binomial random draws for the parametric bootstrap. Exact inversion (sequential search from 0 on the smaller tail
 * probability, Devroye 1986, §X.4) when n·p(1 − p) &lt; 100, where it needs at most a few hundred steps; above that the
 * normal approximation rounded to the nearest count and clipped to [0, n] — its error in distribution is O(1/√(npq))
 * and does not matter for a percentile interval.
 *
 * <p>Reference: Devroye L (1986) <i>Non-Uniform Random Variate Generation</i>. Springer, doi:10.1007/978-1-4613-8643-8.
 */
final class Binomial {

    private static final double NORMAL_THRESHOLD = 100;

    private Binomial() {
    }

    static long draw(SplittableRandom random, long n, double p) {
        if (n <= 0 || p <= 0) {
            return 0;
        }
        if (p >= 1) {
            return n;
        }
        boolean flip = p > 0.5;
        double q = flip ? 1 - p : p;
        double variance = n * q * (1 - q);
        long k;
        if (variance >= NORMAL_THRESHOLD) {
            k = Math.round(n * q + Math.sqrt(variance) * random.nextGaussian());
            k = Math.max(0, Math.min(n, k));
        } else {
            double u = random.nextDouble();
            double pk = Math.exp(n * Math.log1p(-q));
            double ratio = q / (1 - q);
            k = 0;
            while (u > pk && k < n) {
                u -= pk;
                k++;
                pk *= (n - k + 1) / (double) k * ratio;
                if (pk == 0) {
                    break; // far beyond the mean: the remaining mass is below double resolution
                }
            }
        }
        return flip ? n - k : k;
    }
}
