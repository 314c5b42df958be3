package com.example.foldline.sessions;

import java.time.Instant;

/** A stored pageview with its page-end and its impressions summed, as the sessionizer reads it. */
record PageviewRow(String id, Instant ts, String visitor, String clientSession, String path, String source,
                   String device, String browser, String os, String country, String region, String variant, int ads,
                   Long engagedMs, long revenueMicros, int impressions, int viewable, int clicks) {
}
