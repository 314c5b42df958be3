package com.example.foldline.ingest;

import java.util.List;

/**
 * The answer to an ingest request.
 *
 * @param accepted      events newly stored
 * @param duplicates    events whose id was already stored for the site (not stored again)
 * @param rejected      refused events with line (1-based; element number for a JSON array), field and reason;
 *                      at most {@link #MAX_LISTED} are listed
 * @param rejectedCount all refused events, listed or not
 */
public record IngestResult(long accepted, long duplicates, List<Rejection> rejected, long rejectedCount) {

    public static final int MAX_LISTED = 1000;

    /** One refused event. */
    public record Rejection(long line, String field, String message) {
    }
}
