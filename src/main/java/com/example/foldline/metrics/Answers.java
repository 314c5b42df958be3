package com.example.foldline.metrics;

import java.time.LocalDate;
import java.util.List;
import java.util.Map;

/** The JSON answers of the metrics endpoints (field definitions: docs/metrics.md). */
public final class Answers {

    private Answers() {
    }

    /** What was asked: site, currency, range, filters, and where the answer was read from. */
    public record Scope(long siteId, String currency, String timezone, LocalDate from, LocalDate to,
                        Map<String, List<String>> filters, String answeredFrom) {
    }

    public record Comparison(LocalDate from, LocalDate to, Overview values, List<Change> changes) {
    }

    public record OverviewAnswer(Scope scope, Overview current, Comparison comparison) {
    }

    /** One ads-on-the-entry-page value. */
    public record DensityPoint(int entryAds, long sessions, long bounces, Double bounceRate, Double bounceLower,
                               Double bounceUpper, Double pagesPerSession, Double sessionRpmMicros, Double sessionRpm) {
    }

    public record DensityAnswer(Scope scope, List<DensityPoint> points, long sessions, String intervalMethod,
                                FitSummary fit, CapAdvice recommendation, String notice) {
    }

    /** One pages-per-session bucket (11 = 11 or more). */
    public record DepthPoint(int pages, String label, long sessions, Double share, Double revenuePerSessionMicros,
                             Double revenuePerSession, Double marginalRevenueMicros, Double marginalRevenue) {
    }

    public record DepthAnswer(Scope scope, List<DepthPoint> points, long sessions, KneeReport fit, String notice) {
    }

    /** One engaged-time bucket of pageviews. */
    public record EngagementPoint(int bucket, String label, long lowerMs, Long upperMs, long pageviews,
                                  long revenueMicros, Double revenuePerPageviewMicros, Double revenuePerPageview,
                                  Double pageRpmMicros, Double pageRpm) {
    }

    public record EngagementAnswer(Scope scope, List<EngagementPoint> points, long pageviews,
                                   long unmeasuredPageviews, KneeReport fit, String notice) {
    }

    /** One country (or region). Ratios compare with the site average over the same filter. */
    public record GeoRow(String country, String region, long sessions, Double share, long pageviews,
                         Double pageRpmMicros, Double pageRpm, Double pageRpmVsSite, Double sessionRpmMicros,
                         Double sessionRpm, Double sessionRpmVsSite) {
    }

    public record GeographyAnswer(Scope scope, String by, List<GeoRow> rows, Overview site) {
    }

    /** One entry path. */
    public record PageRow(String path, long sessions, long bounces, Double bounceRate, Double bounceLower,
                          Double bounceUpper, Double pagesPerSession, Double sessionRpmMicros, Double sessionRpm,
                          Double meanEntryAds) {
    }

    public record PagesAnswer(Scope scope, String sort, String order, int limit, String q, long matchingPaths,
                              List<PageRow> rows) {
    }

    /** One point of a series: local date (daily) or local date-time of the hour (hourly). */
    public record SeriesPoint(String at, Double value, double numerator, double denominator) {
    }

    public record SeriesAnswer(Scope scope, String metric, String grain, List<SeriesPoint> points,
                               List<SeriesPoint> previous) {
    }
}
