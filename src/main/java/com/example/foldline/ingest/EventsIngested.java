package com.example.foldline.ingest;

/** Published after events of a site were committed; the sessions module builds sessions from them. */
public record EventsIngested(long siteId, long pageviews, long pageEnds, long impressions, long sessions) {
}
