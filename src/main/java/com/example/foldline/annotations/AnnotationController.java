package com.example.foldline.annotations;

import java.security.Principal;
import java.time.Clock;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;

import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.sites.Sites;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;
import com.example.foldline.system.NotFoundException;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;

@RestController
@RequestMapping("/api/v1/sites/{siteId}/annotations")
@Tag(name = "Annotations", description = "Dated notes shown as markers on a site's time series")
class AnnotationController {

    static final int MAX_TEXT = 200;

    private final Sites sites;
    private final AnnotationRepository annotations;
    private final Clock clock;

    AnnotationController(Sites sites, AnnotationRepository annotations, Clock clock) {
        this.sites = sites;
        this.annotations = annotations;
        this.clock = clock;
    }

    @GetMapping
    @Operation(summary = "The site's annotations, by date", description = "from and to (YYYY-MM-DD) narrow the range")
    List<Annotation> list(@PathVariable long siteId, @RequestParam(required = false) String from,
                          @RequestParam(required = false) String to) {
        sites.require(siteId);
        List<FieldError> errors = new ArrayList<>();
        LocalDate start = date("from", from, LocalDate.of(1970, 1, 1), errors);
        LocalDate end = date("to", to, LocalDate.of(9999, 12, 31), errors);
        if (errors.isEmpty() && start.isAfter(end)) {
            errors.add(new FieldError("from", "must not be after to (" + end + ")"));
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return annotations.findBetween(siteId, start, end);
    }

    @PostMapping
    @Operation(summary = "Add an annotation", description = "date as YYYY-MM-DD in the site's time zone; text of 1 to "
            + MAX_TEXT + " characters")
    ResponseEntity<Annotation> create(@PathVariable long siteId, @RequestBody(required = false) NewAnnotation body,
                                      Principal principal) {
        sites.require(siteId);
        List<FieldError> errors = new ArrayList<>();
        LocalDate date = body == null || body.date() == null || body.date().isBlank() ? null
                : date("date", body.date(), null, errors);
        if (date == null && errors.isEmpty()) {
            errors.add(new FieldError("date", "is required, as YYYY-MM-DD"));
        }
        String text = body == null || body.text() == null ? "" : body.text().strip();
        if (text.isEmpty()) {
            errors.add(new FieldError("text", "is required"));
        } else if (text.length() > MAX_TEXT) {
            errors.add(new FieldError("text", "must be at most " + MAX_TEXT + " characters, got " + text.length()));
        }
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        long id = annotations.insert(siteId, date, text, principal == null ? null : principal.getName(),
                clock.instant());
        return ResponseEntity.status(HttpStatus.CREATED).body(annotations.find(siteId, id).orElseThrow());
    }

    @DeleteMapping("/{id}")
    @Operation(summary = "Delete an annotation")
    ResponseEntity<Void> delete(@PathVariable long siteId, @PathVariable long id) {
        sites.require(siteId);
        if (!annotations.delete(siteId, id)) {
            throw new NotFoundException("site " + siteId + " has no annotation " + id);
        }
        return ResponseEntity.noContent().build();
    }

    private static LocalDate date(String field, String value, LocalDate fallback, List<FieldError> errors) {
        if (value == null || value.isBlank()) {
            return fallback;
        }
        try {
            return LocalDate.parse(value.strip());
        } catch (DateTimeParseException e) {
            errors.add(new FieldError(field, "must be a date as YYYY-MM-DD, got '" + value + "'"));
            return fallback;
        }
    }

    /** The body of a new annotation; the date is a string so that a malformed one is reported by field name. */
    record NewAnnotation(String date, String text) {
    }
}
