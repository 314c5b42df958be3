package com.example.foldline.alerts;

import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneId;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;

/**
 * Evaluation windows. The rollups count sessions by local day and local hour (site time zone) of their start, so a
 * window is a run of whole local hours named by its exclusive end: the window ending 2026-11-09T13:00 with 2 hours
 * covers the local hours starting 11:00 and 12:00. Windows step by one hour.
 */
final class Windows {

    private Windows() {
    }

    /**
     * The end of the newest window that may be evaluated at {@code now}: the local hour boundary at or before
     * now − settle, where settle = the site's session timeout + a margin. Sessions close only after the timeout, and
     * only closed sessions reach the rollups, so an hour is judged once its sessions have had time to close
     * (docs/alerts.md, "Which hours are complete").
     */
    static LocalDateTime latestEnd(Instant now, ZoneId zone, Duration settle) {
        return LocalDateTime.ofInstant(now.minus(settle), zone).truncatedTo(ChronoUnit.HOURS);
    }

    /**
     * The window ends to evaluate after {@code lastDone} up to {@code latest}: every hour in between, but none older
     * than {@code maxCatchUpHours} before {@code latest}; only {@code latest} when nothing was evaluated yet.
     */
    static List<LocalDateTime> due(LocalDateTime lastDone, LocalDateTime latest, long maxCatchUpHours) {
        List<LocalDateTime> ends = new ArrayList<>();
        if (lastDone == null) {
            ends.add(latest);
            return ends;
        }
        LocalDateTime first = lastDone.plusHours(1);
        LocalDateTime oldest = latest.minusHours(maxCatchUpHours - 1);
        if (first.isBefore(oldest)) {
            first = oldest;
        }
        for (LocalDateTime end = first; !end.isAfter(latest); end = end.plusHours(1)) {
            ends.add(end);
        }
        return ends;
    }

    /** Every hourly window end from after {@code from} up to {@code to}. */
    static List<LocalDateTime> range(LocalDateTime from, LocalDateTime to) {
        List<LocalDateTime> ends = new ArrayList<>();
        for (LocalDateTime end = from.plusHours(1); !end.isAfter(to); end = end.plusHours(1)) {
            ends.add(end);
        }
        return ends;
    }

    /** The local hours of the window ending at {@code end}. */
    static List<LocalDateTime> slots(LocalDateTime end, int hours) {
        List<LocalDateTime> slots = new ArrayList<>(hours);
        for (int i = hours; i >= 1; i--) {
            slots.add(end.minusHours(i));
        }
        return slots;
    }

    /** The local hours of the baseline: the same window shifted back by 1..N days or 1..N weeks. */
    static List<LocalDateTime> baselineSlots(RuleDefinition rule, LocalDateTime end) {
        List<LocalDateTime> slots = new ArrayList<>();
        for (int p = 1; p <= rule.baselinePeriods(); p++) {
            slots.addAll(slots(end.minusDays((long) p * rule.baseline().stepDays), rule.windowHours()));
        }
        return slots;
    }

    /** The first local day any of these window ends (with their baselines) reads. */
    static LocalDate firstDay(RuleDefinition rule, LocalDateTime firstEnd) {
        LocalDateTime start = firstEnd.minusHours(rule.windowHours());
        if (rule.condition() == RuleDefinition.ConditionKind.JUMP) {
            start = start.minusDays((long) rule.baselinePeriods() * rule.baseline().stepDays);
        }
        return start.toLocalDate();
    }

    /** The last local day the window ending at {@code end} reads (an end at midnight reads only the day before). */
    static LocalDate lastDay(LocalDateTime end) {
        return end.minusHours(1).toLocalDate();
    }

    /** The instant a local window end stands for (the earlier one when clocks go back). */
    static Instant instant(LocalDateTime local, ZoneId zone) {
        return local.atZone(zone).toInstant();
    }
}
