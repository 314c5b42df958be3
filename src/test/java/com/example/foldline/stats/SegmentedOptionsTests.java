package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;

import org.junit.jupiter.api.Test;

/** {@link SegmentedOptions}: defaults, with-methods and argument checks. */
class SegmentedOptionsTests {

    @Test
    void defaultsAndWithers() {
        SegmentedOptions d = SegmentedOptions.defaults();
        assertThat(d.maxBreakpoints()).isEqualTo(3);
        assertThat(d.fixedBreakpoints()).isEqualTo(-1);
        assertThat(d.minDistinctPerSegment()).isEqualTo(2);
        assertThat(d.alpha()).isEqualTo(0.05);
        assertThat(d.bootstrapResamples()).isZero();
        assertThat(d.daviesPoints()).isEqualTo(10);
        SegmentedOptions changed = d.withBreakpoints(2).withAlpha(0.1).withBootstrap(99).withSeed(3)
            .withBootstrapScheme(BootstrapScheme.CASES).withDaviesPoints(12).withDaviesAlternative(Alternative.GREATER)
            .withMinDistinctPerSegment(3).withExactSearchLimit(10).withMinTotalWeight(500).withMaxBreakpoints(3);
        assertThat(changed.fixedBreakpoints()).isEqualTo(2);
        assertThat(changed.alpha()).isEqualTo(0.1);
        assertThat(changed.bootstrapResamples()).isEqualTo(99);
        assertThat(changed.seed()).isEqualTo(3);
        assertThat(changed.bootstrapScheme()).isEqualTo(BootstrapScheme.CASES);
        assertThat(changed.daviesPoints()).isEqualTo(12);
        assertThat(changed.daviesAlternative()).isEqualTo(Alternative.GREATER);
        assertThat(changed.minDistinctPerSegment()).isEqualTo(3);
        assertThat(changed.exactSearchLimit()).isEqualTo(10);
        assertThat(changed.minTotalWeight()).isEqualTo(500);
        assertThat(d).isEqualTo(SegmentedOptions.defaults()); // immutable
    }

    @Test
    void invalidValuesAreNamed() {
        SegmentedOptions d = SegmentedOptions.defaults();
        assertThatIllegalArgumentException().isThrownBy(() -> d.withMaxBreakpoints(4))
            .withMessageContaining("maxBreakpoints must be in 0..3, was 4");
        assertThatIllegalArgumentException().isThrownBy(() -> d.withAlpha(0))
            .withMessageContaining("alpha must be in (0, 1), was 0.0");
        assertThatIllegalArgumentException().isThrownBy(() -> d.withMinDistinctPerSegment(1))
            .withMessageContaining("minDistinctPerSegment must be >= 2, was 1");
        assertThatIllegalArgumentException().isThrownBy(() -> d.withBootstrap(-1))
            .withMessageContaining("bootstrapResamples must be >= 0, was -1");
        assertThatIllegalArgumentException().isThrownBy(() -> d.withBreakpoints(5))
            .withMessageContaining("5");
    }

    @Test
    void largerSegmentsNeedMoreData() {
        // With 3 distinct x per segment, 13 ads values allow at most 3 breakpoints; 5 values allow none.
        double[] x = {0, 1, 2, 3, 4};
        double[] y = {0.4, 0.41, 0.43, 0.47, 0.52};
        SegmentedResult r = SegmentedRegression.fit(x, y, null, SegmentedOptions.defaults().withMinDistinctPerSegment(3));
        assertThat(r).isInstanceOf(NoFit.class);
        assertThat(((NoFit) r).message()).contains("need at least 6 (3 per segment)");
    }
}
