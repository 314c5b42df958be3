package com.example.foldline.sessions;

import java.time.Instant;
import java.time.LocalDate;
import java.util.List;

/**
 * One session as stored in {@code session_fact}. Built from pageviews (origin {@code tag}) or imported whole
 * (origin {@code import}). Segment fields come from the entry page.
 */
record SessionFact(long siteId, String id, String origin, String visitor, String clientSession, Instant start,
                   Instant end, LocalDate localDay, int localHour, int pageviews, boolean bounce, long engagedMs,
                   String entryPath, int entryAds, Double laterAds, String source, String device, String browser,
                   String os, String country, String region, String variant, long revenueMicros, int impressions,
                   int viewableImpressions, int clicks, boolean closed, List<PageStat> pages) {

    /** Pages-per-session bucket of the depth answer: 1 to 10, and 11 for 11 or more. */
    int pagesBucket() {
        return Math.min(pageviews, 11);
    }

    SessionFact withClosed(boolean value) {
        return new SessionFact(siteId, id, origin, visitor, clientSession, start, end, localDay, localHour, pageviews,
                bounce, engagedMs, entryPath, entryAds, laterAds, source, device, browser, os, country, region,
                variant, revenueMicros, impressions, viewableImpressions, clicks, value, pages);
    }
}
