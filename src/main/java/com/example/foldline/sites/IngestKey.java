package com.example.foldline.sites;

import java.time.Instant;

/** An ingest key's public facts; the key itself is shown once at creation and stored only as a SHA-256 hash. */
public record IngestKey(long id, long siteId, String prefix, String label, Instant createdAt, Instant revokedAt) {
}
