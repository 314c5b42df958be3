package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * Offline knee (or elbow) detection by the Kneedle algorithm: the point of a curve where extra x stops paying off,
 * for example the ad count after which each extra ad costs more readers than it earns.
 *
 * <p>Steps (Satopää et al. 2011 [1], as implemented by the reference library kneed [2], without its smoothing step
 * unless {@link Smoothing#MOVING_AVERAGE} is chosen):
 * <ol>
 * <li>normalise x and y to [0, 1] (x' = (x − min x)/(max x − min x), likewise y);</li>
 * <li>map the curve to a <i>concave increasing</i> one by a geometric reflection: convex decreasing y' → 1 − y';
 *     concave decreasing x' → 1 − x' (order reversed); convex increasing both (order reversed);</li>
 * <li>difference curve D<sub>i</sub> = y'<sub>i</sub> − x'<sub>i</sub>;</li>
 * <li>at every local maximum i* of D (a point ≥ both neighbours; an end point compares with its one neighbour) set the
 *     threshold T = D<sub>i*</sub> − S · mean(Δx'), S the sensitivity; walking right, a knee is declared at i* as soon
 *     as D falls below T, unless a local minimum of D comes first (which suspends the search until the next maximum);</li>
 * <li>the first knee found is the offline answer; all knees are reported too.</li>
 * </ol>
 *
 * <p>Conventions:
 * <ul>
 * <li>x must be strictly increasing. For unevenly spaced x the reflection is geometric (x' ↦ 1 − x' with the point
 *     order reversed), so the knee is a property of the curve's shape and does not depend on how the points are
 *     spaced. kneed instead reverses the y array without reflecting x, which is the same only for evenly spaced x.</li>
 * <li>{@link Curve#AUTO}: concave if the trapezoid area between the normalised curve and the chord joining its two end
 *     points is positive (a concave curve lies above its chord), convex otherwise. {@link Direction#AUTO}: increasing
 *     if the last y is greater than the first, decreasing if smaller; on a tie, the sign of the least-squares slope,
 *     and increasing if that is zero too.</li>
 * <li>The difference curve in the result is given per input point (index i belongs to x<sub>i</sub>), whatever the
 *     reflection.</li>
 * <li>Fewer than 3 points, a constant y or an all-zero difference curve give a result with {@code found() == false}
 *     and a reason, not an exception. Non-finite or unsorted input throws {@link IllegalArgumentException}.</li>
 * </ul>
 *
 * <p>References: [1] Satopää V, Albrecht J, Irwin D, Raghavan B (2011) Finding a "Kneedle" in a haystack: detecting
 * knee points in system behavior. <i>31st International Conference on Distributed Computing Systems Workshops
 * (ICDCS Workshops)</i>, pp. 166–171, doi:10.1109/ICDCSW.2011.20. [2] Arvai K, kneed 0.8.6 (github.com/arvkevi/kneed).
 */
public final class Kneedle {

    /** Shape of the curve: concave (bends down, like saturating revenue) or convex (bends up). */
    public enum Curve {
        CONCAVE, CONVEX,
        /** Decide from the data (see the class documentation). */
        AUTO
    }

    /** Whether y grows or falls with x. */
    public enum Direction {
        INCREASING, DECREASING,
        /** Decide from the data (see the class documentation). */
        AUTO
    }

    /** Optional smoothing of y before the search. */
    public enum Smoothing {
        /** Use the points as given (the convention of the check values). */
        NONE,
        /**
         * Centred moving average over {@link Options#smoothingWindow()} points (by index; the window shrinks at the
         * ends). A simple stand-in for the paper's smoothing spline, for noisy curves.
         */
        MOVING_AVERAGE
    }

    /**
     * Immutable options; start from {@link #defaults()} (S = 1, curve and direction automatic, no smoothing).
     *
     * @param sensitivity     S ≥ 0; larger S waits for a clearer knee (S = 0 declares one at the first dip)
     * @param curve           curve shape, or {@link Curve#AUTO}
     * @param direction       direction, or {@link Direction#AUTO}
     * @param smoothing       smoothing of y
     * @param smoothingWindow odd window ≥ 3 for {@link Smoothing#MOVING_AVERAGE}
     */
    public record Options(double sensitivity, Curve curve, Direction direction, Smoothing smoothing,
                          int smoothingWindow) {

        public Options {
            if (!(sensitivity >= 0) || Double.isInfinite(sensitivity)) {
                throw new IllegalArgumentException("sensitivity must be finite and >= 0, was " + sensitivity);
            }
            Objects.requireNonNull(curve, "curve");
            Objects.requireNonNull(direction, "direction");
            Objects.requireNonNull(smoothing, "smoothing");
            if (smoothingWindow < 3 || smoothingWindow % 2 == 0) {
                throw new IllegalArgumentException("smoothingWindow must be odd and >= 3, was " + smoothingWindow);
            }
        }

        public static Options defaults() {
            return new Options(1.0, Curve.AUTO, Direction.AUTO, Smoothing.NONE, 3);
        }

        public Options withSensitivity(double s) {
            return new Options(s, curve, direction, smoothing, smoothingWindow);
        }

        public Options withCurve(Curve c) {
            return new Options(sensitivity, c, direction, smoothing, smoothingWindow);
        }

        public Options withDirection(Direction d) {
            return new Options(sensitivity, curve, d, smoothing, smoothingWindow);
        }

        /** Shorthand for {@code withCurve(c).withDirection(d)}. */
        public Options withShape(Curve c, Direction d) {
            return withCurve(c).withDirection(d);
        }

        public Options withSmoothing(Smoothing s) {
            return new Options(sensitivity, curve, direction, s, smoothingWindow);
        }

        public Options withSmoothingWindow(int w) {
            return new Options(sensitivity, curve, direction, smoothing, w);
        }
    }

    /**
     * Outcome of a knee search.
     *
     * @param found           whether a knee was found
     * @param kneeX           x of the first knee (the offline answer); NaN if none
     * @param kneeIndex       index of that point in the input; −1 if none
     * @param kneeY           y of that point as given (not smoothed); NaN if none
     * @param allKneeX        x of every knee found, in increasing x order
     * @param differenceCurve D per input point (empty when the input was too short or constant)
     * @param curve           the curve shape used (AUTO only if the input was too short or constant to decide)
     * @param direction       the direction used (AUTO only if the input was too short or constant to decide)
     * @param reason          why there is no knee, or "knee found"
     */
    public record Result(boolean found, double kneeX, int kneeIndex, double kneeY, List<Double> allKneeX,
                         List<Double> differenceCurve, Curve curve, Direction direction, String reason) {

        public Result {
            allKneeX = List.copyOf(allKneeX);
            differenceCurve = List.copyOf(differenceCurve);
        }

        static Result none(String reason, Curve curve, Direction direction, List<Double> d) {
            return new Result(false, Double.NaN, -1, Double.NaN, List.of(), d, curve, direction, reason);
        }
    }

    private Kneedle() {
    }

    /** Finds knees with {@link Options#defaults()}. */
    public static Result find(double[] x, double[] y) {
        return find(x, y, Options.defaults());
    }

    /**
     * Finds knees of the curve (x<sub>i</sub>, y<sub>i</sub>).
     *
     * @throws IllegalArgumentException if the arrays differ in length, hold a non-finite value, or x is not strictly
     *                                  increasing
     */
    public static Result find(double[] x, double[] y, Options options) {
        Objects.requireNonNull(x, "x");
        Objects.requireNonNull(y, "y");
        Objects.requireNonNull(options, "options");
        if (x.length != y.length) {
            throw new IllegalArgumentException("x and y must have equal lengths, were " + x.length + " and " + y.length);
        }
        int n = x.length;
        for (int i = 0; i < n; i++) {
            if (!Double.isFinite(x[i])) {
                throw new IllegalArgumentException("x[" + i + "] must be finite, was " + x[i]);
            }
            if (!Double.isFinite(y[i])) {
                throw new IllegalArgumentException("y[" + i + "] must be finite, was " + y[i]);
            }
            if (i > 0 && !(x[i] > x[i - 1])) {
                throw new IllegalArgumentException("x must be strictly increasing, but x[" + (i - 1) + "] = "
                    + x[i - 1] + " and x[" + i + "] = " + x[i]);
            }
        }
        Curve curve = options.curve();
        Direction direction = options.direction();
        if (n < 3) {
            return Result.none("no knee: need at least 3 points, got " + n, curve, direction, List.of());
        }
        double[] ys = options.smoothing() == Smoothing.MOVING_AVERAGE ? movingAverage(y, options.smoothingWindow()) : y;
        double[] xn = normalise(x);
        double[] yn = normalise(ys);
        if (yn == null) {
            return Result.none("no knee: y is constant", curve, direction, List.of());
        }
        if (direction == Direction.AUTO) {
            direction = chooseDirection(xn, yn);
        }
        if (curve == Curve.AUTO) {
            curve = chooseCurve(xn, yn);
        }

        // Reflect into "concave increasing"; back[j] is the input index of transformed point j.
        boolean reversed = (curve == Curve.CONCAVE) == (direction == Direction.DECREASING);
        boolean flipY = curve == Curve.CONVEX;
        double[] xt = new double[n];
        double[] yt = new double[n];
        int[] back = new int[n];
        for (int j = 0; j < n; j++) {
            int i = reversed ? n - 1 - j : j;
            back[j] = i;
            xt[j] = reversed ? 1 - xn[i] : xn[i];
            yt[j] = flipY ? 1 - yn[i] : yn[i];
        }
        double[] d = new double[n];
        for (int j = 0; j < n; j++) {
            d[j] = yt[j] - xt[j];
        }
        List<Double> dByInput = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            dByInput.add(d[reversed ? n - 1 - i : i]);
        }

        // Mean step of the normalised x: 1/(n − 1) for sorted x, whatever the spacing.
        double meanStep = 1.0 / (n - 1);
        double threshold = 0;
        int armed = -1;
        boolean active = false;
        List<Integer> knees = new ArrayList<>();
        for (int j = 0; j < n - 1; j++) {
            boolean isMax = d[j] >= (j > 0 ? d[j - 1] : d[j]) && d[j] >= d[j + 1];
            boolean isMin = d[j] <= (j > 0 ? d[j - 1] : d[j]) && d[j] <= d[j + 1];
            if (isMax) {
                threshold = d[j] - options.sensitivity() * meanStep;
                armed = j;
                active = true;
            }
            if (isMin) {
                // After a local minimum a fall below the old threshold is not a knee of the old maximum.
                active = false;
            }
            if (active && d[j + 1] < threshold) {
                knees.add(back[armed]);
                active = false;
            }
        }
        if (knees.isEmpty()) {
            return Result.none("no knee: the difference curve never falls below the threshold after a maximum",
                curve, direction, dByInput);
        }
        int first = knees.get(0);
        List<Double> all = knees.stream().distinct().sorted().map(i -> x[i]).toList();
        return new Result(true, x[first], first, y[first], all, dByInput, curve, direction, "knee found");
    }

    private static double[] normalise(double[] v) {
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (double e : v) {
            min = Math.min(min, e);
            max = Math.max(max, e);
        }
        double range = max - min;
        if (!(range > 0)) {
            return null;
        }
        double[] out = new double[v.length];
        for (int i = 0; i < v.length; i++) {
            out[i] = (v[i] - min) / range;
        }
        return out;
    }

    static Direction chooseDirection(double[] xn, double[] yn) {
        int n = yn.length;
        if (yn[n - 1] != yn[0]) {
            return yn[n - 1] > yn[0] ? Direction.INCREASING : Direction.DECREASING;
        }
        double mx = 0;
        double my = 0;
        for (int i = 0; i < n; i++) {
            mx += xn[i];
            my += yn[i];
        }
        mx /= n;
        my /= n;
        double sxy = 0;
        for (int i = 0; i < n; i++) {
            sxy += (xn[i] - mx) * (yn[i] - my);
        }
        return sxy < 0 ? Direction.DECREASING : Direction.INCREASING;
    }

    static Curve chooseCurve(double[] xn, double[] yn) {
        int n = yn.length;
        double slope = (yn[n - 1] - yn[0]) / (xn[n - 1] - xn[0]);
        double area = 0;
        for (int i = 1; i < n; i++) {
            double g0 = yn[i - 1] - (yn[0] + slope * (xn[i - 1] - xn[0]));
            double g1 = yn[i] - (yn[0] + slope * (xn[i] - xn[0]));
            area += 0.5 * (g0 + g1) * (xn[i] - xn[i - 1]);
        }
        return area > 0 ? Curve.CONCAVE : Curve.CONVEX;
    }

    private static double[] movingAverage(double[] y, int window) {
        int half = window / 2;
        double[] out = new double[y.length];
        for (int i = 0; i < y.length; i++) {
            int lo = Math.max(0, i - half);
            int hi = Math.min(y.length - 1, i + half);
            double s = 0;
            for (int j = lo; j <= hi; j++) {
                s += y[j];
            }
            out[i] = s / (hi - lo + 1);
        }
        return out;
    }
}
