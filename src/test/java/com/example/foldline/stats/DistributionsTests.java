package com.example.foldline.stats;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatIllegalArgumentException;
import static org.assertj.core.api.Assertions.within;
import static org.assertj.core.api.Assertions.withinPercentage;

import java.math.BigDecimal;
import java.math.BigInteger;
import java.math.MathContext;

import org.junit.jupiter.api.Test;

/**
 * Checks of {@link Distributions}. Where possible the reference is an exact closed form (Cauchy = t with 1 df, the t
 * with 2 df, the F with 2 numerator df, the binomial sum behind I_x), so that no remembered digits are needed.
 */
class DistributionsTests {

    @Test
    void logGammaMatchesFactorialsAndHalfIntegers() {
        // Exact: ln Γ(n) = ln (n−1)!, computed here with BigInteger.
        for (int n = 1; n <= 170; n++) {
            BigInteger factorial = BigInteger.ONE;
            for (int k = 2; k < n; k++) {
                factorial = factorial.multiply(BigInteger.valueOf(k));
            }
            double expected = logOf(factorial);
            assertThat(Distributions.logGamma(n)).as("lnΓ(%d)", n)
                .isCloseTo(expected, within(1e-14 * Math.max(1, Math.abs(expected))));
        }
        // Exact: Γ(1/2) = √π, Γ(3/2) = √π/2, Γ(−1/2) = −2√π.
        assertThat(Distributions.logGamma(0.5)).isCloseTo(0.5 * Math.log(Math.PI), within(1e-15));
        assertThat(Distributions.logGamma(1.5)).isCloseTo(0.5 * Math.log(Math.PI) - Math.log(2), within(1e-15));
        assertThat(Distributions.logGamma(-0.5)).isCloseTo(Math.log(2 * Math.sqrt(Math.PI)), within(1e-14));
        // Exact: ln Γ(x+1) − ln Γ(x) = ln x across the Lanczos/Stirling switch at 10.
        for (double x = 0.3; x < 30; x += 0.37) {
            assertThat(Distributions.logGamma(x + 1) - Distributions.logGamma(x)).as("recurrence at %s", x)
                .isCloseTo(Math.log(x), within(2e-14 * Math.max(1, Distributions.logGamma(x + 1))));
        }
        assertThat(Distributions.logGamma(0)).isEqualTo(Double.POSITIVE_INFINITY);
        assertThat(Distributions.logGamma(Double.NaN)).isNaN();
    }

    @Test
    void logBetaAgreesWithLogGammaAndStaysAccurateForHugeArguments() {
        double[][] cases = {{0.5, 0.5}, {1, 1}, {3, 7}, {2.5, 12}, {15, 40}, {0.2, 300}};
        for (double[] c : cases) {
            double expected = Distributions.logGamma(c[0]) + Distributions.logGamma(c[1])
                - Distributions.logGamma(c[0] + c[1]);
            assertThat(Distributions.logBeta(c[0], c[1])).as("lnB(%s,%s)", c[0], c[1])
                .isCloseTo(expected, within(1e-12 * Math.max(1, Math.abs(expected))));
        }
        // Exact: B(1, b) = 1/b, so ln B(1, 1e9) = −ln 1e9 (the naive form loses ~7 digits here).
        assertThat(Distributions.logBeta(1, 1e9)).isCloseTo(-Math.log(1e9), within(1e-13));
        // Exact: B(a, 1) = 1/a
        assertThat(Distributions.logBeta(2e8, 1)).isCloseTo(-Math.log(2e8), within(1e-13));
        assertThatIllegalArgumentException().isThrownBy(() -> Distributions.logBeta(0, 1))
            .withMessageContaining("a must be positive, was 0.0");
    }

    @Test
    void regularizedBetaMatchesClosedFormsAndBinomialSums() {
        for (double x = 0.01; x < 1; x += 0.07) {
            // Exact: I_x(1, b) = 1 − (1−x)^b and I_x(a, 1) = x^a.
            assertThat(Distributions.regularizedBeta(x, 1, 7.5)).isCloseTo(1 - Math.pow(1 - x, 7.5), within(5e-15));
            assertThat(Distributions.regularizedBeta(x, 3.25, 1)).isCloseTo(Math.pow(x, 3.25), within(5e-15));
        }
        // Exact: I_p(k, n−k+1) = P(Binomial(n, p) ≥ k); the sum is done in BigDecimal.
        int n = 40;
        double p = 0.3;
        for (int k = 1; k <= n; k++) {
            double expected = binomialUpperTail(n, k, p);
            assertThat(Distributions.regularizedBeta(p, k, n - k + 1)).as("k=%d", k)
                .isCloseTo(expected, within(1e-14 + 1e-13 * expected));
        }
        // Exact by symmetry: I_{1/2}(a, a) = 1/2, including a of size 10⁹ (TOMS 708 prefactor path). The continued
        // fraction needs O(√a) terms there, and their rounding accumulates (documented accuracy ~1e−11 at 5e8).
        for (double a : new double[] {0.5, 3, 50, 1e5}) {
            assertThat(Distributions.regularizedBeta(0.5, a, a)).as("a=%s", a).isCloseTo(0.5, within(1e-13));
        }
        assertThat(Distributions.regularizedBeta(0.5, 5e8, 5e8)).isCloseTo(0.5, within(1e-10));
        assertThat(Distributions.regularizedBeta(0, 2, 3)).isZero();
        assertThat(Distributions.regularizedBeta(1, 2, 3)).isEqualTo(1);
        assertThat(Distributions.regularizedBeta(Double.NaN, 2, 3)).isNaN();
    }

    @Test
    void regularizedBetaForHugeCountsAgreesWithNormalLimit() {
        // For a = k, b = n − k + 1 with n = 1e9 the binomial is normal to within ~1/sqrt(n·p·q); at one sd
        // above the mean the tail is Φ̄(1) = 0.158655… up to a skewness term of order 1e−5 (de Moivre–Laplace).
        double n = 1e9;
        double k = 2e7;
        double pMean = k / n;
        double sd = Math.sqrt(pMean * (1 - pMean) / n);
        double value = Distributions.regularizedBeta(pMean - sd, k, n - k + 1);
        assertThat(value).isCloseTo(Distributions.normalSurvival(1), within(1e-4));
    }

    @Test
    void betaQuantileInvertsRegularizedBeta() {
        double[][] cases = {{0.025, 1, 20}, {0.975, 81, 183}, {0.5, 0.5, 0.5}, {1e-6, 2, 3}, {0.999999, 30, 2},
            {0.025, 1234, 55556}, {0.975, 2e7, 9.8e8}, {0.3, 0.1, 0.2}};
        for (double[] c : cases) {
            double x = Distributions.betaQuantile(c[0], c[1], c[2]);
            assertThat(Distributions.regularizedBeta(x, c[1], c[2])).as("round trip %s", c[0] + "," + c[1] + "," + c[2])
                .isCloseTo(c[0], within(1e-12));
        }
        // Exact: Beta(1, b) quantile is 1 − (1 − p)^{1/b}; the Clopper–Pearson upper limit for 0/20 is
        // 1 − 0.025^{1/20} = 0.1684334710 (checkvalues.md P1, R binom.test).
        assertThat(Distributions.betaQuantile(0.975, 1, 20)).isCloseTo(1 - Math.pow(0.025, 1.0 / 20), within(1e-15))
            .isCloseTo(0.1684334710, within(1e-10));
        assertThat(Distributions.betaQuantile(0, 2, 3)).isZero();
        assertThat(Distributions.betaQuantile(1, 2, 3)).isEqualTo(1);
        assertThatIllegalArgumentException().isThrownBy(() -> Distributions.betaQuantile(1.5, 2, 3))
            .withMessageContaining("1.5");
    }

    @Test
    void normalDistributionFunctions() {
        // Brief / AS 241 paper: Φ⁻¹(0.975) = 1.959963984540054 (checkvalues.md §2 quotes 1.959963985).
        assertThat(Distributions.normalQuantile(0.975)).isCloseTo(1.959963984540054, within(1e-15));
        assertThat(Distributions.normalQuantile(0.025)).isCloseTo(-1.959963984540054, within(1e-15));
        assertThat(Distributions.normalQuantile(0.5)).isZero();
        // From memory (R pnorm): Φ(−1) = 0.158655253931457, Φ̄(5) = 2.866515718791939e−7, Φ̄(10) = 7.619853024160527e−24.
        assertThat(Distributions.normalCdf(-1)).isCloseTo(0.158655253931457, within(1e-15));
        assertThat(Distributions.normalSurvival(5)).isCloseTo(2.866515718791939e-7, withinPercentage(1e-10));
        assertThat(Distributions.normalSurvival(10)).isCloseTo(7.619853024160527e-24, withinPercentage(1e-10));
        // Exact identity: Φ(z) + Φ̄(z) = 1 and Φ(Φ⁻¹(p)) = p, over the whole range including AS 241's far tail (r > 5).
        for (double p : new double[] {1e-300, 1e-20, 1e-12, 1e-5, 0.01, 0.07, 0.2, 0.5, 0.8, 0.93, 0.99}) {
            double z = Distributions.normalQuantile(p);
            // relative 1e−13: an error of one ulp in z moves Φ(z) by about z·ulp(z) relative in the far tail
            assertThat(Distributions.normalCdf(z)).as("Φ(Φ⁻¹(%s))", p).isCloseTo(p, within(1e-13 * p + 1e-300));
        }
        for (double z = -8; z <= 8; z += 0.25) {
            assertThat(Distributions.normalCdf(z) + Distributions.normalSurvival(z)).isCloseTo(1, within(2e-16));
        }
        assertThat(Distributions.normalCdf(Double.POSITIVE_INFINITY)).isEqualTo(1);
        assertThat(Distributions.normalCdf(Double.NEGATIVE_INFINITY)).isZero();
        assertThat(Distributions.normalQuantile(0)).isEqualTo(Double.NEGATIVE_INFINITY);
        assertThat(Distributions.normalCdf(Double.NaN)).isNaN();
    }

    @Test
    void studentTAgainstClosedForms() {
        for (double p : new double[] {0.001, 0.025, 0.1, 0.3, 0.5, 0.6, 0.9, 0.975, 0.9995}) {
            // Exact: t with 1 df is Cauchy, quantile tan(π(p − ½)).
            double cauchy = Math.tan(Math.PI * (p - 0.5));
            assertThat(Distributions.studentTQuantile(p, 1)).as("t1 %s", p)
                .isCloseTo(cauchy, within(1e-13 * Math.max(1, Math.abs(cauchy))));
            // Exact: t with 2 df has quantile (2p − 1)/sqrt(2p(1 − p)).
            double t2 = (2 * p - 1) / Math.sqrt(2 * p * (1 - p));
            assertThat(Distributions.studentTQuantile(p, 2)).as("t2 %s", p)
                .isCloseTo(t2, within(1e-13 * Math.max(1, Math.abs(t2))));
            assertThat(Distributions.studentTCdf(t2, 2)).isCloseTo(p, within(1e-15));
        }
        // Published t tables (e.g. Fisher & Yates; any statistics text): t_{0.975,10} = 2.228, t_{0.975,30} = 2.042,
        // t_{0.995,5} = 4.032 (3 dp).
        assertThat(Distributions.studentTQuantile(0.975, 10)).isCloseTo(2.228, within(5e-4));
        assertThat(Distributions.studentTQuantile(0.975, 30)).isCloseTo(2.042, within(5e-4));
        assertThat(Distributions.studentTQuantile(0.995, 5)).isCloseTo(4.032, within(5e-4));
        // From memory (R qt): qt(0.975, 10) = 2.228138851986274.
        assertThat(Distributions.studentTQuantile(0.975, 10)).isCloseTo(2.228138851986274, within(1e-13));
        // Continuity across the switch to the Cornish–Fisher expansion at df = 1e6, and accuracy for huge df
        // (exact identity check: cdf(quantile(p)) = p).
        // Between df ≈ 1e3 and the switch at 1e5 the incomplete-beta continued fraction converges so slowly that its
        // last terms round away: the documented accuracy there is ~1e−12 relative, hence the looser check.
        for (double df : new double[] {30, 3e4, 99_999, 100_001, 5e5, 2e9, 1e12}) {
            for (double p : new double[] {1e-10, 0.025, 0.3, 0.975}) {
                double t = Distributions.studentTQuantile(p, df);
                double tolerance = df < 1e3 || df > 1e5 ? 1e-13 : 1e-11;
                assertThat(Distributions.studentTCdf(t, df)).as("probability %s at %s degrees of freedom", p, df)
                    .isCloseTo(p, within(tolerance * p + 1e-16));
            }
        }
        // Across the switch the quantile must move only by its true slope dt/dν ≈ −(z³ + z)/(4ν²) (A&S 26.7.5).
        double z = 1.959963984540054;
        double slope = -(z * z * z + z) / (4 * 1e10);
        assertThat(Distributions.studentTQuantile(0.975, 99_999) - Distributions.studentTQuantile(0.975, 100_001))
            .isCloseTo(-2 * slope, within(2e-12));
        // Huge df approaches the normal.
        assertThat(Distributions.studentTQuantile(0.975, 1e12)).isCloseTo(1.959963984540054, within(1e-11));
        assertThat(Distributions.studentTQuantile(0.975, Double.POSITIVE_INFINITY))
            .isEqualTo(Distributions.normalQuantile(0.975));
    }

    @Test
    void studentTQuantilesImpliedByCheckvaluesConfidenceIntervals() {
        // checkvalues.md §1: each delta CI is ψ̂ ± t_{0.975,df}·SE, so (upper − lower)/(2·SE) is R's qt(0.975, df).
        // S1 stagnant, df 24
        assertThat(Distributions.studentTQuantile(0.975, 24))
            .isCloseTo((0.0882345050964 + 0.00602294471476) / (2 * 0.0228348067981), within(2e-10));
        // S2 cars, df 46
        assertThat(Distributions.studentTQuantile(0.975, 46))
            .isCloseTo((25.3138783686 - 20.025927424) / (2 * 1.31351843273), within(2e-9));
        // S3 down (GLM uses t as segmented does), df 26
        assertThat(Distributions.studentTQuantile(0.975, 26))
            .isCloseTo((32.5697802676 - 29.5925209705) / (2 * 0.724207408848), within(2e-10));
        // S4 weighted, df 11
        assertThat(Distributions.studentTQuantile(0.975, 11))
            .isCloseTo((5.96060047227 - 4.83684594213) / (2 * 0.255284440467), within(2e-10));
    }

    @Test
    void fAndChiSquaredAgainstIdentities() {
        for (double f = 0.1; f < 30; f *= 1.7) {
            // Exact: F(2, d2) survival = (1 + 2f/d2)^(−d2/2).
            assertThat(Distributions.fSurvival(f, 2, 46)).isCloseTo(Math.pow(1 + 2 * f / 46, -23), within(1e-14));
            // Exact: F(1, d) = t², so P(F > t²) = 2·P(T > t).
            double t = Math.sqrt(f);
            assertThat(Distributions.fSurvival(f, 1, 9)).isCloseTo(2 * Distributions.studentTSurvival(t, 9),
                within(1e-14));
            // Exact: χ²₂ survival = exp(−x/2); χ²₁ survival = 2Φ̄(√x).
            assertThat(Distributions.chiSquaredSurvival(f, 2)).isCloseTo(Math.exp(-f / 2), within(1e-15));
            assertThat(Distributions.chiSquaredSurvival(f, 1)).isCloseTo(2 * Distributions.normalSurvival(t),
                within(1e-14));
        }
        // checkvalues.md S2 (R anova): naive F 2.58052 on (2, 46) has p = 0.086662.
        assertThat(Distributions.fSurvival(2.58052, 2, 46)).isCloseTo(0.086662, within(5e-6));
        // Exact: for even df = 2k, P(χ²_{2k} > x) = P(Poisson(x/2) ≤ k − 1); the sum is done in BigDecimal.
        // Cases cover the series branch (x < a + 1), the continued fraction, and the large-a prefactor.
        double[][] chi = {{100, 200}, {100, 80}, {6, 3}, {6, 30}, {2000, 1900}, {2000, 2300}};
        for (double[] c : chi) {
            double expected = poissonCdf((int) (c[0] / 2) - 1, c[1] / 2);
            double tail = Distributions.chiSquaredSurvival(c[1], c[0]);
            assertThat(tail).as("χ²_%s > %s", c[0], c[1]).isCloseTo(expected, within(2e-13 * expected));
            assertThat(Distributions.regularizedGammaP(c[0] / 2, c[1] / 2) + tail).isCloseTo(1, within(2e-15));
        }
        assertThat(Distributions.fSurvival(0, 2, 3)).isEqualTo(1);
        assertThatIllegalArgumentException().isThrownBy(() -> Distributions.fSurvival(1, -2, 3))
            .withMessageContaining("d1 must be positive, was -2.0");
    }

    private static double poissonCdf(int k, double mean) {
        MathContext mc = new MathContext(50);
        BigDecimal m = new BigDecimal(mean);
        BigDecimal term = BigDecimal.ONE;
        BigDecimal sum = BigDecimal.ONE;
        for (int j = 1; j <= k; j++) {
            term = term.multiply(m, mc).divide(BigDecimal.valueOf(j), mc);
            sum = sum.add(term, mc);
        }
        // ln(sum) − mean, so that e^{1150}·e^{−1150} does not overflow
        int digits = sum.precision() - sum.scale();
        double logSum = Math.log(sum.movePointLeft(digits).doubleValue()) + digits * Math.log(10);
        return Math.exp(logSum - mean);
    }

    private static double logOf(BigInteger value) {
        int shift = Math.max(0, value.bitLength() - 1000);
        return Math.log(value.shiftRight(shift).doubleValue()) + shift * Math.log(2);
    }

    private static double binomialUpperTail(int n, int k, double p) {
        MathContext mc = new MathContext(40);
        BigDecimal bp = new BigDecimal(p);
        BigDecimal bq = BigDecimal.ONE.subtract(bp);
        BigDecimal sum = BigDecimal.ZERO;
        for (int j = k; j <= n; j++) {
            BigDecimal choose = new BigDecimal(binomial(n, j));
            sum = sum.add(choose.multiply(bp.pow(j, mc), mc).multiply(bq.pow(n - j, mc), mc), mc);
        }
        return sum.doubleValue();
    }

    private static BigInteger binomial(int n, int k) {
        BigInteger r = BigInteger.ONE;
        for (int i = 1; i <= k; i++) {
            r = r.multiply(BigInteger.valueOf(n - k + i)).divide(BigInteger.valueOf(i));
        }
        return r;
    }
}
