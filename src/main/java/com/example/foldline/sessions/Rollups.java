package com.example.foldline.sessions;

import java.sql.Date;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.EnumSet;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.StringJoiner;
import java.util.function.Predicate;

import org.springframework.jdbc.core.namedparam.MapSqlParameterSource;
import org.springframework.jdbc.core.namedparam.NamedParameterJdbcTemplate;
import org.springframework.stereotype.Service;

/**
 * Answers grouped questions from the rollup views: the cheapest view holding every filtered and grouped dimension
 * is read; when no view holds the combination, sessions (and their page detail) are aggregated directly, the
 * documented fallback (docs/architecture.md). Column names come only from {@link Dim}; values are bound.
 */
@Service
public class Rollups {

    /**
     * Where an answer was read from, reported in answers so slow combinations are visible.
     *
     * @param weekly the weekly twin the range's whole weeks were read from, or null
     */
    public record Plan(String table, Integer cuboid, Integer weekly) {
        public String describe() {
            return cuboid == null ? table + " (no rollup view holds this combination)"
                    : table + " view " + cuboid + (weekly == null ? "" : ", whole weeks from view " + weekly);
        }
    }

    /** Grouped session measures. */
    public record SessionAnswer(Plan plan, List<Group<SessionTotals>> groups) {
        public SessionTotals total() {
            return groups.stream().map(Group::totals).reduce(SessionTotals.ZERO, SessionTotals::plus);
        }
    }

    /** Grouped page measures. */
    public record PageAnswer(Plan plan, List<Group<PageTotals>> groups) {
        public PageTotals total() {
            return groups.stream().map(Group::totals).reduce(PageTotals.ZERO, PageTotals::plus);
        }
    }

    private static final String SESSION_SUMS = """
            SUM(sessions) AS sessions, SUM(bounces) AS bounces, SUM(pageviews) AS pageviews,
            SUM(pageviews_sq) AS pageviews_sq, SUM(engaged_ms) AS engaged_ms, SUM(engaged_sq) AS engaged_sq,
            SUM(revenue_micros) AS revenue_micros, SUM(revenue_sq) AS revenue_sq, SUM(entry_ads_sum) AS entry_ads_sum,
            SUM(impressions) AS impressions, SUM(viewable_impressions) AS viewable_impressions, SUM(clicks) AS clicks""";

    private static final String FACT_SUMS = """
            COUNT(*) AS sessions, SUM(CASE WHEN bounce THEN 1 ELSE 0 END) AS bounces, SUM(pageviews) AS pageviews,
            SUM(CAST(pageviews AS DOUBLE PRECISION) * pageviews) AS pageviews_sq, SUM(engaged_ms) AS engaged_ms,
            SUM(CAST(engaged_ms AS DOUBLE PRECISION) * engaged_ms) AS engaged_sq,
            SUM(revenue_micros) AS revenue_micros,
            SUM(CAST(revenue_micros AS DOUBLE PRECISION) * revenue_micros) AS revenue_sq,
            SUM(entry_ads) AS entry_ads_sum, SUM(impressions) AS impressions,
            SUM(viewable_impressions) AS viewable_impressions, SUM(clicks) AS clicks""";

    private static final String PAGE_SUMS = """
            SUM(pageviews) AS pageviews, SUM(exits) AS exits, SUM(engaged_ms) AS engaged_ms,
            SUM(revenue_micros) AS revenue_micros, SUM(revenue_sq) AS revenue_sq, SUM(impressions) AS impressions,
            SUM(viewable_impressions) AS viewable_impressions, SUM(clicks) AS clicks""";

    private final NamedParameterJdbcTemplate jdbc;
    private final RollupFill fills;
    private final WeeklyViews weeks;

    Rollups(NamedParameterJdbcTemplate jdbc, RollupFill fills, WeeklyViews weeks) {
        this.jdbc = jdbc;
        this.fills = fills;
        this.weeks = weeks;
    }

    /** Session measures grouped by {@code groupBy} (and by day when {@code byDay}). */
    public SessionAnswer sessions(long siteId, SegmentFilter filter, List<Dim> groupBy, boolean byDay) {
        Set<Dim> needed = needed(filter, groupBy);
        Predicate<Cuboid> usable = fills.usable(siteId, filter.from());
        Optional<Cuboid> view = Cuboid.cheapest(Cuboid.SESSION, needed, usable);
        if (view.isEmpty()) {
            return sessionsFromFacts(siteId, filter, groupBy, byDay);
        }
        List<Cuboid.Part> parts = parts(siteId, Cuboid.SESSION, view.get(), usable, filter, byDay);
        return new SessionAnswer(plan("rollup_session", parts), readParts("rollup_session", SESSION_SUMS, parts,
                siteId, filter, groupBy, byDay, Rollups::sessionTotals, SessionTotals::plus));
    }

    /** Fallback: closed sessions aggregated directly (no view holds the combination). */
    private SessionAnswer sessionsFromFacts(long siteId, SegmentFilter filter, List<Dim> groupBy, boolean byDay) {
        MapSqlParameterSource params = new MapSqlParameterSource("site", siteId)
                .addValue("from", Date.valueOf(filter.from())).addValue("to", Date.valueOf(filter.to()));
        List<String> groupExprs = new ArrayList<>();
        if (byDay) {
            groupExprs.add("local_day");
        }
        groupBy.forEach(d -> groupExprs.add(factExpression(d)));
        StringBuilder sql = new StringBuilder("SELECT ");
        for (int i = 0; i < groupExprs.size(); i++) {
            sql.append(groupExprs.get(i)).append(" AS g").append(i).append(", ");
        }
        sql.append(FACT_SUMS).append(" FROM session_fact WHERE site_id = :site AND closed = TRUE")
                .append(" AND local_day BETWEEN :from AND :to");
        appendFilter(sql, params, filter, false);
        appendGroupOrder(sql, groupExprs);
        List<Group<SessionTotals>> groups = jdbc.query(sql.toString(), params,
                (rs, i) -> new Group<>(byDay ? rs.getObject("g0", LocalDate.class) : null,
                        key(rs, groupBy, byDay ? 1 : 0), sessionTotals(rs)));
        return new SessionAnswer(new Plan("session_fact", null, null), groups);
    }

    /** Page measures grouped by {@code groupBy} (and by day when {@code byDay}). */
    public PageAnswer pages(long siteId, SegmentFilter filter, List<Dim> groupBy, boolean byDay) {
        Set<Dim> needed = needed(filter, groupBy);
        Predicate<Cuboid> usable = fills.usable(siteId, filter.from());
        Optional<Cuboid> view = Cuboid.cheapest(Cuboid.PAGE, needed, usable);
        if (view.isEmpty()) {
            return pagesFromSessions(siteId, filter, groupBy, byDay);
        }
        List<Cuboid.Part> parts = parts(siteId, Cuboid.PAGE, view.get(), usable, filter, byDay);
        return new PageAnswer(plan("rollup_page", parts), readParts("rollup_page", PAGE_SUMS, parts, siteId, filter,
                groupBy, byDay, Rollups::pageTotals, PageTotals::plus));
    }

    /** Reads one row's measures. */
    @FunctionalInterface
    private interface Totals<T> {
        T read(ResultSet rs) throws SQLException;
    }

    /** One grouped query per part of the range ({@code table} and {@code sums} are constants), added up by key. */
    private <T> List<Group<T>> readParts(String table, String sums, List<Cuboid.Part> parts, long siteId,
                                         SegmentFilter filter, List<Dim> groupBy, boolean byDay, Totals<T> totals,
                                         java.util.function.BinaryOperator<T> plus) {
        List<List<Group<T>>> read = new ArrayList<>(parts.size());
        for (Cuboid.Part part : parts) {
            Read q = read(siteId, part, groupBy, byDay, filter);
            read.add(jdbc.query("SELECT " + q.select() + sums + " FROM " + table + q.where(), q.params(),
                    (rs, i) -> new Group<>(byDay ? rs.getObject("g0", LocalDate.class) : null,
                            key(rs, groupBy, byDay ? 1 : 0), totals.read(rs))));
        }
        return merge(read, plus, groupBy);
    }

    /** The parts a question reads: built whole weeks from the view's weekly twin where it has one and may use it. */
    private List<Cuboid.Part> parts(long siteId, List<Cuboid> views, Cuboid daily, Predicate<Cuboid> usable,
                                    SegmentFilter filter, boolean byDay) {
        Optional<Cuboid> twin = byDay ? Optional.empty() : Cuboid.twin(views, daily, usable);
        // without a twin, or under 7 days (no whole week), skip the look-up of the built weeks
        if (twin.isEmpty() || filter.to().toEpochDay() - filter.from().toEpochDay() < 6) {
            return List.of(new Cuboid.Part(daily, filter.from(), filter.to()));
        }
        return Cuboid.split(daily, twin, filter.from(), filter.to(), weeks.builtThrough(siteId));
    }

    private static Plan plan(String table, List<Cuboid.Part> parts) {
        Integer daily = null;
        Integer weekly = null;
        for (Cuboid.Part p : parts) {
            if (p.view().weekly()) {
                weekly = p.view().id();
                daily = p.view().weekOf();
            } else {
                daily = p.view().id();
            }
        }
        return new Plan(table, daily, weekly);
    }

    /** One grouped read of one part: its select list of groups, and its WHERE clause with the values bound. */
    private record Read(String select, String where, MapSqlParameterSource params) {
    }

    private static Read read(long siteId, Cuboid.Part part, List<Dim> groupBy, boolean byDay, SegmentFilter filter) {
        MapSqlParameterSource params = new MapSqlParameterSource("site", siteId).addValue("cuboid", part.view().id())
                .addValue("from", Date.valueOf(part.from())).addValue("to", Date.valueOf(part.to()));
        List<String> groupExprs = new ArrayList<>();
        if (byDay) {
            groupExprs.add("local_day");
        }
        groupBy.forEach(d -> groupExprs.add(d.column()));
        StringBuilder select = new StringBuilder();
        for (int i = 0; i < groupExprs.size(); i++) {
            select.append(groupExprs.get(i)).append(" AS g").append(i).append(", ");
        }
        StringBuilder where = new StringBuilder(
                " WHERE site_id = :site AND cuboid = :cuboid AND local_day BETWEEN :from AND :to");
        appendFilter(where, params, filter, true);
        appendGroupOrder(where, groupExprs);
        return new Read(select.toString(), where.toString(), params);
    }

    /**
     * Adds up groups with the same key read from several parts of a range, in the order of their keys (as one
     * grouped query would have returned them). One part is returned as read.
     */
    private static <T> List<Group<T>> merge(List<List<Group<T>>> parts, java.util.function.BinaryOperator<T> plus,
                                            List<Dim> groupBy) {
        if (parts.size() == 1) {
            return parts.get(0);
        }
        Map<Map<Dim, Object>, Group<T>> sums = new LinkedHashMap<>();
        for (List<Group<T>> part : parts) {
            for (Group<T> g : part) {
                sums.merge(g.key(), g, (a, b) -> new Group<>(a.day(), a.key(), plus.apply(a.totals(), b.totals())));
            }
        }
        List<Group<T>> merged = new ArrayList<>(sums.values());
        merged.sort((a, b) -> compareKeys(a, b, groupBy));
        return merged;
    }

    /** Fallback: reads closed sessions with their page detail and aggregates pages in memory. */
    private PageAnswer pagesFromSessions(long siteId, SegmentFilter filter, List<Dim> groupBy, boolean byDay) {
        MapSqlParameterSource params = new MapSqlParameterSource("site", siteId)
                .addValue("from", Date.valueOf(filter.from())).addValue("to", Date.valueOf(filter.to()));
        StringBuilder sql = new StringBuilder("""
                SELECT local_day, device, source, browser, variant, country, region, pageviews, page_detail,
                       entry_ads, later_ads, engaged_ms, revenue_micros, impressions, viewable_impressions, clicks, id,
                       origin
                FROM session_fact WHERE site_id = :site AND closed = TRUE AND local_day BETWEEN :from AND :to""");
        appendFilter(sql, params, filter, false);
        Map<List<Object>, PageTotals> sums = new LinkedHashMap<>();
        jdbc.query(sql.toString(), params, rs -> {
            List<PageStat> pages = PageStat.decode(rs.getString("page_detail"));
            if (pages.isEmpty()) {
                double later = rs.getDouble("later_ads");
                pages = ImportedPages.withPages(new SessionFact(siteId, "", "import", "", null, null, null, null, 0,
                        rs.getInt("pageviews"), false, rs.getLong("engaged_ms"), "", rs.getInt("entry_ads"),
                        rs.wasNull() ? null : later, null, null, null, null, null, null, null,
                        rs.getLong("revenue_micros"), rs.getInt("impressions"), rs.getInt("viewable_impressions"),
                        rs.getInt("clicks"), true, List.of())).pages();
            }
            Map<Dim, String> segment = new EnumMap<>(Dim.class);
            for (Dim d : List.of(Dim.DEVICE, Dim.SOURCE, Dim.BROWSER, Dim.VARIANT, Dim.COUNTRY, Dim.REGION)) {
                String v = rs.getString(d.column());
                segment.put(d, v == null ? "" : v);
            }
            LocalDate day = rs.getObject("local_day", LocalDate.class);
            for (int i = 0; i < pages.size(); i++) {
                PageStat p = pages.get(i);
                List<Object> key = new ArrayList<>();
                key.add(byDay ? day : null);
                for (Dim d : groupBy) {
                    key.add(switch (d) {
                        case ADS -> p.ads();
                        case POSITION -> i == 0 ? 0 : 1;
                        case ENGAGED_BUCKET -> p.engagedBucket();
                        default -> segment.get(d);
                    });
                }
                PageTotals add = new PageTotals(1, i == pages.size() - 1 ? 1 : 0,
                        p.engagedMs() == null ? 0 : p.engagedMs(), p.revenueMicros(),
                        (double) p.revenueMicros() * p.revenueMicros(), p.impressions(), p.viewable(), p.clicks());
                sums.merge(key, add, PageTotals::plus);
            }
        });
        List<Group<PageTotals>> groups = new ArrayList<>();
        sums.forEach((k, v) -> {
            Map<Dim, Object> key = new EnumMap<>(Dim.class);
            for (int i = 0; i < groupBy.size(); i++) {
                key.put(groupBy.get(i), k.get(i + 1));
            }
            groups.add(new Group<>((LocalDate) k.get(0), key, v));
        });
        groups.sort((a, b) -> compareKeys(a, b, groupBy));
        return new PageAnswer(new Plan("session_fact", null, null), groups);
    }

    private static int compareKeys(Group<?> a, Group<?> b, List<Dim> groupBy) {
        if (a.day() != null && b.day() != null && !a.day().equals(b.day())) {
            return a.day().compareTo(b.day());
        }
        for (Dim d : groupBy) {
            Object x = a.key().get(d);
            Object y = b.key().get(d);
            int c = x instanceof Integer xi ? Integer.compare(xi, (Integer) y) : ((String) x).compareTo((String) y);
            if (c != 0) {
                return c;
            }
        }
        return 0;
    }

    private static Set<Dim> needed(SegmentFilter filter, List<Dim> groupBy) {
        Set<Dim> needed = EnumSet.noneOf(Dim.class);
        needed.addAll(filter.dims());
        needed.addAll(groupBy);
        return needed;
    }

    private static void appendFilter(StringBuilder sql, MapSqlParameterSource params, SegmentFilter filter,
                                     boolean rollup) {
        int i = 0;
        for (Map.Entry<Dim, List<String>> e : filter.values().entrySet()) {
            String column = rollup ? e.getKey().column() : "COALESCE(" + e.getKey().column() + ", '')";
            sql.append(" AND ").append(column).append(" IN (:f").append(i).append(")");
            params.addValue("f" + i, e.getValue());
            i++;
        }
    }

    private static void appendGroupOrder(StringBuilder sql, List<String> groupExprs) {
        if (groupExprs.isEmpty()) {
            return;
        }
        StringJoiner cols = new StringJoiner(", ");
        groupExprs.forEach(cols::add);
        sql.append(" GROUP BY ").append(cols).append(" ORDER BY ").append(cols);
    }

    /** How a grouping dimension is computed from session_fact in the fallback. */
    private static String factExpression(Dim d) {
        return switch (d) {
            case HOUR -> "local_hour";
            case PAGES -> "LEAST(pageviews, 11)";
            case ENTRY_ADS, ENTRY_PATH -> d.column();
            case DEVICE, SOURCE, BROWSER, VARIANT, COUNTRY, REGION -> "COALESCE(" + d.column() + ", '')";
            default -> throw new IllegalArgumentException(d + " is a page-level dimension");
        };
    }

    private static Map<Dim, Object> key(ResultSet rs, List<Dim> groupBy, int offset) throws SQLException {
        Map<Dim, Object> key = new HashMap<>();
        for (int i = 0; i < groupBy.size(); i++) {
            Dim d = groupBy.get(i);
            String column = "g" + (i + offset);
            key.put(d, d.isNumeric() ? (Object) rs.getInt(column) : (Object) rs.getString(column));
        }
        return key;
    }

    private static SessionTotals sessionTotals(ResultSet rs) throws SQLException {
        return new SessionTotals(rs.getLong("sessions"), rs.getLong("bounces"), rs.getLong("pageviews"),
                rs.getDouble("pageviews_sq"), rs.getLong("engaged_ms"), rs.getDouble("engaged_sq"),
                rs.getLong("revenue_micros"), rs.getDouble("revenue_sq"), rs.getLong("entry_ads_sum"),
                rs.getLong("impressions"), rs.getLong("viewable_impressions"), rs.getLong("clicks"));
    }

    private static PageTotals pageTotals(ResultSet rs) throws SQLException {
        return new PageTotals(rs.getLong("pageviews"), rs.getLong("exits"), rs.getLong("engaged_ms"),
                rs.getLong("revenue_micros"), rs.getDouble("revenue_sq"), rs.getLong("impressions"),
                rs.getLong("viewable_impressions"), rs.getLong("clicks"));
    }
}
