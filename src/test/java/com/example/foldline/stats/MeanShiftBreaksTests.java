package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;
import static org.assertj.core.api.Assertions.withinPercentage;

import com.example.foldline.stats.MeanShiftBreaks.Fit;
import com.example.foldline.stats.MeanShiftBreaks.Options;
import com.example.foldline.stats.MeanShiftBreaks.Result;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Check values: checkvalues.md section 5 (BP1, BP2). COMP = R 4.2.2 strucchange 1.5-3 {@code breakpoints(y ~ 1)}
 * ({@code out/baiperron_R.txt}); INDEP = {@code scripts/baiperron_dp.py} ({@code out/baiperron_py.txt}), which agrees
 * with R on every printed digit.
 */
class MeanShiftBreaksTests {

    private static double relative(double expected, double relTol) {
        return Math.abs(expected) * relTol;
    }

    @Test
    void bp1NileRssBreakpointsAndBicForEachNumberOfBreaks() {
        double[] flow = ReferenceCsv.load("nile.csv").doubles("flow");
        Result r = MeanShiftBreaks.fit(flow);
        assertThat(r.minSegmentLength()).isEqualTo(15); // h = floor(0.15 · 100), strucchange default
        assertThat(r.fits()).hasSize(6); // m = 0..5 = ceil(100/15) − 2, strucchange default
        // RSS: INDEP full-precision values (R prints the same to 12 digits); tolerance relative 1e-10.
        double[] rss = {2835156.75, 1597457.1944444478, 1552923.6157754008, 1538096.5127450973, 1507888.4759164527,
            1659993.5004262570};
        // BIC: COMP (R, 8 decimals) = INDEP; tolerance absolute 1e-7.
        double[] bic = {1318.24180688, 1270.08373574, 1276.46670076, 1284.71766745, 1291.94447689, 1310.76515477};
        int[][] breaks = {{}, {28}, {28, 83}, {28, 68, 83}, {28, 45, 68, 83}, {15, 30, 45, 68, 83}};
        for (int m = 0; m <= 5; m++) {
            Fit f = r.fits().get(m);
            assertThat(f.breakCount()).isEqualTo(m);
            assertThat(f.rss()).as("RSS m=%d", m).isCloseTo(rss[m], within(relative(rss[m], 1e-10)));
            assertThat(f.bic()).as("BIC m=%d", m).isCloseTo(bic[m], within(1e-7));
            // Breakpoints: COMP + INDEP, exact (1-based last observation of a segment).
            assertThat(f.breakpoints()).as("breakpoints m=%d", m).containsExactly(breaks[m]);
        }
        // BIC picks m = 1 with the break at observation 28 (year 1898; COMP + INDEP, PUB for the year).
        assertThat(r.selected().breakCount()).isEqualTo(1);
        assertThat(r.selected().breakpoints()).containsExactly(28);
        // Segment means for m = 1: COMP (R, 12 digits); tolerance absolute 1e-8.
        assertThat(r.selected().segmentMeans()[0]).isCloseTo(1097.75, within(1e-8));
        assertThat(r.selected().segmentMeans()[1]).isCloseTo(849.972222222, within(1e-8));
    }

    @Test
    void bp2SmallRateSeriesWithTwoShifts() {
        double[] y = ReferenceCsv.load("bp_small.csv").doubles("y");
        Result r = MeanShiftBreaks.fit(y, Options.defaults().withMinSegmentLength(3));
        assertThat(r.fits()).hasSize(6);
        // RSS m = 0..3: COMP (R, 12 significant digits) = INDEP; tolerance relative 1e-10.
        double[] rss = {0.00039620, 1.40637362637e-04, 4.54285714286e-05, 4.37142857143e-05, 0.000042, 0.000042};
        // BIC m = 0..5: COMP = INDEP (8+ decimals); tolerance absolute 1e-7.
        double[] bic = {-153.83746807, -168.560692584, -185.170096986, -179.947958056, -174.756600201,
            -168.765135654};
        int[][] breaks = {{}, {7}, {7, 14}, {3, 7, 14}};
        for (int m = 0; m <= 5; m++) {
            Fit f = r.fits().get(m);
            assertThat(f.rss()).as("RSS m=%d", m).isCloseTo(rss[m], within(relative(rss[m], 1e-10)));
            assertThat(f.bic()).as("BIC m=%d", m).isCloseTo(bic[m], within(1e-7));
            if (m <= 3) { // m = 4, 5 tie in RSS; checkvalues.md: test breakpoints for m <= 3 only
                assertThat(f.breakpoints()).as("breakpoints m=%d", m).containsExactly(breaks[m]);
            }
        }
        // BIC chooses m = 2, breaks 7 and 14 (COMP + INDEP), exact.
        assertThat(r.selected().breakpoints()).containsExactly(7, 14);
    }

    @Test
    void weightedDynamicProgrammeMatchesBruteForceEnumeration() {
        // Own check: exhaustive search over all one- and two-break partitions of a random weighted series.
        SplittableRandom rnd = new SplittableRandom(7);
        int n = 24;
        int h = 3;
        double[] y = new double[n];
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            y[i] = (i < 9 ? 0.3 : i < 17 ? 0.36 : 0.33) + 0.02 * rnd.nextGaussian();
            w[i] = 200 + rnd.nextInt(800);
        }
        Result r = MeanShiftBreaks.fit(y, w, Options.defaults().withMinSegmentLength(h).withMaxBreaks(2));
        double best1 = Double.POSITIVE_INFINITY;
        double best2 = Double.POSITIVE_INFINITY;
        int arg1 = -1;
        int[] arg2 = null;
        for (int a = h; a <= n - h; a++) {
            double v = weightedRss(y, w, 0, a) + weightedRss(y, w, a, n);
            if (v < best1) {
                best1 = v;
                arg1 = a;
            }
            for (int b = a + h; b <= n - h; b++) {
                double v2 = weightedRss(y, w, 0, a) + weightedRss(y, w, a, b) + weightedRss(y, w, b, n);
                if (v2 < best2) {
                    best2 = v2;
                    arg2 = new int[] {a, b};
                }
            }
        }
        assertThat(r.fits().get(1).rss()).isCloseTo(best1, within(relative(best1, 1e-10)));
        assertThat(r.fits().get(1).breakpoints()).containsExactly(arg1);
        assertThat(r.fits().get(2).rss()).isCloseTo(best2, within(relative(best2, 1e-10)));
        assertThat(r.fits().get(2).breakpoints()).containsExactly(arg2);
        // Weighted logLik follows R's logLik.lm: ½ Σ ln w − n/2 (ln(2π RSS/n) + 1).
        double sumLogW = 0;
        for (double wi : w) {
            sumLogW += Math.log(wi);
        }
        double expected = 0.5 * sumLogW - n / 2.0 * (Math.log(2 * Math.PI * best2 / n) + 1);
        assertThat(r.fits().get(2).logLik()).isCloseTo(expected, within(1e-9));
    }

    private static double weightedRss(double[] y, double[] w, int from, int to) {
        double sw = 0;
        double swy = 0;
        for (int i = from; i < to; i++) {
            sw += w[i];
            swy += w[i] * y[i];
        }
        double mean = swy / sw;
        double rss = 0;
        for (int i = from; i < to; i++) {
            rss += w[i] * (y[i] - mean) * (y[i] - mean);
        }
        return rss;
    }

    @Test
    void unitWeightsGiveTheUnweightedFit() {
        double[] flow = ReferenceCsv.load("nile.csv").doubles("flow");
        double[] ones = new double[flow.length];
        java.util.Arrays.fill(ones, 1.0);
        Result plain = MeanShiftBreaks.fit(flow);
        Result weighted = MeanShiftBreaks.fit(flow, ones, Options.defaults());
        for (int m = 0; m < plain.fits().size(); m++) {
            assertThat(weighted.fits().get(m).breakpoints()).containsExactly(plain.fits().get(m).breakpoints());
            assertThat(weighted.fits().get(m).bic()).isCloseTo(plain.fits().get(m).bic(), withinPercentage(1e-10));
        }
    }

    @Test
    void shortSeriesAndPerfectFitsAreHandled() {
        // n < 2h: only m = 0 fits.
        Result one = MeanShiftBreaks.fit(new double[] {1, 2, 3}, Options.defaults().withMinSegmentLength(2));
        assertThat(one.fits()).hasSize(1);
        assertThat(one.selected().breakCount()).isZero();
        // A noiseless step: RSS 0 for m = 1, logLik +inf, BIC −inf, selected.
        Result step = MeanShiftBreaks.fit(new double[] {1, 1, 1, 1, 5, 5, 5, 5}, Options.defaults()
            .withMinSegmentLength(2).withMaxBreaks(1));
        assertThat(step.selected().breakpoints()).containsExactly(4);
        assertThat(step.selected().bic()).isEqualTo(Double.NEGATIVE_INFINITY);
    }

    @Test
    void rejectsBadArgumentsNamingTheValue() {
        assertThatIllegalArgumentException().isThrownBy(() -> MeanShiftBreaks.fit(new double[0]))
            .withMessageContaining("empty");
        assertThatIllegalArgumentException().isThrownBy(() -> MeanShiftBreaks.fit(new double[] {1, Double.NaN}))
            .withMessageContaining("y[1]").withMessageContaining("NaN");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> MeanShiftBreaks.fit(new double[] {1, 2}, new double[] {1, 0}, Options.defaults()))
            .withMessageContaining("weights[1]").withMessageContaining("0.0");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> MeanShiftBreaks.fit(new double[] {1, 2}, new double[] {1}, Options.defaults()))
            .withMessageContaining("2 and 1");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> MeanShiftBreaks.fit(new double[] {1, 2}, Options.defaults().withMinSegmentLength(3)))
            .withMessageContaining("h = 3");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withTrimming(0.7))
            .withMessageContaining("0.7");
    }
}
