package com.example.foldline.metrics;

import java.util.Arrays;
import java.util.Optional;

import com.example.foldline.sessions.SessionTotals;

/**
 * The overview metrics, each defined in docs/metrics.md. Money metrics are in micro-units of the site's currency.
 */
public enum Metric {
    SESSIONS("sessions", Kind.COUNT, false),
    PAGEVIEWS("pageviews", Kind.COUNT, false),
    BOUNCE_RATE("bounceRate", Kind.PROPORTION, false),
    PAGES_PER_SESSION("pagesPerSession", Kind.MEAN, false),
    ENGAGED_MS_PER_SESSION("engagedMsPerSession", Kind.MEAN, false),
    REVENUE("revenue", Kind.COUNT, true),
    PAGE_RPM("pageRpm", Kind.RATIO, true),
    SESSION_RPM("sessionRpm", Kind.MEAN, true),
    ECPM("ecpm", Kind.RATIO, true),
    IMPRESSIONS("impressions", Kind.COUNT, false),
    VIEWABILITY_RATE("viewabilityRate", Kind.PROPORTION, false),
    CLICKS("clicks", Kind.COUNT, false),
    CTR("ctr", Kind.PROPORTION, false);

    /** How a change of the metric is tested. */
    public enum Kind {
        /** successes of trials: Newcombe's hybrid score interval for the difference */
        PROPORTION,
        /** mean per session: Welch's t test from sums and sums of squares */
        MEAN,
        /** a ratio of two totals: change reported, not tested */
        RATIO,
        /** a total: change reported, not tested */
        COUNT
    }

    private final String apiName;
    private final Kind kind;
    private final boolean money;

    Metric(String apiName, Kind kind, boolean money) {
        this.apiName = apiName;
        this.kind = kind;
        this.money = money;
    }

    public String apiName() {
        return apiName;
    }

    public Kind kind() {
        return kind;
    }

    public boolean money() {
        return money;
    }

    public static Optional<Metric> byName(String name) {
        return Arrays.stream(values()).filter(m -> m.apiName.equals(name)).findFirst();
    }

    /** numerator / denominator × scale; NaN when the denominator is 0. */
    public double value(SessionTotals t) {
        double d = denominator(t);
        return kind == Kind.COUNT ? numerator(t) : d == 0 ? Double.NaN : numerator(t) / d * scale();
    }

    double scale() {
        return this == PAGE_RPM || this == SESSION_RPM || this == ECPM ? 1000.0 : 1.0;
    }

    public double numerator(SessionTotals t) {
        return switch (this) {
            case SESSIONS -> t.sessions();
            case PAGEVIEWS, PAGES_PER_SESSION -> t.pageviews();
            case BOUNCE_RATE -> t.bounces();
            case ENGAGED_MS_PER_SESSION -> t.engagedMs();
            case REVENUE, PAGE_RPM, SESSION_RPM, ECPM -> t.revenueMicros();
            case IMPRESSIONS -> t.impressions();
            case VIEWABILITY_RATE -> t.viewableImpressions();
            case CLICKS, CTR -> t.clicks();
        };
    }

    public double denominator(SessionTotals t) {
        return switch (this) {
            case SESSIONS, PAGEVIEWS, REVENUE, IMPRESSIONS, CLICKS -> 1;
            case BOUNCE_RATE, PAGES_PER_SESSION, ENGAGED_MS_PER_SESSION, SESSION_RPM -> t.sessions();
            case PAGE_RPM -> t.pageviews();
            case ECPM, VIEWABILITY_RATE, CTR -> t.impressions();
        };
    }

    /** Sum of squares of the per-session quantity (MEAN metrics). */
    double sumOfSquares(SessionTotals t) {
        return switch (this) {
            case PAGES_PER_SESSION -> t.pageviewsSq();
            case ENGAGED_MS_PER_SESSION -> t.engagedSq();
            case SESSION_RPM -> t.revenueSq();
            default -> Double.NaN;
        };
    }
}
