package com.example.foldline.ingest;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import com.example.foldline.sites.Site;

/**
 * The validated events of one transaction, kept per type and written through {@link EventWriter}. The live ingest
 * request and each commit of an import job use it, so both store events the same way: one ingest batch per
 * transaction (the sessionizer's work item), idempotent writes, and stored versus duplicate counts.
 */
final class EventBatch {

    private final EventWriter writer;
    private final Site site;
    private final Instant receivedAt;
    private final List<Event.Pageview> pageviews = new ArrayList<>();
    private final List<Event.PageEnd> pageEnds = new ArrayList<>();
    private final List<Event.Impression> impressions = new ArrayList<>();
    private final List<Event.Session> sessions = new ArrayList<>();
    private long valid;
    private long pageviewsStored;
    private long pageEndsStored;
    private long impressionsStored;
    private long sessionsStored;
    private long batchId = -1;
    private Instant newest;

    EventBatch(EventWriter writer, Site site, Instant receivedAt) {
        this.writer = writer;
        this.site = site;
        this.receivedAt = receivedAt;
    }

    void add(Event event) {
        valid++;
        if (event instanceof Event.Pageview p) {
            pageviews.add(p);
        } else if (event instanceof Event.PageEnd e) {
            pageEnds.add(e);
        } else if (event instanceof Event.Impression i) {
            impressions.add(i);
        } else if (event instanceof Event.Session s) {
            sessions.add(s);
        }
    }

    /** Events added and not yet written. */
    int pending() {
        return pageviews.size() + pageEnds.size() + impressions.size() + sessions.size();
    }

    /** Writes the pending events; must run inside the caller's transaction. */
    void flush() {
        if (pending() == 0) {
            return;
        }
        if (batchId < 0) {
            batchId = writer.openBatch(site);
        }
        for (Event.Pageview p : pageviews) {
            if (newest == null || p.ts().isAfter(newest)) {
                newest = p.ts();
            }
        }
        if (!pageviews.isEmpty()) {
            pageviewsStored += writer.pageviews(site, batchId, pageviews, receivedAt);
            pageviews.clear();
        }
        if (!pageEnds.isEmpty()) {
            pageEndsStored += writer.pageEnds(site, batchId, pageEnds, receivedAt);
            pageEnds.clear();
        }
        if (!impressions.isEmpty()) {
            impressionsStored += writer.impressions(site, batchId, impressions, receivedAt);
            impressions.clear();
        }
        if (!sessions.isEmpty()) {
            sessionsStored += writer.sessions(site, sessions, receivedAt);
            sessions.clear();
        }
    }

    /** Writes what is pending and closes the ingest batch (records its newest pageview time). */
    void finish() {
        flush();
        if (batchId >= 0) {
            writer.closeBatch(batchId, newest);
        }
    }

    long valid() {
        return valid;
    }

    long stored() {
        return pageviewsStored + pageEndsStored + impressionsStored + sessionsStored;
    }

    long duplicates() {
        return valid - stored();
    }

    /** The event to publish after commit, or null when nothing new was stored. */
    EventsIngested ingested() {
        return stored() == 0 ? null
                : new EventsIngested(site.id(), pageviewsStored, pageEndsStored, impressionsStored, sessionsStored);
    }
}
