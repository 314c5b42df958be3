package com.example.foldline.ingest;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

import org.springframework.stereotype.Service;
import org.springframework.web.multipart.MultipartFile;

import com.example.foldline.sites.Site;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.NotFoundException;

import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Starts, lists and cancels a site's import jobs (docs/imports.md). Starting one checks everything that can be checked
 * before the background work: the format, the CSV mapping against the file's header, and a server path against the
 * allowed directory; an uploaded file is first spooled to disk, never held in memory.
 */
@Service
class ImportJobs {

    static final int LIST_LIMIT = 100;

    private final ImportJobRepository jobs;
    private final ImportFiles files;
    private final ImportWorker worker;
    private final ImportProperties properties;
    private final ObjectMapper mapper;
    private final Clock clock;

    ImportJobs(ImportJobRepository jobs, ImportFiles files, ImportWorker worker, ImportProperties properties,
               ObjectMapper mapper, Clock clock) {
        this.jobs = jobs;
        this.files = files;
        this.worker = worker;
        this.properties = properties;
        this.mapper = mapper;
        this.clock = clock;
    }

    /** Spools an uploaded file and queues its import. */
    ImportJob startUpload(Site site, MultipartFile file, String format, String mapping, String user) {
        if (file == null || file.isEmpty()) {
            throw new BadRequestException("file", "is required and must not be empty");
        }
        String name = displayName(file.getOriginalFilename());
        JsonNode mappingJson = null;
        if (mapping != null && !mapping.isBlank()) {
            try {
                mappingJson = mapper.readTree(mapping);
            } catch (JacksonException e) {
                throw new BadRequestException("mapping", "is not valid JSON: " + e.getOriginalMessage());
            }
        }
        String fmt = format(format, mappingJson, name);
        CsvMapping csv = fmt.equals("csv") ? CsvMapping.of(mappingJson) : null;
        Path spooled;
        try {
            spooled = files.newSpoolFile(fmt.equals("csv") ? ".csv" : ".ndjson");
            // an absolute target lets the servlet container move its own temporary file instead of copying it
            file.transferTo(spooled.toFile());
        } catch (IOException e) {
            throw new UncheckedIOException("could not spool the upload", e);
        }
        try {
            return queue(site, fmt, "upload", name, spooled, csv, user);
        } catch (RuntimeException e) {
            deleteQuietly(spooled);
            throw e;
        }
    }

    /** Queues the import of a file under the allowed directory. */
    ImportJob startServerFile(Site site, String path, String format, JsonNode mapping, String user) {
        Path file = files.allowedFile(path);
        String fmt = format(format, mapping, file.getFileName().toString());
        CsvMapping csv = fmt.equals("csv") ? CsvMapping.of(mapping) : null;
        return queue(site, fmt, "server", path, file, csv, user);
    }

    private ImportJob queue(Site site, String format, String origin, String name, Path file, CsvMapping csv,
                            String user) {
        if (csv != null) {
            checkHeader(file, csv);
        }
        long size;
        try {
            size = Files.size(file);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        long id = jobs.insert(new ImportJobRepository.NewJob(site.id(), format, origin, name, file.toString(),
                csv == null ? null : csv.toJson().toString(), user, size, clock.instant()));
        worker.dispatch();
        return require(site, id);
    }

    private void checkHeader(Path file, CsvMapping csv) {
        try (InputStream in = files.open(file, 0)) {
            ImportInput input = new ImportInput(in, 0, 0, properties.maxLineBytes());
            input.skipByteOrderMark();
            ImportInput.CsvRecord header = input.nextCsv(csv.delimiter());
            if (header == null || header.problem() != null) {
                throw new BadRequestException("file", header == null ? "the file is empty; a CSV import needs a "
                        + "header line" : "the header line is malformed: " + header.problem());
            }
            csv.bind(header.fields());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * The format: as requested, else CSV when a mapping was given or the file name ends in .csv or .tsv, else
     * NDJSON. NDJSON takes no mapping.
     */
    static String format(String requested, JsonNode mapping, String fileName) {
        boolean hasMapping = mapping != null && !mapping.isNull() && !mapping.isMissingNode();
        String f;
        if (requested != null && !requested.isBlank()) {
            f = requested.strip().toLowerCase(Locale.ROOT);
            if (!f.equals("csv") && !f.equals("ndjson")) {
                throw new BadRequestException("format", "must be ndjson or csv, got '" + requested + "'");
            }
        } else {
            String name = fileName.toLowerCase(Locale.ROOT);
            f = hasMapping || name.endsWith(".csv") || name.endsWith(".tsv") ? "csv" : "ndjson";
        }
        if (f.equals("ndjson") && hasMapping) {
            throw new BadRequestException("mapping", "only a CSV import takes a mapping; NDJSON lines are events");
        }
        return f;
    }

    List<ImportJob> list(Site site) {
        return jobs.list(site.id(), LIST_LIMIT);
    }

    ImportJob require(Site site, long jobId) {
        return jobs.find(site.id(), jobId)
                .orElseThrow(() -> new NotFoundException("no import job " + jobId + " on site " + site.id()));
    }

    /**
     * Cancels a job: a queued one at once, a running one at its next line (lines read until then stay stored).
     * Returns the job as it is now; empty when it had already finished.
     */
    Optional<ImportJob> cancel(Site site, long jobId) {
        if (require(site, jobId).finished()) {
            return Optional.empty();
        }
        if (!jobs.cancelQueued(site.id(), jobId, clock.instant())) {
            jobs.requestCancel(site.id(), jobId);
            worker.cancel(jobId);
        }
        return Optional.of(require(site, jobId));
    }

    /** The job's rejection file and how much of it is committed. */
    record Rejections(Path file, long length) {
    }

    Rejections rejections(Site site, long jobId) {
        ImportJob job = require(site, jobId);
        try {
            return new Rejections(files.rejectionFile(job.id()), job.rejectionBytes());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The last part of a client's file name, for display only (it never names a file on the server). */
    static String displayName(String original) {
        if (original == null) {
            return "upload";
        }
        String name = original.substring(Math.max(original.lastIndexOf('/'), original.lastIndexOf('\\')) + 1)
                .replaceAll("\\p{Cntrl}", "").strip();
        if (name.length() > 200) {
            name = name.substring(0, 200);
        }
        return name.isEmpty() ? "upload" : name;
    }

    private static void deleteQuietly(Path file) {
        try {
            Files.deleteIfExists(file);
        } catch (IOException ignored) {
            // a leftover spool file is harmless; the job was never queued
        }
    }
}
