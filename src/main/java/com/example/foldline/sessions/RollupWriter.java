package com.example.foldline.sessions;

import java.sql.Date;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/**
 * Applies contributions to the rollup tables: add to the cell when it exists, insert it otherwise. Callers hold the
 * site's sessionizer lock, so the update-then-insert pair cannot race with another writer of the same site.
 */
@Repository
class RollupWriter {

    private final JdbcTemplate jdbc;

    RollupWriter(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    void apply(long siteId, Contributions c) {
        applySessions(siteId, c.sessionCells, false);
        applyPages(siteId, c.pageCells, false);
    }

    /** Inserts every cell without trying updates: the caller knows none of them exists (a view being filled). */
    void insert(long siteId, Contributions c) {
        applySessions(siteId, c.sessionCells, true);
        applyPages(siteId, c.pageCells, true);
    }

    private void applySessions(long siteId, Map<Contributions.SessionCell, Contributions.SessionMeasures> cells,
                               boolean fresh) {
        List<Map.Entry<Contributions.SessionCell, Contributions.SessionMeasures>> rows = new ArrayList<>();
        cells.entrySet().stream().filter(e -> !e.getValue().isZero()).forEach(rows::add);
        if (rows.isEmpty()) {
            return;
        }
        // cells of days the table has no rows for yet (bulk loads of history) are inserted without trying updates
        int[][] updated = fresh || !hasRows("rollup_session", FIRST_SESSION_VIEW, siteId, rows.stream().map(e -> e.getKey().day()).toList())
                ? allMissing(rows.size()) : jdbc.batchUpdate("""
                        UPDATE rollup_session SET sessions = sessions + ?, bounces = bounces + ?,
                               pageviews = pageviews + ?, pageviews_sq = pageviews_sq + ?, engaged_ms = engaged_ms + ?,
                               engaged_sq = engaged_sq + ?, revenue_micros = revenue_micros + ?,
                               revenue_sq = revenue_sq + ?, entry_ads_sum = entry_ads_sum + ?,
                               impressions = impressions + ?, viewable_impressions = viewable_impressions + ?,
                               clicks = clicks + ?
                        WHERE site_id = ? AND cuboid = ? AND local_day = ? AND local_hour = ? AND device = ? AND source = ?
                          AND browser = ? AND variant = ? AND country = ? AND region = ? AND entry_ads = ?
                          AND pages = ? AND entry_path = ?""", rows, 2000, (ps, e) -> sessionRow(ps, 0, siteId, e));
        List<Map.Entry<Contributions.SessionCell, Contributions.SessionMeasures>> missing = missing(rows, updated);
        if (missing.isEmpty()) {
            return;
        }
        insertRows("""
                        INSERT INTO rollup_session (sessions, bounces, pageviews, pageviews_sq, engaged_ms, engaged_sq,
                               revenue_micros, revenue_sq, entry_ads_sum, impressions, viewable_impressions, clicks,
                               site_id, cuboid, local_day, local_hour, device, source, browser, variant, country, region, entry_ads,
                               pages, entry_path)
                        VALUES\s""", 25, missing, (ps, o, e) -> sessionRow(ps, o, siteId, e));
    }

    private void applyPages(long siteId, Map<Contributions.PageCell, Contributions.PageMeasures> cells,
                            boolean fresh) {
        List<Map.Entry<Contributions.PageCell, Contributions.PageMeasures>> rows = new ArrayList<>();
        cells.entrySet().stream().filter(e -> !e.getValue().isZero()).forEach(rows::add);
        if (rows.isEmpty()) {
            return;
        }
        int[][] updated = fresh || !hasRows("rollup_page", FIRST_PAGE_VIEW, siteId, rows.stream().map(e -> e.getKey().day()).toList())
                ? allMissing(rows.size()) : jdbc.batchUpdate("""
                        UPDATE rollup_page SET pageviews = pageviews + ?, exits = exits + ?, engaged_ms = engaged_ms + ?,
                               revenue_micros = revenue_micros + ?, revenue_sq = revenue_sq + ?,
                               impressions = impressions + ?, viewable_impressions = viewable_impressions + ?,
                               clicks = clicks + ?
                        WHERE site_id = ? AND cuboid = ? AND local_day = ? AND device = ? AND source = ? AND browser = ?
                          AND variant = ? AND country = ? AND region = ? AND ads = ? AND page_position = ?
                          AND engaged_bucket = ?""", rows, 2000, (ps, e) -> pageRow(ps, 0, siteId, e));
        List<Map.Entry<Contributions.PageCell, Contributions.PageMeasures>> missing = missing(rows, updated);
        if (missing.isEmpty()) {
            return;
        }
        insertRows("""
                        INSERT INTO rollup_page (pageviews, exits, engaged_ms, revenue_micros, revenue_sq, impressions,
                               viewable_impressions, clicks, site_id, cuboid, local_day, device, source, browser, variant,
                               country, region, ads, page_position, engaged_bucket)
                        VALUES\s""", 20, missing, (ps, o, e) -> pageRow(ps, o, siteId, e));
    }

    /** Sets one row's parameters from position {@code offset + 1} on. */
    @FunctionalInterface
    private interface RowSetter<T> {
        void set(java.sql.PreparedStatement ps, int offset, T row) throws java.sql.SQLException;
    }

    /**
     * Rows per INSERT statement: on PostgreSQL multi-row VALUES lists save a round trip and a statement per row
     * (the bulk load rate doubled in the metrics benchmark); embedded H2 has no round trip and was slower with them.
     */
    private int rowsPerInsert() {
        Integer n = rowsPerInsert;
        if (n == null) {
            String product = jdbc.execute((java.sql.Connection c) -> c.getMetaData().getDatabaseProductName());
            n = "PostgreSQL".equals(product) ? 50 : 1;
            rowsPerInsert = n;
        }
        return n;
    }

    private volatile Integer rowsPerInsert;

    /**
     * Inserts {@code rows} with statements of {@link #rowsPerInsert} value lists each (sent as one JDBC batch),
     * then one statement for the remainder.
     */
    private <T> void insertRows(String head, int columns, List<T> rows, RowSetter<T> setter) {
        String tuple = "(" + "?, ".repeat(columns - 1) + "?)";
        int per = rowsPerInsert();
        int full = rows.size() / per;
        if (full > 0) {
            List<List<T>> chunks = new ArrayList<>(full);
            for (int i = 0; i < full; i++) {
                chunks.add(rows.subList(i * per, (i + 1) * per));
            }
            jdbc.batchUpdate(head + String.join(", ", java.util.Collections.nCopies(per, tuple)), chunks,
                    Math.max(40, 2000 / per), (ps, chunk) -> {
                        for (int i = 0; i < chunk.size(); i++) {
                            setter.set(ps, i * columns, chunk.get(i));
                        }
                    });
        }
        List<T> rest = rows.subList(full * per, rows.size());
        if (!rest.isEmpty()) {
            jdbc.update(head + String.join(", ", java.util.Collections.nCopies(rest.size(), tuple)), ps -> {
                for (int i = 0; i < rest.size(); i++) {
                    setter.set(ps, i * columns, rest.get(i));
                }
            });
        }
    }

    /** Measures, then key: the order both the UPDATE and the INSERT of rollup_session use. */
    private static void sessionRow(java.sql.PreparedStatement ps, int o, long siteId,
                       Map.Entry<Contributions.SessionCell, Contributions.SessionMeasures> e)
            throws java.sql.SQLException {
        Contributions.SessionMeasures m = e.getValue();
        Contributions.SessionCell k = e.getKey();
        ps.setLong(o + 1, m.sessions);
        ps.setLong(o + 2, m.bounces);
        ps.setLong(o + 3, m.pageviews);
        ps.setDouble(o + 4, m.pageviewsSq);
        ps.setLong(o + 5, m.engagedMs);
        ps.setDouble(o + 6, m.engagedSq);
        ps.setLong(o + 7, m.revenueMicros);
        ps.setDouble(o + 8, m.revenueSq);
        ps.setLong(o + 9, m.entryAdsSum);
        ps.setLong(o + 10, m.impressions);
        ps.setLong(o + 11, m.viewable);
        ps.setLong(o + 12, m.clicks);
        ps.setLong(o + 13, siteId);
        ps.setInt(o + 14, k.cuboid());
        ps.setDate(o + 15, Date.valueOf(k.day()));
        ps.setInt(o + 16, k.hour());
        ps.setString(o + 17, k.device());
        ps.setString(o + 18, k.source());
        ps.setString(o + 19, k.browser());
        ps.setString(o + 20, k.variant());
        ps.setString(o + 21, k.country());
        ps.setString(o + 22, k.region());
        ps.setInt(o + 23, k.entryAds());
        ps.setInt(o + 24, k.pages());
        ps.setString(o + 25, k.entryPath());
    }

    private static void pageRow(java.sql.PreparedStatement ps, int o, long siteId,
                                Map.Entry<Contributions.PageCell, Contributions.PageMeasures> e)
            throws java.sql.SQLException {
        Contributions.PageMeasures m = e.getValue();
        Contributions.PageCell k = e.getKey();
        ps.setLong(o + 1, m.pageviews);
        ps.setLong(o + 2, m.exits);
        ps.setLong(o + 3, m.engagedMs);
        ps.setLong(o + 4, m.revenueMicros);
        ps.setDouble(o + 5, m.revenueSq);
        ps.setLong(o + 6, m.impressions);
        ps.setLong(o + 7, m.viewable);
        ps.setLong(o + 8, m.clicks);
        ps.setLong(o + 9, siteId);
        ps.setInt(o + 10, k.cuboid());
        ps.setDate(o + 11, Date.valueOf(k.day()));
        ps.setString(o + 12, k.device());
        ps.setString(o + 13, k.source());
        ps.setString(o + 14, k.browser());
        ps.setString(o + 15, k.variant());
        ps.setString(o + 16, k.country());
        ps.setString(o + 17, k.region());
        ps.setInt(o + 18, k.ads());
        ps.setInt(o + 19, k.position());
        ps.setInt(o + 20, k.engagedBucket());
    }

    /**
     * Views of the first lattice: every day that has rows in a rollup table has rows in these (each session adds to
     * every view, and these were filled from the start), so asking one of them is enough, and it is a range of the
     * primary key (site, view, day) instead of a scan of the site's rows.
     */
    private static final int FIRST_SESSION_VIEW = Cuboid.SESSION.stream().filter(c -> c.lattice() == 1).findFirst()
            .orElseThrow().id();
    private static final int FIRST_PAGE_VIEW = Cuboid.PAGE.stream().filter(c -> c.lattice() == 1).findFirst()
            .orElseThrow().id();

    private boolean hasRows(String table, int view, long siteId, List<java.time.LocalDate> days) {
        java.time.LocalDate min = days.stream().min(java.util.Comparator.naturalOrder()).orElseThrow();
        java.time.LocalDate max = days.stream().max(java.util.Comparator.naturalOrder()).orElseThrow();
        // the table name is one of two constants, never input
        return Boolean.TRUE.equals(jdbc.queryForObject("SELECT EXISTS (SELECT 1 FROM " + table
                + " WHERE site_id = ? AND cuboid = ? AND local_day BETWEEN ? AND ?)", Boolean.class, siteId, view,
                Date.valueOf(min), Date.valueOf(max)));
    }

    private static int[][] allMissing(int n) {
        return new int[][]{new int[n]};
    }

    private static <T> List<T> missing(List<T> rows, int[][] updated) {
        List<T> missing = new ArrayList<>();
        int i = 0;
        for (int[] batch : updated) {
            for (int count : batch) {
                if (count == 0) {
                    missing.add(rows.get(i));
                }
                i++;
            }
        }
        return missing;
    }

    /** Removes the rows of the given views of a site for local days {@code from}..{@code to}. */
    void clear(long siteId, List<Integer> sessionViews, List<Integer> pageViews, java.time.LocalDate from,
               java.time.LocalDate to) {
        // view ids are integers from Cuboid, never input
        if (!sessionViews.isEmpty()) {
            jdbc.update("DELETE FROM rollup_session WHERE site_id = ? AND cuboid IN (" + ids(sessionViews)
                    + ") AND local_day BETWEEN ? AND ?", siteId, Date.valueOf(from), Date.valueOf(to));
        }
        if (!pageViews.isEmpty()) {
            jdbc.update("DELETE FROM rollup_page WHERE site_id = ? AND cuboid IN (" + ids(pageViews)
                    + ") AND local_day BETWEEN ? AND ?", siteId, Date.valueOf(from), Date.valueOf(to));
        }
    }

    private static String ids(List<Integer> ids) {
        return String.join(", ", ids.stream().map(String::valueOf).toList());
    }

    /** Removes every rollup row of a site (before a rebuild). */
    void clear(long siteId) {
        jdbc.update("DELETE FROM rollup_session WHERE site_id = ?", siteId);
        jdbc.update("DELETE FROM rollup_page WHERE site_id = ?", siteId);
    }
}
