package com.example.foldline.ingest;

import java.time.Instant;

/** One validated event, ready to store. The visitor field already holds the pseudonym, never the client's id. */
sealed interface Event {

    /** Segment fields shared by pageviews and imported sessions. */
    record Segment(String source, String device, String browser, String os, String country, String region,
                   String variant) {
    }

    record Pageview(String id, Instant ts, String visitor, String clientSession, String path, String referrer,
                    Segment segment, int ads, Long engagedMs) implements Event {
    }

    record PageEnd(String pageview, long engagedMs, Integer scrollPct) implements Event {
    }

    record Impression(String id, String pageview, String slot, String size, boolean viewable, boolean clicked,
                      long revenueMicros, Long cpmMicros) implements Event {
    }

    /** A whole session summarised by another system; stored as a finished session. */
    record Session(String id, String visitor, String clientSession, Instant start, Instant end, int pageviews,
                   Boolean bounce, long engagedMs, String entryPath, int entryAds, Double laterAds, Segment segment,
                   long revenueMicros, int impressions, int viewableImpressions, int clicks) implements Event {
    }
}
