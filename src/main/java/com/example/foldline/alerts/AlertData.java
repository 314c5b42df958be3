package com.example.foldline.alerts;

import java.time.LocalDate;
import java.time.LocalDateTime;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.springframework.stereotype.Component;

import com.example.foldline.sessions.Dim;
import com.example.foldline.sessions.Group;
import com.example.foldline.sessions.Rollups;
import com.example.foldline.sessions.SessionTotals;

/**
 * Reads hourly session totals for rules from the rollups module (never from raw events). A {@link Reads} instance
 * lives for one evaluator run, so rules of one site and segment that need the same days share one query.
 */
@Component
class AlertData {

    private final Rollups rollups;

    AlertData(Rollups rollups) {
        this.rollups = rollups;
    }

    /** Totals per local hour of the segment for local days {@code from}..{@code to}. */
    HourlySeries hourly(long siteId, Map<String, List<String>> segment, LocalDate from, LocalDate to) {
        Rollups.SessionAnswer answer = rollups.sessions(siteId, SegmentSpec.filter(segment, from, to),
                List.of(Dim.HOUR), true);
        Map<LocalDateTime, SessionTotals> byHour = new HashMap<>();
        for (Group<SessionTotals> g : answer.groups()) {
            byHour.merge(g.day().atTime(g.number(Dim.HOUR), 0), g.totals(), SessionTotals::plus);
        }
        return new HourlySeries(from, to, byHour, answer.plan().describe());
    }

    Reads reads() {
        return new Reads();
    }

    /** Remembers what one run read; not shared between runs, so every run sees the rollups as they are. */
    final class Reads {

        private final Map<List<Object>, HourlySeries> read = new HashMap<>();
        private int queries;

        HourlySeries hourly(long siteId, Map<String, List<String>> segment, LocalDate from, LocalDate to) {
            return read.computeIfAbsent(List.of(siteId, segment, from, to), k -> {
                queries++;
                return AlertData.this.hourly(siteId, segment, from, to);
            });
        }

        int queries() {
            return queries;
        }
    }
}
