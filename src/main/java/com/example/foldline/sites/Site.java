package com.example.foldline.sites;

import java.time.Instant;
import java.time.ZoneId;

/**
 * A publisher's site: where its day begins (IANA time zone), what money it earns in (ISO 4217), and its session and
 * retention settings.
 *
 * @param engagedSeconds when set, a one-page session with at least this much engaged time is not a bounce
 */
public record Site(long id, String name, String domain, ZoneId timezone, String currency,
                   int sessionTimeoutMinutes, Integer engagedSeconds, int retentionDays, Instant createdAt) {
}
