package com.example.foldline.ingest;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;

import org.springframework.context.ApplicationEventPublisher;
import org.springframework.stereotype.Component;
import org.springframework.transaction.support.TransactionTemplate;

import com.example.foldline.privacy.VisitorPseudonyms;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * Reads one import job's file from its last commit to the end, a cancel or a shutdown. Every
 * {@code lines-per-commit} lines (or {@code commit-interval}, whichever comes first) the events go through the same
 * {@link EventParser} and {@link EventBatch} as live ingest, in one transaction with the job's progress, so the job
 * row always matches what is stored and a re-run of the file stores nothing new.
 */
@Component
class ImportRunner {

    /** A job whose first this many records were all rejected fails: the format or mapping is surely wrong. */
    static final int GIVE_UP_AFTER = 1_000;

    /** How a run ended. */
    enum Outcome { DONE, CANCELLED, STOPPED, GAVE_UP }

    /** What the worker tells a running job. */
    interface Control {
        boolean cancelled();

        boolean stopping();
    }

    private final EventWriter writer;
    private final VisitorPseudonyms pseudonyms;
    private final ObjectMapper mapper;
    private final TransactionTemplate tx;
    private final ApplicationEventPublisher events;
    private final Clock clock;
    private final ImportProperties properties;
    private final ImportJobRepository jobs;
    private final ImportFiles files;
    private final Sites sites;

    ImportRunner(EventWriter writer, VisitorPseudonyms pseudonyms, ObjectMapper mapper, TransactionTemplate tx,
                 ApplicationEventPublisher events, Clock clock, ImportProperties properties, ImportJobRepository jobs,
                 ImportFiles files, Sites sites) {
        this.writer = writer;
        this.pseudonyms = pseudonyms;
        this.mapper = mapper;
        this.tx = tx;
        this.events = events;
        this.clock = clock;
        this.properties = properties;
        this.jobs = jobs;
        this.files = files;
        this.sites = sites;
    }

    Outcome run(ImportJob job, Control control) throws IOException {
        Site site = sites.require(job.siteId());
        Path source = Path.of(job.sourcePath());
        if (!Files.isRegularFile(source)) {
            throw new IOException("the file to import is no longer there: " + job.fileName());
        }
        long offset = job.bytesRead();
        long lines = job.linesRead();
        CsvMapping.Bound csv = null;
        char delimiter = ',';
        if (job.format().equals("csv")) {
            CsvMapping mapping = CsvMapping.of(mapper.readTree(job.mapping()));
            delimiter = mapping.delimiter();
            try (InputStream in = files.open(source, 0)) {
                ImportInput header = new ImportInput(in, 0, 0, properties.maxLineBytes());
                header.skipByteOrderMark();
                ImportInput.CsvRecord h = header.nextCsv(delimiter);
                if (h == null) {
                    return Outcome.DONE;
                }
                csv = mapping.bind(h.fields());
                if (offset == 0) {
                    offset = header.position();
                    lines = header.linesRead();
                }
            }
        }
        Path rejectionFile = files.rejectionFile(job.id());
        try (FileChannel rejections = FileChannel.open(rejectionFile, StandardOpenOption.CREATE,
                StandardOpenOption.WRITE);
             InputStream in = files.open(source, offset)) {
            // lines rejected after the last commit (before a stop) are written again on resume
            rejections.truncate(job.rejectionBytes());
            rejections.position(job.rejectionBytes());
            OutputStream out = new BufferedOutputStream(Channels.newOutputStream(rejections), 64 * 1024);
            ImportInput input = new ImportInput(in, offset, lines, properties.maxLineBytes());
            input.skipByteOrderMark();
            Run run = new Run(job, site, input, csv, delimiter, out, rejections, control);
            return run.loop();
        }
    }

    /** The state of one run over the file. */
    private final class Run {
        final ImportJob job;
        final Site site;
        final ImportInput input;
        final CsvMapping.Bound csv;
        final char delimiter;
        final OutputStream out;
        final FileChannel rejectionChannel;
        final Control control;
        final long startPosition;
        final long startNanos = System.nanoTime();
        final boolean fromStart;
        long records;
        long accepted;
        EventParser parser;
        EventBatch batch;
        long rejected;

        Run(ImportJob job, Site site, ImportInput input, CsvMapping.Bound csv, char delimiter, OutputStream out,
            FileChannel rejectionChannel, Control control) {
            this.job = job;
            this.site = site;
            this.input = input;
            this.csv = csv;
            this.delimiter = delimiter;
            this.out = out;
            this.rejectionChannel = rejectionChannel;
            this.control = control;
            this.startPosition = input.position();
            this.fromStart = job.linesRead() == 0;
        }

        Outcome loop() throws IOException {
            long interval = properties.commitInterval().toNanos();
            while (true) {
                Instant now = clock.instant();
                parser = new EventParser(site, now, pseudonyms);
                batch = new EventBatch(writer, site, now);
                rejected = 0;
                boolean end = false;
                long deadline = System.nanoTime() + interval;
                int n = 0;
                while (n < properties.linesPerCommit()) {
                    if (control.stopping()) {
                        return Outcome.STOPPED;
                    }
                    if (control.cancelled()) {
                        break;
                    }
                    if ((n & 63) == 0 && n > 0 && System.nanoTime() > deadline) {
                        break;
                    }
                    int read = csv != null ? nextCsv() : nextNdjson();
                    if (read < 0) {
                        end = true;
                        break;
                    }
                    n += read;
                }
                boolean cancelRequested = commit();
                if (fromStart && accepted == 0 && records >= GIVE_UP_AFTER) {
                    return Outcome.GAVE_UP;
                }
                if (end) {
                    return Outcome.DONE;
                }
                if (cancelRequested || control.cancelled()) {
                    return Outcome.CANCELLED;
                }
            }
        }

        /** Reads one NDJSON line; returns 1 for a record, 0 for a blank line, -1 at the end. */
        private int nextNdjson() throws IOException {
            ImportInput.Line line = input.nextLine();
            if (line == null) {
                return -1;
            }
            if (line.tooLong()) {
                record(line.number(), "", "the line is longer than " + properties.maxLineBytes() + " bytes");
                return 1;
            }
            int start = 0;
            int end = line.length();
            byte[] b = line.bytes();
            while (start < end && (b[start] == ' ' || b[start] == '\t')) {
                start++;
            }
            while (end > start && (b[end - 1] == ' ' || b[end - 1] == '\t')) {
                end--;
            }
            if (start == end) {
                return 0;
            }
            JsonNode node;
            try {
                node = mapper.readTree(b, start, end - start);
            } catch (JacksonException e) {
                record(line.number(), "", "malformed JSON: " + e.getOriginalMessage());
                return 1;
            }
            parse(line.number(), node);
            return 1;
        }

        /** Reads one CSV record; returns 1 for a record, 0 for a blank line, -1 at the end. */
        private int nextCsv() throws IOException {
            ImportInput.CsvRecord r = input.nextCsv(delimiter);
            if (r == null) {
                return -1;
            }
            if (r.problem() == null && r.fields().size() == 1 && r.fields().get(0).isBlank()) {
                return 0;
            }
            if (r.problem() != null) {
                record(r.number(), "", "malformed CSV: " + r.problem());
                return 1;
            }
            JsonNode node;
            try {
                node = csv.event(r.fields());
            } catch (EventParser.Rejected e) {
                record(r.number(), e.field, e.getMessage());
                return 1;
            }
            parse(r.number(), node);
            return 1;
        }

        private void parse(long line, JsonNode node) throws IOException {
            Event event;
            try {
                event = parser.parse(node);
            } catch (EventParser.Rejected e) {
                record(line, e.field, e.getMessage());
                return;
            }
            records++;
            accepted++;
            batch.add(event);
        }

        /** Counts a rejected record and appends it to the rejection file. */
        private void record(long line, String field, String message) throws IOException {
            records++;
            rejected++;
            ObjectNode r = mapper.createObjectNode();
            r.put("line", line);
            r.put("field", field);
            r.put("message", message);
            out.write(mapper.writeValueAsBytes(r));
            out.write('\n');
        }

        /** Writes the batch and the job's progress in one transaction; returns whether a cancel was requested. */
        private boolean commit() throws IOException {
            out.flush();
            long rejectionBytes = rejectionChannel.position();
            Instant now = clock.instant();
            Instant eta = estimate(now);
            Boolean cancel = tx.execute(status -> {
                batch.finish();
                return jobs.progress(job.siteId(), job.id(), input.position(), input.linesRead(), batch.stored(),
                        batch.duplicates(), rejected, rejectionBytes, eta, now);
            });
            EventsIngested ingested = batch.ingested();
            if (ingested != null) {
                events.publishEvent(ingested);
            }
            return Boolean.TRUE.equals(cancel);
        }

        /** Finish time at this run's byte rate so far; null until something was read. */
        private Instant estimate(Instant now) {
            long read = input.position() - startPosition;
            long nanos = System.nanoTime() - startNanos;
            if (read <= 0 || nanos <= 0) {
                return null;
            }
            long remaining = Math.max(0, job.bytesTotal() - input.position());
            return now.plus(Duration.ofNanos((long) ((double) remaining / read * nanos)));
        }
    }
}
