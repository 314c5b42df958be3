package com.example.foldline.metrics;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;

import org.springframework.beans.factory.annotation.Value;
import org.springframework.stereotype.Component;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.Group;
import com.example.foldline.sessions.PageTotals;
import com.example.foldline.sessions.Rollups;
import com.example.foldline.sessions.SessionTotals;
import com.example.foldline.stats.AdCapRecommender;
import com.example.foldline.stats.Breakpoint;
import com.example.foldline.stats.CandidateModel;
import com.example.foldline.stats.Kneedle;
import com.example.foldline.stats.NoFit;
import com.example.foldline.stats.SegmentedFit;
import com.example.foldline.stats.SegmentedLogistic;
import com.example.foldline.stats.SegmentedLogisticFit;
import com.example.foldline.stats.SegmentedLogisticResult;
import com.example.foldline.stats.SegmentedOptions;
import com.example.foldline.stats.SegmentedRegression;
import com.example.foldline.stats.SegmentedResult;
import com.example.foldline.stats.Slope;

/**
 * Runs the statistics core on metric answers: the knee of bounce against entry-page ads, the ad-cap recommendation,
 * and knees of saturating curves. Thin data gives a notice instead of a knee.
 *
 * <p>The density fit and the ad-cap advice are pure functions of the aggregated counts they are given, so their
 * answers are kept in a small least-recently-used cache keyed by those counts (and the model asked for): a repeated
 * view of the same segment and range skips the fit and the resampling, and any change in the data changes the key,
 * so a cached answer can never be stale. {@code foldline.metrics.fit-cache-size} (default 256 entries of each kind,
 * 0 turns it off) bounds it.
 */
@Component
class KneeAnalysis {

    /** Points with fewer sessions are left out of fits (they are still shown). */
    static final long MIN_POINT_SESSIONS = 30;
    static final long MIN_TOTAL_SESSIONS = MetricsService.MIN_SESSIONS;
    static final int BOOTSTRAP = 200;
    /**
     * Entry sessions and later pages an ad count needs, on each side, before the advice values it as a cap for every
     * page (docs/methods.md §11). At 300 sessions a 40% bounce rate is known to about ±5.5 points (Wilson, 95%); the
     * resamples carry that uncertainty into the probability that the cap is best.
     */
    static final long MIN_CAP_DATA = 300;

    private final Rollups rollups;
    private final Lru<List<Object>, FitSummary> densityFits;
    private final Lru<List<Object>, CapAdvice> advice;

    KneeAnalysis(Rollups rollups, @Value("${foldline.metrics.fit-cache-size:256}") int cacheSize) {
        if (cacheSize < 0) {
            throw new IllegalArgumentException("foldline.metrics.fit-cache-size must be >= 0, was " + cacheSize);
        }
        this.rollups = rollups;
        this.densityFits = new Lru<>(cacheSize);
        this.advice = new Lru<>(cacheSize);
    }

    /** A bounded least-recently-used map, synchronised; size 0 keeps nothing. */
    private static final class Lru<K, V> {
        private final int size;
        private final java.util.LinkedHashMap<K, V> map;

        Lru(int size) {
            this.size = size;
            this.map = new java.util.LinkedHashMap<>(16, 0.75f, true) {
                @Override
                protected boolean removeEldestEntry(java.util.Map.Entry<K, V> eldest) {
                    return size() > Lru.this.size;
                }
            };
        }

        V get(K key, java.util.function.Supplier<V> compute) {
            if (size == 0) {
                return compute.get();
            }
            synchronized (map) {
                V hit = map.get(key);
                if (hit != null) {
                    return hit;
                }
            }
            V value = compute.get(); // outside the lock: two first requests may both compute, with equal results
            if (value != null) {
                synchronized (map) {
                    map.put(key, value);
                }
            }
            return value;
        }
    }

    /** {@link #density(List, String)} through the cache, keyed by the points and the model. */
    FitSummary densityFit(List<Answers.DensityPoint> points, String model) {
        List<Object> key = new ArrayList<>(1 + 3 * points.size());
        key.add(model);
        for (Answers.DensityPoint p : points) {
            key.add(p.entryAds());
            key.add(p.sessions());
            key.add(p.bounces());
        }
        return densityFits.get(key, () -> density(points, model));
    }

    /** Segmented logistic (default) or weighted linear fit of bounce rate on ads on the entry page. */
    static FitSummary density(List<Answers.DensityPoint> points, String model) {
        List<Answers.DensityPoint> used = points.stream().filter(p -> p.sessions() >= MIN_POINT_SESSIONS).toList();
        long total = used.stream().mapToLong(Answers.DensityPoint::sessions).sum();
        if (total < MIN_TOTAL_SESSIONS || used.size() < 4) {
            return FitSummary.none("not enough data for a knee: " + used.size() + " ad counts with at least "
                    + MIN_POINT_SESSIONS + " sessions, " + total + " sessions in all (need 4 and " + MIN_TOTAL_SESSIONS
                    + ")");
        }
        double[] x = used.stream().mapToDouble(Answers.DensityPoint::entryAds).toArray();
        long[] bounces = used.stream().mapToLong(Answers.DensityPoint::bounces).toArray();
        long[] sessions = used.stream().mapToLong(Answers.DensityPoint::sessions).toArray();
        if (model.equals("linear")) {
            double[] y = new double[x.length];
            double[] w = new double[x.length];
            for (int i = 0; i < x.length; i++) {
                y[i] = (double) bounces[i] / sessions[i];
                w[i] = sessions[i];
            }
            return linear(x, y, w, "bounce rate per ad", 2, true);
        }
        return logistic(x, bounces, sessions, "bounce");
    }

    /** Segmented logistic fit of successes out of trials (one breakpoint at most), with a verdict in words. */
    static FitSummary logistic(double[] x, long[] bounces, long[] sessions, String what) {
        SegmentedLogisticResult result = SegmentedLogistic.fit(x, bounces, sessions,
                SegmentedOptions.defaults().withMaxBreakpoints(1));
        if (result instanceof NoFit no) {
            return FitSummary.none("no fit: " + no.message());
        }
        SegmentedLogisticFit fit = (SegmentedLogisticFit) result;
        List<FitSummary.CurvePoint> curve = new ArrayList<>();
        double lo = x[0];
        double hi = x[x.length - 1];
        for (int i = 0; i <= 48; i++) {
            double at = lo + (hi - lo) * i / 48;
            curve.add(new FitSummary.CurvePoint(at, fit.predictProbability(at)));
        }
        boolean breakFound = fit.breakpointCount() > 0 && fit.davies() != null && fit.davies().pValue() < 0.05;
        String verdict;
        if (breakFound) {
            Breakpoint b = fit.breakpoints().get(0);
            double before = (fit.predictProbability(b.estimate()) - fit.predictProbability(lo)) / (b.estimate() - lo);
            double after = (fit.predictProbability(hi) - fit.predictProbability(b.estimate())) / (hi - b.estimate());
            verdict = (Math.abs(before) * 100 < 1
                    ? String.format(Locale.ROOT, "%s stays about flat up to %.1f ads", what, b.estimate())
                    : String.format(Locale.ROOT, "%s %s about %.1f points per extra ad up to %.1f ads", what,
                    before > 0 ? "rises" : "falls", Math.abs(before) * 100, b.estimate()))
                    + String.format(Locale.ROOT, " (95%% interval %.1f to %.1f), then %s about %.1f points per extra ad",
                    b.lower(), b.upper(), after > 0 ? "rises" : "falls", Math.abs(after) * 100);
        } else {
            double per = (fit.predictProbability(hi) - fit.predictProbability(lo)) / (hi - lo) * 100;
            verdict = String.format(Locale.ROOT, "no clear knee: the break test finds no change of slope (p = %s); "
                    + "%s changes about %.1f points per extra ad throughout", p(fit.davies() == null ? Double.NaN
                    : fit.davies().pValue()), what, per);
        }
        return new FitSummary("segmented logistic regression (binomial GLM with a hinge; Muggeo 2003)",
                fit.breakpointCount(), fit.selectionReason(), candidates(fit.candidates()), breakpoints(fit.breakpoints()),
                slopes(fit.slopes(), "log-odds per ad"), fit.deviance(), "deviance",
                new FitSummary.BreakTest("Davies (2002), likelihood-ratio version",
                        fit.davies() == null ? null : finite(fit.davies().pValue()), breakFound),
                verdict, curve, null);
    }

    /** Weighted segmented linear regression with up to {@code maxBreaks} breakpoints chosen by BIC. */
    static FitSummary linear(double[] x, double[] y, double[] w, String unit, int maxBreaks, boolean bootstrap) {
        SegmentedOptions options = SegmentedOptions.defaults().withMaxBreakpoints(maxBreaks);
        if (bootstrap) {
            options = options.withBootstrap(BOOTSTRAP);
        }
        SegmentedResult result;
        try {
            result = SegmentedRegression.fit(x, y, w, options);
        } catch (IllegalArgumentException e) {
            return FitSummary.none("no fit: " + e.getMessage());
        }
        if (result instanceof NoFit no) {
            return FitSummary.none("no fit: " + no.message());
        }
        SegmentedFit fit = (SegmentedFit) result;
        List<FitSummary.CurvePoint> curve = new ArrayList<>();
        for (int i = 0; i <= 48; i++) {
            double at = x[0] + (x[x.length - 1] - x[0]) * i / 48;
            curve.add(new FitSummary.CurvePoint(at, fit.predict(at)));
        }
        boolean breakFound = fit.breakpointCount() > 0 && fit.davies() != null && fit.davies().pValue() < 0.05;
        String verdict = breakFound
                ? String.format(Locale.ROOT, "the slope changes at %.1f (95%% interval %.1f to %.1f)",
                fit.breakpoints().get(0).estimate(), fit.breakpoints().get(0).lower(), fit.breakpoints().get(0).upper())
                : "no clear knee: the break test finds no change of slope (p = "
                + p(fit.davies() == null ? Double.NaN : fit.davies().pValue()) + ")";
        return new FitSummary("segmented linear regression, weighted (Muggeo 2003)", fit.breakpointCount(),
                fit.selectionReason(), candidates(fit.candidates()), breakpoints(fit.breakpoints()),
                slopes(fit.slopes(), unit), fit.residualSumOfSquares(), "weighted residual sum of squares",
                new FitSummary.BreakTest("Davies (2002)", fit.davies() == null ? null : finite(fit.davies().pValue()),
                        breakFound), verdict, curve, null);
    }

    /** Kneedle on a saturating curve, with the segmented fit as a second opinion. */
    static KneeReport curve(double[] x, double[] y, double[] w, String unit) {
        return curve(x, y, w, unit, Kneedle.Options.defaults());
    }

    static KneeReport curve(double[] x, double[] y, double[] w, String unit, Kneedle.Options options) {
        Kneedle.Result k = Kneedle.find(x, y, options);
        KneeReport.Kneedle kneedle = new KneeReport.Kneedle(k.found(), k.found() ? k.kneeX() : null, k.allKneeX(),
                options.sensitivity(), k.curve() == null ? null : k.curve().name().toLowerCase(Locale.ROOT),
                k.direction() == null ? null : k.direction().name().toLowerCase(Locale.ROOT), k.found() ? null : k.reason());
        return new KneeReport(kneedle, linear(x, y, w, unit, 1, false));
    }

    /**
     * The ad-cap recommendation from page-level rollups of the same segment: one cap for every page read from the
     * entry/later model where both caps are equal, and the best pair, from one shared set of resamples
     * ({@link AdCapRecommender#advise}).
     */
    CapAdvice recommendation(MetricRequest r, SessionTotals current) {
        Rollups.PageAnswer pages = rollups.pages(r.site().id(), r.filter(), List.of(Dim.ADS, Dim.POSITION), false);
        List<AdCapRecommender.EntryStats> entry = new ArrayList<>();
        List<AdCapRecommender.PageStats> later = new ArrayList<>();
        java.util.Map<Integer, PageTotals> byAds = new java.util.TreeMap<>();
        for (Group<PageTotals> g : pages.groups()) {
            int ads = g.number(Dim.ADS);
            PageTotals t = g.totals();
            byAds.merge(ads, t, PageTotals::plus);
            if (g.number(Dim.POSITION) == 0) {
                entry.add(new AdCapRecommender.EntryStats(ads, t.pageviews(), t.exits(), t.revenueMicros(), t.revenueSq()));
            } else {
                later.add(new AdCapRecommender.PageStats(ads, t.pageviews(), t.exits(), t.revenueMicros(), t.revenueSq()));
            }
        }
        if (byAds.isEmpty()) {
            return null;
        }
        OptionalDouble perSession = current.sessions() == 0 ? OptionalDouble.empty()
                : OptionalDouble.of((double) current.revenueMicros() / current.sessions());
        // the answer depends on these inputs only (the options are fixed)
        List<Object> key = List.of(entry, later, perSession);
        return advice.get(key, () -> advise(entry, later, byAds, perSession));
    }

    private static CapAdvice advise(List<AdCapRecommender.EntryStats> entry, List<AdCapRecommender.PageStats> later,
                                    java.util.Map<Integer, PageTotals> byAds, OptionalDouble perSession) {
        AdCapRecommender.Advice advice = AdCapRecommender.advise(entry, later, perSession,
                AdCapRecommender.Options.defaults().withMinSessions(MIN_CAP_DATA).withMinPages(MIN_CAP_DATA));
        AdCapRecommender.SameCapRecommendation rec = advice.sameCap();
        List<CapAdvice.CapOption> caps = new ArrayList<>();
        Double probability = null;
        for (AdCapRecommender.SameCapValue c : rec.caps()) {
            PageTotals all = byAds.get(c.adCount());
            caps.add(new CapAdvice.CapOption(c.adCount(), c.status().name().toLowerCase(Locale.ROOT), c.note(),
                    c.pages(), all.pageviews() == 0 ? null : finite((double) all.exits() / all.pageviews()),
                    all.pageviews() == 0 ? null : finite((double) all.revenueMicros() / all.pageviews()),
                    micros(c.sessionRpm().estimate()), micros(c.sessionRpm().lower()), micros(c.sessionRpm().upper()),
                    finite(c.probabilityBest()), c.entrySessions(), c.laterPages(), finite(c.bounceRate()),
                    finite(c.laterExitRate()), finite(c.expectedPagesPerSession())));
            if (rec.recommendedCap().isPresent() && rec.recommendedCap().get() == c.adCount()) {
                probability = finite(c.probabilityBest());
            }
        }
        AdCapRecommender.TwoCapRecommendation two = advice.pair();
        Integer entryCap = null;
        Integer laterCap = null;
        Double pairProbability = null;
        Double pairRpm = null;
        String pairSummary = entry.isEmpty() || later.isEmpty() ? null : two.summary();
        if (two.recommended().isPresent()) {
            entryCap = two.recommended().get().entryAdCount();
            laterCap = two.recommended().get().laterAdCount();
            pairProbability = finite(two.recommended().get().probabilityBest());
            pairRpm = micros(two.recommended().get().sessionRpm().estimate());
        }
        // the recommender works in currency units per 1,000 sessions; the API gives micro-units like every money field
        return new CapAdvice(rec.recommendedCap().orElse(null), probability,
                rec.currentSessionRpm().isPresent() ? micros(rec.currentSessionRpm().getAsDouble()) : null,
                rec.expectedGainRpm().map(i -> micros(i.estimate())).orElse(null),
                rec.expectedGainRpm().map(i -> micros(i.lower())).orElse(null),
                rec.expectedGainRpm().map(i -> micros(i.upper())).orElse(null), rec.summary(), caps, entryCap,
                laterCap, pairProbability, pairRpm, pairSummary, rec.resamples(), rec.caution(), CapAdvice.MODEL,
                two.expectedGainRpm().map(i -> micros(i.estimate())).orElse(null));
    }

    private static List<FitSummary.Candidate> candidates(List<CandidateModel> models) {
        return models.stream().map(c -> new FitSummary.Candidate(c.breakpoints(), c.bic())).toList();
    }

    private static List<FitSummary.BreakpointEstimate> breakpoints(List<Breakpoint> list) {
        return list.stream().map(b -> new FitSummary.BreakpointEstimate(b.estimate(), finite(b.standardError()),
                finite(b.lower()), finite(b.upper()), finite(b.bootstrapLower()), finite(b.bootstrapUpper()))).toList();
    }

    private static List<FitSummary.SlopeEstimate> slopes(List<Slope> list, String unit) {
        return list.stream().map(s -> new FitSummary.SlopeEstimate(s.estimate(), finite(s.standardError()),
                finite(s.lower()), finite(s.upper()), unit)).toList();
    }

    static Double micros(double currencyUnits) {
        return finite(currencyUnits * 1_000_000);
    }

    static Double finite(double v) {
        return Double.isFinite(v) ? v : null;
    }

    private static String p(double value) {
        return Double.isFinite(value) ? String.format(Locale.ROOT, "%.3g", value) : "n/a";
    }
}
