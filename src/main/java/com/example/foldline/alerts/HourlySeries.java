package com.example.foldline.alerts;

import java.time.LocalDate;
import java.time.LocalDateTime;
import java.util.Collection;
import java.util.Map;

import com.example.foldline.sessions.SessionTotals;

/**
 * Session totals per local hour of one segment of one site, for the local days {@code from}..{@code to}, as read from
 * the rollups. Evaluations only sum hours, so one read serves many windows (catch-up, back-tests).
 *
 * @param readFrom where the rollups module read them (a rollup view, or the session table when no view holds the
 *                 segment's dimensions together with the hour)
 */
record HourlySeries(LocalDate from, LocalDate to, Map<LocalDateTime, SessionTotals> byHour, String readFrom) {

    HourlySeries {
        byHour = Map.copyOf(byHour);
    }

    /** The totals of these hours; fails loudly for an hour outside the days read, rather than counting it as 0. */
    SessionTotals sum(Collection<LocalDateTime> hours) {
        SessionTotals sum = SessionTotals.ZERO;
        for (LocalDateTime h : hours) {
            LocalDate d = h.toLocalDate();
            if (d.isBefore(from) || d.isAfter(to)) {
                throw new IllegalStateException("hour " + h + " lies outside the days read, " + from + " to " + to);
            }
            SessionTotals t = byHour.get(h);
            if (t != null) {
                sum = sum.plus(t);
            }
        }
        return sum;
    }

    boolean covers(LocalDate first, LocalDate last) {
        return !first.isBefore(from) && !last.isAfter(to);
    }
}
