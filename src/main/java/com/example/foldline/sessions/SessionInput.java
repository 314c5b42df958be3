package com.example.foldline.sessions;

import java.time.Instant;
import java.util.List;

/**
 * A finished session with its pages, as a bulk source (the demo simulator, page-level history) hands it over.
 * Segment fields are those of the entry page; {@code pages} are in order, the first is the entry page.
 */
public record SessionInput(String id, String visitor, Instant start, Instant end, String entryPath, String source,
                           String device, String browser, String os, String country, String region, String variant,
                           List<Page> pages) {

    /** One page: ads shown, engaged time (null when unmeasured) and its ad results. */
    public record Page(int ads, Long engagedMs, long revenueMicros, int impressions, int viewable, int clicks) {
    }
}
