package com.example.foldline.ingest;

import java.net.URI;
import java.util.Locale;
import java.util.Set;

/**
 * Derives a pageview's traffic source from its referrer and landing path, and its device class from a user agent,
 * when the client did not send them. Rules are generic (no list of named products); see docs/events.md.
 */
final class Traffic {

    static final Set<String> SOURCES = Set.of("search", "social", "direct", "referral", "email", "paid", "other");
    static final Set<String> DEVICES = Set.of("desktop", "phone", "tablet", "other");

    private Traffic() {
    }

    /**
     * Campaign tags on the landing path win (utm_medium, the common convention); then the referrer: none → direct,
     * a host or path that says "search" → search, a host that says "social" → social, anything else → referral.
     */
    static String source(String path, String referrer) {
        String medium = queryParameter(path, "utm_medium");
        if (medium != null) {
            String m = medium.toLowerCase(Locale.ROOT);
            if (m.equals("email") || m.equals("newsletter")) {
                return "email";
            }
            if (m.equals("cpc") || m.equals("ppc") || m.equals("paid") || m.startsWith("paid")) {
                return "paid";
            }
            if (m.contains("social")) {
                return "social";
            }
        }
        if (referrer == null || referrer.isBlank()) {
            return "direct";
        }
        String host;
        String refPath;
        try {
            URI uri = URI.create(referrer.strip());
            host = uri.getHost() == null ? "" : uri.getHost().toLowerCase(Locale.ROOT);
            refPath = uri.getPath() == null ? "" : uri.getPath().toLowerCase(Locale.ROOT);
        } catch (IllegalArgumentException e) {
            return "other";
        }
        if (host.isEmpty()) {
            return "other";
        }
        if (host.contains("search") || refPath.startsWith("/search")) {
            return "search";
        }
        if (host.contains("social")) {
            return "social";
        }
        if (host.startsWith("mail.") || host.contains("webmail")) {
            return "email";
        }
        return "referral";
    }

    /** "Mobi" in a user agent marks a phone (the convention browser makers document); "Tablet" a tablet. */
    static String device(String userAgent) {
        if (userAgent == null || userAgent.isBlank()) {
            return "other";
        }
        String ua = userAgent.toLowerCase(Locale.ROOT);
        if (ua.contains("tablet")) {
            return "tablet";
        }
        if (ua.contains("mobi")) {
            return "phone";
        }
        if (ua.contains("bot") || ua.contains("crawl") || ua.contains("spider")) {
            return "other";
        }
        return "desktop";
    }

    private static String queryParameter(String path, String name) {
        int q = path.indexOf('?');
        if (q < 0) {
            return null;
        }
        for (String pair : path.substring(q + 1).split("&")) {
            int eq = pair.indexOf('=');
            if (eq > 0 && pair.substring(0, eq).equals(name)) {
                return pair.substring(eq + 1);
            }
        }
        return null;
    }
}
