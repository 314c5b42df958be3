package com.example.foldline.sessions;

import java.sql.Date;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Predicate;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.boot.context.event.ApplicationReadyEvent;
import org.springframework.context.event.EventListener;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.support.TransactionTemplate;

/**
 * Fills the rollup views that a site's rollups lack because they were built for an older lattice (migration V8
 * marks such sites in {@code rollup_fill}), and tells the planner which views it may read for a site.
 *
 * <p>A site is filled one local day at a time, each day in its own transaction under the sessionizer's site lock:
 * the new views' rows of that day are deleted and recomputed from the day's stored sessions that the rollups hold
 * (closed and rolled up), so sessionizer writes before and after a day's transaction stay consistent. A day whose
 * stored sessions no longer add up to view 0 (retention deleted some; the rollups keep them) cannot be filled; the
 * site's new views are then complete only from the day after the last such day, and {@link #usable} keeps questions
 * that reach back further on the older views. Until a site is done, its new views are not read at all. Weekly
 * twins ({@link WeeklyViews}) are not filled here: they are built from the daily views once these are complete.
 */
@Service
public class RollupFill {

    private static final Logger log = LoggerFactory.getLogger(RollupFill.class);
    private static final long REFRESH_NANOS = 10_000_000_000L;

    /** One row of rollup_fill: the views of {@code lattice} are complete from {@code completeFrom} (null: all days). */
    record Fill(long siteId, int lattice, boolean done, LocalDate completeFrom) {
    }

    /** What a fill did. */
    public record Report(long siteId, int lattice, int days, long sessions, LocalDate completeFrom) {
    }

    private final JdbcTemplate jdbc;
    private final SessionRepository sessions;
    private final RollupWriter writer;
    private final TransactionTemplate tx;
    private final Clock clock;
    private final boolean onStartup;
    private volatile Map<Long, Map<Integer, Fill>> fills;
    private volatile long readAt;

    RollupFill(JdbcTemplate jdbc, SessionRepository sessions, RollupWriter writer, TransactionTemplate tx, Clock clock,
               @Value("${foldline.sessions.enabled:true}") boolean onStartup) {
        this.jdbc = jdbc;
        this.sessions = sessions;
        this.writer = writer;
        this.tx = tx;
        this.clock = clock;
        this.onStartup = onStartup;
    }

    /** Where the sessionizer runs, pending fills start in the background once the application is ready. */
    @EventListener(ApplicationReadyEvent.class)
    void started() {
        if (!onStartup || pending().isEmpty()) {
            return;
        }
        Thread t = new Thread(() -> {
            try {
                fillPending();
            } catch (RuntimeException e) {
                log.error("filling new rollup views stopped; it resumes on the next start", e);
            }
        }, "rollup-fill");
        t.setDaemon(true);
        t.start();
    }

    /** Fills every pending site and lattice; returns what was done. */
    public List<Report> fillPending() {
        return pending().stream().map(f -> fill(f.siteId(), f.lattice())).toList();
    }

    /** Fills the views of {@code lattice} for one site from its stored sessions. */
    public Report fill(long siteId, int lattice) {
        // daily views only: their weekly twins are built from them afterwards (WeeklyViews)
        List<Cuboid> sessionViews = Cuboid.SESSION.stream().filter(c -> c.lattice() == lattice && !c.weekly()).toList();
        List<Cuboid> pageViews = Cuboid.PAGE.stream().filter(c -> c.lattice() == lattice && !c.weekly()).toList();
        List<Integer> sessionIds = sessionViews.stream().map(Cuboid::id).toList();
        List<Integer> pageIds = pageViews.stream().map(Cuboid::id).toList();
        Map<String, Object> range = jdbc.queryForMap("""
                SELECT (SELECT MIN(local_day) FROM rollup_session WHERE site_id = ? AND cuboid = 0) AS r_min,
                       (SELECT MAX(local_day) FROM rollup_session WHERE site_id = ? AND cuboid = 0) AS r_max,
                       (SELECT MIN(local_day) FROM session_fact WHERE site_id = ?) AS s_min,
                       (SELECT MAX(local_day) FROM session_fact WHERE site_id = ?) AS s_max""",
                siteId, siteId, siteId, siteId);
        LocalDate first = min(day(range.get("r_min")), day(range.get("s_min")));
        LocalDate last = max(day(range.get("r_max")), day(range.get("s_max")));
        long started = System.nanoTime();
        int days = 0;
        long total = 0;
        LocalDate lastIncomplete = null;
        for (LocalDate d = first; d != null && !d.isAfter(last); d = d.plusDays(1)) {
            LocalDate day = d;
            long[] counts = tx.execute(status -> {
                if (!sessions.lockSite(siteId)) {
                    return null;
                }
                writer.clear(siteId, sessionIds, pageIds, day, day);
                Contributions c = new Contributions(sessionViews, pageViews);
                long n = sessions.forEachInRollups(siteId, day, s -> c.add(ImportedPages.withPages(s), +1));
                writer.insert(siteId, c);
                Long held = jdbc.queryForObject("""
                        SELECT COALESCE(SUM(sessions), 0) FROM rollup_session
                        WHERE site_id = ? AND cuboid = 0 AND local_day = ?""", Long.class, siteId, Date.valueOf(day));
                return new long[]{n, held == null ? 0 : held};
            });
            if (counts == null) {
                break; // the site was deleted meanwhile; its rollup_fill row went with it
            }
            days++;
            total += counts[0];
            if (counts[0] != counts[1]) {
                lastIncomplete = day;
            }
        }
        LocalDate completeFrom = lastIncomplete == null ? null : lastIncomplete.plusDays(1);
        // weekly twins built meanwhile summed the new views while they were filling: drop them before the views are
        // read; the sessionizer's next run builds them again
        tx.executeWithoutResult(status -> {
            sessions.lockSite(siteId);
            writer.forgetWeeks(siteId);
        });
        jdbc.update("UPDATE rollup_fill SET state = 'done', complete_from = ?, filled_at = ? "
                        + "WHERE site_id = ? AND lattice = ?", completeFrom == null ? null : Date.valueOf(completeFrom),
                Timestamp.from(clock.instant()), siteId, lattice);
        readAt = 0;
        log.info("rollup lattice {}: filled {} new views of site {} over {} days ({} sessions) in {} s{}", lattice,
                sessionIds.size() + pageIds.size(), siteId, days, total,
                String.format("%.1f", (System.nanoTime() - started) / 1e9),
                completeFrom == null ? "" : "; complete from " + completeFrom + " (older sessions were deleted)");
        return new Report(siteId, lattice, days, total, completeFrom);
    }

    /**
     * Leaves the views of {@code lattice} of a new site to the background fill: call before storing its first
     * sessions with {@link BulkSessions#store(com.example.foldline.sites.Site, List, int)} up to an older lattice.
     * Until the fill is done, questions on the site read the older views (or the sessions), so answers stay whole.
     */
    public void defer(long siteId, int lattice) {
        jdbc.update("INSERT INTO rollup_fill (site_id, lattice, state) VALUES (?, ?, 'pending')", siteId, lattice);
        refresh();
    }

    /** Marks a site's views as consistent again (after a rebuild from raw events, which fills every view). */
    void forget(long siteId) {
        jdbc.update("DELETE FROM rollup_fill WHERE site_id = ?", siteId);
        readAt = 0;
    }

    /** Which views a question on the site starting at local day {@code from} may read. */
    Predicate<Cuboid> usable(long siteId, LocalDate from) {
        if (System.nanoTime() - readAt > REFRESH_NANOS || fills == null) {
            refresh();
        }
        Map<Integer, Fill> site = fills.get(siteId);
        if (site == null) {
            return c -> true;
        }
        return c -> {
            Fill f = site.get(c.lattice());
            return f == null || (f.done() && (f.completeFrom() == null || !from.isBefore(f.completeFrom())));
        };
    }

    private List<Fill> pending() {
        return jdbc.query("SELECT site_id, lattice, state, complete_from FROM rollup_fill WHERE state = 'pending' "
                + "ORDER BY site_id, lattice", (rs, i) -> fill(rs));
    }

    /** Re-reads rollup_fill now (it is otherwise re-read at most every 10 s, for changes by other instances). */
    public synchronized void refresh() {
        long now = System.nanoTime();
        Map<Long, Map<Integer, Fill>> all = new HashMap<>();
        jdbc.query("SELECT site_id, lattice, state, complete_from FROM rollup_fill", rs -> {
            Fill f = fill(rs);
            all.computeIfAbsent(f.siteId(), k -> new HashMap<>()).put(f.lattice(), f);
        });
        fills = all;
        readAt = now;
    }

    private static Fill fill(java.sql.ResultSet rs) throws java.sql.SQLException {
        return new Fill(rs.getLong("site_id"), rs.getInt("lattice"), rs.getString("state").equals("done"),
                rs.getObject("complete_from", LocalDate.class));
    }

    private static LocalDate day(Object v) {
        if (v == null) {
            return null;
        }
        return v instanceof Date d ? d.toLocalDate() : (LocalDate) v;
    }

    private static LocalDate min(LocalDate a, LocalDate b) {
        return a == null ? b : b == null ? a : a.isBefore(b) ? a : b;
    }

    private static LocalDate max(LocalDate a, LocalDate b) {
        return a == null ? b : b == null ? a : a.isAfter(b) ? a : b;
    }
}
