package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;

/**
 * The large-problem paths of the (package-private) breakpoint search, checked against the exhaustive paths on the same
 * data: the screened 1-D profile against exact evaluation in chunks, and the global coordinate descent against the
 * exhaustive search over interval combinations.
 */
class HingeSearchTests {

    private static DistinctData twoKnees(int m, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] x = new double[m];
        double[] y = new double[m];
        for (int i = 0; i < m; i++) {
            x[i] = i / (double) m * 10 + random.nextDouble() * 0.001;
            y[i] = 1 + 0.2 * x[i] + (x[i] > 3.3 ? 0.8 * (x[i] - 3.3) : 0) - (x[i] > 7.1 ? 1.5 * (x[i] - 7.1) : 0)
                + 0.3 * random.nextGaussian();
        }
        return DistinctData.of(x, y, null);
    }

    @Test
    void screenedProfileFindsTheExactOptimum() {
        // m = 3000 distinct x: one profile call over all intervals exceeds the QR work limit and is screened; chunks of
        // 500 intervals stay below it and are evaluated exactly. Both must agree.
        DistinctData data = twoKnees(3000, 1);
        HingeSearch search = new HingeSearch(data);
        HingeSearch.Result screened = search.search(1, 2, 20000);
        HingeSearch.Step best = null;
        for (int from = 1; from <= data.size() - 3; from += 500) {
            int to = Math.min(from + 499, data.size() - 3);
            HingeSearch.Step s = search.profile(new double[0], from, to); // 500·3000·2 < 5e6: exact path
            if (best == null || s.rss() < best.rss()) {
                best = s;
            }
        }
        assertThat(screened.psi()[0]).isCloseTo(best.psi(), within(1e-12));
        assertThat(screened.rss()).isCloseTo(best.rss(), within(1e-12 * best.rss()));
        assertThat(screened.psi()[0]).isBetween(6.5, 8.0); // one breakpoint goes to the larger change (at 7.1)
    }

    @Test
    void globalCoordinateDescentAgreesWithExhaustiveSearchOnAClearSignal() {
        DistinctData data = twoKnees(80, 2);
        HingeSearch search = new HingeSearch(data);
        HingeSearch.Result exhaustive = search.search(2, 2, 1e9);
        HingeSearch.Result heuristic = search.search(2, 2, 10);
        assertThat(exhaustive.exact()).isTrue();
        assertThat(heuristic.exact()).isFalse();
        assertThat(heuristic.rss()).isCloseTo(exhaustive.rss(), within(1e-9 * exhaustive.rss()));
        assertThat(heuristic.psi()[0]).isCloseTo(exhaustive.psi()[0], within(1e-6));
        assertThat(heuristic.psi()[1]).isCloseTo(exhaustive.psi()[1], within(1e-6));
        assertThat(exhaustive.psi()[0]).isBetween(2.8, 3.8);
        assertThat(exhaustive.psi()[1]).isBetween(6.6, 7.6);
    }
}
