package com.example.foldline.annotations;

import java.time.Instant;
import java.time.LocalDate;

/**
 * A dated note on a site's timeline, such as "new sidebar ad", shown as a marker on the health time series.
 *
 * @param date      the day it refers to, in the site's time zone
 * @param text      the note, at most {@value AnnotationController#MAX_TEXT} characters, shown as plain text
 * @param createdBy the user who wrote it
 */
record Annotation(long id, long siteId, LocalDate date, String text, String createdBy, Instant createdAt) {
}
