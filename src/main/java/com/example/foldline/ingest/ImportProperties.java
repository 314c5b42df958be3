package com.example.foldline.ingest;

import java.nio.file.Path;
import java.time.Duration;

import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Bulk import settings (docs/imports.md).
 *
 * @param allowedDir     directory on the server whose files an import may name by path; empty switches the option off
 * @param spoolDir       where uploaded files wait for processing, and where rejection files are kept
 * @param linesPerCommit lines read per transaction
 * @param commitInterval longest time between commits, so progress shows on slow sources
 * @param workers        import jobs processed at once (never two of one site)
 * @param maxLineBytes   a longer line is rejected without being held in memory
 */
@ConfigurationProperties("foldline.imports")
record ImportProperties(String allowedDir, Path spoolDir, int linesPerCommit, Duration commitInterval, int workers,
                        int maxLineBytes) {

    ImportProperties {
        if (spoolDir == null) {
            throw new IllegalArgumentException("foldline.imports.spool-dir must be set");
        }
        if (linesPerCommit <= 0) {
            throw new IllegalArgumentException("foldline.imports.lines-per-commit must be positive, got "
                    + linesPerCommit);
        }
        if (commitInterval == null || commitInterval.isNegative() || commitInterval.isZero()) {
            throw new IllegalArgumentException("foldline.imports.commit-interval must be positive, got "
                    + commitInterval);
        }
        if (workers <= 0) {
            throw new IllegalArgumentException("foldline.imports.workers must be positive, got " + workers);
        }
        if (maxLineBytes < 1024) {
            throw new IllegalArgumentException("foldline.imports.max-line-bytes must be at least 1024, got "
                    + maxLineBytes);
        }
        allowedDir = allowedDir == null ? "" : allowedDir.strip();
    }
}
