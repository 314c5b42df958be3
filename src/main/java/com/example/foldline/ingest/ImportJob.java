package com.example.foldline.ingest;

import java.time.Instant;

/**
 * One import job as stored (table import_job). States, in our own words: {@code queued} (waiting for a worker),
 * {@code reading} (lines are being read and committed), then {@code done}, {@code failed} or {@code cancelled}.
 *
 * @param origin         {@code upload} (a spooled copy, deleted when the job ends) or {@code server} (a file under
 *                       the allowed directory, never deleted)
 * @param bytesRead      byte offset after the last committed line: the job resumes there after a stop
 * @param rejectionBytes length of the rejection file at the last commit
 */
record ImportJob(long id, long siteId, String state, String format, String origin, String fileName,
                 String sourcePath, String mapping, String createdBy, long bytesTotal, long bytesRead, long linesRead,
                 long stored, long duplicates, long rejected, long rejectionBytes, boolean cancelRequested,
                 String message, Instant createdAt, Instant startedAt, Instant finishedAt, Instant estimatedFinish) {

    static final String QUEUED = "queued";
    static final String READING = "reading";
    static final String DONE = "done";
    static final String FAILED = "failed";
    static final String CANCELLED = "cancelled";

    boolean finished() {
        return state.equals(DONE) || state.equals(FAILED) || state.equals(CANCELLED);
    }
}
