package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * Bayesian online changepoint detection (BOCPD) on a series of counts (successes k<sub>t</sub> out of trials
 * n<sub>t</sub>, e.g. bounces out of sessions per hour) with a Beta-Binomial observation model and a constant hazard:
 * after each step, the posterior over the current run length r<sub>t</sub> (steps since the last change).
 *
 * <p>Algorithm 1 of Adams and MacKay [1], in log space. Convention (as in the paper): P(r<sub>0</sub> = 0) = 1; the
 * predictive for run length r uses the last r observations; growth r → r + 1 with probability 1 − H, change r → 0
 * with probability H, and the statistics of r = 0 are the prior Beta(α<sub>0</sub>, β<sub>0</sub>) (x<sub>t</sub> not
 * included). So P(r<sub>t</sub> = 0 | x<sub>1:t</sub>) = H at every t, and r<sub>t</sub> = 1 means "the current run
 * began with x<sub>t</sub>". The predictive is the Beta-Binomial pmf with its binomial coefficient,
 * C(n, k)·B(α + k, β + n − k)/B(α, β), so the log evidence ln P(x<sub>1:T</sub>) = Σ<sub>t</sub> ln
 * P(x<sub>t</sub> | x<sub>1:t−1</sub>) is that of the counts, not of one Bernoulli sequence.
 *
 * <p>Reported per step: the MAP run length and its probability, the expected run length, and the probability of a
 * change within the last w steps, P(r<sub>t</sub> ≤ w) (w = {@link Options#recentWindow()}; it includes the
 * constant H of r<sub>t</sub> = 0); optionally the whole run-length posterior.
 *
 * <p>Run-length truncation ({@link Options#maxRunLength()} = R &gt; 0) bounds the cost at O(T·R) instead of
 * O(T²): run lengths ≥ R share one state whose predictive uses only the last R observations (a sliding window). The
 * results are exact while t &lt; R; afterwards the model forgets data older than R steps, a MAP run length of R
 * means "R or longer", and the log evidence is that of the windowed model. Choose R well above the segment lengths
 * that matter (for hourly data, a few weeks).
 *
 * <p>Assumptions and caveats: within a run the k<sub>t</sub> are binomial with one common rate (overdispersion, e.g.
 * day-of-week or hour-of-day cycles, shows up as spurious changes; deseasonalise or aggregate first); the hazard is
 * the prior rate of changes per step (1/H = expected run length). An empty series gives no steps and log evidence 0;
 * a step with n<sub>t</sub> = 0 carries no information (predictive 1). Negative counts, successes above trials, a
 * non-positive or non-finite prior, or H outside (0, 1) throw {@link IllegalArgumentException}.
 *
 * <p>Reference: [1] Adams RP, MacKay DJC (2007) Bayesian online changepoint detection. arXiv:0710.3742 [stat.ML].
 */
public final class BayesianChangepoint {

    /**
     * Immutable options; {@link #defaults()}: prior Beta(1, 1), hazard 1/100, no truncation, recent window 2, run-length
     * posteriors not kept.
     *
     * @param priorAlpha     α<sub>0</sub> &gt; 0
     * @param priorBeta      β<sub>0</sub> &gt; 0
     * @param hazard         H in (0, 1), the prior probability of a change at each step
     * @param maxRunLength   R ≥ 1 to truncate (see the class documentation), 0 for none
     * @param recentWindow   w ≥ 0 for {@link Step#recentChangeProbability()}
     * @param keepPosteriors whether each {@link Step} carries its full run-length posterior (memory O(T²))
     */
    public record Options(double priorAlpha, double priorBeta, double hazard, int maxRunLength, int recentWindow,
                          boolean keepPosteriors) {

        public Options {
            if (!(priorAlpha > 0) || Double.isInfinite(priorAlpha)) {
                throw new IllegalArgumentException("priorAlpha must be finite and > 0, was " + priorAlpha);
            }
            if (!(priorBeta > 0) || Double.isInfinite(priorBeta)) {
                throw new IllegalArgumentException("priorBeta must be finite and > 0, was " + priorBeta);
            }
            if (!(hazard > 0 && hazard < 1)) {
                throw new IllegalArgumentException("hazard must be in (0, 1), was " + hazard);
            }
            if (maxRunLength < 0) {
                throw new IllegalArgumentException("maxRunLength must be >= 0 (0 = no truncation), was "
                    + maxRunLength);
            }
            if (recentWindow < 0) {
                throw new IllegalArgumentException("recentWindow must be >= 0, was " + recentWindow);
            }
        }

        public static Options defaults() {
            return new Options(1, 1, 0.01, 0, 2, false);
        }

        public Options withPrior(double alpha, double beta) {
            return new Options(alpha, beta, hazard, maxRunLength, recentWindow, keepPosteriors);
        }

        public Options withHazard(double h) {
            return new Options(priorAlpha, priorBeta, h, maxRunLength, recentWindow, keepPosteriors);
        }

        public Options withMaxRunLength(int r) {
            return new Options(priorAlpha, priorBeta, hazard, r, recentWindow, keepPosteriors);
        }

        public Options withRecentWindow(int w) {
            return new Options(priorAlpha, priorBeta, hazard, maxRunLength, w, keepPosteriors);
        }

        public Options withKeepPosteriors(boolean keep) {
            return new Options(priorAlpha, priorBeta, hazard, maxRunLength, recentWindow, keep);
        }
    }

    /**
     * The run-length posterior after one step.
     *
     * @param index                   0-based step index
     * @param mapRunLength            most probable run length (smallest on ties)
     * @param mapProbability          its posterior probability
     * @param expectedRunLength       posterior mean of r<sub>t</sub>
     * @param recentChangeProbability P(r<sub>t</sub> ≤ w)
     * @param logPredictive           ln P(x<sub>t</sub> | x<sub>1:t−1</sub>)
     * @param runLengthPosterior      P(r<sub>t</sub> = r | x<sub>1:t</sub>) for r = 0..t (or 0..R), empty unless kept
     */
    public record Step(int index, int mapRunLength, double mapProbability, double expectedRunLength,
                       double recentChangeProbability, double logPredictive, double[] runLengthPosterior) {

        public Step {
            runLengthPosterior = runLengthPosterior.clone();
        }

        @Override
        public double[] runLengthPosterior() {
            return runLengthPosterior.clone();
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Step s && index == s.index && mapRunLength == s.mapRunLength
                && Double.compare(mapProbability, s.mapProbability) == 0
                && Double.compare(expectedRunLength, s.expectedRunLength) == 0
                && Double.compare(recentChangeProbability, s.recentChangeProbability) == 0
                && Double.compare(logPredictive, s.logPredictive) == 0
                && Arrays.equals(runLengthPosterior, s.runLengthPosterior);
        }

        @Override
        public int hashCode() {
            return Objects.hash(index, mapRunLength, mapProbability, expectedRunLength, recentChangeProbability,
                logPredictive, Arrays.hashCode(runLengthPosterior));
        }

        @Override
        public String toString() {
            return "Step[index=" + index + ", map=" + mapRunLength + " (" + mapProbability + "), E[r]="
                + expectedRunLength + ", P(r<=w)=" + recentChangeProbability + "]";
        }
    }

    /**
     * Outcome of a pass over the series.
     *
     * @param steps          one entry per observation
     * @param logEvidence    ln P(x<sub>1:T</sub>) (0 for an empty series)
     * @param finalPosterior the run-length posterior after the last step ({1} for an empty series)
     */
    public record Result(List<Step> steps, double logEvidence, double[] finalPosterior) {

        public Result {
            steps = List.copyOf(steps);
            finalPosterior = finalPosterior.clone();
        }

        @Override
        public double[] finalPosterior() {
            return finalPosterior.clone();
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Result r && steps.equals(r.steps) && Double.compare(logEvidence, r.logEvidence) == 0
                && Arrays.equals(finalPosterior, r.finalPosterior);
        }

        @Override
        public int hashCode() {
            return Objects.hash(steps, logEvidence, Arrays.hashCode(finalPosterior));
        }

        @Override
        public String toString() {
            return "Result[steps=" + steps.size() + ", logEvidence=" + logEvidence + ", finalPosterior="
                + Arrays.toString(finalPosterior) + "]";
        }
    }

    private BayesianChangepoint() {
    }

    /** Runs the detector with {@link Options#defaults()}. */
    public static Result detect(long[] successes, long[] trials) {
        return detect(successes, trials, Options.defaults());
    }

    /**
     * Runs the detector over the whole series.
     *
     * @throws IllegalArgumentException on unequal lengths, negative counts or successes above trials
     */
    public static Result detect(long[] successes, long[] trials, Options options) {
        Objects.requireNonNull(successes, "successes");
        Objects.requireNonNull(trials, "trials");
        Objects.requireNonNull(options, "options");
        if (successes.length != trials.length) {
            throw new IllegalArgumentException("successes and trials must have equal lengths, were "
                + successes.length + " and " + trials.length);
        }
        for (int i = 0; i < trials.length; i++) {
            Cusum.checkCounts(i, successes[i], trials[i]);
        }
        int steps = trials.length;
        int cap = options.maxRunLength() > 0 ? Math.min(options.maxRunLength(), steps) : steps;
        double a0 = options.priorAlpha();
        double b0 = options.priorBeta();
        double logB0 = Distributions.logBeta(a0, b0);
        double logH = Math.log(options.hazard());
        double log1mH = Math.log1p(-options.hazard());

        // State for r = 0..len−1: log posterior, Beta parameters and ln B(α, β) (reused as the next normaliser).
        double[] logp = new double[cap + 2];
        double[] alpha = new double[cap + 2];
        double[] beta = new double[cap + 2];
        double[] logB = new double[cap + 2];
        double[] nextLogp = new double[cap + 2];
        double[] nextAlpha = new double[cap + 2];
        double[] nextBeta = new double[cap + 2];
        double[] nextLogB = new double[cap + 2];
        double[] joint = new double[cap + 1];
        int len = 1;
        logp[0] = 0;
        alpha[0] = a0;
        beta[0] = b0;
        logB[0] = logB0;

        List<Step> out = new ArrayList<>(steps);
        double logEvidence = 0;
        for (int t = 0; t < steps; t++) {
            long k = successes[t];
            long n = trials[t];
            double logChoose = Distributions.logGamma(n + 1.0) - Distributions.logGamma(k + 1.0)
                - Distributions.logGamma(n - k + 1.0);
            double maxJoint = Double.NEGATIVE_INFINITY;
            for (int r = 0; r < len; r++) {
                double a = alpha[r] + k;
                double b = beta[r] + (n - k);
                double lb = n == 0 ? logB[r] : Distributions.logBeta(a, b);
                joint[r] = logp[r] + logChoose + lb - logB[r]; // ln P(r_{t−1} = r, x_t | x_{1:t−1})
                nextLogp[r + 1] = joint[r] + log1mH;
                nextAlpha[r + 1] = a;
                nextBeta[r + 1] = b;
                nextLogB[r + 1] = lb;
                maxJoint = Math.max(maxJoint, joint[r]);
            }
            double sumJoint = 0;
            for (int r = 0; r < len; r++) {
                sumJoint += Math.exp(joint[r] - maxJoint);
            }
            double logPredictive = maxJoint + Math.log(sumJoint); // ln P(x_t | x_{1:t−1})
            nextLogp[0] = logPredictive + logH;
            nextAlpha[0] = a0;
            nextBeta[0] = b0;
            nextLogB[0] = logB0;
            int nextLen = len + 1;
            if (nextLen > cap + 1) {
                // Truncation: the state "run length ≥ R" keeps the window statistics of r = R and absorbs r = R + 1.
                nextLogp[cap] = logAdd(nextLogp[cap], nextLogp[cap + 1]);
                nextLen = cap + 1;
            }
            // Normalise: growth and change terms add up to the predictive, so the posterior is joint − predictive.
            double total = Double.NEGATIVE_INFINITY;
            for (int r = 0; r < nextLen; r++) {
                total = logAdd(total, nextLogp[r]);
            }
            logEvidence += logPredictive;
            double expected = 0;
            double recent = 0;
            int map = 0;
            double mapP = -1;
            double[] posterior = options.keepPosteriors() ? new double[nextLen] : new double[0];
            for (int r = 0; r < nextLen; r++) {
                // Normalising by the computed total (equal to the predictive up to rounding) keeps Σ P = 1 exactly.
                nextLogp[r] -= total;
                double p = Math.exp(nextLogp[r]);
                expected += r * p;
                if (r <= options.recentWindow()) {
                    recent += p;
                }
                if (p > mapP) {
                    mapP = p;
                    map = r;
                }
                if (options.keepPosteriors()) {
                    posterior[r] = p;
                }
            }
            out.add(new Step(t, map, mapP, expected, Math.min(1, recent), logPredictive, posterior));

            double[] swap = logp;
            logp = nextLogp;
            nextLogp = swap;
            swap = alpha;
            alpha = nextAlpha;
            nextAlpha = swap;
            swap = beta;
            beta = nextBeta;
            nextBeta = swap;
            swap = logB;
            logB = nextLogB;
            nextLogB = swap;
            len = nextLen;
        }
        double[] finalPosterior = new double[len];
        for (int r = 0; r < len; r++) {
            finalPosterior[r] = Math.exp(logp[r]);
        }
        return new Result(out, logEvidence, finalPosterior);
    }

    private static double logAdd(double x, double y) {
        if (x == Double.NEGATIVE_INFINITY) {
            return y;
        }
        if (y == Double.NEGATIVE_INFINITY) {
            return x;
        }
        double m = Math.max(x, y);
        return m + Math.log1p(Math.exp(-Math.abs(x - y)));
    }
}
