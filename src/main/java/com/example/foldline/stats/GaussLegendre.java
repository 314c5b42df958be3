package com.example.foldline.stats;

/**
 * Gauss–Legendre quadrature nodes and weights, shared by the CUSUM run-length integral equation and the numerical
 * fallback of the Beta comparison. Nodes are the roots of the Legendre polynomial P<sub>n</sub>, found by Newton's
 * method from the Tricomi starting values (Press et al., <i>Numerical Recipes</i>, 3rd ed., 2007, §4.6).
 */
final class GaussLegendre {

    private GaussLegendre() {
    }

    /** Returns {nodes, weights} of the n-point rule on [a, b]. */
    static double[][] rule(int n, double a, double b) {
        if (n < 1) {
            throw new IllegalArgumentException("n must be >= 1, was " + n);
        }
        double[] x = new double[n];
        double[] w = new double[n];
        double half = (b - a) / 2;
        double mid = (a + b) / 2;
        for (int i = 0; i < (n + 1) / 2; i++) {
            double t = Math.cos(Math.PI * (i + 0.75) / (n + 0.5));
            double dp = 1;
            for (int iter = 0; iter < 100; iter++) {
                double p0 = 1;
                double p1 = t;
                for (int j = 2; j <= n; j++) {
                    double p2 = ((2 * j - 1) * t * p1 - (j - 1) * p0) / j;
                    p0 = p1;
                    p1 = p2;
                }
                dp = n * (t * p1 - p0) / (t * t - 1);
                double dt = p1 / dp;
                t -= dt;
                if (Math.abs(dt) < 1e-15) {
                    break;
                }
            }
            if (n == 1) {
                dp = 1; // P1(t) = t: root 0, derivative 1
                t = 0;
            }
            double wt = 2 / ((1 - t * t) * dp * dp);
            x[i] = mid - half * t;
            x[n - 1 - i] = mid + half * t;
            w[i] = half * wt;
            w[n - 1 - i] = half * wt;
        }
        return new double[][] {x, w};
    }
}
