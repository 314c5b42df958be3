package com.example.foldline.alerts;

import java.net.URLEncoder;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.StringJoiner;
import java.util.TreeMap;

import com.example.foldline.metrics.MetricRequest;
import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.SegmentFilter;
import com.example.foldline.system.FieldError;

/**
 * The segment of a rule: per dimension of the metrics API (device, source, country, region, browser, variant) the
 * accepted values. Checked with the same rules as the metrics API's query parameters (docs/metrics.md), because a
 * rule's link opens the matching metrics view.
 */
final class SegmentSpec {

    static final Map<String, Dim> DIMENSIONS = MetricRequest.DIMENSIONS;
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
                String problem = MetricRequest.check(name, v);
                if (problem != null) {
                    errors.add(new FieldError(field, problem));
                } else {
                    String n = MetricRequest.normalise(name, v);
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
