package com.example.foldline.metrics;

import java.util.LinkedHashMap;
import java.util.Map;

import com.example.foldline.sessions.SessionTotals;

/**
 * Overview metrics of a period: totals, and every rate with its numerator and denominator beside it. Money in
 * micro-units ({@code …Micros}) and as a decimal in the site's currency. Definitions: docs/metrics.md.
 */
public record Overview(long sessions, long pageviews, long bounces, Double bounceRate, Double pagesPerSession,
                       long engagedMs, Double engagedMsPerSession, long revenueMicros, Double revenue,
                       Double pageRpmMicros, Double pageRpm, Double sessionRpmMicros, Double sessionRpm,
                       long impressions, long viewableImpressions, Double viewabilityRate, Double ecpmMicros,
                       Double ecpm, long clicks, Double ctr) {

    static Overview of(SessionTotals t) {
        double pageRpm = Metric.PAGE_RPM.value(t);
        double sessionRpm = Metric.SESSION_RPM.value(t);
        double ecpm = Metric.ECPM.value(t);
        return new Overview(t.sessions(), t.pageviews(), t.bounces(), Money.finite(Metric.BOUNCE_RATE.value(t)),
                Money.finite(Metric.PAGES_PER_SESSION.value(t)), t.engagedMs(),
                Money.finite(Metric.ENGAGED_MS_PER_SESSION.value(t)), t.revenueMicros(),
                Money.decimal(t.revenueMicros()), Money.finite(pageRpm), Money.decimal(pageRpm),
                Money.finite(sessionRpm), Money.decimal(sessionRpm), t.impressions(), t.viewableImpressions(),
                Money.finite(Metric.VIEWABILITY_RATE.value(t)), Money.finite(ecpm), Money.decimal(ecpm), t.clicks(),
                Money.finite(Metric.CTR.value(t)));
    }

    /** The value of each metric by API name (for series and comparisons). */
    static Map<String, Double> values(SessionTotals t) {
        Map<String, Double> values = new LinkedHashMap<>();
        for (Metric m : Metric.values()) {
            values.put(m.apiName(), Money.finite(m.value(t)));
        }
        return values;
    }
}
