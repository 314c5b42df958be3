package com.example.foldline.sessions;

/**
 * Additive session measures of a group of closed sessions; sums of squares allow variances of per-session means.
 */
public record SessionTotals(long sessions, long bounces, long pageviews, double pageviewsSq, long engagedMs,
                            double engagedSq, long revenueMicros, double revenueSq, long entryAdsSum, long impressions,
                            long viewableImpressions, long clicks) {

    public static final SessionTotals ZERO = new SessionTotals(0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0);

    public SessionTotals plus(SessionTotals o) {
        return new SessionTotals(sessions + o.sessions, bounces + o.bounces, pageviews + o.pageviews,
                pageviewsSq + o.pageviewsSq, engagedMs + o.engagedMs, engagedSq + o.engagedSq,
                revenueMicros + o.revenueMicros, revenueSq + o.revenueSq, entryAdsSum + o.entryAdsSum,
                impressions + o.impressions, viewableImpressions + o.viewableImpressions, clicks + o.clicks);
    }
}
