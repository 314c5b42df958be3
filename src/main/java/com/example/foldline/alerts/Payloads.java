package com.example.foldline.alerts;

import java.net.URI;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;

import org.springframework.stereotype.Component;

import com.example.foldline.alerts.AlertRule.Notice;
import com.example.foldline.sites.Site;

import tools.jackson.databind.ObjectMapper;

/**
 * The JSON document of a notification: the same for the app, webhooks and the e-mail text (docs/alerts.md,
 * "Webhook payload"). Built once when the notification is recorded, so every retry sends identical bytes.
 */
@Component
class Payloads {

    private final ObjectMapper json;
    private final URI publicUrl;

    Payloads(ObjectMapper json, AlertProperties properties) {
        this.json = json;
        String base = properties.publicUrl().toString();
        this.publicUrl = URI.create(base.endsWith("/") ? base.substring(0, base.length() - 1) : base);
    }

    static String key(long ruleId, LocalDateTime windowEnd, Notice notice) {
        return "rule-" + ruleId + "/" + windowEnd + "/" + notice.name().toLowerCase(Locale.ROOT);
    }

    static String type(Notice notice) {
        return notice == Notice.RAISED ? "alert.raised" : "alert.cleared";
    }

    String title(Site site, AlertRule rule, Notice notice) {
        return (notice == Notice.RAISED ? "Raised: " : "Cleared: ") + rule.definition().name() + " on " + site.name();
    }

    /**
     * The matching view of the UI (docs/ui.md: the whole view state is in the query string): the site's health
     * screen charting the rule's metric hourly over the window's day and the six days before (the UI offers hourly
     * grain up to 7 days), with the rule's segment.
     */
    String link(Site site, RuleDefinition rule, LocalDateTime windowEnd) {
        String query = SegmentSpec.query(rule.segment());
        LocalDate to = Windows.lastDay(windowEnd);
        return publicUrl + "/?screen=health&site=" + site.id() + "&from=" + to.minusDays(6) + "&to=" + to
                + (query.isEmpty() ? "" : "&" + query) + "&metric=" + rule.metric().apiName() + "&grain=hour";
    }

    String json(Site site, AlertRule rule, Transition t, Instant now) {
        RuleDefinition d = rule.definition();
        Evaluation e = t.evaluation();
        Map<String, Object> p = new LinkedHashMap<>();
        p.put("id", key(rule.id(), t.windowEnd(), t.notice()));
        p.put("type", type(t.notice()));
        p.put("createdAt", now.toString());
        Map<String, Object> r = new LinkedHashMap<>();
        r.put("id", rule.id());
        r.put("name", d.name());
        r.put("metric", d.metric().apiName());
        r.put("condition", d.describe());
        r.put("window", d.window().toString());
        r.put("segment", d.segment());
        p.put("rule", r);
        p.put("site", Map.of("id", site.id(), "name", site.name(), "timezone", site.timezone().getId()));
        Map<String, Object> w = new LinkedHashMap<>();
        w.put("start", e.windowStart().toString());
        w.put("end", e.windowEnd().toString());
        w.put("startUtc", Windows.instant(e.windowStart(), site.timezone()).toString());
        w.put("endUtc", Windows.instant(e.windowEnd(), site.timezone()).toString());
        w.put("sessions", e.sessions());
        putIfPresent(w, "observed", e.observed());
        w.put("numerator", e.numerator());
        w.put("denominator", e.denominator());
        p.put("window", w);
        if (e.baseline() != null || e.baselineSessions() != null) {
            Map<String, Object> b = new LinkedHashMap<>();
            b.put("kind", d.baseline() == null ? null : d.baseline().apiName);
            b.put("periods", d.baselinePeriods());
            putIfPresent(b, "observed", e.baseline());
            putIfPresent(b, "sessions", e.baselineSessions());
            putIfPresent(b, "change", e.change());
            putIfPresent(b, "changeUnit", e.changeUnit());
            p.put("baseline", b);
        }
        if (e.test() != null) {
            p.put("test", e.test());
        }
        p.put("verdict", e.reason());
        p.put("state", Map.of("from", t.from().name(), "to", t.to().name(), "reason", t.reason()));
        p.put("link", link(site, d, t.windowEnd()));
        return json.writeValueAsString(p);
    }

    private static void putIfPresent(Map<String, Object> map, String key, Object value) {
        if (value != null) {
            map.put(key, value);
        }
    }
}
