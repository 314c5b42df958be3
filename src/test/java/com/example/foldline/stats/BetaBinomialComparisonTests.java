package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;

import com.example.foldline.stats.BetaBinomialComparison.Method;
import com.example.foldline.stats.BetaBinomialComparison.Options;
import com.example.foldline.stats.BetaBinomialComparison.Result;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.api.Test;

/**
 * Check values: checkvalues.md section 3 (B1–B4). COMP: {@code scripts/bayes_ab.py} (mpmath 1.2.1, 50 digits, and
 * exact rational arithmetic for B1 and B4), confirmed by scipy quad, R integrate and Monte Carlo
 * ({@code out/bayes_ab_py.txt}).
 */
class BetaBinomialComparisonTests {

    /** Case, counts, prior, and the reference P(B > A), loss if B chosen, loss if A chosen. */
    static Stream<Arguments> cases() {
        return Stream.of(
            // B1: exact rational 445/494; losses exact (20 digits).
            Arguments.of("B1", 3, 10, 6, 10, 1, 1, 445.0 / 494, 0.0093720554583389419841, 0.25937205545833894198),
            // B2: mpmath 50 digits (P), closed form in mpmath printed to 15 digits (losses).
            Arguments.of("B2", 200, 10000, 240, 10000, 1, 1, 0.97301385047756470183, 2.14241380840139e-5,
                0.00402062429805202),
            // B3: as B2.
            Arguments.of("B3", 1234, 56789, 1301, 56012, 1, 1, 0.95511079142551591965, 1.62814971591065e-5,
                0.00151406697049636),
            // B4: informative prior Beta(10, 490); P mpmath 50 digits, losses exact.
            Arguments.of("B4", 20, 400, 31, 410, 10, 490, 0.90231740551731904032, 0.0004205744596140966408,
                0.012142186181225818253));
    }

    @ParameterizedTest(name = "{0} closed form")
    @MethodSource("cases")
    void closedFormMatchesFiftyDigitValues(String name, long sA, long nA, long sB, long nB, double a0, double b0,
                                           double p, double lossB, double lossA) {
        Result r = BetaBinomialComparison.compare(sA, nA, sB, nB,
            Options.defaults().withPrior(a0, b0).withMethod(Method.CLOSED_FORM));
        assertThat(r.method()).isEqualTo(Method.CLOSED_FORM);
        // Tolerance 1e-9 absolute (checkvalues.md section 3); the ratio recurrence in fact reaches ~1e-13.
        assertThat(r.probabilityBBetter()).isCloseTo(p, within(1e-9));
        assertThat(r.expectedLossChoosingB()).isCloseTo(lossB, within(1e-9));
        assertThat(r.expectedLossChoosingA()).isCloseTo(lossA, within(1e-9));
        // Tighter, own claim about this implementation (not a checkvalues.md tolerance): 1e-12 absolute.
        assertThat(r.probabilityBBetter()).isCloseTo(p, within(1e-12));
        assertThat(r.expectedLossChoosingB()).isCloseTo(lossB, within(1e-12));
        assertThat(r.expectedLossChoosingA()).isCloseTo(lossA, within(1e-12));
        // Identity: lossA − lossB = E[pB] − E[pA] (checkvalues.md section 3), tolerance 1e-12.
        assertThat(r.expectedLossChoosingA() - r.expectedLossChoosingB()).isCloseTo(r.meanB() - r.meanA(),
            within(1e-12));
    }

    @Test
    void b1IsTheExactRational() {
        // B1 exact rational 445/494 (COMP, exact arithmetic): to the last bits, tolerance 2e-16.
        Result r = BetaBinomialComparison.compare(3, 10, 6, 10);
        assertThat(r.alphaA()).isEqualTo(4);
        assertThat(r.betaA()).isEqualTo(8);
        assertThat(r.alphaB()).isEqualTo(7);
        assertThat(r.betaB()).isEqualTo(5);
        assertThat(r.probabilityBBetter()).isCloseTo(445.0 / 494, within(2e-16));
    }

    @ParameterizedTest(name = "{0} numerical integration")
    @MethodSource("cases")
    void numericalIntegrationMatchesFiftyDigitValues(String name, long sA, long nA, long sB, long nB, double a0,
                                                     double b0, double p, double lossB, double lossA) {
        Result r = BetaBinomialComparison.compare(sA, nA, sB, nB,
            Options.defaults().withPrior(a0, b0).withMethod(Method.NUMERICAL_INTEGRATION));
        assertThat(r.method()).isEqualTo(Method.NUMERICAL_INTEGRATION);
        // Same references; tolerance 1e-9 absolute (the fallback's documented accuracy is about 1e-10).
        assertThat(r.probabilityBBetter()).isCloseTo(p, within(1e-9));
        assertThat(r.expectedLossChoosingB()).isCloseTo(lossB, within(1e-9));
        assertThat(r.expectedLossChoosingA()).isCloseTo(lossA, within(1e-9));
    }

    @Test
    void nonIntegerPriorUsesTheFallbackAndAgreesWithTheOneSidedClosedForm() {
        // Own cross-check: only alphaB is an integer, so the closed form (summing over alphaB) still applies and must
        // agree with the quadrature; tolerance 1e-10.
        Options closed = Options.defaults().withMethod(Method.CLOSED_FORM);
        Options numeric = Options.defaults().withMethod(Method.NUMERICAL_INTEGRATION);
        Result c = BetaBinomialComparison.compareBetas(3.5, 7.5, 7, 5.5, closed);
        Result q = BetaBinomialComparison.compareBetas(3.5, 7.5, 7, 5.5, numeric);
        assertThat(q.probabilityBBetter()).isCloseTo(c.probabilityBBetter(), within(1e-10));
        assertThat(q.expectedLossChoosingA()).isCloseTo(c.expectedLossChoosingA(), within(1e-10));
        assertThat(q.expectedLossChoosingB()).isCloseTo(c.expectedLossChoosingB(), within(1e-10));
        // A Jeffreys prior gives half-integer alphas on both sides: AUTO must integrate.
        Result jeffreys = BetaBinomialComparison.compare(3, 10, 6, 10, Options.defaults().withPrior(0.5, 0.5));
        assertThat(jeffreys.method()).isEqualTo(Method.NUMERICAL_INTEGRATION);
        assertThat(jeffreys.probabilityBBetter()).isBetween(0.85, 0.95);
        assertThatIllegalArgumentException()
            .isThrownBy(() -> BetaBinomialComparison.compare(3, 10, 6, 10, closed.withPrior(0.5, 0.5)))
            .withMessageContaining("alphaA = 3.5").withMessageContaining("alphaB = 6.5");
    }

    @Test
    void autoFallsBackToIntegrationAboveTheTermLimit() {
        Result r = BetaBinomialComparison.compare(1234, 56789, 1301, 56012,
            Options.defaults().withMaxClosedFormTerms(1000));
        assertThat(r.method()).isEqualTo(Method.NUMERICAL_INTEGRATION);
        // B3 reference (COMP, 50 digits), tolerance 1e-9.
        assertThat(r.probabilityBBetter()).isCloseTo(0.95511079142551591965, within(1e-9));
        assertThat(BetaBinomialComparison.compare(1234, 56789, 1301, 56012).method()).isEqualTo(Method.CLOSED_FORM);
    }

    @Test
    void largeCountsStayAccurate() {
        // References NOT in checkvalues.md: computed for this test with mpmath 1.3.0 at 40 digits, Miller's sum by the
        // same term ratio started from loggamma (a one-off script; values to 20 digits). Prior Beta(1, 1).
        // alpha ≈ 1e4: closed form (AUTO), tolerance 1e-11 (documented closed-form error ~3e-12 at this size).
        Result mid = BetaBinomialComparison.compare(10_000, 1_000_000, 10_093, 1_000_000);
        assertThat(mid.method()).isEqualTo(Method.CLOSED_FORM);
        assertThat(mid.probabilityBBetter()).isCloseTo(0.74517688283824884779, within(1e-11));
        // alpha ≈ 1e6: AUTO integrates numerically (the closed form would be off by ~1e-9); tolerance 1e-10.
        Result big = BetaBinomialComparison.compare(1_000_000, 100_000_000, 1_000_948, 100_000_000);
        assertThat(big.method()).isEqualTo(Method.NUMERICAL_INTEGRATION);
        assertThat(big.probabilityBBetter()).isCloseTo(0.74970320838311094509, within(1e-10));
        assertThat(big.expectedLossChoosingA() - big.expectedLossChoosingB()).isCloseTo(big.meanB() - big.meanA(),
            within(1e-12));
    }

    @Test
    void noDataAndSymmetry() {
        // Two uniform posteriors: P = 1/2 and E[max(U1 − U2, 0)] = 1/6 (hand computation: E|U1 − U2| = 1/3).
        Result r = BetaBinomialComparison.compare(0, 0, 0, 0);
        assertThat(r.probabilityBBetter()).isCloseTo(0.5, within(1e-15));
        assertThat(r.expectedLossChoosingA()).isCloseTo(1.0 / 6, within(1e-15));
        assertThat(r.expectedLossChoosingB()).isCloseTo(1.0 / 6, within(1e-15));
        // Swapping the variants: P(A > B) = 1 − P(B > A), losses swap (continuous distributions: no ties).
        Result ab = BetaBinomialComparison.compare(200, 10000, 240, 10000);
        Result ba = BetaBinomialComparison.compare(240, 10000, 200, 10000);
        assertThat(ba.probabilityBBetter()).isCloseTo(1 - ab.probabilityBBetter(), within(1e-13));
        assertThat(ba.expectedLossChoosingA()).isCloseTo(ab.expectedLossChoosingB(), within(1e-15));
        // Extreme counts: all successes vs none.
        Result extreme = BetaBinomialComparison.compare(0, 1000, 1000, 1000);
        assertThat(extreme.probabilityBBetter()).isCloseTo(1, within(1e-15));
        assertThat(extreme.expectedLossChoosingB()).isCloseTo(0, within(1e-15));
    }

    @Test
    void rejectsBadArgumentsNamingTheValue() {
        assertThatIllegalArgumentException().isThrownBy(() -> BetaBinomialComparison.compare(11, 10, 1, 10))
            .withMessageContaining("successesA = 11").withMessageContaining("trialsA = 10");
        assertThatIllegalArgumentException().isThrownBy(() -> BetaBinomialComparison.compare(1, 10, 1, -10))
            .withMessageContaining("trialsB").withMessageContaining("-10");
        assertThatIllegalArgumentException()
            .isThrownBy(() -> BetaBinomialComparison.compareBetas(1, Double.NaN, 1, 1, Options.defaults()))
            .withMessageContaining("betaA").withMessageContaining("NaN");
        assertThatIllegalArgumentException().isThrownBy(() -> Options.defaults().withPrior(-1, 1))
            .withMessageContaining("priorAlpha").withMessageContaining("-1");
    }
}
