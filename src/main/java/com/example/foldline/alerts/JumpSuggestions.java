package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;

import org.springframework.stereotype.Service;

import com.example.foldline.sessions.SessionTotals;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.Sites;
import com.example.foldline.stats.Cusum;

/**
 * "Possible jump" suggestions: a tabular CUSUM (Page 1954; Montgomery 2013, Sec. 9.1; {@link Cusum}) run on a site's
 * hourly bounce rate, each hour standardised against the rate of the same local hour of day in a reference period,
 * so that the daily rhythm of bounce (nights differ from mornings) does not look like a change. A signal is dated to
 * the start of its run; the chart restarts after it to look for further jumps. Each suggestion carries a ready rule
 * that a person can save (docs/alerts.md, "Suggestions").
 */
@Service
public class JumpSuggestions {

    static final int DEFAULT_DAYS = 14;
    static final int MAX_DAYS = 60;
    static final int MAX_SUGGESTIONS = 5;
    /** Below this many reference sessions an hour of day uses the reference period's overall rate. */
    static final long MIN_HOUR_SESSIONS = 30;
    static final String METHOD = "tabular CUSUM (Page 1954; Montgomery 2013, Sec. 9.1), k = 0.5, h = 5, on hourly "
            + "bounce rates standardised against the same local hour of day in the reference period";

    /** A possible jump, and a rule that would alert on it. */
    public record Suggestion(String direction, LocalDateTime startedAt, Instant startedAtUtc, LocalDateTime detectedAt,
                             double expectedRate, double observedRate, double changePercentagePoints,
                             long sessionsSince, RuleRequest suggestedRule) {
    }

    /** The answer: the hours examined and the suggestions, newest first. */
    public record Answer(long siteId, Map<String, List<String>> segment, LocalDateTime referenceFrom,
                         LocalDateTime monitoredFrom, LocalDateTime to, String timezone, String method,
                         List<Suggestion> suggestions, String notice) {
    }

    private final AlertData data;
    private final Sites sites;
    private final AlertProperties properties;
    private final Clock clock;

    JumpSuggestions(AlertData data, Sites sites, AlertProperties properties, Clock clock) {
        this.data = data;
        this.sites = sites;
        this.properties = properties;
        this.clock = clock;
    }

    /**
     * Suggestions for the {@code days} days up to the end of local day {@code until} (null: up to the newest complete
     * hour); the first half, at most 7 days, is the reference.
     */
    public Answer suggest(long siteId, Map<String, List<String>> segment, int days, LocalDate until) {
        Site site = sites.require(siteId);
        Duration settle = Duration.ofMinutes(site.sessionTimeoutMinutes()).plus(properties.settleMargin());
        LocalDateTime latest = Windows.latestEnd(clock.instant(), site.timezone(), settle);
        LocalDateTime end = until == null ? latest : until.plusDays(1).atStartOfDay();
        LocalDateTime to = end.isBefore(latest) ? end : latest;
        LocalDateTime from = to.minusDays(days);
        int referenceDays = Math.min(7, days / 2);
        LocalDateTime monitoredFrom = from.plusDays(referenceDays);
        HourlySeries series = data.hourly(siteId, segment, from.toLocalDate(), Windows.lastDay(to));
        // reference rate per local hour of day, and overall
        long[] refBounces = new long[24];
        long[] refSessions = new long[24];
        long allBounces = 0;
        long allSessions = 0;
        for (LocalDateTime h = from; h.isBefore(monitoredFrom); h = h.plusHours(1)) {
            SessionTotals t = series.byHour().getOrDefault(h, SessionTotals.ZERO);
            refBounces[h.getHour()] += t.bounces();
            refSessions[h.getHour()] += t.sessions();
            allBounces += t.bounces();
            allSessions += t.sessions();
        }
        if (allSessions == 0) {
            return new Answer(siteId, segment, from, monitoredFrom, to, site.timezone().getId(), METHOD, List.of(),
                    "no sessions in the reference period " + from + " to " + monitoredFrom);
        }
        double overall = clamp((double) allBounces / allSessions);
        double[] p0 = new double[24];
        for (int h = 0; h < 24; h++) {
            p0[h] = refSessions[h] >= MIN_HOUR_SESSIONS ? clamp((double) refBounces[h] / refSessions[h]) : overall;
        }
        // monitored hours with sessions, standardised
        List<LocalDateTime> hours = new ArrayList<>();
        List<SessionTotals> totals = new ArrayList<>();
        long monitoredSessions = 0;
        for (LocalDateTime h = monitoredFrom; h.isBefore(to); h = h.plusHours(1)) {
            SessionTotals t = series.byHour().getOrDefault(h, SessionTotals.ZERO);
            if (t.sessions() > 0) {
                hours.add(h);
                totals.add(t);
                monitoredSessions += t.sessions();
            }
        }
        double[] z = new double[hours.size()];
        for (int i = 0; i < z.length; i++) {
            SessionTotals t = totals.get(i);
            double p = p0[hours.get(i).getHour()];
            z[i] = ((double) t.bounces() / t.sessions() - p) / Math.sqrt(p * (1 - p) / t.sessions());
        }
        double perHour = hours.isEmpty() ? 0 : (double) monitoredSessions / Duration.between(monitoredFrom, to).toHours();
        List<int[]> signals = new ArrayList<>();   // first hour of the run, hour of detection, side (1 up)
        int start = 0;
        while (start < z.length && signals.size() < MAX_SUGGESTIONS) {
            double[] part = java.util.Arrays.copyOfRange(z, start, z.length);
            Optional<Cusum.Signal> signal = Cusum.tabular(part, 0, 1, Cusum.Options.defaults()).firstSignal();
            if (signal.isEmpty()) {
                break;
            }
            Cusum.Signal s = signal.get();
            signals.add(new int[]{start + s.changeStartIndex(), start + s.index(), s.side() == Cusum.Side.UPPER ? 1 : 0});
            start = start + s.index() + 1;
        }
        List<Suggestion> found = new ArrayList<>();
        for (int i = 0; i < signals.size(); i++) {
            int[] s = signals.get(i);
            // the new level is measured from the start of the run up to the next jump (or the newest hour)
            int last = i + 1 < signals.size() ? Math.max(s[1], signals.get(i + 1)[0] - 1) : hours.size() - 1;
            found.add(suggestion(site, segment, hours, totals, p0, s[0], s[1], last, s[2] == 1, perHour));
        }
        List<Suggestion> newestFirst = new ArrayList<>(found);
        java.util.Collections.reverse(newestFirst);
        return new Answer(siteId, segment, from, monitoredFrom, to, site.timezone().getId(), METHOD, newestFirst,
                hours.isEmpty() ? "no sessions in the monitored period" : null);
    }

    private static Suggestion suggestion(Site site, Map<String, List<String>> segment, List<LocalDateTime> hours,
                                         List<SessionTotals> totals, double[] p0, int first, int detected,
                                         int last, boolean up, double perHour) {
        long bounces = 0;
        long sessions = 0;
        double expected = 0;
        for (int i = first; i <= last; i++) {
            SessionTotals t = totals.get(i);
            bounces += t.bounces();
            sessions += t.sessions();
            expected += t.sessions() * p0[hours.get(i).getHour()];
        }
        double observedRate = (double) bounces / sessions;
        double expectedRate = expected / sessions;
        double change = (observedRate - expectedRate) * 100;
        int windowHours = (int) Math.max(1, Math.min(24, Math.ceil(RuleDefinition.DEFAULT_MIN_SESSIONS
                / Math.max(perHour, 1e-9))));
        double by = Math.max(1, Math.round(Math.abs(change) / 2 * 10) / 10.0);
        LocalDateTime started = hours.get(first);
        RuleRequest rule = new RuleRequest("Bounce rate " + (up ? "jump" : "drop") + " like the one of " + started,
                "bounceRate", segment, Duration.ofHours(windowHours).toString(),
                new RuleRequest.Condition("jump", null, up ? "up" : "down", by, "trailingDays", 7),
                new RuleRequest.Guard(RuleDefinition.DEFAULT_MIN_SESSIONS, RuleDefinition.DEFAULT_CONFIDENCE,
                        "zTest"), null, null, List.of(), List.of(), true);
        return new Suggestion(up ? "up" : "down", started, Windows.instant(started, site.timezone()),
                hours.get(detected), expectedRate, observedRate, change, sessions, rule);
    }

    private static double clamp(double p) {
        return Math.min(0.999, Math.max(0.001, p));
    }
}
