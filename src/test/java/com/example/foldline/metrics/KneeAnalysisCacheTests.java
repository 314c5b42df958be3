package com.example.foldline.metrics;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;

import java.util.ArrayList;
import java.util.List;

import org.junit.jupiter.api.Test;

/**
 * The cache of density fits: keyed by the counts themselves, so a repeated question is answered from it and any
 * change of the data is a different key (never a stale answer). The reference is the uncached computation.
 */
class KneeAnalysisCacheTests {

    /** Bounce flat at 30% up to 4 ads, then 6 points more per ad; 2,000 sessions per ad count. */
    private static List<Answers.DensityPoint> points(long extraBouncesAtSix) {
        List<Answers.DensityPoint> points = new ArrayList<>();
        for (int ads = 0; ads <= 10; ads++) {
            long sessions = 2000;
            long bounces = Math.round(sessions * (0.30 + 0.06 * Math.max(0, ads - 4))) + (ads == 6 ? extraBouncesAtSix : 0);
            points.add(new Answers.DensityPoint(ads, sessions, bounces, (double) bounces / sessions, null, null, null,
                    null, null));
        }
        return points;
    }

    @Test
    void aRepeatedQuestionIsAnsweredFromTheCacheAndNewDataIsRefitted() {
        KneeAnalysis knees = new KneeAnalysis(null, 4);
        FitSummary first = knees.densityFit(points(0), "logistic");
        assertThat(first).isEqualTo(KneeAnalysis.density(points(0), "logistic"));
        assertThat(knees.densityFit(points(0), "logistic")).isSameAs(first);
        // another model is another key
        FitSummary linear = knees.densityFit(points(0), "linear");
        assertThat(linear).isNotSameAs(first).isEqualTo(KneeAnalysis.density(points(0), "linear"));
        // one more bounce at one ad count (new data arrived): a new fit, equal to the uncached one
        FitSummary changed = knees.densityFit(points(1), "logistic");
        assertThat(changed).isNotEqualTo(first).isEqualTo(KneeAnalysis.density(points(1), "logistic"));
    }

    @Test
    void theCacheIsBoundedAndSizeZeroTurnsItOff() {
        KneeAnalysis two = new KneeAnalysis(null, 2);
        FitSummary a = two.densityFit(points(0), "logistic");
        two.densityFit(points(1), "logistic");
        two.densityFit(points(2), "logistic"); // evicts the least recently used: points(0)
        FitSummary again = two.densityFit(points(0), "logistic");
        assertThat(again).isNotSameAs(a).isEqualTo(a);

        KneeAnalysis off = new KneeAnalysis(null, 0);
        FitSummary x = off.densityFit(points(0), "logistic");
        assertThat(off.densityFit(points(0), "logistic")).isNotSameAs(x).isEqualTo(x);
        assertThatIllegalArgumentException().isThrownBy(() -> new KneeAnalysis(null, -1))
                .withMessageContaining("fit-cache-size");
    }
}
