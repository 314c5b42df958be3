package com.example.foldline.stats;

import java.util.Arrays;

/**
 * Davies' test for a change in slope with the breakpoint unidentified under the null hypothesis, as implemented in R's
 * {@code segmented::davies.test} (see {@link SegmentedRegression#daviesTest} for the formula).
 *
 * <p>References: Davies RB (1987) Hypothesis testing when a nuisance parameter is present only under the alternative.
 * <i>Biometrika</i> 74:33–43, doi:10.1093/biomet/74.1.33. Davies RB (2002) Hypothesis testing when a nuisance parameter
 * is present only under the alternative: linear model case. <i>Biometrika</i> 89:484–489,
 * doi:10.1093/biomet/89.2.484.
 *
 * @param pValue      upper bound for the p-value, capped at 1
 * @param statistic   M: the largest |t| (two-sided), the largest t (greater) or the smallest t (less)
 * @param bestAt      the evaluation point where M was attained
 * @param points      evaluation points used (singular ones dropped)
 * @param statistics  the t (linear) or signed-root deviance (logistic) statistic at each point
 * @param alternative the alternative hypothesis
 */
public record DaviesTest(double pValue, double statistic, double bestAt, double[] points, double[] statistics,
                         Alternative alternative) {

    public DaviesTest {
        points = points.clone();
        statistics = statistics.clone();
    }

    @Override
    public double[] points() {
        return points.clone();
    }

    @Override
    public double[] statistics() {
        return statistics.clone();
    }

    /** Whether the test rejects "no change in slope" at level alpha. */
    public boolean rejects(double alpha) {
        return pValue < alpha;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof DaviesTest d && Double.compare(pValue, d.pValue) == 0 && Arrays.equals(points, d.points)
            && Arrays.equals(statistics, d.statistics) && alternative == d.alternative;
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(statistics) + Double.hashCode(pValue);
    }

    @Override
    public String toString() {
        return "DaviesTest[p=" + pValue + ", statistic=" + statistic + ", bestAt=" + bestAt + ", points="
            + points.length + ", alternative=" + alternative + "]";
    }
}
