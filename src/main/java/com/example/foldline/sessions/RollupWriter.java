package com.example.foldline.sessions;

import java.sql.Date;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/**
 * Applies contributions to the rollup tables: add to the cell when it exists, insert it otherwise. Callers hold the
 * site's sessionizer lock, so the update-then-insert pair cannot race with another writer of the same site. On
 * PostgreSQL both happen in one array upsert per few thousand cells ({@link #upsertArrays}); on embedded H2, which
 * has no round trips to save, as JDBC batches of single-row statements.
 */
@Repository
class RollupWriter {

    private final JdbcTemplate jdbc;
    private final SqlDialect dialect;

    RollupWriter(JdbcTemplate jdbc, SqlDialect dialect) {
        this.jdbc = jdbc;
        this.dialect = dialect;
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
        if (dialect.postgres()) {
            upsertArrays(siteId, "rollup_session", SESSION_COLUMNS, rows, fresh ? "" : SESSION_UPSERT);
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
                          AND pages = ? AND entry_path = ?""", rows, 2000, (ps, e) -> bind(ps, SESSION_COLUMNS, SESSION_MEASURES, siteId, e));
        List<Map.Entry<Contributions.SessionCell, Contributions.SessionMeasures>> missing = missing(rows, updated);
        if (missing.isEmpty()) {
            return;
        }
        jdbc.batchUpdate(SESSION_INSERT + "(" + "?, ".repeat(24) + "?)", missing, 2000,
                (ps, e) -> bind(ps, SESSION_COLUMNS, SESSION_MEASURES, siteId, e));
    }

    private static final String SESSION_INSERT = """
            INSERT INTO rollup_session (sessions, bounces, pageviews, pageviews_sq, engaged_ms, engaged_sq,
                   revenue_micros, revenue_sq, entry_ads_sum, impressions, viewable_impressions, clicks,
                   site_id, cuboid, local_day, local_hour, device, source, browser, variant, country, region, entry_ads,
                   pages, entry_path)
            VALUES\s""";

    /** PostgreSQL: one statement adds to existing cells and inserts the missing ones. */
    private static final String SESSION_UPSERT = """
             ON CONFLICT (site_id, cuboid, local_day, local_hour, device, source, browser, variant, country, region,
                          entry_ads, pages, entry_path)
            DO UPDATE SET sessions = rollup_session.sessions + EXCLUDED.sessions,
                   bounces = rollup_session.bounces + EXCLUDED.bounces,
                   pageviews = rollup_session.pageviews + EXCLUDED.pageviews,
                   pageviews_sq = rollup_session.pageviews_sq + EXCLUDED.pageviews_sq,
                   engaged_ms = rollup_session.engaged_ms + EXCLUDED.engaged_ms,
                   engaged_sq = rollup_session.engaged_sq + EXCLUDED.engaged_sq,
                   revenue_micros = rollup_session.revenue_micros + EXCLUDED.revenue_micros,
                   revenue_sq = rollup_session.revenue_sq + EXCLUDED.revenue_sq,
                   entry_ads_sum = rollup_session.entry_ads_sum + EXCLUDED.entry_ads_sum,
                   impressions = rollup_session.impressions + EXCLUDED.impressions,
                   viewable_impressions = rollup_session.viewable_impressions + EXCLUDED.viewable_impressions,
                   clicks = rollup_session.clicks + EXCLUDED.clicks""";

    private void applyPages(long siteId, Map<Contributions.PageCell, Contributions.PageMeasures> cells,
                            boolean fresh) {
        List<Map.Entry<Contributions.PageCell, Contributions.PageMeasures>> rows = new ArrayList<>();
        cells.entrySet().stream().filter(e -> !e.getValue().isZero()).forEach(rows::add);
        if (rows.isEmpty()) {
            return;
        }
        if (dialect.postgres()) {
            upsertArrays(siteId, "rollup_page", PAGE_COLUMNS, rows, fresh ? "" : PAGE_UPSERT);
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
                          AND engaged_bucket = ?""", rows, 2000, (ps, e) -> bind(ps, PAGE_COLUMNS, PAGE_MEASURES, siteId, e));
        List<Map.Entry<Contributions.PageCell, Contributions.PageMeasures>> missing = missing(rows, updated);
        if (missing.isEmpty()) {
            return;
        }
        jdbc.batchUpdate(PAGE_INSERT + "(" + "?, ".repeat(19) + "?)", missing, 2000,
                (ps, e) -> bind(ps, PAGE_COLUMNS, PAGE_MEASURES, siteId, e));
    }

    private static final String PAGE_INSERT = """
            INSERT INTO rollup_page (pageviews, exits, engaged_ms, revenue_micros, revenue_sq, impressions,
                   viewable_impressions, clicks, site_id, cuboid, local_day, device, source, browser, variant,
                   country, region, ads, page_position, engaged_bucket)
            VALUES\s""";

    private static final String PAGE_UPSERT = """
             ON CONFLICT (site_id, cuboid, local_day, device, source, browser, variant, country, region, ads,
                          page_position, engaged_bucket)
            DO UPDATE SET pageviews = rollup_page.pageviews + EXCLUDED.pageviews,
                   exits = rollup_page.exits + EXCLUDED.exits,
                   engaged_ms = rollup_page.engaged_ms + EXCLUDED.engaged_ms,
                   revenue_micros = rollup_page.revenue_micros + EXCLUDED.revenue_micros,
                   revenue_sq = rollup_page.revenue_sq + EXCLUDED.revenue_sq,
                   impressions = rollup_page.impressions + EXCLUDED.impressions,
                   viewable_impressions = rollup_page.viewable_impressions + EXCLUDED.viewable_impressions,
                   clicks = rollup_page.clicks + EXCLUDED.clicks""";

    /** One column of an array upsert: its name, the PostgreSQL array element type, and its value in a row. */
    private record Column<T>(String name, String type, java.util.function.Function<T, Object> value) {
    }

    private static <T> Column<T> col(String name, String type, java.util.function.Function<T, Object> value) {
        return new Column<>(name, type, value);
    }

    private static final List<Column<Map.Entry<Contributions.SessionCell, Contributions.SessionMeasures>>>
            SESSION_COLUMNS = List.of(
            col("sessions", "int8", e -> e.getValue().sessions), col("bounces", "int8", e -> e.getValue().bounces),
            col("pageviews", "int8", e -> e.getValue().pageviews),
            col("pageviews_sq", "float8", e -> e.getValue().pageviewsSq),
            col("engaged_ms", "int8", e -> e.getValue().engagedMs),
            col("engaged_sq", "float8", e -> e.getValue().engagedSq),
            col("revenue_micros", "int8", e -> e.getValue().revenueMicros),
            col("revenue_sq", "float8", e -> e.getValue().revenueSq),
            col("entry_ads_sum", "int8", e -> e.getValue().entryAdsSum),
            col("impressions", "int8", e -> e.getValue().impressions),
            col("viewable_impressions", "int8", e -> e.getValue().viewable),
            col("clicks", "int8", e -> e.getValue().clicks),
            col("cuboid", "int4", e -> e.getKey().cuboid()), col("local_day", "date", e -> Date.valueOf(e.getKey().day())),
            col("local_hour", "int4", e -> e.getKey().hour()), col("device", "varchar", e -> e.getKey().device()),
            col("source", "varchar", e -> e.getKey().source()), col("browser", "varchar", e -> e.getKey().browser()),
            col("variant", "varchar", e -> e.getKey().variant()), col("country", "varchar", e -> e.getKey().country()),
            col("region", "varchar", e -> e.getKey().region()), col("entry_ads", "int4", e -> e.getKey().entryAds()),
            col("pages", "int4", e -> e.getKey().pages()), col("entry_path", "varchar", e -> e.getKey().entryPath()));

    private static final List<Column<Map.Entry<Contributions.PageCell, Contributions.PageMeasures>>>
            PAGE_COLUMNS = List.of(
            col("pageviews", "int8", e -> e.getValue().pageviews), col("exits", "int8", e -> e.getValue().exits),
            col("engaged_ms", "int8", e -> e.getValue().engagedMs),
            col("revenue_micros", "int8", e -> e.getValue().revenueMicros),
            col("revenue_sq", "float8", e -> e.getValue().revenueSq),
            col("impressions", "int8", e -> e.getValue().impressions),
            col("viewable_impressions", "int8", e -> e.getValue().viewable),
            col("clicks", "int8", e -> e.getValue().clicks),
            col("cuboid", "int4", e -> e.getKey().cuboid()), col("local_day", "date", e -> Date.valueOf(e.getKey().day())),
            col("device", "varchar", e -> e.getKey().device()), col("source", "varchar", e -> e.getKey().source()),
            col("browser", "varchar", e -> e.getKey().browser()), col("variant", "varchar", e -> e.getKey().variant()),
            col("country", "varchar", e -> e.getKey().country()), col("region", "varchar", e -> e.getKey().region()),
            col("ads", "int4", e -> e.getKey().ads()), col("page_position", "int4", e -> e.getKey().position()),
            col("engaged_bucket", "int4", e -> e.getKey().engagedBucket()));

    /** How many of the first columns above are measures (the rest are the key, after the site). */
    private static final int SESSION_MEASURES = 12;
    private static final int PAGE_MEASURES = 8;

    /** Cells per array upsert statement. */
    private static final int ARRAY_ROWS = 5_000;

    /**
     * PostgreSQL: adds the cells with {@code INSERT … SELECT FROM unnest(one array per column) ON CONFLICT DO UPDATE},
     * {@link #ARRAY_ROWS} cells a statement: one parse and one plan for thousands of rows, instead of an UPDATE and
     * maybe an INSERT per cell (the sessionizer's rollup step took 10–11 s for 200,000 pageviews that way; see
     * docs/benchmarks.md, "Sessionizer").
     */
    private <T> void upsertArrays(long siteId, String table, List<Column<T>> columns, List<T> rows, String tail) {
        StringBuilder names = new StringBuilder();
        StringBuilder arrays = new StringBuilder();
        for (Column<T> c : columns) {
            names.append(", ").append(c.name());
            arrays.append(arrays.isEmpty() ? "" : ", ").append("CAST(? AS ").append(c.type()).append("[])");
        }
        // table and column names are constants of this class, never input
        String sql = "INSERT INTO " + table + " (site_id" + names + ") SELECT CAST(? AS BIGINT), u.* FROM unnest("
                + arrays + ") AS u" + tail;
        for (int from = 0; from < rows.size(); from += ARRAY_ROWS) {
            List<T> chunk = rows.subList(from, Math.min(rows.size(), from + ARRAY_ROWS));
            jdbc.update(con -> {
                java.sql.PreparedStatement ps = con.prepareStatement(sql);
                ps.setLong(1, siteId);
                for (int i = 0; i < columns.size(); i++) {
                    Column<T> c = columns.get(i);
                    Object[] values = new Object[chunk.size()];
                    for (int r = 0; r < values.length; r++) {
                        values[r] = c.value().apply(chunk.get(r));
                    }
                    ps.setArray(i + 2, con.createArrayOf(c.type(), values));
                }
                return ps;
            });
        }
    }

    /**
     * Binds one cell in the order the single-row UPDATE and INSERT statements use: its first {@code measures}
     * columns, then the site, then the key columns.
     */
    private static <T> void bind(java.sql.PreparedStatement ps, List<Column<T>> columns, int measures, long siteId,
                                 T row) throws java.sql.SQLException {
        int p = 1;
        for (int i = 0; i < columns.size(); i++) {
            if (i == measures) {
                ps.setLong(p++, siteId);
            }
            ps.setObject(p++, columns.get(i).value().apply(row));
        }
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
        // a weekly twin's cell (under its Monday) exists once any day of its week has rows: look six days further
        java.time.LocalDate max = days.stream().max(java.util.Comparator.naturalOrder()).orElseThrow().plusDays(6);
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

    /** Removes every rollup row of a site (before a rebuild), and its record of built weeks. */
    void clear(long siteId) {
        jdbc.update("DELETE FROM rollup_session WHERE site_id = ?", siteId);
        jdbc.update("DELETE FROM rollup_page WHERE site_id = ?", siteId);
        jdbc.update("DELETE FROM rollup_week WHERE site_id = ?", siteId);
    }

    // ---- weekly twins (WeeklyViews) ----

    private static final String SESSION_KEYS = "local_hour, device, source, browser, variant, country, region, "
            + "entry_ads, pages, entry_path";
    private static final String SESSION_SUMS = "sessions, bounces, pageviews, pageviews_sq, engaged_ms, engaged_sq, "
            + "revenue_micros, revenue_sq, entry_ads_sum, impressions, viewable_impressions, clicks";
    private static final String PAGE_KEYS = "device, source, browser, variant, country, region, ads, page_position, "
            + "engaged_bucket";
    private static final String PAGE_SUMS = "pageviews, exits, engaged_ms, revenue_micros, revenue_sq, impressions, "
            + "viewable_impressions, clicks";

    /** The Monday of the last week whose weekly twins are built for the site, or null. */
    java.time.LocalDate weeksBuiltThrough(long siteId) {
        List<java.time.LocalDate> d = jdbc.query("SELECT built_through FROM rollup_week WHERE site_id = ?",
                (rs, i) -> rs.getObject(1, java.time.LocalDate.class), siteId);
        return d.isEmpty() ? null : d.get(0);
    }

    void weeksBuiltThrough(long siteId, java.time.LocalDate monday) {
        if (jdbc.update("UPDATE rollup_week SET built_through = ? WHERE site_id = ?", Date.valueOf(monday),
                siteId) == 0) {
            jdbc.update("INSERT INTO rollup_week (site_id, built_through) VALUES (?, ?)", siteId,
                    Date.valueOf(monday));
        }
    }

    /** Removes the site's weekly twin rows and its record of built weeks (they are built again). */
    void forgetWeeks(long siteId) {
        jdbc.update("DELETE FROM rollup_session WHERE site_id = ? AND cuboid IN (" + ids(twins(Cuboid.SESSION)) + ")",
                siteId);
        jdbc.update("DELETE FROM rollup_page WHERE site_id = ? AND cuboid IN (" + ids(twins(Cuboid.PAGE)) + ")",
                siteId);
        jdbc.update("DELETE FROM rollup_week WHERE site_id = ?", siteId);
    }

    /** The site's first local day with rollups, or null. */
    java.time.LocalDate firstDay(long siteId) {
        return jdbc.queryForObject("SELECT MIN(local_day) FROM rollup_session WHERE site_id = ? AND cuboid = 0",
                (rs, i) -> rs.getObject(1, java.time.LocalDate.class), siteId);
    }

    /**
     * Builds every weekly twin's cells of the week starting on {@code monday} from its daily view's cells of that
     * week: one INSERT … SELECT … GROUP BY per twin, a range of the primary key (site, view, day) each (H2 uses an
     * {@code IN} list only on an index's first column, so one statement for all views would scan the site).
     */
    void buildWeek(long siteId, java.time.LocalDate monday) {
        Date from = Date.valueOf(monday);
        Date to = Date.valueOf(monday.plusDays(6));
        // a week after the last built one has no twin rows: nothing adds to twins of unbuilt weeks (Contributions)
        // view ids and column names are constants of this class and of Cuboid, never input
        for (Cuboid twin : Cuboid.SESSION.stream().filter(Cuboid::weekly).toList()) {
            jdbc.update("INSERT INTO rollup_session (site_id, cuboid, local_day, " + SESSION_KEYS + ", " + SESSION_SUMS
                    + ") SELECT site_id, " + twin.id() + ", ?, " + SESSION_KEYS + ", " + sums(SESSION_SUMS)
                    + " FROM rollup_session WHERE site_id = ? AND cuboid = " + twin.weekOf()
                    + " AND local_day BETWEEN ? AND ? GROUP BY site_id, " + SESSION_KEYS, from, siteId, from, to);
        }
        for (Cuboid twin : Cuboid.PAGE.stream().filter(Cuboid::weekly).toList()) {
            jdbc.update("INSERT INTO rollup_page (site_id, cuboid, local_day, " + PAGE_KEYS + ", " + PAGE_SUMS
                    + ") SELECT site_id, " + twin.id() + ", ?, " + PAGE_KEYS + ", " + sums(PAGE_SUMS)
                    + " FROM rollup_page WHERE site_id = ? AND cuboid = " + twin.weekOf()
                    + " AND local_day BETWEEN ? AND ? GROUP BY site_id, " + PAGE_KEYS, from, siteId, from, to);
        }
    }

    private static List<Integer> twins(List<Cuboid> views) {
        return views.stream().filter(Cuboid::weekly).map(Cuboid::id).toList();
    }

    private static String sums(String columns) {
        return String.join(", ", java.util.Arrays.stream(columns.split(", ")).map(c -> "SUM(" + c + ")").toList());
    }
}
