package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Least-squares search for the breakpoints ψ₁ &lt; … &lt; ψ_k of y = b₀ + b₁x + Σ dⱼ(x − ψⱼ)₊ on data aggregated per
 * distinct x (see {@link DistinctData}).
 *
 * <p>Why it is exact: while ψ stays inside one interval [uⱼ, uⱼ₊₁] between consecutive distinct x values, its hinge
 * column is (x − ψ)₊ = a − ψb with a = x·1{x ≥ uⱼ₊₁} and b = 1{x ≥ uⱼ₊₁} fixed. With the other columns Z fixed and M the
 * projection onto the orthogonal complement of Z, RSS(ψ) = yᵀMy − (p − ψq)²/(A − 2Bψ + Dψ²) where p = yᵀMa,
 * q = yᵀMb, A = aᵀMa, B = aᵀMb, D = bᵀMb. Setting the derivative to zero leaves a linear equation, so the only
 * interior stationary point is ψ* = (qA − pB)/(qB − pD); the minimum over the interval is at ψ* or at an end. All of
 * this is computed from Householder-QR residuals, not from normal equations.
 *
 * <ul>
 * <li>k = 1: every admissible interval is evaluated in closed form: the global least-squares breakpoint.</li>
 * <li>k ≥ 2: every admissible combination of intervals is searched (coordinate descent with the exact closed-form
 *     step for each ψ inside its own interval) as long as the number of combinations is at most the exact-search
 *     limit; the best combination wins. Above the limit a global coordinate descent is used instead (each ψ moved to
 *     its best position over all intervals, from a greedy start and evenly spaced starts); that is no longer
 *     guaranteed to find the global optimum, and the result says so.</li>
 * <li>With many distinct x values (so that the per-interval QR work exceeds ~5·10⁶ operations) the intervals are
 *     first screened with suffix sums of the same projections (O(m) for all intervals, but formed by subtraction and so
 *     less accurate), and the best few are re-evaluated exactly.</li>
 * </ul>
 * Segments must contain at least h distinct x values each (h = minDistinctPerSegment).
 */
final class HingeSearch {

    /** Best breakpoints found. */
    record Result(double[] psi, int[] intervals, double rss, boolean exact) {
    }

    private static final int SCREEN_KEEP = 5;
    private static final double QR_WORK_LIMIT = 5e6;

    private final DistinctData data;
    private final int m;
    private final double[] sw;
    private final double[] yv;
    private final double[] swu;

    HingeSearch(DistinctData data) {
        this.data = data;
        this.m = data.size();
        this.sw = new double[m];
        this.yv = new double[m];
        this.swu = new double[m];
        for (int j = 0; j < m; j++) {
            sw[j] = Math.sqrt(data.weight[j]);
            yv[j] = sw[j] * data.mean[j];
            swu[j] = sw[j] * data.u[j];
        }
    }

    /** Number of admissible interval combinations for k breakpoints with h distinct x per segment. */
    static double combinations(int m, int k, int h) {
        if (k == 0) {
            return 1;
        }
        long positions = (long) m - 2L * h + 1 - (long) (k - 1) * (h - 1);
        if (positions < k) {
            return 0;
        }
        double c = 1;
        for (int i = 0; i < k; i++) {
            c = c * (positions - i) / (i + 1);
        }
        return c;
    }

    /** Whether k breakpoints fit with h distinct x values per segment. */
    static boolean feasible(int m, int k, int h) {
        return m >= (k + 1) * h;
    }

    /** √W-scaled design columns [1, x, (x − ψ₁)₊, …]. */
    double[][] columns(double[] psi) {
        double[][] c = new double[2 + psi.length][];
        c[0] = sw.clone();
        c[1] = swu.clone();
        for (int l = 0; l < psi.length; l++) {
            double[] h = new double[m];
            for (int j = 0; j < m; j++) {
                h[j] = data.u[j] > psi[l] ? sw[j] * (data.u[j] - psi[l]) : 0;
            }
            c[2 + l] = h;
        }
        return c;
    }

    double[] scaledResponse() {
        return yv.clone();
    }

    /** Aggregated (between-x) RSS of the fit with breakpoints psi; add data.withinSumOfSquares for the total. */
    double aggregatedRss(double[] psi) {
        return new HouseholderQr(columns(psi)).residualSumOfSquares(yv);
    }

    Result search(int k, int h, double exactLimit) {
        if (k == 0) {
            return new Result(new double[0], new int[0], aggregatedRss(new double[0]), true);
        }
        if (k == 1) {
            Step best = profile(new double[0], h - 1, m - 1 - h);
            return new Result(new double[] {best.psi}, new int[] {best.interval}, best.rss, true);
        }
        if (combinations(m, k, h) <= exactLimit) {
            return exhaustive(k, h);
        }
        return globalCoordinateDescent(k, h);
    }

    // ------------------------------------------------------------------ exhaustive search over interval combinations

    private Result exhaustive(int k, int h) {
        int[] combo = new int[k];
        for (int i = 0; i < k; i++) {
            combo[i] = h - 1 + i * h;
        }
        Result best = null;
        while (true) {
            Result r = descendInBox(combo);
            if (best == null || r.rss < best.rss) {
                best = r;
            }
            // next combination in lexicographic order with gaps ≥ h and last ≤ m − 1 − h
            int i = k - 1;
            while (i >= 0 && combo[i] >= m - 1 - h - (k - 1 - i) * h) {
                i--;
            }
            if (i < 0) {
                break;
            }
            combo[i]++;
            for (int l = i + 1; l < k; l++) {
                combo[l] = combo[l - 1] + h;
            }
        }
        return new Result(best.psi, best.intervals, best.rss, true);
    }

    /** Coordinate descent with every ψᵢ kept inside its own interval [u_{combo[i]}, u_{combo[i]+1}]. */
    private Result descendInBox(int[] combo) {
        int k = combo.length;
        double[] psi = new double[k];
        for (int i = 0; i < k; i++) {
            psi[i] = 0.5 * (data.u[combo[i]] + data.u[combo[i] + 1]);
        }
        double scale = data.u[m - 1] - data.u[0];
        double rss = Double.POSITIVE_INFINITY;
        for (int sweep = 0; sweep < 500; sweep++) {
            double maxMove = 0;
            double before = rss;
            for (int i = 0; i < k; i++) {
                Step s = exactStep(others(psi, i), combo[i], null);
                maxMove = Math.max(maxMove, Math.abs(s.psi - psi[i]));
                psi[i] = s.psi;
                rss = s.rss;
            }
            if (maxMove <= 1e-13 * scale || (before - rss) <= 1e-15 * Math.abs(rss) && maxMove <= 1e-9 * scale) {
                break;
            }
        }
        return new Result(psi, combo.clone(), rss, true);
    }

    private static double[] others(double[] psi, int skip) {
        double[] o = new double[psi.length - 1];
        for (int i = 0, c = 0; i < psi.length; i++) {
            if (i != skip) {
                o[c++] = psi[i];
            }
        }
        return o;
    }

    // ------------------------------------------------------------------ global coordinate descent (large problems)

    private Result globalCoordinateDescent(int k, int h) {
        List<int[]> starts = new ArrayList<>();
        // Greedy start: add breakpoints one at a time, each at its best position given the earlier ones.
        double[] greedy = new double[0];
        int[] greedyIntervals = new int[0];
        for (int i = 0; i < k; i++) {
            Step best = null;
            for (int[] range : freeRanges(greedyIntervals, h)) {
                Step s = profile(greedy, range[0], range[1]);
                if (s != null && (best == null || s.rss < best.rss)) {
                    best = s;
                }
            }
            if (best == null) {
                break;
            }
            greedy = insertSorted(greedy, best.psi);
            greedyIntervals = insertSorted(greedyIntervals, best.interval);
        }
        if (greedyIntervals.length == k) {
            starts.add(greedyIntervals);
        }
        // Evenly spaced starts over the admissible range.
        for (int s = 0; s < 3; s++) {
            int[] start = new int[k];
            int lo = h - 1;
            int hi = m - 1 - h;
            for (int i = 0; i < k; i++) {
                double frac = (i + 0.5 + 0.25 * (s - 1)) / k;
                start[i] = (int) Math.round(lo + frac * (hi - lo));
            }
            if (admissible(start, h)) {
                starts.add(start);
            }
        }
        Result best = null;
        for (int[] start : starts) {
            Result r = coordinateDescentFrom(start, h);
            if (best == null || r.rss < best.rss) {
                best = r;
            }
        }
        return new Result(best.psi, best.intervals, best.rss, false);
    }

    private boolean admissible(int[] c, int h) {
        if (c[0] < h - 1 || c[c.length - 1] > m - 1 - h) {
            return false;
        }
        for (int i = 1; i < c.length; i++) {
            if (c[i] - c[i - 1] < h) {
                return false;
            }
        }
        return true;
    }

    /** Interval ranges where one more breakpoint can go, given the intervals already used. */
    private List<int[]> freeRanges(int[] used, int h) {
        List<int[]> ranges = new ArrayList<>();
        int lo = h - 1;
        for (int j : used) {
            int hi = j - h;
            if (hi >= lo) {
                ranges.add(new int[] {lo, hi});
            }
            lo = j + h;
        }
        if (m - 1 - h >= lo) {
            ranges.add(new int[] {lo, m - 1 - h});
        }
        return ranges;
    }

    private Result coordinateDescentFrom(int[] startIntervals, int h) {
        int k = startIntervals.length;
        int[] intervals = startIntervals.clone();
        double[] psi = new double[k];
        for (int i = 0; i < k; i++) {
            psi[i] = 0.5 * (data.u[intervals[i]] + data.u[intervals[i] + 1]);
        }
        double rss = aggregatedRss(psi);
        for (int sweep = 0; sweep < 200; sweep++) {
            double before = rss;
            for (int i = 0; i < k; i++) {
                int lo = i == 0 ? h - 1 : intervals[i - 1] + h;
                int hi = i == k - 1 ? m - 1 - h : intervals[i + 1] - h;
                Step s = profile(others(psi, i), lo, hi);
                if (s != null && s.rss <= rss) {
                    psi[i] = s.psi;
                    intervals[i] = s.interval;
                    rss = s.rss;
                }
            }
            if (before - rss <= 1e-14 * Math.abs(rss)) {
                break;
            }
        }
        return new Result(psi, intervals, rss, false);
    }

    private static double[] insertSorted(double[] a, double v) {
        double[] r = Arrays.copyOf(a, a.length + 1);
        r[a.length] = v;
        Arrays.sort(r);
        return r;
    }

    private static int[] insertSorted(int[] a, int v) {
        int[] r = Arrays.copyOf(a, a.length + 1);
        r[a.length] = v;
        Arrays.sort(r);
        return r;
    }

    // ------------------------------------------------------------------ one breakpoint, the others fixed

    /** Best position of one more hinge, the fixed hinges at others, over intervals jFrom..jTo. */
    record Step(double psi, int interval, double rss) {
    }

    /** Exact 1-D profile over a range of intervals (screened first when the range is large). */
    Step profile(double[] others, int jFrom, int jTo) {
        if (jTo < jFrom) {
            return null;
        }
        HouseholderQr qr = new HouseholderQr(columns(others));
        double[] ry = qr.residual(yv);
        int count = jTo - jFrom + 1;
        int[] candidates;
        if ((double) count * m * (others.length + 2) <= QR_WORK_LIMIT) {
            candidates = new int[count];
            for (int i = 0; i < count; i++) {
                candidates[i] = jFrom + i;
            }
        } else {
            candidates = screen(qr, ry, jFrom, jTo);
        }
        Step best = null;
        for (int j : candidates) {
            Step s = exactStep(qr, ry, j);
            if (best == null || s.rss < best.rss) {
                best = s;
            }
        }
        return best;
    }

    private Step exactStep(double[] others, int j, HouseholderQr known) {
        HouseholderQr qr = known != null ? known : new HouseholderQr(columns(others));
        return exactStep(qr, qr.residual(yv), j);
    }

    /** Closed-form minimum of RSS(ψ) for ψ in [u_j, u_{j+1}] given QR of the fixed columns. */
    private Step exactStep(HouseholderQr qr, double[] ry, int j) {
        double[] a = new double[m];
        double[] b = new double[m];
        for (int i = j + 1; i < m; i++) {
            a[i] = swu[i];
            b[i] = sw[i];
        }
        double[] ra = qr.residual(a);
        double[] rb = qr.residual(b);
        double p = dot(ry, ra);
        double q = dot(ry, rb);
        double aa = dot(ra, ra);
        double ab = dot(ra, rb);
        double bb = dot(rb, rb);
        double c = dot(ry, ry);
        double lo = data.u[j];
        double hi = data.u[j + 1];
        double bestPsi = lo;
        double bestGain = gain(ry, ra, rb, lo);
        double gHi = gain(ry, ra, rb, hi);
        if (gHi > bestGain) {
            bestGain = gHi;
            bestPsi = hi;
        }
        double den = q * ab - p * bb;
        if (den != 0) {
            double star = (q * aa - p * ab) / den;
            if (star > lo && star < hi) {
                double g = gain(ry, ra, rb, star);
                if (g > bestGain) {
                    bestGain = g;
                    bestPsi = star;
                }
            }
        }
        return new Step(bestPsi, j, Math.max(0, c - bestGain));
    }

    /** RSS reduction ⟨ry, r⟩²/‖r‖² from adding the hinge column r = ra − ψ·rb (0 when r is in the span of Z). */
    private static double gain(double[] ry, double[] ra, double[] rb, double psi) {
        double num = 0;
        double den = 0;
        double scale = 0;
        for (int i = 0; i < ry.length; i++) {
            double r = ra[i] - psi * rb[i];
            num += ry[i] * r;
            den += r * r;
            scale = Math.max(scale, Math.abs(ra[i]) + Math.abs(psi * rb[i]));
        }
        if (den <= 1e-24 * scale * scale * ry.length) {
            return 0;
        }
        return num * num / den;
    }

    /**
     * Screens intervals jFrom..jTo with suffix sums: with Q₁ the first p columns of Q, aᵀMa = ‖a‖² − ‖Q₁ᵀa‖², and
     * ⟨ry, a⟩ needs no projection. O(m·p) for all intervals; keeps the best few for exact re-evaluation.
     */
    private int[] screen(HouseholderQr qr, double[] ry, int jFrom, int jTo) {
        int p = qr.columns();
        double[][] q1 = new double[p][];
        for (int c = 0; c < p; c++) {
            double[] e = new double[m];
            e[c] = 1;
            qr.applyQ(e);
            q1[c] = e;
        }
        double[] qa = new double[p];
        double[] qb = new double[p];
        double sa2 = 0;
        double sab = 0;
        double sb2 = 0;
        double sya = 0;
        double syb = 0;
        double[] scores = new double[jTo - jFrom + 1];
        // walk i from the right end down, so that the sums over i > j are available at interval j
        for (int i = m - 1; i > jFrom; i--) {
            double ai = swu[i];
            double bi = sw[i];
            for (int c = 0; c < p; c++) {
                qa[c] += q1[c][i] * ai;
                qb[c] += q1[c][i] * bi;
            }
            sa2 += ai * ai;
            sab += ai * bi;
            sb2 += bi * bi;
            sya += ry[i] * ai;
            syb += ry[i] * bi;
            int j = i - 1;
            if (j <= jTo) {
                double aMa = sa2 - dotN(qa, qa);
                double aMb = sab - dotN(qa, qb);
                double bMb = sb2 - dotN(qb, qb);
                scores[j - jFrom] = bestGainApprox(sya, syb, aMa, aMb, bMb, data.u[j], data.u[j + 1]);
            }
        }
        Integer[] order = new Integer[scores.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (x, y) -> Double.compare(scores[y], scores[x]));
        int keep = Math.min(SCREEN_KEEP, order.length);
        int[] result = new int[keep];
        for (int i = 0; i < keep; i++) {
            result[i] = jFrom + order[i];
        }
        return result;
    }

    private static double bestGainApprox(double p, double q, double aa, double ab, double bb, double lo, double hi) {
        double best = Math.max(gainApprox(p, q, aa, ab, bb, lo), gainApprox(p, q, aa, ab, bb, hi));
        double den = q * ab - p * bb;
        if (den != 0) {
            double star = (q * aa - p * ab) / den;
            if (star > lo && star < hi) {
                best = Math.max(best, gainApprox(p, q, aa, ab, bb, star));
            }
        }
        return best;
    }

    private static double gainApprox(double p, double q, double aa, double ab, double bb, double psi) {
        double den = aa - 2 * psi * ab + psi * psi * bb;
        return den > 0 ? (p - psi * q) * (p - psi * q) / den : 0;
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    private static double dotN(double[] a, double[] b) {
        return dot(a, b);
    }
}
