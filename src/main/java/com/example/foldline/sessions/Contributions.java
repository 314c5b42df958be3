package com.example.foldline.sessions;

import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Adds (or, with sign −1, removes) sessions' contributions to every rollup view, aggregated in memory so that one
 * database write per touched cell suffices. Only closed sessions count: an open one-page session is not yet a bounce.
 */
final class Contributions {

    static final int MAX_PATH = 512;

    /** Key of one rollup_session cell; dimensions outside the view hold "" or −1; a weekly twin's day is a Monday. */
    record SessionCell(int cuboid, LocalDate day, int hour, String device, String source, String browser,
                       String variant, String country, String region, int entryAds, int pages, String entryPath) {
    }

    /** Key of one rollup_page cell. */
    record PageCell(int cuboid, LocalDate day, String device, String source, String browser, String variant,
                    String country, String region, int ads, int position, int engagedBucket) {
    }

    static final class SessionMeasures {
        long sessions;
        long bounces;
        long pageviews;
        double pageviewsSq;
        long engagedMs;
        double engagedSq;
        long revenueMicros;
        double revenueSq;
        long entryAdsSum;
        long impressions;
        long viewable;
        long clicks;

        boolean isZero() {
            return sessions == 0 && bounces == 0 && pageviews == 0 && engagedMs == 0 && revenueMicros == 0
                    && impressions == 0 && viewable == 0 && clicks == 0 && entryAdsSum == 0
                    && pageviewsSq == 0 && engagedSq == 0 && revenueSq == 0;
        }
    }

    static final class PageMeasures {
        long pageviews;
        long exits;
        long engagedMs;
        long revenueMicros;
        double revenueSq;
        long impressions;
        long viewable;
        long clicks;

        boolean isZero() {
            return pageviews == 0 && exits == 0 && engagedMs == 0 && revenueMicros == 0 && revenueSq == 0
                    && impressions == 0 && viewable == 0 && clicks == 0;
        }
    }

    final Map<SessionCell, SessionMeasures> sessionCells = new HashMap<>();
    final Map<PageCell, PageMeasures> pageCells = new HashMap<>();
    private final List<Cuboid> sessionViews;
    private final List<Cuboid> pageViews;
    /** Weekly twins get the contributions of sessions in weeks up to this Monday (they are built); null: none. */
    private final LocalDate weeksThrough;

    /**
     * Contributions to every daily view, and to the weekly twins for sessions in weeks the twins already hold
     * ({@link WeeklyViews}: later weeks are built from the daily views once they are over).
     *
     * @param weeksThrough the Monday of the last built week, or null
     */
    Contributions(LocalDate weeksThrough) {
        this(Cuboid.SESSION, Cuboid.PAGE, weeksThrough);
    }

    /** Contributions to the given daily views only (filling views a site's rollups lack, {@link RollupFill}). */
    Contributions(List<Cuboid> sessionViews, List<Cuboid> pageViews) {
        this(sessionViews, pageViews, null);
    }

    private Contributions(List<Cuboid> sessionViews, List<Cuboid> pageViews, LocalDate weeksThrough) {
        this.sessionViews = sessionViews;
        this.pageViews = pageViews;
        this.weeksThrough = weeksThrough;
    }

    boolean isEmpty() {
        return sessionCells.isEmpty() && pageCells.isEmpty();
    }

    void add(SessionFact s, int sign) {
        if (!s.closed()) {
            return;
        }
        boolean weekBuilt = weeksThrough != null && !Cuboid.monday(s.localDay()).isAfter(weeksThrough);
        for (Cuboid c : sessionViews) {
            if (c.weekly() && !weekBuilt) {
                continue;
            }
            SessionCell key = new SessionCell(c.id(), c.cellDay(s.localDay()),
                    c.has(Dim.HOUR) ? s.localHour() : -1,
                    text(c, Dim.DEVICE, s.device()), text(c, Dim.SOURCE, s.source()),
                    text(c, Dim.BROWSER, s.browser()), text(c, Dim.VARIANT, s.variant()),
                    text(c, Dim.COUNTRY, s.country()), text(c, Dim.REGION, s.region()),
                    c.has(Dim.ENTRY_ADS) ? s.entryAds() : -1,
                    c.has(Dim.PAGES) ? s.pagesBucket() : -1,
                    c.has(Dim.ENTRY_PATH) ? truncate(s.entryPath()) : "");
            SessionMeasures m = sessionCells.computeIfAbsent(key, k -> new SessionMeasures());
            m.sessions += sign;
            m.bounces += s.bounce() ? sign : 0;
            m.pageviews += (long) sign * s.pageviews();
            m.pageviewsSq += sign * (double) s.pageviews() * s.pageviews();
            m.engagedMs += sign * s.engagedMs();
            m.engagedSq += sign * (double) s.engagedMs() * s.engagedMs();
            m.revenueMicros += sign * s.revenueMicros();
            m.revenueSq += sign * (double) s.revenueMicros() * s.revenueMicros();
            m.entryAdsSum += (long) sign * s.entryAds();
            m.impressions += (long) sign * s.impressions();
            m.viewable += (long) sign * s.viewableImpressions();
            m.clicks += (long) sign * s.clicks();
        }
        List<PageStat> pages = s.pages();
        for (int i = 0; i < pages.size(); i++) {
            PageStat p = pages.get(i);
            int position = i == 0 ? 0 : 1;
            boolean exit = i == pages.size() - 1;
            for (Cuboid c : pageViews) {
                if (c.weekly() && !weekBuilt) {
                    continue;
                }
                PageCell key = new PageCell(c.id(), c.cellDay(s.localDay()),
                        text(c, Dim.DEVICE, s.device()), text(c, Dim.SOURCE, s.source()),
                        text(c, Dim.BROWSER, s.browser()), text(c, Dim.VARIANT, s.variant()),
                        text(c, Dim.COUNTRY, s.country()), text(c, Dim.REGION, s.region()),
                        c.has(Dim.ADS) ? p.ads() : -1, c.has(Dim.POSITION) ? position : -1,
                        c.has(Dim.ENGAGED_BUCKET) ? p.engagedBucket() : -1);
                PageMeasures m = pageCells.computeIfAbsent(key, k -> new PageMeasures());
                m.pageviews += sign;
                m.exits += exit ? sign : 0;
                m.engagedMs += sign * (p.engagedMs() == null ? 0 : p.engagedMs());
                m.revenueMicros += sign * p.revenueMicros();
                m.revenueSq += sign * (double) p.revenueMicros() * p.revenueMicros();
                m.impressions += (long) sign * p.impressions();
                m.viewable += (long) sign * p.viewable();
                m.clicks += (long) sign * p.clicks();
            }
        }
    }

    private static String text(Cuboid c, Dim dim, String value) {
        return c.has(dim) && value != null ? value : "";
    }

    static String truncate(String path) {
        return path.length() <= MAX_PATH ? path : path.substring(0, MAX_PATH);
    }
}
