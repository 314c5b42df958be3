package com.example.foldline.ingest;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import org.springframework.context.ApplicationEventPublisher;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.privacy.VisitorPseudonyms;
import com.example.foldline.sites.Site;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Reads, validates and stores one request's events in a single transaction, so an answer of 2xx means every
 * accepted event is committed and anything else means nothing was stored.
 */
@Service
public class IngestService {

    /** How a body is framed. */
    public enum Format { NDJSON, JSON_ARRAY }

    private final EventWriter writer;
    private final VisitorPseudonyms pseudonyms;
    private final ObjectMapper mapper;
    private final TransactionTemplate tx;
    private final ApplicationEventPublisher events;
    private final Clock clock;
    private final IngestProperties properties;

    IngestService(EventWriter writer, VisitorPseudonyms pseudonyms, ObjectMapper mapper, TransactionTemplate tx,
                  ApplicationEventPublisher events, Clock clock, IngestProperties properties) {
        this.writer = writer;
        this.pseudonyms = pseudonyms;
        this.mapper = mapper;
        this.tx = tx;
        this.events = events;
        this.clock = clock;
        this.properties = properties;
    }

    /** Ingests a body of at most {@code maxBytes}; throws {@link BodyTooLargeException} (nothing stored) above it. */
    public IngestResult ingest(Site site, InputStream body, Format format, long maxBytes) {
        Batch batch = tx.execute(status -> {
            Batch b = new Batch(site, clock.instant());
            InputStream in = new LimitedInputStream(body, maxBytes);
            try {
                if (format == Format.NDJSON) {
                    EventStream.ndjson(in, mapper, b);
                } else {
                    EventStream.jsonArray(in, mapper, b);
                }
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            b.flush();
            if (b.batchId >= 0) {
                writer.closeBatch(b.batchId, b.newest);
            }
            return b;
        });
        if (batch.pageviewsStored + batch.pageEndsStored + batch.impressionsStored + batch.sessionsStored > 0) {
            events.publishEvent(new EventsIngested(site.id(), batch.pageviewsStored, batch.pageEndsStored,
                    batch.impressionsStored, batch.sessionsStored));
        }
        long stored = batch.pageviewsStored + batch.pageEndsStored + batch.impressionsStored + batch.sessionsStored;
        return new IngestResult(stored, batch.valid - stored, List.copyOf(batch.rejections), batch.rejectedCount);
    }

    /** Collects valid events into per-type batches and writes each when full. */
    private final class Batch implements EventStream.Sink {
        final Site site;
        final Instant now;
        final EventParser parser;
        final List<Event.Pageview> pageviews = new ArrayList<>();
        final List<Event.PageEnd> pageEnds = new ArrayList<>();
        final List<Event.Impression> impressions = new ArrayList<>();
        final List<Event.Session> sessions = new ArrayList<>();
        final List<IngestResult.Rejection> rejections = new ArrayList<>();
        long rejectedCount;
        long valid;
        long pageviewsStored;
        long pageEndsStored;
        long impressionsStored;
        long sessionsStored;
        long batchId = -1;
        Instant newest;

        Batch(Site site, Instant now) {
            this.site = site;
            this.now = now;
            this.parser = new EventParser(site, now, pseudonyms);
        }

        @Override
        public void event(long line, JsonNode node) {
            Event event;
            try {
                event = parser.parse(node);
            } catch (EventParser.Rejected r) {
                reject(line, r.field, r.getMessage());
                return;
            }
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
            if (pageviews.size() + pageEnds.size() + impressions.size() + sessions.size() >= properties.batchSize()) {
                flush();
            }
        }

        @Override
        public void malformed(long line, String message) {
            reject(line, "", message);
        }

        private void reject(long line, String field, String message) {
            rejectedCount++;
            if (rejections.size() < IngestResult.MAX_LISTED) {
                rejections.add(new IngestResult.Rejection(line, field, message));
            }
        }

        void flush() {
            if (pageviews.isEmpty() && pageEnds.isEmpty() && impressions.isEmpty() && sessions.isEmpty()) {
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
                pageviewsStored += writer.pageviews(site, batchId, pageviews, now);
                pageviews.clear();
            }
            if (!pageEnds.isEmpty()) {
                pageEndsStored += writer.pageEnds(site, batchId, pageEnds, now);
                pageEnds.clear();
            }
            if (!impressions.isEmpty()) {
                impressionsStored += writer.impressions(site, batchId, impressions, now);
                impressions.clear();
            }
            if (!sessions.isEmpty()) {
                sessionsStored += writer.sessions(site, sessions, now);
                sessions.clear();
            }
        }
    }
}
