package com.example.foldline.alerts;

import java.net.URLEncoder;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.StringJoiner;
import java.util.TreeMap;
import java.util.regex.Pattern;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.SegmentFilter;
import com.example.foldline.system.FieldError;

/**
 * The segment of a rule: per dimension of the metrics API (device, source, country, region, browser, variant) the
 * accepted values. Checked with the same rules as the metrics API's query parameters (docs/metrics.md), because a
 * rule's link opens the matching metrics view.
 */
final class SegmentSpec {

    static final Map<String, Dim> DIMENSIONS = Map.of("device", Dim.DEVICE, "source", Dim.SOURCE,
            "country", Dim.COUNTRY, "region", Dim.REGION, "browser", Dim.BROWSER, "variant", Dim.VARIANT);
    private static final Set<String> DEVICES = Set.of("desktop", "phone", "tablet", "other");
    private static final Set<String> SOURCES = Set.of("search", "social", "direct", "referral", "email", "paid", "other");
    private static final Set<String> COUNTRIES = Set.of(Locale.getISOCountries());
    private static final Pattern REGION = Pattern.compile("[A-Z]{2}-[A-Z0-9]{1,3}");
    private static final int MAX_VALUES = 20;

    private SegmentSpec() {
    }

    /** The segment with names and values normalised (sorted, upper-case country and region), or errors added. */
    static Map<String, List<String>> validated(Map<String, List<String>> segment, List<FieldError> errors) {
        Map<String, List<String>> out = new TreeMap<>();
        if (segment == null) {
            return out;
        }
        segment.forEach((name, values) -> {
            String field = "segment." + name;
            if (!DIMENSIONS.containsKey(name)) {
                errors.add(new FieldError(field, "unknown dimension; accepted: browser, country, device, region, "
                        + "source, variant"));
                return;
            }
            if (values == null || values.isEmpty() || values.size() > MAX_VALUES) {
                errors.add(new FieldError(field, "must list 1 to " + MAX_VALUES + " values"));
                return;
            }
            List<String> accepted = new ArrayList<>();
            for (String v : values) {
                String problem = check(name, v);
                if (problem != null) {
                    errors.add(new FieldError(field, problem));
                } else {
                    String n = name.equals("country") || name.equals("region") ? v.toUpperCase(Locale.ROOT) : v;
                    if (!accepted.contains(n)) {
                        accepted.add(n);
                    }
                }
            }
            accepted.sort(null);
            out.put(name, List.copyOf(accepted));
        });
        return out;
    }

    private static String check(String name, String v) {
        if (v == null) {
            return "must not contain null";
        }
        return switch (name) {
            case "device" -> DEVICES.contains(v) ? null : "must be desktop, phone, tablet or other, got '" + v + "'";
            case "source" -> SOURCES.contains(v) ? null
                    : "must be search, social, direct, referral, email, paid or other, got '" + v + "'";
            case "country" -> COUNTRIES.contains(v.toUpperCase(Locale.ROOT)) ? null
                    : "must be an ISO 3166-1 alpha-2 code, got '" + v + "'";
            case "region" -> REGION.matcher(v.toUpperCase(Locale.ROOT)).matches() ? null
                    : "must be an ISO 3166-2 code such as PT-11, got '" + v + "'";
            default -> v.isEmpty() || v.length() > 64 ? "must be 1 to 64 characters" : null;
        };
    }

    /** The rollup filter for local days {@code from}..{@code to}. */
    static SegmentFilter filter(Map<String, List<String>> segment, LocalDate from, LocalDate to) {
        Map<Dim, List<String>> values = new EnumMap<>(Dim.class);
        segment.forEach((name, v) -> values.put(DIMENSIONS.get(name), v));
        return new SegmentFilter(from, to, values);
    }

    /** The segment as query parameters of the metrics API and the UI ("device=phone&country=PT"). */
    static String query(Map<String, List<String>> segment) {
        StringJoiner q = new StringJoiner("&");
        segment.forEach((name, values) -> values.forEach(v ->
                q.add(name + "=" + URLEncoder.encode(v, StandardCharsets.UTF_8))));
        return q.toString();
    }
}
