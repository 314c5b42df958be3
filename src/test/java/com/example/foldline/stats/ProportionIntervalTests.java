package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

/** {@link ProportionInterval} (and the {@link ProportionDifference} value next to it). */
class ProportionIntervalTests {

    @Test
    void widthAndContains() {
        ProportionInterval ci = new ProportionInterval(0.2, 0.5, 0.3, ProportionMethod.WILSON);
        assertThat(ci.width()).isEqualTo(0.3);
        assertThat(ci.contains(0.2)).isTrue();
        assertThat(ci.contains(0.5)).isTrue();
        assertThat(ci.contains(0.51)).isFalse();
    }

    @Test
    void differenceExcludesZero() {
        assertThat(new ProportionDifference(0.2, 0.05, 0.33, "m").excludesZero()).isTrue();
        assertThat(new ProportionDifference(-0.2, -0.33, -0.05, "m").excludesZero()).isTrue();
        assertThat(new ProportionDifference(0.0, -0.1, 0.1, "m").excludesZero()).isFalse();
    }
}
