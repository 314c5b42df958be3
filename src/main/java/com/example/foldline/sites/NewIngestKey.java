package com.example.foldline.sites;

import java.time.Instant;

/** A freshly created ingest key, the only time the secret {@code key} is available. */
public record NewIngestKey(long id, long siteId, String key, String prefix, String label, Instant createdAt) {
}
