package com.example.foldline.sessions;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Map;
import java.util.Optional;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.namedparam.MapSqlParameterSource;
import org.springframework.jdbc.core.namedparam.NamedParameterJdbcTemplate;
import org.springframework.stereotype.Repository;

/** Reads the sessionizer's work list (ingest batches) and pageviews, and stores sessions. */
@Repository
class SessionRepository {

    private static final String SESSION_COLUMNS = """
            site_id, id, origin, visitor, client_session, start_ts, end_ts, local_day, local_hour, pageviews, bounce,
            engaged_ms, entry_path, entry_ads, later_ads, source, device, browser, os, country, region, variant,
            revenue_micros, impressions, viewable_impressions, clicks, closed, page_detail""" + " ";

    private final NamedParameterJdbcTemplate named;
    private final JdbcTemplate jdbc;

    SessionRepository(NamedParameterJdbcTemplate named, JdbcTemplate jdbc) {
        this.named = named;
        this.jdbc = jdbc;
    }

    /** Serialises sessionizer work on one site across threads and application instances (row lock). */
    boolean lockSite(long siteId) {
        return !jdbc.queryForList("SELECT id FROM site WHERE id = ? FOR UPDATE", Long.class, siteId).isEmpty();
    }

    /** Ids of committed ingest batches of the site not yet sessionized, oldest first. */
    List<Long> batches(long siteId, int limit) {
        return jdbc.queryForList("SELECT id FROM ingest_batch WHERE site_id = ? ORDER BY id LIMIT ?", Long.class,
                siteId, limit);
    }

    Optional<Instant> newestOf(long siteId, List<Long> batches) {
        Timestamp ts = named.queryForObject("""
                        SELECT MAX(newest_ts) FROM ingest_batch WHERE site_id = :site AND id IN (:ids)""",
                new MapSqlParameterSource("site", siteId).addValue("ids", batches), Timestamp.class);
        return Optional.ofNullable(ts).map(Timestamp::toInstant);
    }

    /**
     * Visitors touched by these batches, with the earliest pageview time touched: their new pageviews, and the
     * pageviews whose page-end or impressions came in the batches. Extras of a pageview not yet stored are skipped;
     * the pageview's own arrival rebuilds its session later.
     */
    Map<String, Instant> changedVisitors(long siteId, List<Long> batches) {
        MapSqlParameterSource params = new MapSqlParameterSource("site", siteId).addValue("ids", batches);
        Map<String, Instant> earliest = new HashMap<>();
        for (String sql : List.of("""
                        SELECT visitor, MIN(ts) FROM pageview WHERE site_id = :site AND ingest_batch IN (:ids)
                        GROUP BY visitor""", """
                        SELECT p.visitor, MIN(p.ts) FROM page_end e
                        JOIN pageview p ON p.site_id = e.site_id AND p.id = e.pageview_id
                        WHERE e.site_id = :site AND e.ingest_batch IN (:ids) GROUP BY p.visitor""", """
                        SELECT p.visitor, MIN(p.ts) FROM impression i
                        JOIN pageview p ON p.site_id = i.site_id AND p.id = i.pageview_id
                        WHERE i.site_id = :site AND i.ingest_batch IN (:ids) GROUP BY p.visitor""")) {
            named.query(sql, params, rs -> {
                Instant ts = rs.getTimestamp(2).toInstant();
                earliest.merge(rs.getString(1), ts, (a, b) -> a.isBefore(b) ? a : b);
            });
        }
        return earliest;
    }

    /** Every visitor of the site with their first pageview time (for a rebuild). */
    Map<String, Instant> allVisitors(long siteId) {
        Map<String, Instant> visitors = new HashMap<>();
        jdbc.query("SELECT visitor, MIN(ts) FROM pageview WHERE site_id = ? GROUP BY visitor",
                rs -> {
                    visitors.put(rs.getString(1), rs.getTimestamp(2).toInstant());
                }, siteId);
        return visitors;
    }

    void deleteBatches(long siteId, List<Long> ids) {
        named.update("DELETE FROM ingest_batch WHERE site_id = :site AND id IN (:ids)",
                new MapSqlParameterSource("site", siteId).addValue("ids", ids));
    }

    /** Built sessions of these visitors that end at or after {@code endFrom}. */
    List<SessionFact> tagSessions(long siteId, Collection<String> visitors, Instant endFrom) {
        return named.query("SELECT " + SESSION_COLUMNS + """
                         FROM session_fact
                        WHERE site_id = :site AND origin = 'tag' AND visitor IN (:visitors) AND end_ts >= :from""",
                new MapSqlParameterSource("site", siteId).addValue("visitors", visitors)
                        .addValue("from", Timestamp.from(endFrom)),
                SessionRepository::session);
    }

    /** Pageviews of these visitors from {@code from} on, with page-end and impressions, by visitor and time. */
    List<PageviewRow> pageviews(long siteId, Collection<String> visitors, Instant from) {
        return named.query("""
                        SELECT p.id, p.ts, p.visitor, p.client_session, p.path, p.source, p.device, p.browser, p.os,
                               p.country, p.region, p.variant, p.ads, COALESCE(e.engaged_ms, p.engaged_ms) AS engaged,
                               COALESCE(SUM(i.revenue_micros), 0) AS revenue, COUNT(i.id) AS impressions,
                               COALESCE(SUM(CASE WHEN i.viewable THEN 1 ELSE 0 END), 0) AS viewable,
                               COALESCE(SUM(CASE WHEN i.clicked THEN 1 ELSE 0 END), 0) AS clicks
                        FROM pageview p
                        LEFT JOIN page_end e ON e.site_id = p.site_id AND e.pageview_id = p.id
                        LEFT JOIN impression i ON i.site_id = p.site_id AND i.pageview_id = p.id
                        WHERE p.site_id = :site AND p.visitor IN (:visitors) AND p.ts >= :from
                        GROUP BY p.id, p.ts, p.visitor, p.client_session, p.path, p.source, p.device, p.browser, p.os,
                                 p.country, p.region, p.variant, p.ads, e.engaged_ms, p.engaged_ms
                        ORDER BY p.visitor, p.ts, p.id""",
                new MapSqlParameterSource("site", siteId).addValue("visitors", visitors)
                        .addValue("from", Timestamp.from(from)),
                (rs, i) -> {
                    long engaged = rs.getLong("engaged");
                    Long engagedMs = rs.wasNull() ? null : engaged;
                    return new PageviewRow(rs.getString("id"), instant(rs, 2), rs.getString("visitor"),
                            rs.getString("client_session"), rs.getString("path"), rs.getString("source"),
                            rs.getString("device"), rs.getString("browser"), rs.getString("os"),
                            rs.getString("country"), rs.getString("region"), rs.getString("variant"),
                            rs.getInt("ads"), engagedMs, rs.getLong("revenue"), rs.getInt("impressions"),
                            rs.getInt("viewable"), rs.getInt("clicks"));
                });
    }

    void deleteTagSessions(long siteId, List<String> ids) {
        for (List<String> chunk : chunks(ids, 1000)) {
            named.update("DELETE FROM session_fact WHERE site_id = :site AND origin = 'tag' AND id IN (:ids)",
                    new MapSqlParameterSource("site", siteId).addValue("ids", chunk));
        }
    }

    void insert(List<SessionFact> sessions, Instant now) {
        insert(sessions, now, "");
    }

    /** Inserts sessions whose id is new for the site and origin; returns those that were inserted. */
    List<SessionFact> insertImported(List<SessionFact> sessions, Instant now) {
        int[][] counts = insert(sessions, now, " ON CONFLICT DO NOTHING");
        List<SessionFact> fresh = new ArrayList<>(sessions.size());
        int i = 0;
        for (int[] batch : counts) {
            for (int c : batch) {
                if (c > 0) {
                    fresh.add(sessions.get(i));
                }
                i++;
            }
        }
        return fresh;
    }

    private int[][] insert(List<SessionFact> sessions, Instant now, String onConflict) {
        if (sessions.isEmpty()) {
            return new int[0][];
        }
        Timestamp updated = Timestamp.from(now);
        return jdbc.batchUpdate("INSERT INTO session_fact (" + SESSION_COLUMNS + """
                        , rolled_up, updated_at)
                        VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, TRUE, ?)\
                        """ + onConflict,
                sessions, 1000, (ps, s) -> {
                    ps.setLong(1, s.siteId());
                    ps.setString(2, s.id());
                    ps.setString(3, s.origin());
                    ps.setString(4, s.visitor());
                    ps.setString(5, s.clientSession());
                    ps.setTimestamp(6, Timestamp.from(s.start()));
                    ps.setTimestamp(7, Timestamp.from(s.end()));
                    ps.setObject(8, s.localDay());
                    ps.setInt(9, s.localHour());
                    ps.setInt(10, s.pageviews());
                    ps.setBoolean(11, s.bounce());
                    ps.setLong(12, s.engagedMs());
                    ps.setString(13, s.entryPath());
                    ps.setInt(14, s.entryAds());
                    if (s.laterAds() == null) {
                        ps.setNull(15, Types.DOUBLE);
                    } else {
                        ps.setDouble(15, s.laterAds());
                    }
                    ps.setString(16, s.source());
                    ps.setString(17, s.device());
                    ps.setString(18, s.browser());
                    ps.setString(19, s.os());
                    ps.setString(20, s.country());
                    ps.setString(21, s.region());
                    ps.setString(22, s.variant());
                    ps.setLong(23, s.revenueMicros());
                    ps.setInt(24, s.impressions());
                    ps.setInt(25, s.viewableImpressions());
                    ps.setInt(26, s.clicks());
                    ps.setBoolean(27, s.closed());
                    ps.setString(28, PageStat.encode(s.pages()));
                    ps.setTimestamp(29, updated);
                });
    }

    List<SessionFact> visitorSessions(long siteId, String visitor) {
        return jdbc.query("SELECT " + SESSION_COLUMNS + " FROM session_fact WHERE site_id = ? AND visitor = ?",
                SessionRepository::session, siteId, visitor);
    }

    /** Open sessions whose last pageview is before {@code before}. */
    List<SessionFact> openSessionsEndingBefore(long siteId, Instant before, int limit) {
        return jdbc.query("SELECT " + SESSION_COLUMNS + """
                         FROM session_fact WHERE site_id = ? AND closed = FALSE AND end_ts < ?
                        ORDER BY end_ts LIMIT ?""", SessionRepository::session, siteId, Timestamp.from(before), limit);
    }

    void markClosed(long siteId, List<SessionFact> sessions) {
        jdbc.batchUpdate("UPDATE session_fact SET closed = TRUE WHERE site_id = ? AND origin = ? AND id = ?",
                sessions, 1000, (ps, s) -> {
                    ps.setLong(1, siteId);
                    ps.setString(2, s.origin());
                    ps.setString(3, s.id());
                });
    }

    /**
     * Calls {@code action} with every session of the local day whose contribution the rollups hold (closed and
     * rolled up), streamed in pages of 1,000 rows; returns how many there were.
     */
    long forEachInRollups(long siteId, LocalDate day, java.util.function.Consumer<SessionFact> action) {
        long[] n = {0};
        jdbc.query(con -> {
            java.sql.PreparedStatement ps = con.prepareStatement("SELECT " + SESSION_COLUMNS + """
                     FROM session_fact WHERE site_id = ? AND local_day = ? AND closed = TRUE AND rolled_up = TRUE""");
            ps.setFetchSize(1000);
            ps.setLong(1, siteId);
            ps.setObject(2, day);
            return ps;
        }, rs -> {
            action.accept(session(rs, 0));
            n[0]++;
        });
        return n[0];
    }

    /** Sessions stored without rollup contributions yet (imports). */
    List<SessionFact> notRolledUp(long siteId, int limit) {
        return jdbc.query("SELECT " + SESSION_COLUMNS + """
                         FROM session_fact WHERE site_id = ? AND rolled_up = FALSE ORDER BY id LIMIT ?""",
                SessionRepository::session, siteId, limit);
    }

    void markRolledUp(long siteId, List<SessionFact> sessions) {
        jdbc.batchUpdate("""
                        UPDATE session_fact SET rolled_up = TRUE, page_detail = ?
                        WHERE site_id = ? AND origin = ? AND id = ?""",
                sessions, 1000, (ps, s) -> {
                    ps.setString(1, PageStat.encode(s.pages()));
                    ps.setLong(2, siteId);
                    ps.setString(3, s.origin());
                    ps.setString(4, s.id());
                });
    }

    /** The newest pageview time the sessionizer has seen on the site. */
    Optional<Instant> newestEventTime(long siteId) {
        return jdbc.queryForList("SELECT newest_ts FROM sessionizer_state WHERE site_id = ?", Timestamp.class, siteId)
                .stream().findFirst().map(Timestamp::toInstant);
    }

    void raiseNewestEventTime(long siteId, Instant ts) {
        Optional<Instant> current = newestEventTime(siteId);
        if (current.isEmpty()) {
            jdbc.update("INSERT INTO sessionizer_state (site_id, newest_ts) VALUES (?, ?)", siteId, Timestamp.from(ts));
        } else if (ts.isAfter(current.get())) {
            jdbc.update("UPDATE sessionizer_state SET newest_ts = ? WHERE site_id = ?", Timestamp.from(ts), siteId);
        }
    }

    List<Long> siteIds() {
        return jdbc.queryForList("SELECT id FROM site ORDER BY id", Long.class);
    }

    private static SessionFact session(ResultSet rs, int row) throws SQLException {
        double later = rs.getDouble("later_ads");
        Double laterAds = rs.wasNull() ? null : later;
        return new SessionFact(rs.getLong("site_id"), rs.getString("id"), rs.getString("origin"),
                rs.getString("visitor"), rs.getString("client_session"), instant(rs, "start_ts"),
                instant(rs, "end_ts"), rs.getObject("local_day", LocalDate.class), rs.getInt("local_hour"),
                rs.getInt("pageviews"), rs.getBoolean("bounce"), rs.getLong("engaged_ms"), rs.getString("entry_path"),
                rs.getInt("entry_ads"), laterAds, rs.getString("source"), rs.getString("device"),
                rs.getString("browser"), rs.getString("os"), rs.getString("country"), rs.getString("region"),
                rs.getString("variant"), rs.getLong("revenue_micros"), rs.getInt("impressions"),
                rs.getInt("viewable_impressions"), rs.getInt("clicks"), rs.getBoolean("closed"),
                PageStat.decode(rs.getString("page_detail")));
    }

    private static Instant instant(ResultSet rs, int column) throws SQLException {
        Timestamp ts = rs.getTimestamp(column);
        return ts == null ? null : ts.toInstant();
    }

    private static Instant instant(ResultSet rs, String column) throws SQLException {
        Timestamp ts = rs.getTimestamp(column);
        return ts == null ? null : ts.toInstant();
    }

    static <T> List<List<T>> chunks(List<T> items, int size) {
        List<List<T>> chunks = new ArrayList<>();
        for (int i = 0; i < items.size(); i += size) {
            chunks.add(items.subList(i, Math.min(items.size(), i + size)));
        }
        return chunks;
    }

}
