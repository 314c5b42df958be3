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
            b.events.finish();
            return b;
        });
        EventsIngested ingested = batch.events.ingested();
        if (ingested != null) {
            events.publishEvent(ingested);
        }
        return new IngestResult(batch.events.stored(), batch.events.duplicates(), List.copyOf(batch.rejections),
                batch.rejectedCount);
    }

    /** Parses each event of the body into the transaction's {@link EventBatch}, writing it whenever it is full. */
    private final class Batch implements EventStream.Sink {
        final EventParser parser;
        final EventBatch events;
        final List<IngestResult.Rejection> rejections = new ArrayList<>();
        long rejectedCount;

        Batch(Site site, Instant now) {
            this.parser = new EventParser(site, now, pseudonyms);
            this.events = new EventBatch(writer, site, now);
        }

        @Override
        public void event(long line, JsonNode node) {
            try {
                events.add(parser.parse(node));
            } catch (EventParser.Rejected r) {
                reject(line, r.field, r.getMessage());
                return;
            }
            if (events.pending() >= properties.batchSize()) {
                events.flush();
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
    }
}
