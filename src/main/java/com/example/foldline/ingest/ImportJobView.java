package com.example.foldline.ingest;

import java.time.Instant;

/**
 * An import job as the API shows it (docs/imports.md).
 *
 * @param state           queued, reading, done, failed or cancelled
 * @param file            the uploaded file's name, or the server path as given
 * @param progress        share of the file's bytes read and committed, 0 to 1
 * @param linesRead       physical lines read and committed (a CSV header counts)
 * @param stored          events newly stored
 * @param duplicates      valid events already stored (a re-run of a file stores nothing new)
 * @param rejected        lines refused; each is listed in the rejection file
 * @param estimatedFinish while reading: when the job should end at its byte rate so far
 * @param rejections      where to download the rejection file (NDJSON, or CSV with {@code ?format=csv})
 */
record ImportJobView(long id, long siteId, String state, String format, String origin, String file, String createdBy,
                     long bytesTotal, long bytesRead, double progress, long linesRead, long stored, long duplicates,
                     long rejected, boolean cancelRequested, String message, Instant createdAt, Instant startedAt,
                     Instant finishedAt, Instant estimatedFinish, String rejections) {

    static ImportJobView of(ImportJob j) {
        double progress;
        if (j.state().equals(ImportJob.DONE)) {
            progress = 1;
        } else if (j.bytesTotal() <= 0) {
            progress = 0;
        } else {
            progress = Math.min(1, Math.max(0, (double) j.bytesRead() / j.bytesTotal()));
        }
        return new ImportJobView(j.id(), j.siteId(), j.state(), j.format(), j.origin(), j.fileName(), j.createdBy(),
                j.bytesTotal(), j.bytesRead(), progress, j.linesRead(), j.stored(), j.duplicates(), j.rejected(),
                j.cancelRequested(), j.message(), j.createdAt(), j.startedAt(), j.finishedAt(),
                j.state().equals(ImportJob.READING) ? j.estimatedFinish() : null,
                "/api/v1/sites/" + j.siteId() + "/imports/" + j.id() + "/rejections");
    }
}
