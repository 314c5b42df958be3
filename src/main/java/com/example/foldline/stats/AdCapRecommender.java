package com.example.foldline.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.SplittableRandom;

/**
 * Recommends the number of ads per page (the ad cap) that maximises session RPM, the revenue per 1,000 sessions, by
 * weighing the revenue of each page against the readers that more ads drive away.
 *
 * <p><b>Entry cap and later cap.</b> With k<sub>e</sub> ads on the entry page and k<sub>l</sub> on later pages:
 * V(k<sub>e</sub>, k<sub>l</sub>) = RPP<sub>entry</sub>(k<sub>e</sub>) + (1 − bounce(k<sub>e</sub>)) ·
 * RPP<sub>later</sub>(k<sub>l</sub>)/q<sub>later</sub>(k<sub>l</sub>), where bounce = bounces/sessions on entry pages
 * at k<sub>e</sub> ads and q<sub>later</sub> = exits/pages over non-entry pages at k<sub>l</sub> ads (pages after the
 * entry page are geometric with mean 1/q<sub>later</sub>).
 *
 * <p><b>One cap for every page ({@link #recommendSameCap}, {@link #advise}).</b> The same model with k<sub>e</sub> =
 * k<sub>l</sub> = k: V(k) = V(k, k). Readers leave entry pages and later pages at different rates, and the two kinds
 * of page carry different ad counts, so one exit rate per ad count mixes them and is confounded by the mix; the
 * diagonal keeps them apart. {@link #advise} computes the single cap and the pair from one shared set of resamples.
 *
 * <p><b>Pooled single cap ({@link #recommend}, kept for comparison).</b> With k ads on every page, RPP(k) and one exit
 * rate q(k) = exits/pages over all pages with k ads, V(k) = RPP(k)/q(k) (geometric pages). Its exit rate at k is a
 * mix of bounce (entry pages) and later exits weighted by how many of each carry k ads, so where the two kinds of
 * page carry different ad counts it is biased (docs/methods.md shows a case); the metrics answers no longer use it.
 *
 * <p><b>Uncertainty.</b> B parametric resamples (default 1,000) from a {@link SplittableRandom} with a fixed seed: each
 * exit (or bounce) rate from its Beta(α<sub>0</sub> + exits, β<sub>0</sub> + pages − exits) posterior (Marsaglia and
 * Tsang's gamma sampler [2]), each revenue per page from a normal with its standard error s/√pages, s² = (Σr² −
 * (Σr)²/n)/(n − 1) from the revenue sum and sum of squares (normal draws by the polar method on
 * {@code nextDouble()}, so the stream depends only on the seed). Reported: the percentile interval of the session RPM
 * of each cap (R's type-7 quantiles) and the share of resamples in which each cap (or pair) is the best; ties within
 * a resample go to fewer ads. The recommended cap is the one with the highest point estimate (ties: fewer ads), shown
 * with its probability of being best; the expected gain is its session RPM minus the current session RPM (revenue
 * per session × 1000, taken as known), with the interval of the resampled difference.
 *
 * <p>Session RPM = 1000 · V (in currency units when revenue is in micros: V/1000).
 *
 * <p><b>Minimum data.</b> A cap with fewer than {@link Options#minPages()} pages (later pages) or
 * {@link Options#minSessions()} sessions (entry pages), or with no exit at all (pages per session unknown), is reported
 * as not having enough data, is never resampled and never recommended; if no cap qualifies, the recommendation is
 * empty and the summary says so. An empty list is allowed (no recommendation).
 *
 * <p><b>Caveats.</b> The data are observational: pages that carry more ads may differ in topic, device, traffic source
 * or position in the session, so the estimated effect of the cap can be confounded ({@link #CAUTION}); the geometric
 * model assumes the continuation probability does not depend on how deep the reader is; a confirmed change should
 * come from a layout-variant test. Counts must be non-negative with exits ≤ pages; sums of squares must be finite and
 * consistent with the revenue sum; ad counts must be distinct and non-negative ({@link IllegalArgumentException}
 * otherwise).
 *
 * <p>References: [1] Efron B, Tibshirani RJ (1993) <i>An Introduction to the Bootstrap</i>, Chapman &amp; Hall, ch. 6
 * (parametric bootstrap) and ch. 13 (percentile intervals). [2] Marsaglia G, Tsang WW (2000) A simple method for
 * generating gamma variables. <i>ACM Transactions on Mathematical Software</i> 26:363–372, doi:10.1145/358407.358414.
 * [3] Hyndman RJ, Fan Y (1996) Sample quantiles in statistical packages. <i>The American Statistician</i> 50:361–365,
 * doi:10.1080/00031305.1996.10473566.
 */
public final class AdCapRecommender {

    /** Fixed text shown with every recommendation. */
    public static final String CAUTION = "This recommendation comes from observational data: pages with more ads can "
        + "differ in topic, device, traffic source or position in the session, so the estimated effect of the ad cap "
        + "may be confounded. Confirm the cap with a layout-variant test before rolling it out.";

    /** Whether a cap had enough data to be estimated and recommended. */
    public enum DataStatus {
        ENOUGH_DATA,
        NOT_ENOUGH_DATA
    }

    /**
     * Observed totals for pages carrying {@code adCount} ads (all pages, or non-entry pages for the two-cap variant).
     *
     * @param adCount              ads per page, ≥ 0
     * @param pages                page views
     * @param exits                page views after which the session ended
     * @param revenueMicros        Σ revenue per page view, in micros (10⁻⁶ currency units)
     * @param revenueSquaredMicros Σ (revenue per page view)², in micros²; a double because it overflows a long beyond
     *                             about 3 currency units per page over a million pages
     */
    public record PageStats(int adCount, long pages, long exits, long revenueMicros, double revenueSquaredMicros) {

        public PageStats {
            checkCell("adCount", adCount, pages, "pages", exits, "exits", revenueMicros, revenueSquaredMicros);
        }
    }

    /**
     * Observed totals for entry pages (the first page of a session) carrying {@code adCount} ads.
     *
     * @param adCount              ads on the entry page, ≥ 0
     * @param sessions             sessions that entered on such a page
     * @param bounces              of those, sessions with that single page
     * @param revenueMicros        Σ revenue of those entry pages, in micros
     * @param revenueSquaredMicros Σ (revenue per entry page)², in micros²
     */
    public record EntryStats(int adCount, long sessions, long bounces, long revenueMicros,
                             double revenueSquaredMicros) {

        public EntryStats {
            checkCell("adCount", adCount, sessions, "sessions", bounces, "bounces", revenueMicros,
                revenueSquaredMicros);
        }
    }

    /**
     * Immutable options; {@link #defaults()}: B = 1,000 resamples, seed 20240501, 95% intervals, at least 1,000 pages
     * and 1,000 sessions per cap, Beta(1, 1) prior on exit and bounce rates.
     *
     * @param resamples   B ≥ 1
     * @param seed        seed of the {@link SplittableRandom}
     * @param level       interval level in (0, 1)
     * @param minPages    pages needed for a (later-page) cap to count
     * @param minSessions sessions needed for an entry cap to count
     * @param priorAlpha  α<sub>0</sub> &gt; 0 of the exit-rate prior
     * @param priorBeta   β<sub>0</sub> &gt; 0 of the exit-rate prior
     */
    public record Options(int resamples, long seed, double level, long minPages, long minSessions, double priorAlpha,
                          double priorBeta) {

        public Options {
            if (resamples < 1) {
                throw new IllegalArgumentException("resamples must be >= 1, was " + resamples);
            }
            if (!(level > 0 && level < 1)) {
                throw new IllegalArgumentException("level must be in (0, 1), was " + level);
            }
            if (minPages < 1) {
                throw new IllegalArgumentException("minPages must be >= 1, was " + minPages);
            }
            if (minSessions < 1) {
                throw new IllegalArgumentException("minSessions must be >= 1, was " + minSessions);
            }
            if (!(priorAlpha > 0) || Double.isInfinite(priorAlpha)) {
                throw new IllegalArgumentException("priorAlpha must be finite and > 0, was " + priorAlpha);
            }
            if (!(priorBeta > 0) || Double.isInfinite(priorBeta)) {
                throw new IllegalArgumentException("priorBeta must be finite and > 0, was " + priorBeta);
            }
        }

        public static Options defaults() {
            return new Options(1000, 20240501L, 0.95, 1000, 1000, 1, 1);
        }

        public Options withResamples(int b) {
            return new Options(b, seed, level, minPages, minSessions, priorAlpha, priorBeta);
        }

        public Options withSeed(long s) {
            return new Options(resamples, s, level, minPages, minSessions, priorAlpha, priorBeta);
        }

        public Options withLevel(double l) {
            return new Options(resamples, seed, l, minPages, minSessions, priorAlpha, priorBeta);
        }

        public Options withMinPages(long p) {
            return new Options(resamples, seed, level, p, minSessions, priorAlpha, priorBeta);
        }

        public Options withMinSessions(long s) {
            return new Options(resamples, seed, level, minPages, s, priorAlpha, priorBeta);
        }

        public Options withPrior(double alpha, double beta) {
            return new Options(resamples, seed, level, minPages, minSessions, alpha, beta);
        }
    }

    /**
     * A point estimate with its percentile interval (NaN bounds when not resampled).
     *
     * @param estimate point estimate
     * @param lower    lower bound
     * @param upper    upper bound
     */
    public record Interval(double estimate, double lower, double upper) {
    }

    /**
     * The estimate for one cap. For the two-cap variant this describes later pages: {@code sessionRpm} is then the
     * value of the later pages per 1,000 sessions that reach them, and {@code probabilityBest} the share of resamples
     * in which the best pair uses this later cap.
     *
     * @param adCount                 ads per page
     * @param status                  whether the cap had enough data
     * @param note                    why not, or empty
     * @param pages                   page views
     * @param exitRate                exits/pages (NaN without pages)
     * @param revenuePerPageMicros    revenue per page (NaN without pages)
     * @param revenuePerPageSeMicros  its standard error (NaN with fewer than 2 pages)
     * @param expectedPagesPerSession 1/exitRate (NaN without exits)
     * @param sessionRpm              session RPM in currency units, with interval (NaN bounds if not enough data)
     * @param probabilityBest         share of resamples in which this cap was best (0 if not enough data)
     */
    public record CapValue(int adCount, DataStatus status, String note, long pages, double exitRate,
                           double revenuePerPageMicros, double revenuePerPageSeMicros, double expectedPagesPerSession,
                           Interval sessionRpm, double probabilityBest) {
    }

    /**
     * The estimate for one entry cap of the two-cap variant.
     *
     * @param adCount                ads on the entry page
     * @param status                 whether the cap had enough data
     * @param note                   why not, or empty
     * @param sessions               sessions entering on such a page
     * @param bounceRate             bounces/sessions
     * @param revenuePerEntryMicros  revenue per entry page
     * @param revenuePerEntrySeMicros its standard error
     * @param probabilityBest        share of resamples in which the best pair uses this entry cap
     */
    public record EntryCapValue(int adCount, DataStatus status, String note, long sessions, double bounceRate,
                                double revenuePerEntryMicros, double revenuePerEntrySeMicros,
                                double probabilityBest) {
    }

    /**
     * One (entry cap, later cap) pair.
     *
     * @param entryAdCount    ads on the entry page
     * @param laterAdCount    ads on later pages
     * @param sessionRpm      session RPM in currency units, with interval
     * @param probabilityBest share of resamples in which this pair was best
     */
    public record PairValue(int entryAdCount, int laterAdCount, Interval sessionRpm, double probabilityBest) {
    }

    /**
     * Recommendation of one cap for all pages.
     *
     * @param recommendedCap    the cap with the highest estimated session RPM among caps with enough data
     * @param summary           one sentence for the dashboard
     * @param caps              every cap, in increasing ad count
     * @param currentSessionRpm current session RPM, if given
     * @param expectedGainRpm   session RPM of the recommended cap minus the current one, with interval
     * @param resamples         B
     * @param seed              the seed used
     * @param caution           {@link #CAUTION}
     */
    public record Recommendation(Optional<Integer> recommendedCap, String summary, List<CapValue> caps,
                                 OptionalDouble currentSessionRpm, Optional<Interval> expectedGainRpm, int resamples,
                                 long seed, String caution) {

        public Recommendation {
            caps = List.copyOf(caps);
        }
    }

    /**
     * Recommendation of an entry cap and a later-page cap.
     *
     * @param recommended       the best pair among caps with enough data
     * @param summary           one sentence for the dashboard
     * @param entryCaps         every entry cap, in increasing ad count
     * @param laterCaps         every later-page cap, in increasing ad count
     * @param pairs             every pair of caps with enough data, by entry then later ad count
     * @param currentSessionRpm current session RPM, if given
     * @param expectedGainRpm   session RPM of the recommended pair minus the current one, with interval
     * @param resamples         B
     * @param seed              the seed used
     * @param caution           {@link #CAUTION}
     */
    public record TwoCapRecommendation(Optional<PairValue> recommended, String summary, List<EntryCapValue> entryCaps,
                                       List<CapValue> laterCaps, List<PairValue> pairs,
                                       OptionalDouble currentSessionRpm, Optional<Interval> expectedGainRpm,
                                       int resamples, long seed, String caution) {

        public TwoCapRecommendation {
            entryCaps = List.copyOf(entryCaps);
            laterCaps = List.copyOf(laterCaps);
            pairs = List.copyOf(pairs);
        }
    }

    /**
     * One cap k on every page, read from the entry/later model at k<sub>e</sub> = k<sub>l</sub> = k (its diagonal):
     * V(k) = RPP<sub>entry</sub>(k) + (1 − bounce(k)) · RPP<sub>later</sub>(k)/q<sub>later</sub>(k).
     *
     * @param adCount                   ads on every page
     * @param status                    whether both the entry cap and the later-page cap had enough data
     * @param note                      why not, or empty
     * @param entrySessions             sessions entering on a page with k ads
     * @param laterPages                non-entry pages with k ads
     * @param bounceRate                bounces/sessions of those entry pages (NaN without sessions)
     * @param laterExitRate             exits/pages of those later pages (NaN without pages)
     * @param revenuePerEntryMicros     revenue per entry page (NaN without sessions)
     * @param revenuePerLaterPageMicros revenue per later page (NaN without pages)
     * @param expectedPagesPerSession   1 + (1 − bounce)/q<sub>later</sub> (NaN when either side is missing or has no
     *                                  exit)
     * @param sessionRpm                session RPM in currency units, with interval (NaN bounds if not enough data)
     * @param probabilityBest           share of resamples in which this cap was the best single cap
     */
    public record SameCapValue(int adCount, DataStatus status, String note, long entrySessions, long laterPages,
                               double bounceRate, double laterExitRate, double revenuePerEntryMicros,
                               double revenuePerLaterPageMicros, double expectedPagesPerSession, Interval sessionRpm,
                               double probabilityBest) {

        /** All pages with k ads: entry pages plus later pages. */
        public long pages() {
            return entrySessions + laterPages;
        }
    }

    /**
     * Recommendation of one cap for all pages from the entry/later model (its diagonal).
     *
     * @param recommendedCap    the cap with the highest estimated session RPM among caps with enough data
     * @param summary           one sentence for the dashboard
     * @param caps              every ad count seen on entry or later pages, in increasing order
     * @param currentSessionRpm current session RPM, if given
     * @param expectedGainRpm   session RPM of the recommended cap minus the current one, with interval
     * @param resamples         B
     * @param seed              the seed used
     * @param caution           {@link #CAUTION}
     */
    public record SameCapRecommendation(Optional<Integer> recommendedCap, String summary, List<SameCapValue> caps,
                                        OptionalDouble currentSessionRpm, Optional<Interval> expectedGainRpm,
                                        int resamples, long seed, String caution) {

        public SameCapRecommendation {
            caps = List.copyOf(caps);
        }
    }

    /**
     * The single cap (diagonal) and the best pair, from one shared set of resamples.
     *
     * @param sameCap one cap on every page
     * @param pair    separate caps for the entry page and later pages
     */
    public record Advice(SameCapRecommendation sameCap, TwoCapRecommendation pair) {
    }

    private AdCapRecommender() {
    }

    // ------------------------------------------------------------------ one cap

    /** Pooled single cap (see the class comment: biased by the entry/later mix), with {@link Options#defaults()}. */
    public static Recommendation recommend(List<PageStats> caps) {
        return recommend(caps, OptionalDouble.empty(), Options.defaults());
    }

    /**
     * One cap for all pages from one pooled exit rate per ad count (see the class comment: biased by the entry/later
     * mix; {@link #recommendSameCap} is the unbiased reading of the same data).
     *
     * @param caps                           totals per ad count (any order; ad counts distinct)
     * @param currentRevenuePerSessionMicros current revenue per session in micros, for the expected gain
     * @throws IllegalArgumentException for duplicate ad counts or a non-finite or negative current revenue
     */
    public static Recommendation recommend(List<PageStats> caps, OptionalDouble currentRevenuePerSessionMicros,
                                           Options options) {
        Objects.requireNonNull(caps, "caps");
        Objects.requireNonNull(currentRevenuePerSessionMicros, "currentRevenuePerSessionMicros");
        Objects.requireNonNull(options, "options");
        OptionalDouble currentRpm = currentRpm(currentRevenuePerSessionMicros);
        List<PageStats> sorted = caps.stream().sorted(Comparator.comparingInt(PageStats::adCount)).toList();
        checkDistinct(sorted.stream().map(PageStats::adCount).toList());

        int n = sorted.size();
        Rate[] rates = new Rate[n];
        List<Integer> eligible = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            PageStats s = sorted.get(i);
            rates[i] = Rate.of(s.pages(), s.exits(), s.revenueMicros(), s.revenueSquaredMicros());
            if (reason(s.pages(), options.minPages(), "pages", s.exits(), true).isEmpty()) {
                eligible.add(i);
            }
        }
        int b = options.resamples();
        double[][] draws = new double[n][];
        int[] wins = new int[n];
        SplittableRandom random = new SplittableRandom(options.seed());
        for (int i : eligible) {
            draws[i] = new double[b];
        }
        for (int r = 0; r < b; r++) {
            int best = -1;
            for (int i : eligible) {
                double q = rates[i].drawLeaveRate(random, options);
                double rpp = rates[i].drawRevenue(random);
                double v = rpp / q / 1000;
                draws[i][r] = v;
                if (best < 0 || v > draws[best][r]) {
                    best = i;
                }
            }
            if (best >= 0) {
                wins[best]++;
            }
        }
        int recommended = -1;
        for (int i : eligible) {
            if (recommended < 0 || rates[i].sessionValue() > rates[recommended].sessionValue()) {
                recommended = i;
            }
        }
        List<CapValue> values = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            PageStats s = sorted.get(i);
            String why = reason(s.pages(), options.minPages(), "pages", s.exits(), true);
            Rate rate = rates[i];
            Interval rpm = draws[i] == null ? new Interval(rate.sessionValue() / 1000, Double.NaN, Double.NaN)
                : percentileInterval(rate.sessionValue() / 1000, draws[i], options.level());
            values.add(new CapValue(s.adCount(), why.isEmpty() ? DataStatus.ENOUGH_DATA : DataStatus.NOT_ENOUGH_DATA,
                why, s.pages(), rate.leaveRate(), rate.revenuePerPage(), rate.revenueSe(), rate.expectedPages(), rpm,
                (double) wins[i] / b));
        }
        if (recommended < 0) {
            String summary = String.format(Locale.ROOT, "No recommendation: no ad cap has enough data (at least %d "
                + "pages with at least one exit).", options.minPages());
            return new Recommendation(Optional.empty(), summary, values, currentRpm, Optional.empty(), b,
                options.seed(), CAUTION);
        }
        CapValue best = values.get(recommended);
        Optional<Interval> gain = gain(best.sessionRpm(), draws[recommended], currentRpm, options.level());
        String summary = String.format(Locale.ROOT, "Recommended cap: %d ads per page, session RPM %.2f (%s%% interval "
                + "%.2f to %.2f), best in %.0f%% of %d resamples.", best.adCount(), best.sessionRpm().estimate(),
            percent(options.level()), best.sessionRpm().lower(), best.sessionRpm().upper(),
            100 * best.probabilityBest(), b);
        return new Recommendation(Optional.of(best.adCount()), summary, values, currentRpm, gain, b, options.seed(),
            CAUTION);
    }

    // ------------------------------------------------------------------ entry cap and later cap

    /**
     * An entry-page cap and a later-page cap.
     *
     * @param entryCaps                      entry-page totals per ad count (ad counts distinct)
     * @param laterCaps                      later-page totals per ad count (ad counts distinct)
     * @param currentRevenuePerSessionMicros current revenue per session in micros, for the expected gain
     * @throws IllegalArgumentException for duplicate ad counts or a non-finite or negative current revenue
     */
    public static TwoCapRecommendation recommendEntryAndLater(List<EntryStats> entryCaps, List<PageStats> laterCaps,
                                                              OptionalDouble currentRevenuePerSessionMicros,
                                                              Options options) {
        return advise(entryCaps, laterCaps, currentRevenuePerSessionMicros, options).pair();
    }

    /**
     * One cap for every page, read from the entry/later model where both caps are equal (its diagonal), so that
     * entry pages and later pages, which readers leave at different rates, are not mixed into one exit rate.
     * Same arguments as {@link #recommendEntryAndLater}; see {@link #advise}.
     */
    public static SameCapRecommendation recommendSameCap(List<EntryStats> entryCaps, List<PageStats> laterCaps,
                                                         OptionalDouble currentRevenuePerSessionMicros,
                                                         Options options) {
        return advise(entryCaps, laterCaps, currentRevenuePerSessionMicros, options).sameCap();
    }

    /**
     * The single cap and the entry/later pair from one shared set of B resamples: each resample draws every entry cap
     * and every later cap once, values every pair (k<sub>e</sub>, k<sub>l</sub>) from them, and the single cap k is
     * the pair (k, k). The pair part is identical to {@link #recommendEntryAndLater}'s answer for the same seed. A
     * single cap counts when its entry cap and its later cap both have enough data; an ad count seen on one side only
     * is reported as not having enough data (nothing tells what readers do on the other kind of page at that count).
     *
     * @param entryCaps                      entry-page totals per ad count (ad counts distinct)
     * @param laterCaps                      later-page totals per ad count (ad counts distinct)
     * @param currentRevenuePerSessionMicros current revenue per session in micros, for the expected gains
     * @throws IllegalArgumentException for duplicate ad counts or a non-finite or negative current revenue
     */
    public static Advice advise(List<EntryStats> entryCaps, List<PageStats> laterCaps,
                                OptionalDouble currentRevenuePerSessionMicros, Options options) {
        Objects.requireNonNull(entryCaps, "entryCaps");
        Objects.requireNonNull(laterCaps, "laterCaps");
        Objects.requireNonNull(currentRevenuePerSessionMicros, "currentRevenuePerSessionMicros");
        Objects.requireNonNull(options, "options");
        OptionalDouble currentRpm = currentRpm(currentRevenuePerSessionMicros);
        List<EntryStats> entries = entryCaps.stream().sorted(Comparator.comparingInt(EntryStats::adCount)).toList();
        List<PageStats> laters = laterCaps.stream().sorted(Comparator.comparingInt(PageStats::adCount)).toList();
        checkDistinct(entries.stream().map(EntryStats::adCount).toList());
        checkDistinct(laters.stream().map(PageStats::adCount).toList());

        int ne = entries.size();
        int nl = laters.size();
        Rate[] entryRates = new Rate[ne];
        Rate[] laterRates = new Rate[nl];
        String[] entryWhy = new String[ne];
        String[] laterWhy = new String[nl];
        List<Integer> okEntry = new ArrayList<>();
        List<Integer> okLater = new ArrayList<>();
        for (int i = 0; i < ne; i++) {
            EntryStats s = entries.get(i);
            entryRates[i] = Rate.of(s.sessions(), s.bounces(), s.revenueMicros(), s.revenueSquaredMicros());
            entryWhy[i] = reason(s.sessions(), options.minSessions(), "sessions", s.bounces(), false);
            if (entryWhy[i].isEmpty()) {
                okEntry.add(i);
            }
        }
        for (int j = 0; j < nl; j++) {
            PageStats s = laters.get(j);
            laterRates[j] = Rate.of(s.pages(), s.exits(), s.revenueMicros(), s.revenueSquaredMicros());
            laterWhy[j] = reason(s.pages(), options.minPages(), "pages", s.exits(), true);
            if (laterWhy[j].isEmpty()) {
                okLater.add(j);
            }
        }
        // the single caps: every ad count seen on either side; eligible when both sides are
        java.util.TreeSet<Integer> counts = new java.util.TreeSet<>();
        entries.forEach(e -> counts.add(e.adCount()));
        laters.forEach(l -> counts.add(l.adCount()));
        int nd = counts.size();
        int[] diagEntry = new int[nd];
        int[] diagLater = new int[nd];
        int[] diagPair = new int[nd];
        int[] diagAds = new int[nd];
        {
            int d = 0;
            for (int k : counts) {
                diagAds[d] = k;
                diagEntry[d] = indexOf(entries.stream().mapToInt(EntryStats::adCount).toArray(), k);
                diagLater[d] = indexOf(laters.stream().mapToInt(PageStats::adCount).toArray(), k);
                diagPair[d] = -1;
                d++;
            }
        }
        int b = options.resamples();
        int pairCount = okEntry.size() * okLater.size();
        int[] pairEntry = new int[pairCount];
        int[] pairLater = new int[pairCount];
        {
            int p = 0;
            for (int i : okEntry) {
                for (int j : okLater) {
                    pairEntry[p] = i;
                    pairLater[p] = j;
                    for (int d = 0; d < nd; d++) {
                        if (diagEntry[d] == i && diagLater[d] == j) {
                            diagPair[d] = p;
                        }
                    }
                    p++;
                }
            }
        }
        double[][] pairDraws = new double[pairCount][b];
        double[][] laterDraws = new double[nl][];
        for (int j : okLater) {
            laterDraws[j] = new double[b];
        }
        int[] pairWins = new int[pairCount];
        int[] diagWins = new int[nd];
        double[] entryRevenue = new double[ne];
        double[] entryContinue = new double[ne];
        SplittableRandom random = new SplittableRandom(options.seed());
        for (int r = 0; r < b; r++) {
            for (int i : okEntry) {
                entryContinue[i] = 1 - entryRates[i].drawLeaveRate(random, options);
                entryRevenue[i] = entryRates[i].drawRevenue(random);
            }
            for (int j : okLater) {
                double q = laterRates[j].drawLeaveRate(random, options);
                laterDraws[j][r] = laterRates[j].drawRevenue(random) / q / 1000;
            }
            int best = -1;
            double bestDraw = Double.NEGATIVE_INFINITY;
            for (int p = 0; p < pairCount; p++) {
                double v = entryRevenue[pairEntry[p]] / 1000 + entryContinue[pairEntry[p]] * laterDraws[pairLater[p]][r];
                pairDraws[p][r] = v;
                if (best < 0 || v > bestDraw) {
                    best = p;
                    bestDraw = v;
                }
            }
            if (best >= 0) {
                pairWins[best]++;
            }
            int bestDiag = -1;
            double bestDiagDraw = Double.NEGATIVE_INFINITY;
            for (int d = 0; d < nd; d++) {
                int p = diagPair[d];
                if (p >= 0 && (bestDiag < 0 || pairDraws[p][r] > bestDiagDraw)) {
                    bestDiag = d;
                    bestDiagDraw = pairDraws[p][r];
                }
            }
            if (bestDiag >= 0) {
                diagWins[bestDiag]++;
            }
        }

        List<PairValue> pairs = new ArrayList<>(pairCount);
        double[] entryWins = new double[ne];
        double[] laterWins = new double[nl];
        double[] pairValue = new double[pairCount];
        int recommended = -1;
        double bestValue = Double.NEGATIVE_INFINITY;
        for (int p = 0; p < pairCount; p++) {
            int i = pairEntry[p];
            int j = pairLater[p];
            Rate e = entryRates[i];
            Rate l = laterRates[j];
            double value = (e.revenuePerPage() + (1 - e.leaveRate()) * l.sessionValue()) / 1000;
            pairValue[p] = value;
            double share = (double) pairWins[p] / b;
            pairs.add(new PairValue(entries.get(i).adCount(), laters.get(j).adCount(),
                percentileInterval(value, pairDraws[p], options.level()), share));
            entryWins[i] += share;
            laterWins[j] += share;
            if (value > bestValue) { // strict: the first pair (fewest entry ads, then later ads) wins a tie
                bestValue = value;
                recommended = p;
            }
        }
        List<EntryCapValue> entryValues = new ArrayList<>(ne);
        for (int i = 0; i < ne; i++) {
            EntryStats s = entries.get(i);
            entryValues.add(new EntryCapValue(s.adCount(), entryWhy[i].isEmpty() ? DataStatus.ENOUGH_DATA
                : DataStatus.NOT_ENOUGH_DATA, entryWhy[i], s.sessions(), entryRates[i].leaveRate(),
                entryRates[i].revenuePerPage(), entryRates[i].revenueSe(), entryWins[i]));
        }
        List<CapValue> laterValues = new ArrayList<>(nl);
        for (int j = 0; j < nl; j++) {
            PageStats s = laters.get(j);
            Rate rate = laterRates[j];
            Interval rpm = laterDraws[j] == null ? new Interval(rate.sessionValue() / 1000, Double.NaN, Double.NaN)
                : percentileInterval(rate.sessionValue() / 1000, laterDraws[j], options.level());
            laterValues.add(new CapValue(s.adCount(), laterWhy[j].isEmpty() ? DataStatus.ENOUGH_DATA
                : DataStatus.NOT_ENOUGH_DATA, laterWhy[j], s.pages(), rate.leaveRate(), rate.revenuePerPage(),
                rate.revenueSe(), rate.expectedPages(), rpm, laterWins[j]));
        }
        TwoCapRecommendation pair;
        if (recommended < 0) {
            String summary = String.format(Locale.ROOT, "No recommendation: no pair of caps has enough data (entry "
                + "caps need %d sessions, later-page caps %d pages with at least one exit).", options.minSessions(),
                options.minPages());
            pair = new TwoCapRecommendation(Optional.empty(), summary, entryValues, laterValues, pairs, currentRpm,
                Optional.empty(), b, options.seed(), CAUTION);
        } else {
            PairValue best = pairs.get(recommended);
            Optional<Interval> gain = gain(best.sessionRpm(), pairDraws[recommended], currentRpm, options.level());
            String summary = String.format(Locale.ROOT, "Recommended caps: %d ads on the entry page and %d on later "
                    + "pages, session RPM %.2f (%s%% interval %.2f to %.2f), best in %.0f%% of %d resamples.",
                best.entryAdCount(), best.laterAdCount(), best.sessionRpm().estimate(), percent(options.level()),
                best.sessionRpm().lower(), best.sessionRpm().upper(), 100 * best.probabilityBest(), b);
            pair = new TwoCapRecommendation(Optional.of(best), summary, entryValues, laterValues, pairs, currentRpm,
                gain, b, options.seed(), CAUTION);
        }

        // the single cap: the diagonal, same draws
        List<SameCapValue> same = new ArrayList<>(nd);
        int sameBest = -1;
        for (int d = 0; d < nd; d++) {
            int i = diagEntry[d];
            int j = diagLater[d];
            int k = diagAds[d];
            Rate e = i < 0 ? null : entryRates[i];
            Rate l = j < 0 ? null : laterRates[j];
            String why;
            if (i < 0) {
                why = "not enough data: no session entered on a page with " + k + " ads";
            } else if (j < 0) {
                why = "not enough data: no later page carried " + k + " ads, so what readers do after such pages "
                    + "is unknown";
            } else {
                why = !entryWhy[i].isEmpty() ? "entry pages: " + entryWhy[i]
                    : !laterWhy[j].isEmpty() ? "later pages: " + laterWhy[j] : "";
            }
            double bounce = e == null ? Double.NaN : e.leaveRate();
            double value = e == null || l == null ? Double.NaN
                : (e.revenuePerPage() + (1 - bounce) * l.sessionValue()) / 1000;
            double pages = e == null || l == null ? Double.NaN : 1 + (1 - bounce) * l.expectedPages();
            int p = diagPair[d];
            Interval rpm = p < 0 ? new Interval(value, Double.NaN, Double.NaN)
                : pairs.get(p).sessionRpm();
            same.add(new SameCapValue(k, why.isEmpty() ? DataStatus.ENOUGH_DATA : DataStatus.NOT_ENOUGH_DATA, why,
                e == null ? 0 : e.count(), l == null ? 0 : l.count(), bounce, l == null ? Double.NaN : l.leaveRate(),
                e == null ? Double.NaN : e.revenuePerPage(), l == null ? Double.NaN : l.revenuePerPage(), pages, rpm,
                (double) diagWins[d] / b));
            if (p >= 0 && (sameBest < 0 || pairValue[p] > pairValue[diagPair[sameBest]])) { // strict: fewer ads win ties
                sameBest = d;
            }
        }
        SameCapRecommendation sameCap;
        if (sameBest < 0) {
            String summary = String.format(Locale.ROOT, "No recommendation: no ad count has enough data on both entry "
                + "pages (%d sessions) and later pages (%d pages with at least one exit).", options.minSessions(),
                options.minPages());
            sameCap = new SameCapRecommendation(Optional.empty(), summary, same, currentRpm, Optional.empty(), b,
                options.seed(), CAUTION);
        } else {
            SameCapValue best = same.get(sameBest);
            Optional<Interval> gain = gain(best.sessionRpm(), pairDraws[diagPair[sameBest]], currentRpm,
                options.level());
            String summary = String.format(Locale.ROOT, "Recommended cap: %d ads per page, session RPM %.2f (%s%% "
                    + "interval %.2f to %.2f), best in %.0f%% of %d resamples.", best.adCount(),
                best.sessionRpm().estimate(), percent(options.level()), best.sessionRpm().lower(),
                best.sessionRpm().upper(), 100 * best.probabilityBest(), b);
            sameCap = new SameCapRecommendation(Optional.of(best.adCount()), summary, same, currentRpm, gain, b,
                options.seed(), CAUTION);
        }
        return new Advice(sameCap, pair);
    }

    private static int indexOf(int[] sortedAdCounts, int k) {
        int at = Arrays.binarySearch(sortedAdCounts, k);
        return at < 0 ? -1 : at;
    }

    // ------------------------------------------------------------------ estimates and draws

    /** Leave rate (exit or bounce) and revenue per page of one cap, with the sampler's parameters. */
    private record Rate(long count, long leaves, double revenuePerPage, double revenueSe) {

        static Rate of(long count, long leaves, long revenue, double revenueSquared) {
            double mean = count == 0 ? Double.NaN : (double) revenue / count;
            double se = Double.NaN;
            if (count >= 2) {
                double ss = Math.max(0, revenueSquared - (double) revenue * revenue / count);
                se = Math.sqrt(ss / (count - 1) / count);
            }
            return new Rate(count, leaves, mean, se);
        }

        double leaveRate() {
            return count == 0 ? Double.NaN : (double) leaves / count;
        }

        /** Revenue per session in micros: RPP/q (geometric number of pages); NaN without exits. */
        double sessionValue() {
            return leaves == 0 ? Double.NaN : revenuePerPage / leaveRate();
        }

        /** 1/q; NaN without exits (the estimate would be infinite). */
        double expectedPages() {
            return leaves == 0 ? Double.NaN : 1 / leaveRate();
        }

        double drawLeaveRate(SplittableRandom random, Options options) {
            double x = gamma(random, options.priorAlpha() + leaves);
            double y = gamma(random, options.priorBeta() + (count - leaves));
            return x / (x + y);
        }

        double drawRevenue(SplittableRandom random) {
            return revenuePerPage + revenueSe * gaussian(random);
        }
    }

    /** Gamma(shape, 1) by Marsaglia and Tsang (2000); shape &lt; 1 through Gamma(shape + 1)·U^(1/shape). */
    static double gamma(SplittableRandom random, double shape) {
        if (shape < 1) {
            double u = random.nextDouble();
            return gamma(random, shape + 1) * Math.pow(u, 1 / shape);
        }
        double d = shape - 1.0 / 3;
        double c = 1 / Math.sqrt(9 * d);
        while (true) {
            double x;
            double v;
            do {
                x = gaussian(random);
                v = 1 + c * x;
            } while (v <= 0);
            v = v * v * v;
            double u = random.nextDouble();
            if (u < 1 - 0.0331 * x * x * x * x || Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) {
                return d * v;
            }
        }
    }

    /** Standard normal by Marsaglia's polar method (one of the pair is used: simpler, and cost is negligible). */
    static double gaussian(SplittableRandom random) {
        double u;
        double v;
        double s;
        do {
            u = 2 * random.nextDouble() - 1;
            v = 2 * random.nextDouble() - 1;
            s = u * u + v * v;
        } while (s >= 1 || s == 0);
        return u * Math.sqrt(-2 * Math.log(s) / s);
    }

    /**
     * Percentile interval (type-7 quantiles) of the draws, around the given point estimate. The order statistics come
     * from a selection (Hoare's FIND, expected O(B)) rather than a full sort: the same values as sorting, at a quarter
     * of the cost for B = 1,000, which matters with one interval per pair of caps.
     */
    private static Interval percentileInterval(double estimate, double[] draws, double level) {
        double[] work = draws.clone();
        double tail = (1 - level) / 2;
        return new Interval(estimate, selectQuantile7(work, tail), selectQuantile7(work, 1 - tail));
    }

    /** Type-7 quantile by selection; reorders {@code a} (finite values). */
    static double selectQuantile7(double[] a, double p) {
        int n = a.length;
        double h = (n - 1) * p;
        int lo = (int) Math.floor(h);
        double low = select(a, lo);
        if (lo + 1 >= n || h == lo) {
            return low;
        }
        // after the selection every element right of lo is >= a[lo]: the next order statistic is their minimum
        double next = Double.POSITIVE_INFINITY;
        for (int i = lo + 1; i < n; i++) {
            next = Math.min(next, a[i]);
        }
        return low + (h - lo) * (next - low);
    }

    /**
     * The k-th smallest value (0-based), leaving smaller values left of k and larger right of it. Three-way
     * partitioning (Dijkstra's Dutch national flag) on a median-of-three pivot, so runs of equal draws (a cap without
     * revenue draws only zeros) stay linear.
     */
    private static double select(double[] a, int k) {
        int left = 0;
        int right = a.length - 1;
        while (right > left) {
            int mid = (left + right) >>> 1;
            double x = a[left];
            double y = a[mid];
            double z = a[right];
            double pivot = Math.max(Math.min(x, y), Math.min(Math.max(x, y), z));
            int lt = left;
            int gt = right;
            int i = left;
            while (i <= gt) {
                if (a[i] < pivot) {
                    swap(a, lt++, i++);
                } else if (a[i] > pivot) {
                    swap(a, i, gt--);
                } else {
                    i++;
                }
            }
            // a[left..lt-1] < pivot, a[lt..gt] == pivot, a[gt+1..right] > pivot
            if (k < lt) {
                right = lt - 1;
            } else if (k > gt) {
                left = gt + 1;
            } else {
                return pivot;
            }
        }
        return a[k];
    }

    private static void swap(double[] a, int i, int j) {
        double t = a[i];
        a[i] = a[j];
        a[j] = t;
    }

    static double quantile7(double[] sorted, double p) {
        double h = (sorted.length - 1) * p;
        int lo = (int) Math.floor(h);
        int hi = Math.min(lo + 1, sorted.length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    private static Optional<Interval> gain(Interval rpm, double[] draws, OptionalDouble currentRpm, double level) {
        if (currentRpm.isEmpty()) {
            return Optional.empty();
        }
        double current = currentRpm.getAsDouble();
        double[] diff = new double[draws.length];
        for (int r = 0; r < draws.length; r++) {
            diff[r] = draws[r] - current;
        }
        return Optional.of(percentileInterval(rpm.estimate() - current, diff, level));
    }

    private static OptionalDouble currentRpm(OptionalDouble revenuePerSessionMicros) {
        if (revenuePerSessionMicros.isEmpty()) {
            return OptionalDouble.empty();
        }
        double v = revenuePerSessionMicros.getAsDouble();
        if (!(v >= 0) || Double.isInfinite(v)) {
            throw new IllegalArgumentException("currentRevenuePerSessionMicros must be finite and >= 0, was " + v);
        }
        return OptionalDouble.of(v / 1000);
    }

    private static String percent(double level) {
        double pct = 100 * level;
        return pct == Math.rint(pct) ? String.valueOf((long) pct) : String.valueOf(pct);
    }

    /** Empty if the cap counts, else why not. */
    private static String reason(long count, long minimum, String unit, long leaves, boolean needLeaves) {
        if (count < minimum) {
            return String.format(Locale.ROOT, "not enough data: %d %s, need %d", count, unit, minimum);
        }
        if (needLeaves && leaves == 0) {
            return "not enough data: no exits observed, so pages per session cannot be estimated";
        }
        return "";
    }

    private static void checkDistinct(List<Integer> adCounts) {
        Set<Integer> seen = new HashSet<>();
        for (int k : adCounts) {
            if (!seen.add(k)) {
                throw new IllegalArgumentException("adCount values must be distinct, " + k + " appears twice");
            }
        }
    }

    private static void checkCell(String adName, int adCount, long count, String countName, long leaves,
                                  String leaveName, long revenue, double revenueSquared) {
        if (adCount < 0) {
            throw new IllegalArgumentException(adName + " must be >= 0, was " + adCount);
        }
        if (count < 0) {
            throw new IllegalArgumentException(countName + " must be >= 0, was " + count + " (adCount " + adCount
                + ")");
        }
        if (leaves < 0 || leaves > count) {
            throw new IllegalArgumentException(leaveName + " must be in [0, " + countName + " = " + count + "], was "
                + leaves + " (adCount " + adCount + ")");
        }
        if (revenue < 0) {
            throw new IllegalArgumentException("revenueMicros must be >= 0, was " + revenue + " (adCount " + adCount
                + ")");
        }
        if (!(revenueSquared >= 0) || Double.isInfinite(revenueSquared)) {
            throw new IllegalArgumentException("revenueSquaredMicros must be finite and >= 0, was " + revenueSquared
                + " (adCount " + adCount + ")");
        }
        // Cauchy–Schwarz: Σr² ≥ (Σr)²/n; a smaller value means the inputs are in different units or mixed up.
        if (count > 0 && revenueSquared < (double) revenue * revenue / count * (1 - 1e-9)) {
            throw new IllegalArgumentException("revenueSquaredMicros = " + revenueSquared + " is below revenueMicros²/"
                + countName + " = " + ((double) revenue * revenue / count) + " (adCount " + adCount
                + "): not a sum of squares of the same revenues");
        }
    }
}
