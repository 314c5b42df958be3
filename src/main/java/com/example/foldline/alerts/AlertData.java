package com.example.foldline.alerts;

import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneId;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

import org.springframework.stereotype.Component;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.Group;
import com.example.foldline.sessions.Rollups;
import com.example.foldline.sessions.SessionTotals;

/**
 * Reads hourly session totals for rules from the rollups module (never from raw events).
 *
 * <p>Two things keep the evaluator's reads small (docs/alerts.md, "Reading the rollups"): a {@link Reads} instance
 * lives for one run, so rules of one site and segment share one query; and the hours of settled local days (ended
 * more than a day before the run) are kept between runs for at most {@code foldline.alerts.rollup-cache-ttl}, so an
 * hourly run reads about the newest day instead of a whole baseline of one to four weeks. A late change to a settled
 * day (a late event, an import, a rebuild) therefore reaches the baselines within that time. Back-tests read
 * everything afresh.
 */
@Component
class AlertData {

    /** Beyond this many site-and-segment entries the kept days are dropped (rules were deleted or changed). */
    private static final int MAX_KEPT_SEGMENTS = 20_000;
    /** Kept days older than this before the newest day read are dropped. */
    private static final int KEEP_DAYS = 70;

    private final Rollups rollups;
    private final Duration ttl;
    private final Map<List<Object>, Map<LocalDate, KeptDay>> kept = new ConcurrentHashMap<>();

    private record KeptDay(Map<LocalDateTime, SessionTotals> hours, Instant readAt, String readFrom) {
    }

    AlertData(Rollups rollups, AlertProperties properties) {
        this.rollups = rollups;
        this.ttl = properties.rollupCacheTtl();
    }

    /** Totals per local hour of the segment for local days {@code from}..{@code to}, read now. */
    HourlySeries hourly(long siteId, Map<String, List<String>> segment, LocalDate from, LocalDate to) {
        Rollups.SessionAnswer answer = rollups.sessions(siteId, SegmentSpec.filter(segment, from, to),
                List.of(Dim.HOUR), true);
        Map<LocalDateTime, SessionTotals> byHour = new HashMap<>();
        for (Group<SessionTotals> g : answer.groups()) {
            byHour.merge(g.day().atTime(g.number(Dim.HOUR), 0), g.totals(), SessionTotals::plus);
        }
        return new HourlySeries(from, to, byHour, answer.plan().describe());
    }

    /** A run's reads at {@code now}. */
    Reads reads(Instant now) {
        return new Reads(now);
    }

    /**
     * What one run read. Before judging, the evaluator plans the local days every rule of a site and segment needs
     * ({@link #plan}); the first rule of that site and segment then reads all of them (less the kept settled days)
     * in one query and the others share it. Not shared between runs.
     */
    final class Reads {

        private final Instant now;
        private final Map<List<Object>, LocalDate[]> planned = new HashMap<>();
        private final Map<List<Object>, HourlySeries> read = new HashMap<>();
        private int queries;
        private long nanos;

        private Reads(Instant now) {
            this.now = now;
        }

        /** Notes that a rule of this site and segment will need local days {@code from}..{@code to}. */
        void plan(long siteId, Map<String, List<String>> segment, LocalDate from, LocalDate to) {
            planned.merge(List.of(siteId, segment), new LocalDate[]{from, to}, (a, b) -> new LocalDate[]{
                    a[0].isBefore(b[0]) ? a[0] : b[0], a[1].isAfter(b[1]) ? a[1] : b[1]});
        }

        HourlySeries hourly(long siteId, ZoneId zone, Map<String, List<String>> segment, LocalDate from,
                            LocalDate to) {
            List<Object> key = List.of(siteId, segment);
            HourlySeries series = read.get(key);
            if (series != null && series.covers(from, to)) {
                return series;
            }
            LocalDate[] span = planned.get(key);
            boolean planCovers = span != null && !from.isBefore(span[0]) && !to.isAfter(span[1]);
            HourlySeries fresh = keptOrRead(key, siteId, zone, segment, planCovers ? span[0] : from,
                    planCovers ? span[1] : to);
            if (planCovers) {
                read.put(key, fresh);
            }
            return fresh;
        }

        /** The days from..to: kept settled days as they are, the rest (from the first day not kept) read now. */
        private HourlySeries keptOrRead(List<Object> key, long siteId, ZoneId zone, Map<String, List<String>> segment,
                                        LocalDate from, LocalDate to) {
            LocalDate settledUntil = LocalDate.ofInstant(now, zone).minusDays(2);
            Map<LocalDate, KeptDay> days = kept.computeIfAbsent(key, k -> new ConcurrentHashMap<>());
            Map<LocalDateTime, SessionTotals> hours = new HashMap<>();
            String readFrom = null;
            LocalDate firstMissing = null;
            for (LocalDate d = from; !d.isAfter(to); d = d.plusDays(1)) {
                KeptDay day = ttl.isZero() || d.isAfter(settledUntil) ? null : days.get(d);
                if (day == null || day.readAt().isBefore(now.minus(ttl))) {
                    firstMissing = d;
                    break;
                }
                hours.putAll(day.hours());
                readFrom = day.readFrom();
            }
            if (firstMissing != null) {
                long started = System.nanoTime();
                HourlySeries s = AlertData.this.hourly(siteId, segment, firstMissing, to);
                nanos += System.nanoTime() - started;
                queries++;
                hours.putAll(s.byHour());
                readFrom = s.readFrom();
                if (!ttl.isZero()) {
                    keep(days, s, settledUntil);
                }
            }
            return new HourlySeries(from, to, hours, readFrom == null ? "kept rollup hours" : readFrom);
        }

        private void keep(Map<LocalDate, KeptDay> days, HourlySeries s, LocalDate settledUntil) {
            if (kept.size() > MAX_KEPT_SEGMENTS) {
                kept.clear();
            }
            for (LocalDate d = s.from(); !d.isAfter(s.to()) && !d.isAfter(settledUntil); d = d.plusDays(1)) {
                Map<LocalDateTime, SessionTotals> dayHours = new HashMap<>();
                for (int h = 0; h < 24; h++) {
                    SessionTotals t = s.byHour().get(d.atTime(h, 0));
                    if (t != null) {
                        dayHours.put(d.atTime(h, 0), t);
                    }
                }
                days.put(d, new KeptDay(Map.copyOf(dayHours), now, s.readFrom()));
            }
            days.keySet().removeIf(d -> d.isBefore(s.to().minusDays(KEEP_DAYS)));
        }

        int queries() {
            return queries;
        }

        long readMillis() {
            return nanos / 1_000_000;
        }
    }
}
