package com.example.foldline.sessions;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Consumer;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/** Reads the sessionizer's work list (ingest batches) and pageviews, and stores sessions. */
@Repository
class SessionRepository {

    private static final String SESSION_COLUMNS = """
            site_id, id, origin, visitor, client_session, start_ts, end_ts, local_day, local_hour, pageviews, bounce,
            engaged_ms, entry_path, entry_ads, later_ads, source, device, browser, os, country, region, variant,
            revenue_micros, impressions, viewable_impressions, clicks, closed, page_detail""" + " ";

    private static final String PAGEVIEW_COLUMNS =
            "id, ts, visitor, client_session, path, source, device, browser, os, country, region, variant, ads, engaged_ms";

    /** Most keys per {@code VALUES} look-up. */
    static final int LOOKUP = 1024;

    private final JdbcTemplate jdbc;
    private final SqlDialect dialect;

    SessionRepository(JdbcTemplate jdbc, SqlDialect dialect) {
        this.jdbc = jdbc;
        this.dialect = dialect;
    }

    /** Serialises sessionizer work on one site across threads and application instances (row lock). */
    boolean lockSite(long siteId) {
        return !jdbc.queryForList("SELECT id FROM site WHERE id = ? FOR UPDATE", Long.class, siteId).isEmpty();
    }

    /** A committed ingest batch not yet sessionized, with the newest pageview time it carried. */
    record Batch(long id, Instant newest) {
    }

    /** Committed ingest batches of the site not yet sessionized, oldest first. */
    List<Batch> batches(long siteId, int limit) {
        return jdbc.query("SELECT id, newest_ts FROM ingest_batch WHERE site_id = ? ORDER BY id LIMIT ?",
                (rs, i) -> new Batch(rs.getLong(1), instant(rs, 2)), siteId, limit);
    }

    /**
     * The pageviews one ingest batch stored, without page-end and impressions (see {@link #withExtras}). One pass over
     * the batch index: an equality per batch, because H2 uses an {@code IN} list only on the first column of an index
     * and would scan every pageview of the site (docs/benchmarks.md, "Sessionizer").
     */
    void batchPageviews(long siteId, long batch, Consumer<PageviewRow> sink) {
        jdbc.query("SELECT " + PAGEVIEW_COLUMNS + " FROM pageview WHERE site_id = ? AND ingest_batch = ?",
                rs -> {
                    sink.accept(pageview(rs));
                }, siteId, batch);
    }

    /**
     * Visitors whose stored pageviews got a page-end or impressions in this batch, with the earliest such pageview
     * time. Extras of a pageview not yet stored are skipped; the pageview's own arrival rebuilds its session later.
     */
    Map<String, Instant> extrasVisitors(long siteId, long batch) {
        Map<String, Instant> earliest = new HashMap<>();
        for (String sql : List.of("""
                        SELECT p.visitor, MIN(p.ts) FROM page_end e
                        LEFT JOIN pageview p ON p.site_id = e.site_id AND p.id = e.pageview_id
                        WHERE e.site_id = ? AND e.ingest_batch = ? GROUP BY p.visitor""", """
                        SELECT p.visitor, MIN(p.ts) FROM impression i
                        LEFT JOIN pageview p ON p.site_id = i.site_id AND p.id = i.pageview_id
                        WHERE i.site_id = ? AND i.ingest_batch = ? GROUP BY p.visitor""")) {
            // LEFT JOIN: keeps the batch's rows as the outer side on H2 whatever the statistics; extras whose
            // pageview is not stored yet come back as a NULL visitor
            jdbc.query(sql, rs -> {
                if (rs.getString(1) == null) {
                    return;
                }
                Instant ts = rs.getTimestamp(2).toInstant();
                earliest.merge(rs.getString(1), ts, (a, b) -> a.isBefore(b) ? a : b);
            }, siteId, batch);
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
        jdbc.batchUpdate("DELETE FROM ingest_batch WHERE site_id = ? AND id = ?", ids, 1000, (ps, id) -> {
            ps.setLong(1, siteId);
            ps.setLong(2, id);
        });
    }

    /**
     * Built sessions of these visitors (at most {@link #LOOKUP} of them) that end at or after {@code endFrom}, each
     * visitor looked up in the (site, visitor, start) index ({@link #keyed}). On H2 an {@code IN} list on the index's
     * second column is filtered in a scan of the whole site, {@code IN (subquery)} re-runs the subquery for every row,
     * and an inner join with the list may keep a plan made while the table was empty (docs/benchmarks.md,
     * "Sessionizer"). The origin is checked here, not in SQL: with {@code origin = 'tag'} in the join the primary key
     * (site, origin, id) ties with the visitor index on H2 until statistics exist, and a plan made then scans every
     * session.
     */
    List<SessionFact> tagSessions(long siteId, List<String> visitors, Instant endFrom) {
        return visitorRows(prefixed("s", SESSION_COLUMNS), "session_fact s", "s.end_ts", siteId, visitors, endFrom,
                (rs, n) -> rs.getString("id") == null || !"tag".equals(rs.getString("origin")) ? null : session(rs, n));
    }

    /**
     * Stored pageviews of these visitors (at most {@link #LOOKUP}) from {@code from} on, without page-end and
     * impressions, in no particular order (the caller sorts each visitor's pages).
     */
    List<PageviewRow> visitorPageviews(long siteId, List<String> visitors, Instant from) {
        return visitorRows(prefixed("p", PAGEVIEW_COLUMNS), "pageview p", "p.ts", siteId, visitors, from,
                (rs, n) -> rs.getString(1) == null ? null : pageview(rs));
    }

    /**
     * Rows of {@code table} (name and alias) of these visitors whose {@code time} is at or after {@code from}, looked
     * up by visitor ({@link #keyed}); {@code mapper} returns null for rows to drop (H2's unmatched keys among them).
     */
    private <T> List<T> visitorRows(String columns, String table, String time, long siteId, List<String> visitors,
                                    Instant from, org.springframework.jdbc.core.RowMapper<T> mapper) {
        String alias = table.substring(table.indexOf(' ') + 1);
        return jdbc.query("SELECT " + columns + " FROM "
                        + keyed(table, alias + ".visitor", visitors.size(), 32, " AND " + time + " >= ?"),
                ps -> ps.setTimestamp(bindKeys(ps, visitors, siteId), Timestamp.from(from)), mapper)
                .stream().filter(java.util.Objects::nonNull).toList();
    }

    /**
     * The same pageviews with their page-end (its engaged time replaces the pageview's own) and their impressions
     * summed. Two look-ups by pageview id per {@link #LOOKUP} pageviews.
     */
    List<PageviewRow> withExtras(long siteId, List<PageviewRow> rows) {
        if (rows.isEmpty()) {
            return rows;
        }
        Map<String, Long> engaged = new HashMap<>();
        Map<String, long[]> ads = new HashMap<>();
        List<String> ids = rows.stream().map(PageviewRow::id).toList();
        for (List<String> chunk : chunks(ids, LOOKUP)) {
            jdbc.query("SELECT e.pageview_id, e.engaged_ms FROM " + keyed("page_end e", "e.pageview_id", chunk.size(), 64, ""),
                    ps -> bindKeys(ps, chunk, siteId),
                    rs -> {
                        if (rs.getString(1) != null) {
                            engaged.put(rs.getString(1), rs.getLong(2));
                        }
                    });
            jdbc.query("""
                            SELECT i.pageview_id, SUM(i.revenue_micros), COUNT(*),
                                   SUM(CASE WHEN i.viewable THEN 1 ELSE 0 END), SUM(CASE WHEN i.clicked THEN 1 ELSE 0 END)
                            FROM""" + " " + keyed("impression i", "i.pageview_id", chunk.size(), 64, "")
                            + " GROUP BY i.pageview_id",
                    ps -> bindKeys(ps, chunk, siteId),
                    rs -> {
                        if (rs.getString(1) == null) {
                            return;
                        }
                        ads.put(rs.getString(1), new long[]{rs.getLong(2), rs.getLong(3), rs.getLong(4), rs.getLong(5)});
                    });
        }
        if (engaged.isEmpty() && ads.isEmpty()) {
            return rows;
        }
        List<PageviewRow> out = new ArrayList<>(rows.size());
        for (PageviewRow p : rows) {
            Long e = engaged.get(p.id());
            long[] a = ads.get(p.id());
            out.add(e == null && a == null ? p : new PageviewRow(p.id(), p.ts(), p.visitor(), p.clientSession(),
                    p.path(), p.source(), p.device(), p.browser(), p.os(), p.country(), p.region(), p.variant(),
                    p.ads(), e != null ? e : p.engagedMs(), a == null ? 0 : a[0], a == null ? 0 : (int) a[1],
                    a == null ? 0 : (int) a[2], a == null ? 0 : (int) a[3]));
        }
        return out;
    }

    /**
     * A FROM clause for the rows of {@code table} (name and alias) of one site whose {@code column} is one of at most
     * {@link #LOOKUP} keys and that meet {@code more} (" AND …"), in a form each database answers with one index seek
     * per key. On H2 the keys are a {@code VALUES} list on the left of a LEFT JOIN (an outer join is never
     * reordered), which yields a row of NULLs for a key without a match; an {@code IN} list is used only on the first
     * column of an index there. On PostgreSQL the keys are an array, joined LATERAL so that the planner can only
     * loop over them: a {@code VALUES} join is planned as a hash join over a scan of the whole table, and
     * {@code = ANY(array)} is estimated to match nearly every row, so while a table that grew inside the transaction
     * still has the statistics of an empty one the planner scanned another index per look-up (docs/benchmarks.md,
     * "Sessionizer"). Parameters: the keys, then the site, then those of {@code more} (see {@link #bindKeys}).
     */
    private String keyed(String table, String column, int keys, int length, String more) {
        String alias = table.substring(table.indexOf(' ') + 1);
        if (dialect.postgres()) {
            return "unnest(CAST(? AS VARCHAR(" + length + ")[])) AS v (k) CROSS JOIN LATERAL (SELECT * FROM " + table
                    + " WHERE " + column + " = v.k AND " + alias + ".site_id = ?" + more + ") " + alias;
        }
        return values(keys, "k", length) + " LEFT JOIN " + table + " ON " + column + " = v.k AND " + alias
                + ".site_id = ?" + more;
    }

    /** Binds the keys and the site of a {@link #keyed} clause; returns the next parameter index. */
    private int bindKeys(java.sql.PreparedStatement ps, List<String> keys, long siteId) throws SQLException {
        int i;
        if (dialect.postgres()) {
            ps.setArray(1, ps.getConnection().createArrayOf("varchar", keys.toArray()));
            i = 2;
        } else {
            i = bindPadded(ps, keys);
        }
        ps.setLong(i, siteId);
        return i + 1;
    }

    /** {@code (VALUES (CAST(? AS VARCHAR(n))), …) AS v (column)} with a padded number of rows (see bindPadded). */
    private static String values(int n, String column, int length) {
        int rows = padded(n);
        StringBuilder sb = new StringBuilder(rows * 30 + 40).append("(VALUES ");
        String row = "(CAST(? AS VARCHAR(" + length + ")))";
        for (int i = 0; i < rows; i++) {
            sb.append(i == 0 ? "" : ", ").append(row);
        }
        return sb.append(") AS v (").append(column).append(')').toString();
    }

    /**
     * Binds the keys from parameter 1 on and NULL for the padding rows (which match nothing); returns the next
     * parameter index. Padding to a power of two keeps the number of distinct statements small for the databases'
     * statement caches.
     */
    private static int bindPadded(java.sql.PreparedStatement ps, List<String> keys) throws SQLException {
        int rows = padded(keys.size());
        for (int i = 0; i < rows; i++) {
            if (i < keys.size()) {
                ps.setString(i + 1, keys.get(i));
            } else {
                ps.setNull(i + 1, Types.VARCHAR);
            }
        }
        return rows + 1;
    }

    private static int padded(int n) {
        if (n > LOOKUP) {
            throw new IllegalArgumentException("at most " + LOOKUP + " keys per look-up, got " + n);
        }
        return Math.max(16, Integer.highestOneBit(Math.max(1, n - 1)) << 1);
    }

    private static String prefixed(String alias, String columns) {
        StringBuilder sb = new StringBuilder();
        for (String c : columns.split(",")) {
            sb.append(sb.isEmpty() ? "" : ", ").append(alias).append('.').append(c.strip());
        }
        return sb.append(' ').toString();
    }

    private static PageviewRow pageview(ResultSet rs) throws SQLException {
        long engaged = rs.getLong(14);
        Long engagedMs = rs.wasNull() ? null : engaged;
        return new PageviewRow(rs.getString(1), instant(rs, 2), rs.getString(3), rs.getString(4), rs.getString(5),
                rs.getString(6), rs.getString(7), rs.getString(8), rs.getString(9), rs.getString(10),
                rs.getString(11), rs.getString(12), rs.getInt(13), engagedMs, 0, 0, 0, 0);
    }

    /** One keyed delete per session, batched (an {@code IN} list on the key's third column scans on H2). */
    void deleteTagSessions(long siteId, List<String> ids) {
        jdbc.batchUpdate("DELETE FROM session_fact WHERE site_id = ? AND origin = 'tag' AND id = ?", ids, 1000,
                (ps, id) -> {
                    ps.setLong(1, siteId);
                    ps.setString(2, id);
                });
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

    private static final String INSERT_SESSION = "INSERT INTO session_fact (" + SESSION_COLUMNS + ", rolled_up, updated_at) VALUES ";
    private static final String SESSION_TUPLE = "(" + "?, ".repeat(28) + "TRUE, ?)";
    /** Sessions per multi-row INSERT on PostgreSQL (29 parameters each). */
    private static final int ROWS_PER_INSERT = 50;

    private int[][] insert(List<SessionFact> sessions, Instant now, String onConflict) {
        if (sessions.isEmpty()) {
            return new int[0][];
        }
        Timestamp updated = Timestamp.from(now);
        if (onConflict.isEmpty() && dialect.postgres()) {
            // one statement per 50 sessions saves a round trip and an executor start per row; the per-row counts
            // are not needed here (imports, which need them, keep single-row statements)
            List<List<SessionFact>> chunks = chunks(sessions, ROWS_PER_INSERT);
            List<SessionFact> last = chunks.remove(chunks.size() - 1);
            if (!chunks.isEmpty()) {
                jdbc.batchUpdate(INSERT_SESSION + String.join(", ", java.util.Collections.nCopies(ROWS_PER_INSERT,
                        SESSION_TUPLE)), chunks, 40, (ps, chunk) -> {
                    for (int i = 0; i < chunk.size(); i++) {
                        bindSession(ps, i * 29, chunk.get(i), updated);
                    }
                });
            }
            jdbc.update(INSERT_SESSION + String.join(", ", java.util.Collections.nCopies(last.size(), SESSION_TUPLE)),
                    ps -> {
                        for (int i = 0; i < last.size(); i++) {
                            bindSession(ps, i * 29, last.get(i), updated);
                        }
                    });
            return new int[0][];
        }
        return jdbc.batchUpdate(INSERT_SESSION + SESSION_TUPLE + onConflict, sessions, 1000,
                (ps, s) -> bindSession(ps, 0, s, updated));
    }

    /** Sets one session's 29 parameters of {@link #SESSION_TUPLE} from position {@code o + 1} on. */
    private static void bindSession(java.sql.PreparedStatement ps, int o, SessionFact s, Timestamp updated)
            throws SQLException {
        ps.setLong(o + 1, s.siteId());
        ps.setString(o + 2, s.id());
        ps.setString(o + 3, s.origin());
        ps.setString(o + 4, s.visitor());
        ps.setString(o + 5, s.clientSession());
        ps.setTimestamp(o + 6, Timestamp.from(s.start()));
        ps.setTimestamp(o + 7, Timestamp.from(s.end()));
        ps.setObject(o + 8, s.localDay());
        ps.setInt(o + 9, s.localHour());
        ps.setInt(o + 10, s.pageviews());
        ps.setBoolean(o + 11, s.bounce());
        ps.setLong(o + 12, s.engagedMs());
        ps.setString(o + 13, s.entryPath());
        ps.setInt(o + 14, s.entryAds());
        if (s.laterAds() == null) {
            ps.setNull(o + 15, Types.DOUBLE);
        } else {
            ps.setDouble(o + 15, s.laterAds());
        }
        ps.setString(o + 16, s.source());
        ps.setString(o + 17, s.device());
        ps.setString(o + 18, s.browser());
        ps.setString(o + 19, s.os());
        ps.setString(o + 20, s.country());
        ps.setString(o + 21, s.region());
        ps.setString(o + 22, s.variant());
        ps.setLong(o + 23, s.revenueMicros());
        ps.setInt(o + 24, s.impressions());
        ps.setInt(o + 25, s.viewableImpressions());
        ps.setInt(o + 26, s.clicks());
        ps.setBoolean(o + 27, s.closed());
        ps.setString(o + 28, PageStat.encode(s.pages()));
        ps.setTimestamp(o + 29, updated);
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

    /**
     * The next imported sessions stored without rollup contributions yet, in (local day, id) order through the
     * pending index (V7), so that a chunk covers few days and its contributions aggregate into few rollup cells.
     * Only imports are ever stored without their contributions (built sessions and bulk loads add them at once).
     */
    List<SessionFact> notRolledUp(long siteId, int limit) {
        return jdbc.query("SELECT " + SESSION_COLUMNS + """
                         FROM session_fact WHERE site_id = ? AND rolled_up = FALSE AND origin = 'import'
                        ORDER BY local_day, id LIMIT ?""",
                SessionRepository::session, siteId, limit);
    }

    /**
     * Marks the sessions read by {@link #notRolledUp} (in its order) as rolled up with one UPDATE over their
     * (day, id) range. Returns false, having changed nothing the caller keeps, when the range held more pending rows
     * than were read (an import committed new ones into it meanwhile): the caller must roll back and use
     * {@link #markRolledUpOneByOne}. Their page detail is not stored: {@link ImportedPages} derives it from the
     * totals wherever it is needed.
     */
    boolean markRolledUp(long siteId, List<SessionFact> sessions) {
        SessionFact first = sessions.get(0);
        SessionFact last = sessions.get(sessions.size() - 1);
        int n = jdbc.update("""
                        UPDATE session_fact SET rolled_up = TRUE
                        WHERE site_id = ? AND rolled_up = FALSE AND origin = 'import' AND local_day BETWEEN ? AND ?
                          AND (local_day < ? OR id <= ?)""",
                siteId, first.localDay(), last.localDay(), last.localDay(), last.id());
        return n == sessions.size();
    }

    void markRolledUpOneByOne(long siteId, List<SessionFact> sessions) {
        jdbc.batchUpdate("UPDATE session_fact SET rolled_up = TRUE WHERE site_id = ? AND origin = ? AND id = ?",
                sessions, 1000, (ps, s) -> {
                    ps.setLong(1, siteId);
                    ps.setString(2, s.origin());
                    ps.setString(3, s.id());
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
