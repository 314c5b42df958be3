package com.example.foldline.support;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/** Builds NDJSON event lines for tests. */
public final class Events {

    private final List<String> lines = new ArrayList<>();

    public Events pageview(String id, String ts, String visitor, String path, int ads, String device, String source,
                           String country) {
        lines.add("""
                {"type":"pageview","id":"%s","ts":"%s","visitor":"%s","path":"%s","ads":%d,"device":"%s",\
                "source":"%s","country":"%s","browser":"Lumen"}""".formatted(id, Instant.parse(ts), visitor, path, ads,
                device, source, country));
        return this;
    }

    public Events pageEnd(String pageview, long engagedMs) {
        lines.add("{\"type\":\"pageend\",\"pageview\":\"%s\",\"engagedMs\":%d}".formatted(pageview, engagedMs));
        return this;
    }

    public Events impression(String id, String pageview, long revenueMicros, boolean viewable, boolean clicked) {
        lines.add("""
                {"type":"impression","id":"%s","pageview":"%s","revenueMicros":%d,"viewable":%s,"clicked":%s}"""
                .formatted(id, pageview, revenueMicros, viewable, clicked));
        return this;
    }

    public Events line(String json) {
        lines.add(json);
        return this;
    }

    public String ndjson() {
        return String.join("\n", lines);
    }
}
