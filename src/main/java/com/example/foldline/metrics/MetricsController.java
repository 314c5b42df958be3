package com.example.foldline.metrics;

import java.time.Clock;
import java.time.LocalDate;
import java.util.Map;
import java.util.Set;

import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;
import com.example.foldline.system.NotFoundException;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import jakarta.servlet.http.HttpServletRequest;

@RestController
@Tag(name = "Metrics", description = "Answers read from the rollups; definitions in docs/metrics.md")
class MetricsController {

    private static final Map<String, Set<String>> EXTRAS = Map.of(
            "overview", Set.of(),
            "density", Set.of("model"),
            "depth", Set.of(),
            "engagement", Set.of(),
            "geography", Set.of("by", "sort", "order"),
            "pages", Set.of("sort", "order", "limit", "q", "minSessions"),
            "timeseries", Set.of("metric", "grain"));

    private final Sites sites;
    private final MetricsService metrics;
    private final Clock clock;
    private final MetricsService.DensityExtras densityExtras;

    MetricsController(Sites sites, MetricsService metrics, Clock clock,
                      org.springframework.beans.factory.ObjectProvider<MetricsService.DensityExtras> densityExtras) {
        this.sites = sites;
        this.metrics = metrics;
        this.clock = clock;
        this.densityExtras = densityExtras.getIfAvailable();
    }

    @GetMapping("/api/v1/sites/{siteId}/metrics/{name}")
    @Operation(summary = "A metric answer: overview, density, depth, engagement, geography, pages or timeseries",
            description = "Segment filter: from, to (YYYY-MM-DD in the site's time zone; default the last 28 days), "
                    + "device, source, country, region, browser, variant (repeatable), compare=previous.")
    Object metric(@PathVariable long siteId, @PathVariable String name, HttpServletRequest request) {
        Set<String> extras = EXTRAS.get(name);
        if (extras == null) {
            throw new NotFoundException("no metric answer '" + name + "'; one of " + String.join(", ",
                    EXTRAS.keySet().stream().sorted().toList()));
        }
        Site site = sites.require(siteId);
        LocalDate today = LocalDate.now(clock.withZone(site.timezone()));
        MetricRequest r = MetricRequest.parse(site, request.getParameterMap(), extras, today);
        return switch (name) {
            case "overview" -> metrics.overview(r);
            case "density" -> metrics.density(r, densityExtras);
            case "depth" -> metrics.depth(r);
            case "engagement" -> metrics.engagement(r);
            case "geography" -> metrics.geography(r);
            case "pages" -> metrics.pages(r);
            default -> metrics.timeseries(r);
        };
    }
}
