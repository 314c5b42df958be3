package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * {@link Proportions} against checkvalues.md §2. "Published" = Newcombe (1998a) Table I / Newcombe (1998b) Table II,
 * 4 decimals (PUB-2), checked at 5e−5; "computed" = statsmodels 0.13.5 proportion_confint / confint_proportions_2indep
 * and R 4.2.2 prop.test(correct = FALSE) / binom.test, checked at 1e−9.
 */
class ProportionsTests {

    private static final double PUBLISHED = 5e-5;
    private static final double COMPUTED = 1e-9;

    // checkvalues.md P1 (Newcombe 1998a Table I): k, n, Wilson published, Wilson computed, CP published, CP computed,
    // Agresti–Coull computed (raw formula; our interval clips it to [0, 1]).
    @ParameterizedTest(name = "P1 {0}/{1}")
    @CsvSource({
        "81, 263, 0.2553, 0.3662, 0.2552885199, 0.3662095770, 0.2527, 0.3676, 0.2527367456, 0.3676219226, 0.2552206652, 0.3662774317",
        "15, 148, 0.0624, 0.1605, 0.0623863995, 0.1604872417, 0.0578, 0.1617, 0.0578440101, 0.1616504903, 0.0613859749, 0.1614876663",
        "0, 20, 0.0000, 0.1611, 0, 0.1611251581, 0.0000, 0.1684, 0, 0.1684334710, -0.0286844025, 0.1898095605",
        "1, 29, 0.0061, 0.1718, 0.0061132143, 0.1717552188, 0.0009, 0.1776, 0.0008726469, 0.1776442955, -0.0084180755, 0.1862865086",
    })
    void newcombeTableOne(long k, long n, double wPubLo, double wPubHi, double wLo, double wHi, double cpPubLo,
                          double cpPubHi, double cpLo, double cpHi, double acLo, double acHi) {
        ProportionInterval wilson = Proportions.wilson(k, n, 0.05);
        assertThat(wilson.lower()).isCloseTo(wPubLo, within(PUBLISHED)).isCloseTo(wLo, within(COMPUTED));
        assertThat(wilson.upper()).isCloseTo(wPubHi, within(PUBLISHED)).isCloseTo(wHi, within(COMPUTED));
        ProportionInterval cp = Proportions.clopperPearson(k, n, 0.05);
        assertThat(cp.lower()).isCloseTo(cpPubLo, within(PUBLISHED)).isCloseTo(cpLo, within(COMPUTED));
        assertThat(cp.upper()).isCloseTo(cpPubHi, within(PUBLISHED)).isCloseTo(cpHi, within(COMPUTED));
        ProportionInterval ac = Proportions.agrestiCoull(k, n, 0.05);
        assertThat(ac.lower()).isCloseTo(Math.max(0, acLo), within(COMPUTED));
        assertThat(ac.upper()).isCloseTo(Math.min(1, acHi), within(COMPUTED));
        assertThat(wilson.estimate()).isEqualTo((double) k / n);
    }

    // checkvalues.md P1 "more computed cases" (statsmodels 0.13.5 / R 4.2.2): k, n, confidence, Wilson, CP, AC raw.
    @ParameterizedTest(name = "P1 computed {0}/{1} at {2}")
    @CsvSource({
        "0, 10, 0.95, 0, 0.2775327999, 0, 0.3084971078, -0.0433545059, 0.3208873058",
        "10, 10, 0.95, 0.7224672001, 1, 0.6915028922, 1, 0.6791126942, 1.0433545059",
        "5, 25, 0.95, 0.0886058469, 0.3913095037, 0.0683114640, 0.4070374323, 0.0841008983, 0.3958144522",
        "1234, 56789, 0.95, 0.0205623719, 0.0229614490, 0.0205461030, 0.0229622406, 0.0205619357, 0.0229618851",
        "81, 263, 0.90, 0.2633136172, 0.3565663496, 0.2610557460, 0.3581784956, 0.2632730585, 0.3566069083",
        "81, 263, 0.99, 0.2401369027, 0.3852825023, 0.2368373582, 0.3862583257, 0.2399870326, 0.3854323724",
    })
    void moreComputedCases(long k, long n, double level, double wLo, double wHi, double cpLo, double cpHi, double acLo,
                           double acHi) {
        double alpha = 1 - level;
        ProportionInterval w = Proportions.interval(ProportionMethod.WILSON, k, n, alpha);
        assertThat(w.lower()).isCloseTo(wLo, within(COMPUTED));
        assertThat(w.upper()).isCloseTo(wHi, within(COMPUTED));
        ProportionInterval cp = Proportions.interval(ProportionMethod.CLOPPER_PEARSON, k, n, alpha);
        assertThat(cp.lower()).isCloseTo(cpLo, within(COMPUTED));
        assertThat(cp.upper()).isCloseTo(cpHi, within(COMPUTED));
        ProportionInterval ac = Proportions.interval(ProportionMethod.AGRESTI_COULL, k, n, alpha);
        assertThat(ac.lower()).isCloseTo(Math.max(0, acLo), within(COMPUTED));
        assertThat(ac.upper()).isCloseTo(Math.min(1, acHi), within(COMPUTED));
        assertThat(ac.method()).isEqualTo(ProportionMethod.AGRESTI_COULL);
    }

    // checkvalues.md P2 (Newcombe 1998b Table II, method 10): published 4 dp and statsmodels 0.13.5 "newcomb".
    @ParameterizedTest(name = "P2 {0}/{1} - {2}/{3}")
    @CsvSource({
        "56, 70, 48, 80, 0.2, 0.0524, 0.3339, 0.0524314724, 0.3338726540",
        "9, 10, 3, 10, 0.6, 0.1705, 0.8090, 0.1705227239, 0.8090179735",
        "6, 7, 2, 7, 0.5714285714, 0.0582, 0.8062, 0.0582279275, 0.8062496375",
        "5, 56, 0, 29, 0.0892857143, -0.0381, 0.1926, -0.0381371479, 0.1925600139",
        "0, 10, 0, 20, 0, -0.1611, 0.2775, -0.1611251581, 0.2775327999",
        "0, 10, 0, 10, 0, -0.2775, 0.2775, -0.2775327999, 0.2775327999",
        "10, 10, 0, 20, 1, 0.6791, 1.0000, 0.6790860371, 1",
        "10, 10, 0, 10, 1, 0.6075, 1.0000, 0.6075093504, 1",
    })
    void newcombeDifferenceTableTwo(long x1, long n1, long x2, long n2, double d, double pubLo, double pubHi,
                                    double lo, double hi) {
        ProportionDifference diff = Proportions.newcombeDifference(x1, n1, x2, n2, 0.05);
        assertThat(diff.difference()).isCloseTo(d, within(1e-10));
        assertThat(diff.lower()).isCloseTo(pubLo, within(PUBLISHED)).isCloseTo(lo, within(COMPUTED));
        assertThat(diff.upper()).isCloseTo(pubHi, within(PUBLISHED)).isCloseTo(hi, within(COMPUTED));
        assertThat(diff.method()).contains("Newcombe");
    }

    @Test
    void newcombeDifferenceAtWebScale() {
        // checkvalues.md P2 web-scale row (statsmodels 0.13.5 only, COMP).
        ProportionDifference diff = Proportions.newcombeDifference(1234, 56789, 1301, 56012, 0.05);
        assertThat(diff.difference()).isCloseTo(-0.0014976053, within(1e-10));
        assertThat(diff.lower()).isCloseTo(-0.0032302156, within(COMPUTED));
        assertThat(diff.upper()).isCloseTo(0.0002327037, within(COMPUTED));
        assertThat(diff.excludesZero()).isFalse();
    }

    @Test
    void edgeCasesZeroAndAll() {
        for (ProportionMethod m : ProportionMethod.values()) {
            ProportionInterval none = Proportions.interval(m, 0, 50, 0.05);
            assertThat(none.lower()).as(m.name()).isZero();
            assertThat(none.estimate()).isZero();
            ProportionInterval all = Proportions.interval(m, 50, 50, 0.05);
            assertThat(all.upper()).as(m.name()).isEqualTo(1);
            assertThat(all.estimate()).isEqualTo(1);
        }
        // Exact: Clopper–Pearson upper limit for 0/n is 1 − (α/2)^{1/n}.
        assertThat(Proportions.clopperPearson(0, 50, 0.05).upper()).isCloseTo(1 - Math.pow(0.025, 1.0 / 50),
            within(1e-15));
    }

    @Test
    void noTrialsIsAnAnswerNotAnError() {
        for (ProportionMethod m : ProportionMethod.values()) {
            ProportionInterval empty = Proportions.interval(m, 0, 0, 0.05);
            assertThat(empty.lower()).isZero();
            assertThat(empty.upper()).isEqualTo(1);
            assertThat(empty.estimate()).isNaN();
            assertThat(empty.width()).isEqualTo(1);
        }
        ProportionDifference both = Proportions.newcombeDifference(0, 0, 0, 0, 0.05);
        assertThat(both.difference()).isNaN();
        assertThat(both.lower()).isEqualTo(-1);
        assertThat(both.upper()).isEqualTo(1);
        ProportionDifference one = Proportions.newcombeDifference(0, 0, 3, 10, 0.05);
        assertThat(one.difference()).isNaN();
        assertThat(one.lower()).isGreaterThanOrEqualTo(-1).isLessThan(0);
        assertThat(one.upper()).isLessThanOrEqualTo(1).isGreaterThan(0);
        ZTestResult z = Proportions.twoProportionZTest(0, 0, 3, 10, Alternative.TWO_SIDED);
        assertThat(z.z()).isNaN();
        assertThat(z.pValue()).isNaN();
    }

    @Test
    void hugeCounts() {
        long n = 1_000_000_000L;
        long x = 20_000_000L;
        ProportionInterval w = Proportions.wilson(x, n, 0.05);
        ProportionInterval cp = Proportions.clopperPearson(x, n, 0.05);
        ProportionInterval ac = Proportions.agrestiCoull(x, n, 0.05);
        // At n = 1e9 the three methods agree to O(1/n); the width is 2·1.96·sqrt(p(1−p)/n) ≈ 1.735e−5.
        double wald = 1.959963984540054 * Math.sqrt(0.02 * 0.98 / n);
        assertThat(w.upper() - w.lower()).isCloseTo(2 * wald, within(1e-9));
        assertThat(cp.lower()).isCloseTo(w.lower(), within(5e-9));
        assertThat(cp.upper()).isCloseTo(w.upper(), within(5e-9));
        assertThat(ac.lower()).isCloseTo(w.lower(), within(5e-9));
        // Exact: CP upper for 0/n is 1 − 0.025^{1/n} = −expm1(ln(0.025)/n) ≈ 3.689e−9; Wilson's is z²/(n + z²).
        assertThat(Proportions.clopperPearson(0, n, 0.05).upper()).isCloseTo(-Math.expm1(Math.log(0.025) / n),
            within(1e-20));
        double z2 = 1.959963984540054 * 1.959963984540054;
        assertThat(Proportions.wilson(0, n, 0.05).upper()).isCloseTo(z2 / (n + z2), within(1e-20));
        assertThat(Proportions.clopperPearson(n, n, 0.05).lower()).isCloseTo(Math.exp(Math.log(0.025) / n),
            within(1e-16));
        // Exact: CP lower for 1/n is the Beta(1, n) quantile 1 − 0.975^{1/n}; the general solver is documented to be
        // good to ~1e−8 relative for such lopsided parameters.
        double exactLower = -Math.expm1(Math.log(0.975) / n);
        assertThat(Proportions.clopperPearson(1, n, 0.05).lower()).isCloseTo(exactLower, within(1e-7 * exactLower));
        assertThat(Proportions.clopperPearson(n / 2, n, 0.05).contains(0.5)).isTrue();
        assertThat(Proportions.newcombeDifference(x, n, x + 10_000, n, 0.05).excludesZero()).isFalse();
    }

    @Test
    void intervalsContainTheEstimateAndStayInTheUnitInterval() {
        // Property test as a seeded loop (no jqwik, see pom.xml): any n up to 1e9, any x, any α.
        SplittableRandom random = new SplittableRandom(20240501);
        for (int i = 0; i < 2000; i++) {
            long n = i % 4 == 0 ? random.nextLong(1, 30) : random.nextLong(1, i % 2 == 0 ? 5000 : 1_000_000_000L);
            long x = random.nextInt(5) == 0 ? (random.nextBoolean() ? 0 : n) : random.nextLong(0, n + 1);
            double alpha = 0.001 + 0.3 * random.nextDouble();
            for (ProportionMethod m : ProportionMethod.values()) {
                ProportionInterval ci = Proportions.interval(m, x, n, alpha);
                assertThat(ci.lower()).as("%s %d/%d α=%s", m, x, n, alpha)
                    .isBetween(0.0, ci.estimate()).isLessThan(ci.upper());
                assertThat(ci.upper()).as("%s %d/%d α=%s", m, x, n, alpha).isBetween(ci.estimate(), 1.0);
            }
            if (i % 10 == 0) {
                long n2 = random.nextLong(1, 10_000);
                long x2 = random.nextLong(0, n2 + 1);
                ProportionDifference d = Proportions.newcombeDifference(x, n, x2, n2, alpha);
                assertThat(d.lower()).isBetween(-1.0, d.difference());
                assertThat(d.upper()).isBetween(d.difference(), 1.0);
            }
        }
    }

    @Test
    void zTestEqualsPearsonChiSquareWithoutCorrection() {
        // Exact identity: the pooled two-sided z test is Pearson's χ² test on the 2×2 table (z² = χ²), which we
        // compute by brute force from observed and expected counts. Cases from checkvalues.md P2.
        long[][] cases = {{56, 70, 48, 80}, {9, 10, 3, 10}, {1234, 56789, 1301, 56012}, {5, 56, 0, 29}};
        for (long[] c : cases) {
            ZTestResult z = Proportions.twoProportionZTest(c[0], c[1], c[2], c[3], Alternative.TWO_SIDED);
            double chi2 = pearsonChiSquare(c[0], c[1], c[2], c[3]);
            assertThat(z.z() * z.z()).isCloseTo(chi2, within(1e-10 * chi2));
            assertThat(z.pValue()).isCloseTo(Distributions.chiSquaredSurvival(chi2, 1), within(1e-13));
            ZTestResult greater = Proportions.twoProportionZTest(c[0], c[1], c[2], c[3], Alternative.GREATER);
            ZTestResult less = Proportions.twoProportionZTest(c[0], c[1], c[2], c[3], Alternative.LESS);
            assertThat(greater.pValue() + less.pValue()).isCloseTo(1, within(1e-15));
            assertThat(Math.min(greater.pValue(), less.pValue()) * 2).isCloseTo(z.pValue(), within(1e-15));
        }
        // Worked example 56/70 vs 48/80: p̄ = 104/150, z = 0.2 / sqrt(p̄(1−p̄)(1/70 + 1/80)) = 2.6112…
        double pooled = 104.0 / 150;
        double expected = 0.2 / Math.sqrt(pooled * (1 - pooled) * (1.0 / 70 + 1.0 / 80));
        assertThat(Proportions.twoProportionZTest(56, 70, 48, 80, Alternative.GREATER).z()).isCloseTo(expected,
            within(1e-14));
        ZTestResult degenerate = Proportions.twoProportionZTest(0, 10, 0, 20, Alternative.TWO_SIDED);
        assertThat(degenerate.z()).isZero();
        assertThat(degenerate.pValue()).isEqualTo(1);
    }

    @Test
    void invalidArgumentsNameTheBadValue() {
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.wilson(11, 10, 0.05))
            .withMessageContaining("successes = 11").withMessageContaining("trials = 10");
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.clopperPearson(-1, 10, 0.05))
            .withMessageContaining("-1");
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.agrestiCoull(1, -10, 0.05))
            .withMessageContaining("trials must be >= 0, was -10");
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.wilson(1, 10, 1.0))
            .withMessageContaining("alpha must be in (0, 1), was 1.0");
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.wilson(1, 10, Double.NaN))
            .withMessageContaining("NaN");
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.newcombeDifference(1, 10, 5, 4, 0.05))
            .withMessageContaining("x2 = 5");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> Proportions.twoProportionZTest(1, 10, 5, 4, Alternative.TWO_SIDED))
            .withMessageContaining("n2 = 4");
        assertThatIllegalArgumentException().isThrownBy(() -> Proportions.interval(null, 1, 10, 0.05))
            .withMessageContaining("method");
    }

    private static double pearsonChiSquare(long x1, long n1, long x2, long n2) {
        double[][] observed = {{x1, n1 - x1}, {x2, n2 - x2}};
        double total = n1 + n2;
        double[] rows = {n1, n2};
        double[] cols = {x1 + x2, (n1 - x1) + (n2 - x2)};
        double chi2 = 0;
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 2; j++) {
                double expected = rows[i] * cols[j] / total;
                chi2 += (observed[i][j] - expected) * (observed[i][j] - expected) / expected;
            }
        }
        return chi2;
    }
}
