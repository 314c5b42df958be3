package com.example.foldline.sessions;

/** Additive page measures of a group of pageviews (of closed sessions). */
public record PageTotals(long pageviews, long exits, long engagedMs, long revenueMicros, double revenueSq,
                         long impressions, long viewableImpressions, long clicks) {

    public static final PageTotals ZERO = new PageTotals(0, 0, 0, 0, 0, 0, 0, 0);

    public PageTotals plus(PageTotals o) {
        return new PageTotals(pageviews + o.pageviews, exits + o.exits, engagedMs + o.engagedMs,
                revenueMicros + o.revenueMicros, revenueSq + o.revenueSq, impressions + o.impressions,
                viewableImpressions + o.viewableImpressions, clicks + o.clicks);
    }
}
