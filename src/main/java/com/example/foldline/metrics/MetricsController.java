package com.example.foldline.metrics;

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

    private final Sites sites;
    private final MetricsService metrics;
    private final MetricRequestFactory requests;

    MetricsController(Sites sites, MetricsService metrics, MetricRequestFactory requests) {
        this.sites = sites;
        this.metrics = metrics;
        this.requests = requests;
    }

    @GetMapping("/api/v1/sites/{siteId}/metrics/{name}")
    @Operation(summary = "A metric answer: overview, density, depth, engagement, geography, pages or timeseries",
            description = "Segment filter: from, to (YYYY-MM-DD in the site's time zone; default the last 28 days), "
                    + "device, source, country, region, browser, variant (repeatable), compare=previous.")
    Object metric(@PathVariable long siteId, @PathVariable String name, HttpServletRequest request) {
        if (!MetricRequestFactory.ANSWERS.containsKey(name)) {
            throw new NotFoundException("no metric answer '" + name + "'; one of " + String.join(", ",
                    MetricRequestFactory.ANSWERS.keySet().stream().sorted().toList()));
        }
        Site site = sites.require(siteId);
        MetricRequest r = requests.request(site, name, request.getParameterMap());
        return switch (name) {
            case "overview" -> metrics.overview(r);
            case "density" -> metrics.density(r);
            case "depth" -> metrics.depth(r);
            case "engagement" -> metrics.engagement(r);
            case "geography" -> metrics.geography(r);
            case "pages" -> metrics.pages(r);
            default -> metrics.timeseries(r);
        };
    }
}
