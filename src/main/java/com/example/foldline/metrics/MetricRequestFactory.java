package com.example.foldline.metrics;

import java.net.URLDecoder;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

import org.springframework.stereotype.Component;

import com.example.foldline.sites.Site;
import com.example.foldline.system.NotFoundException;

/** Builds validated metric questions from query parameters, for the API and for other modules (alerts, demo). */
@Component
public class MetricRequestFactory {

    /** The answers and the extra parameters each accepts besides the segment filter. */
    static final Map<String, Set<String>> ANSWERS = Map.of(
            "overview", Set.of(),
            "density", Set.of("model"),
            "depth", Set.of(),
            "engagement", Set.of(),
            "geography", Set.of("by", "sort", "order"),
            "pages", Set.of("sort", "order", "limit", "q", "minSessions"),
            "timeseries", Set.of("metric", "grain"));

    private final Clock clock;

    MetricRequestFactory(Clock clock) {
        this.clock = clock;
    }

    public MetricRequest request(Site site, String answer, Map<String, String[]> params) {
        Set<String> extras = ANSWERS.get(answer);
        if (extras == null) {
            throw new NotFoundException("no metric answer '" + answer + "'; one of "
                    + String.join(", ", ANSWERS.keySet().stream().sorted().toList()));
        }
        LocalDate today = LocalDate.now(clock.withZone(site.timezone()));
        return MetricRequest.parse(site, params, extras, today);
    }

    /** The same from a query string such as {@code device=phone&from=2026-10-01}. */
    public MetricRequest request(Site site, String answer, String query) {
        Map<String, List<String>> values = new LinkedHashMap<>();
        for (String pair : query.split("&")) {
            if (pair.isEmpty()) {
                continue;
            }
            int eq = pair.indexOf('=');
            String name = URLDecoder.decode(eq < 0 ? pair : pair.substring(0, eq), StandardCharsets.UTF_8);
            String value = eq < 0 ? "" : URLDecoder.decode(pair.substring(eq + 1), StandardCharsets.UTF_8);
            values.computeIfAbsent(name, k -> new ArrayList<>()).add(value);
        }
        Map<String, String[]> params = new LinkedHashMap<>();
        values.forEach((k, v) -> params.put(k, v.toArray(String[]::new)));
        return request(site, answer, params);
    }
}
