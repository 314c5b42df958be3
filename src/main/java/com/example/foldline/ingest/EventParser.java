package com.example.foldline.ingest;

import java.time.DateTimeException;
import java.time.Duration;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Pattern;

import com.example.foldline.privacy.VisitorPseudonyms;
import com.example.foldline.sites.Site;

import tools.jackson.databind.JsonNode;

/**
 * Validates one JSON event against the event model (docs/events.md) and turns it into an {@link Event}.
 * A bad event raises {@link Rejected} naming the first bad field and the reason. Unknown fields are ignored.
 */
final class EventParser {

    static final Duration MAX_FUTURE = Duration.ofMinutes(10);
    private static final Set<String> COUNTRIES = Set.of(Locale.getISOCountries());
    private static final Pattern REGION = Pattern.compile("[A-Z]{2}-[A-Z0-9]{1,3}");
    private static final Pattern SIZE = Pattern.compile("[0-9]{1,5}x[0-9]{1,5}");

    private final Site site;
    private final Instant now;
    private final Instant oldest;
    private final VisitorPseudonyms pseudonyms;

    EventParser(Site site, Instant now, VisitorPseudonyms pseudonyms) {
        this.site = site;
        this.now = now;
        this.oldest = now.minus(Duration.ofDays(site.retentionDays()));
        this.pseudonyms = pseudonyms;
    }

    /** A refused event: the field and the reason. */
    static final class Rejected extends RuntimeException {
        final String field;

        Rejected(String field, String message) {
            super(message, null, false, false);
            this.field = field;
        }
    }

    Event parse(JsonNode node) {
        if (node == null || !node.isObject()) {
            throw new Rejected("", "each event must be a JSON object");
        }
        String type = text(node, "type", 20, true);
        return switch (type) {
            case "pageview" -> pageview(node);
            case "pageend" -> pageEnd(node);
            case "impression" -> impression(node);
            case "session" -> session(node);
            default -> throw new Rejected("type", "unknown event type '" + type
                    + "' (expected pageview, pageend, impression or session)");
        };
    }

    private Event.Pageview pageview(JsonNode n) {
        String id = text(n, "id", 64, true);
        Instant ts = timestamp(n, "ts");
        String visitor = text(n, "visitor", 128, true);
        String session = text(n, "session", 64, false);
        String path = text(n, "path", 2048, true);
        String referrer = text(n, "referrer", 2048, false);
        int ads = (int) integer(n, "ads", 0, 100, true, 0);
        Long engaged = n.has("engagedMs") && !n.get("engagedMs").isNull()
                ? integer(n, "engagedMs", 0, Duration.ofHours(24).toMillis(), true, 0) : null;
        return new Event.Pageview(id, ts, pseudonyms.of(site.id(), visitor), session, path, referrer,
                segment(n, path, referrer), ads, engaged);
    }

    private Event.PageEnd pageEnd(JsonNode n) {
        String pageview = text(n, "pageview", 64, true);
        long engaged = integer(n, "engagedMs", 0, Duration.ofHours(24).toMillis(), true, 0);
        Integer scroll = n.has("scrollPct") && !n.get("scrollPct").isNull()
                ? (int) integer(n, "scrollPct", 0, 100, true, 0) : null;
        return new Event.PageEnd(pageview, engaged, scroll);
    }

    private Event.Impression impression(JsonNode n) {
        String id = text(n, "id", 64, true);
        String pageview = text(n, "pageview", 64, true);
        String slot = text(n, "slot", 64, false);
        String size = text(n, "size", 11, false);
        if (size != null && !SIZE.matcher(size).matches()) {
            throw new Rejected("size", "must be WIDTHxHEIGHT in pixels such as 300x250, got '" + size + "'");
        }
        boolean viewable = bool(n, "viewable");
        boolean clicked = bool(n, "clicked");
        long revenue = integer(n, "revenueMicros", 0, Long.MAX_VALUE, false, 0);
        Long cpm = n.has("cpmMicros") && !n.get("cpmMicros").isNull()
                ? integer(n, "cpmMicros", 0, Long.MAX_VALUE, true, 0) : null;
        return new Event.Impression(id, pageview, slot, size, viewable, clicked, revenue, cpm);
    }

    private Event.Session session(JsonNode n) {
        String id = text(n, "id", 64, true);
        String visitor = text(n, "visitor", 128, true);
        String clientSession = text(n, "session", 64, false);
        Instant start = timestamp(n, "start");
        Instant end = timestamp(n, "end");
        if (end.isBefore(start)) {
            throw new Rejected("end", "must not be before start");
        }
        int pageviews = (int) integer(n, "pageviews", 1, 100_000, true, 0);
        Boolean bounce = n.has("bounce") && !n.get("bounce").isNull() ? bool(n, "bounce") : null;
        if (Boolean.TRUE.equals(bounce) && pageviews > 1) {
            throw new Rejected("bounce", "a session with " + pageviews + " pageviews cannot be a bounce");
        }
        long engaged = integer(n, "engagedMs", 0, Duration.ofDays(1).toMillis(), false, 0);
        String entryPath = text(n, "entryPath", 2048, true);
        int entryAds = (int) integer(n, "entryAds", 0, 100, true, 0);
        Double laterAds = null;
        if (n.has("laterAds") && !n.get("laterAds").isNull()) {
            JsonNode v = n.get("laterAds");
            if (!v.isNumber() || v.asDouble() < 0 || v.asDouble() > 100 || !Double.isFinite(v.asDouble())) {
                throw new Rejected("laterAds", "must be a number from 0 to 100 (mean ads on later pages)");
            }
            laterAds = pageviews > 1 ? v.asDouble() : null;
        }
        long revenue = integer(n, "revenueMicros", 0, Long.MAX_VALUE, false, 0);
        int impressions = (int) integer(n, "impressions", 0, 10_000_000, false, 0);
        int viewable = (int) integer(n, "viewableImpressions", 0, 10_000_000, false, 0);
        if (viewable > impressions) {
            throw new Rejected("viewableImpressions", "must not exceed impressions (" + impressions + ")");
        }
        int clicks = (int) integer(n, "clicks", 0, 10_000_000, false, 0);
        String referrer = text(n, "referrer", 2048, false);
        return new Event.Session(id, pseudonyms.of(site.id(), visitor), clientSession, start, end, pageviews, bounce,
                engaged, entryPath, entryAds, laterAds, segment(n, entryPath, referrer), revenue, impressions, viewable,
                clicks);
    }

    private Event.Segment segment(JsonNode n, String path, String referrer) {
        String source = text(n, "source", 16, false);
        if (source == null) {
            source = Traffic.source(path, referrer);
        } else if (!Traffic.SOURCES.contains(source)) {
            throw new Rejected("source", "must be one of " + String.join(", ", Traffic.SOURCES.stream().sorted().toList())
                    + ", got '" + source + "'");
        }
        String device = text(n, "device", 16, false);
        if (device == null) {
            device = Traffic.device(text(n, "userAgent", 1024, false));
        } else if (!Traffic.DEVICES.contains(device)) {
            throw new Rejected("device", "must be one of desktop, phone, tablet, other, got '" + device + "'");
        }
        String browser = text(n, "browser", 64, false);
        String os = text(n, "os", 64, false);
        String country = text(n, "country", 2, false, "an ISO 3166-1 alpha-2 code such as PT");
        if (country != null) {
            country = country.toUpperCase(Locale.ROOT);
            if (!COUNTRIES.contains(country)) {
                throw new Rejected("country", "'" + country + "' is not an ISO 3166-1 alpha-2 country code");
            }
        }
        String region = text(n, "region", 6, false, "an ISO 3166-2 code such as PT-11");
        if (region != null) {
            region = region.toUpperCase(Locale.ROOT);
            if (!REGION.matcher(region).matches()) {
                throw new Rejected("region", "'" + region + "' is not an ISO 3166-2 subdivision code such as PT-11");
            }
            if (country != null && !region.startsWith(country + "-")) {
                throw new Rejected("region", "'" + region + "' is not in country " + country);
            }
            if (country == null) {
                country = region.substring(0, 2);
                if (!COUNTRIES.contains(country)) {
                    throw new Rejected("region", "'" + region + "' does not start with an ISO 3166-1 country code");
                }
            }
        }
        String variant = text(n, "variant", 64, false);
        return new Event.Segment(source, device, browser, os, country, region, variant);
    }

    private Instant timestamp(JsonNode n, String field) {
        JsonNode v = n.get(field);
        if (v == null || v.isNull()) {
            throw new Rejected(field, "is required");
        }
        Instant ts;
        if (v.isIntegralNumber()) {
            ts = Instant.ofEpochMilli(v.asLong());
        } else if (v.isString()) {
            try {
                ts = OffsetDateTime.parse(v.stringValue()).toInstant();
            } catch (DateTimeException e) {
                throw new Rejected(field, "must be ISO-8601 with an offset (2026-03-01T09:30:00+01:00) or epoch "
                        + "milliseconds, got '" + v.stringValue() + "'");
            }
        } else {
            throw new Rejected(field, "must be an ISO-8601 string with offset or epoch milliseconds");
        }
        if (ts.isAfter(now.plus(MAX_FUTURE))) {
            throw new Rejected(field, "is more than 10 minutes in the future");
        }
        if (ts.isBefore(oldest)) {
            throw new Rejected(field, "is older than the site's retention of " + site.retentionDays() + " days");
        }
        return ts;
    }

    private static String text(JsonNode n, String field, int maxLength, boolean required) {
        return text(n, field, maxLength, required, null);
    }

    private static String text(JsonNode n, String field, int maxLength, boolean required, String expected) {
        JsonNode v = n.get(field);
        if (v == null || v.isNull()) {
            if (required) {
                throw new Rejected(field, "is required");
            }
            return null;
        }
        if (!v.isString()) {
            throw new Rejected(field, "must be a string");
        }
        String s = v.stringValue();
        if (s.isEmpty()) {
            if (required) {
                throw new Rejected(field, "must not be empty");
            }
            return null;
        }
        if (s.length() > maxLength) {
            throw new Rejected(field, expected != null ? "must be " + expected
                    : "must be at most " + maxLength + " characters, got " + s.length());
        }
        return s;
    }

    private static long integer(JsonNode n, String field, long min, long max, boolean required, long fallback) {
        JsonNode v = n.get(field);
        if (v == null || v.isNull()) {
            if (required) {
                throw new Rejected(field, "is required");
            }
            return fallback;
        }
        if (!v.isIntegralNumber() || !v.canConvertToLong()) {
            throw new Rejected(field, "must be an integer, got " + v);
        }
        long value = v.asLong();
        if (value < min || value > max) {
            throw new Rejected(field, max == Long.MAX_VALUE ? "must not be negative, got " + value
                    : "must be from " + min + " to " + max + ", got " + value);
        }
        return value;
    }

    private static boolean bool(JsonNode n, String field) {
        JsonNode v = n.get(field);
        if (v == null || v.isNull()) {
            return false;
        }
        if (!v.isBoolean()) {
            throw new Rejected(field, "must be true or false, got " + v);
        }
        return v.asBoolean();
    }
}
