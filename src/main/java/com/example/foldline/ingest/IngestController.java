package com.example.foldline.ingest;

import java.io.IOException;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.concurrent.Semaphore;
import java.util.concurrent.TimeUnit;

import org.springframework.http.HttpHeaders;
import org.springframework.http.HttpStatus;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import jakarta.servlet.http.HttpServletRequest;

@RestController
@Tag(name = "Ingest", description = "Pageview, page-end, impression and session events")
class IngestController {

    private final Sites sites;
    private final IngestService ingest;
    private final IngestProperties properties;
    private final Semaphore writers;

    IngestController(Sites sites, IngestService ingest, IngestProperties properties) {
        this.sites = sites;
        this.ingest = ingest;
        this.properties = properties;
        this.writers = new Semaphore(properties.maxConcurrentRequests(), true);
    }

    @PostMapping("/api/v1/sites/{siteId}/events")
    @Operation(summary = "Post events",
            description = "Body: NDJSON (application/x-ndjson; text/plain is read as NDJSON for navigator.sendBeacon) "
                    + "or a JSON array (application/json). Authorization: Bearer <ingest key>, or ?key= for beacons. "
                    + "Answers {accepted, duplicates, rejected:[{line, field, message}], rejectedCount}.")
    ResponseEntity<?> post(@PathVariable String siteId, HttpServletRequest request) throws IOException {
        Optional<Site> site = authenticate(siteId, request);
        if (site.isEmpty()) {
            return problem(HttpStatus.UNAUTHORIZED, "missing, wrong or revoked ingest key, or unknown site");
        }
        IngestService.Format format = format(request.getContentType());
        if (format == null) {
            return problem(HttpStatus.UNSUPPORTED_MEDIA_TYPE, "Content-Type must be application/x-ndjson, "
                    + "application/json or text/plain (NDJSON), got " + request.getContentType());
        }
        long length = request.getContentLengthLong();
        if (length > properties.maxBodyBytes()) {
            return tooLarge();
        }
        boolean acquired;
        try {
            acquired = writers.tryAcquire(2, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            acquired = false;
        }
        if (!acquired) {
            return ResponseEntity.status(HttpStatus.SERVICE_UNAVAILABLE).header(HttpHeaders.RETRY_AFTER, "2")
                    .body(ProblemDetail.forStatusAndDetail(HttpStatus.SERVICE_UNAVAILABLE,
                            "the write path is saturated; retry after 2 seconds"));
        }
        try {
            return ResponseEntity.ok(ingest.ingest(site.get(), request.getInputStream(), format,
                    properties.maxBodyBytes()));
        } finally {
            writers.release();
        }
    }

    @ExceptionHandler(BodyTooLargeException.class)
    ResponseEntity<ProblemDetail> bodyTooLarge() {
        return tooLarge();
    }

    private ResponseEntity<ProblemDetail> tooLarge() {
        return problem(HttpStatus.CONTENT_TOO_LARGE, "request body is larger than the maximum of "
                + properties.maxBodyBytes() + " bytes; nothing was stored, split it into smaller batches");
    }

    private Optional<Site> authenticate(String siteId, HttpServletRequest request) {
        long id;
        try {
            id = Long.parseLong(siteId);
        } catch (NumberFormatException e) {
            return Optional.empty();
        }
        String key = null;
        String header = request.getHeader(HttpHeaders.AUTHORIZATION);
        if (header != null && header.regionMatches(true, 0, "Bearer ", 0, 7)) {
            key = header.substring(7).strip();
        } else if (header == null) {
            key = request.getParameter("key");
        }
        if (key == null || !sites.acceptsIngestKey(id, key)) {
            return Optional.empty();
        }
        return sites.find(id);
    }

    static IngestService.Format format(String contentType) {
        if (contentType == null) {
            return null;
        }
        String type = contentType.split(";", 2)[0].strip().toLowerCase(Locale.ROOT);
        return switch (type) {
            case "application/x-ndjson", "application/ndjson", "text/plain" -> IngestService.Format.NDJSON;
            case "application/json" -> IngestService.Format.JSON_ARRAY;
            default -> null;
        };
    }

    private static <T> ResponseEntity<T> problem(HttpStatus status, String detail) {
        @SuppressWarnings("unchecked")
        T body = (T) ProblemDetail.forStatusAndDetail(status, detail);
        return ResponseEntity.status(status).body(body);
    }

    static List<String> acceptedTypes() {
        return List.of("application/x-ndjson", "application/json", "text/plain");
    }
}
