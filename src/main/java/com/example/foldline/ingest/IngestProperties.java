package com.example.foldline.ingest;

import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Ingest limits.
 *
 * @param maxBodyBytes          largest request body accepted (413 above it)
 * @param maxConcurrentRequests requests written at once; more wait briefly, then get 503 with Retry-After
 * @param batchSize             rows per JDBC batch
 */
@ConfigurationProperties("foldline.ingest")
record IngestProperties(long maxBodyBytes, int maxConcurrentRequests, int batchSize) {

    IngestProperties {
        if (maxBodyBytes <= 0) {
            throw new IllegalArgumentException("foldline.ingest.max-body-bytes must be positive, got " + maxBodyBytes);
        }
        if (maxConcurrentRequests <= 0) {
            throw new IllegalArgumentException(
                    "foldline.ingest.max-concurrent-requests must be positive, got " + maxConcurrentRequests);
        }
        if (batchSize <= 0) {
            throw new IllegalArgumentException("foldline.ingest.batch-size must be positive, got " + batchSize);
        }
    }
}
