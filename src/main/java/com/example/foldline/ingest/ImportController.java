package com.example.foldline.ingest;

import java.io.BufferedReader;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.security.Principal;
import java.util.List;
import java.util.Locale;

import org.springframework.http.HttpHeaders;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestHeader;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;
import org.springframework.web.multipart.MultipartFile;
import org.springframework.web.servlet.mvc.method.annotation.StreamingResponseBody;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/** Bulk import jobs of a site (docs/imports.md). Reading needs viewer on the site, starting and cancelling editor. */
@RestController
@RequestMapping("/api/v1/sites/{siteId}/imports")
@Tag(name = "Imports", description = "Bulk backfill from NDJSON or CSV files, run in the background")
class ImportController {

    static final MediaType NDJSON = MediaType.parseMediaType("application/x-ndjson");
    static final MediaType CSV = MediaType.parseMediaType("text/csv;charset=UTF-8");

    private final Sites sites;
    private final ImportJobs imports;
    private final ObjectMapper mapper;

    ImportController(Sites sites, ImportJobs imports, ObjectMapper mapper) {
        this.sites = sites;
        this.imports = imports;
        this.mapper = mapper;
    }

    /** Body of an import of a file on the server. */
    record ServerFileImport(String path, String format, JsonNode mapping) {
    }

    @PostMapping(consumes = MediaType.MULTIPART_FORM_DATA_VALUE)
    @Operation(summary = "Upload a file and import it in the background",
            description = "Parts: file (NDJSON events or CSV), format (ndjson or csv; guessed from the name when "
                    + "absent), mapping (CSV only: JSON {type, columns: {eventField: csvColumn}, delimiter}). "
                    + "Answers 202 with the job.")
    ResponseEntity<ImportJobView> upload(@PathVariable long siteId, @RequestParam("file") MultipartFile file,
                                         @RequestParam(required = false) String format,
                                         @RequestParam(required = false) String mapping, Principal user) {
        Site site = sites.require(siteId);
        return accepted(imports.startUpload(site, file, format, mapping, name(user)));
    }

    @PostMapping(consumes = MediaType.APPLICATION_JSON_VALUE)
    @Operation(summary = "Import a file from the server's allowed import directory in the background",
            description = "Body: {path, format, mapping}. The path is read inside foldline.imports.allowed-dir "
                    + "(relative paths against it); anything outside it is refused. Answers 202 with the job.")
    ResponseEntity<ImportJobView> serverFile(@PathVariable long siteId, @RequestBody ServerFileImport body,
                                             Principal user) {
        Site site = sites.require(siteId);
        return accepted(imports.startServerFile(site, body.path(), body.format(), body.mapping(), name(user)));
    }

    @GetMapping
    @Operation(summary = "The site's import jobs, newest first (at most 100)")
    List<ImportJobView> list(@PathVariable long siteId) {
        return imports.list(sites.require(siteId)).stream().map(ImportJobView::of).toList();
    }

    @GetMapping("/{jobId}")
    @Operation(summary = "One import job: state, progress, counts, estimated finish")
    ImportJobView get(@PathVariable long siteId, @PathVariable long jobId) {
        return ImportJobView.of(imports.require(sites.require(siteId), jobId));
    }

    @PostMapping("/{jobId}/cancel")
    @Operation(summary = "Cancel an import job",
            description = "A queued job is cancelled at once; a running one stops at its next line, keeping what it "
                    + "stored. 409 when the job had already finished.")
    ResponseEntity<?> cancel(@PathVariable long siteId, @PathVariable long jobId) {
        Site site = sites.require(siteId);
        return imports.cancel(site, jobId).<ResponseEntity<?>>map(j -> ResponseEntity.ok(ImportJobView.of(j)))
                .orElseGet(() -> ResponseEntity.status(HttpStatus.CONFLICT).body(ProblemDetail.forStatusAndDetail(
                        HttpStatus.CONFLICT, "import job " + jobId + " has already finished")));
    }

    @GetMapping("/{jobId}/rejections")
    @Operation(summary = "The rejected lines of an import job: line, field, message",
            description = "NDJSON by default; CSV with ?format=csv or Accept: text/csv. Lists the lines committed "
                    + "so far while the job runs.")
    ResponseEntity<StreamingResponseBody> rejections(@PathVariable long siteId, @PathVariable long jobId,
                                                     @RequestParam(required = false) String format,
                                                     @RequestHeader(value = HttpHeaders.ACCEPT, required = false)
                                                     String accept) {
        ImportJobs.Rejections r = imports.rejections(sites.require(siteId), jobId);
        boolean csv = format != null ? format.equalsIgnoreCase("csv")
                : accept != null && accept.toLowerCase(Locale.ROOT).contains("text/csv");
        String name = "import-" + jobId + "-rejections." + (csv ? "csv" : "ndjson");
        StreamingResponseBody body = out -> {
            if (r.length() <= 0 || !Files.exists(r.file())) {
                if (csv) {
                    out.write("line,field,message\n".getBytes(StandardCharsets.UTF_8));
                }
                return;
            }
            try (InputStream in = new LimitedRead(Files.newInputStream(r.file()), r.length())) {
                if (csv) {
                    toCsv(in, new BufferedWriter(new OutputStreamWriter(out, StandardCharsets.UTF_8)));
                } else {
                    in.transferTo(out);
                }
            }
        };
        return ResponseEntity.ok().contentType(csv ? CSV : NDJSON)
                .header(HttpHeaders.CONTENT_DISPOSITION, "attachment; filename=\"" + name + "\"").body(body);
    }

    private void toCsv(InputStream in, Writer out) throws IOException {
        out.write("line,field,message\n");
        BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
        String line;
        while ((line = reader.readLine()) != null) {
            if (line.isBlank()) {
                continue;
            }
            JsonNode r = mapper.readTree(line);
            out.write(r.get("line").asLong() + "," + quote(r.get("field").asString()) + ","
                    + quote(r.get("message").asString()) + "\n");
        }
        out.flush();
    }

    /** RFC 4180 quoting: in double quotes, a quote doubled. */
    static String quote(String s) {
        return "\"" + s.replace("\"", "\"\"") + "\"";
    }

    private static ResponseEntity<ImportJobView> accepted(ImportJob job) {
        return ResponseEntity.accepted().location(URI.create("/api/v1/sites/" + job.siteId() + "/imports/" + job.id()))
                .body(ImportJobView.of(job));
    }

    private static String name(Principal user) {
        return user == null ? null : user.getName();
    }

    /** Reads at most {@code limit} bytes: the committed part of a rejection file that may still grow. */
    private static final class LimitedRead extends java.io.FilterInputStream {
        private long left;

        LimitedRead(InputStream in, long limit) {
            super(in);
            this.left = limit;
        }

        @Override
        public int read() throws IOException {
            if (left <= 0) {
                return -1;
            }
            int b = super.read();
            if (b >= 0) {
                left--;
            }
            return b;
        }

        @Override
        public int read(byte[] b, int off, int len) throws IOException {
            if (left <= 0) {
                return -1;
            }
            int n = super.read(b, off, (int) Math.min(len, left));
            if (n > 0) {
                left -= n;
            }
            return n;
        }
    }
}
