package com.example.foldline.bench;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

import javax.sql.DataSource;

import org.springframework.boot.WebApplicationType;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;

import com.example.foldline.FoldlineApplication;
import com.example.foldline.demo.DemoPublisher;
import com.example.foldline.metrics.MetricRequestFactory;
import com.example.foldline.metrics.MetricsService;
import com.example.foldline.sessions.Cuboid;
import com.example.foldline.sessions.RollupFill;
import com.example.foldline.sessions.WeeklyViews;
import com.example.foldline.sites.Site;

/**
 * Issue #3/#4 benchmark: loads the demo publisher at a chosen size (default 1,000,000 sessions over 90 days) into H2
 * (and PostgreSQL with --pg), then times every metrics answer with filters varied as users vary them (median and
 * p95 over --runs calls each), and in the same run answers the same questions with DuckDB scanning a raw sessions
 * table holding the same sessions. Prints a table and the ratio of our p95 to DuckDB's.
 */
final class MetricsBenchmark {

    static final String[] ANSWERS = {"overview", "density", "depth", "engagement", "geography", "pages", "timeseries"};
    static final String[] FILTERS = {"", "device=phone", "source=search", "device=desktop&source=social", "country=US",
            "device=phone&variant=stacked"};
    static final int[] RANGES = {7, 28, 90};

    private MetricsBenchmark() {
    }

    record Question(String answer, int days, String filter) {
    }

    public static void main(String[] args) throws Exception {
        long sessions = Bench.arg(args, "sessions", 1_000_000);
        int runs = (int) Bench.arg(args, "runs", 30);
        boolean pg = Bench.flag(args, "pg");
        timeFill = !Bench.flag(args, "no-fill");
        double scale = sessions / (2250.0 * 90);
        System.out.printf("metrics benchmark: about %,d sessions over 90 days (demo scale %.2f), %d calls per answer, "
                + "max heap %d MB%n", sessions, scale, runs, Runtime.getRuntime().maxMemory() >> 20);
        List<Question> questions = questions(runs);

        // --no-h2: PostgreSQL only (a 10M-session load on H2 takes hours on this machine)
        Map<String, double[]> h2 = Bench.flag(args, "no-h2") ? null : run("H2", h2Url(), "sa", "", scale, questions);
        Map<String, double[]> postgres = null;
        if (pg) {
            String url = System.getProperty("pg.url", "jdbc:postgresql://127.0.0.1:5432/foldline_bench");
            try (Connection c = DriverManager.getConnection(url, "foldline", "foldline"); Statement s = c.createStatement()) {
                s.execute("DROP SCHEMA public CASCADE");
                s.execute("CREATE SCHEMA public");
            }
            postgres = run("PostgreSQL", url, "foldline", "foldline", scale, questions);
        }
        Map<String, double[]> duck = duckdb(questions);

        System.out.printf("%n%-11s %17s %17s %17s %12s %12s%n", "answer", "H2 p50/p95 ms", "PostgreSQL p50/p95",
                "DuckDB p50/p95", "H2/DuckDB p95", "PG/DuckDB p95");
        for (String a : ANSWERS) {
            double[] d = duck.get(a);
            System.out.printf("%-11s %17s %17s %17s %12s %12s%n", a, h2 == null ? "-" : fmt(h2.get(a)),
                    postgres == null ? "-" : fmt(postgres.get(a)), d == null ? "n/a" : fmt(d),
                    ratio(h2, d, a), ratio(postgres, d, a));
        }
    }

    private static String ratio(Map<String, double[]> engine, double[] duck, String answer) {
        return engine == null || duck == null ? "-" : String.format("%.2f", engine.get(answer)[1] / duck[1]);
    }

    static String h2Url() throws Exception {
        Path dir = Files.createTempDirectory("foldline-bench-metrics");
        // no reuse of a repeated query's result (H2 keeps the last result of each cached statement): every timed
        // call reads the rollups, as DuckDB scans its table every time
        return "jdbc:h2:file:" + dir.resolve("foldline") + IngestBenchmark.H2_OPTIONS + ";OPTIMIZE_REUSE_RESULTS=0";
    }

    static List<Question> questions(int runs) {
        SplittableRandom r = new SplittableRandom(42);
        List<Question> qs = new ArrayList<>();
        for (String a : ANSWERS) {
            for (int i = 0; i < runs; i++) {
                int days = RANGES[r.nextInt(RANGES.length)];
                if (a.equals("timeseries") && r.nextBoolean()) {
                    days = 7;
                }
                qs.add(new Question(a, days, FILTERS[r.nextInt(FILTERS.length)]));
            }
        }
        return qs;
    }

    static Map<String, double[]> run(String name, String url, String user, String password, double scale,
                                     List<Question> questions) {
        try (ConfigurableApplicationContext app = new SpringApplicationBuilder(FoldlineApplication.class)
                .web(WebApplicationType.NONE).run("--spring.main.banner-mode=off", "--logging.level.root=WARN",
                        "--spring.datasource.url=" + url, "--spring.datasource.username=" + user,
                        "--spring.datasource.password=" + password, "--foldline.demo.enabled=false",
                        "--foldline.sessions.enabled=false", "--foldline.admin.initial-password=bench-password")) {
            long t0 = System.nanoTime();
            DemoPublisher.Seeded seeded = app.getBean(DemoPublisher.class).seed(20261202, 90, scale);
            double load = (System.nanoTime() - t0) / 1e9;
            System.out.printf("%s: loaded %,d sessions with rollups in %.1f s (%,.0f sessions/s)%n", name,
                    seeded.sessions(), load, seeded.sessions() / load);
            // what the sessionizer's next run does after a history load: build the weekly views of past weeks
            long t1 = System.nanoTime();
            int weeks = 0;
            for (Site s : seeded.sites()) {
                weeks += app.getBean(WeeklyViews.class).build(s);
            }
            double built = (System.nanoTime() - t1) / 1e9;
            System.out.printf("%s: built the weekly views of %d site-weeks in %.1f s; load and build together %,.0f "
                    + "sessions/s%n", name, weeks, built, seeded.sessions() / (load + built));
            exportOnce(app.getBean(DataSource.class));
            Site site = seeded.sites().stream().filter(s -> s.domain().startsWith("harborview")).findFirst().orElseThrow();
            MetricsService metrics = app.getBean(MetricsService.class);
            MetricRequestFactory requests = app.getBean(MetricRequestFactory.class);
            LocalDate last = LocalDate.now(site.timezone()).minusDays(1);
            printViewSizes(name, app.getBean(DataSource.class), site.id());
            Map<String, List<Double>> times = new LinkedHashMap<>();
            Map<String, Integer> fallbacks = new LinkedHashMap<>();
            Map<String, List<String>> calls = new LinkedHashMap<>();
            for (int warm = 0; warm < 2; warm++) {
                for (Question q : questions) {
                    long start = System.nanoTime();
                    Object answer = call(metrics, requests, site, q, last);
                    if (warm == 1) {
                        double ms = (System.nanoTime() - start) / 1e6;
                        times.computeIfAbsent(q.answer(), k -> new ArrayList<>()).add(ms);
                        calls.computeIfAbsent(q.answer(), k -> new ArrayList<>()).add(String.format("%09.1f ms %d days %s (%s)",
                                ms, q.days(), q.filter().isEmpty() ? "no filter" : q.filter(), answeredFrom(answer)));
                        if (answeredFrom(answer).contains("session_fact")) {
                            fallbacks.merge(q.answer() + " " + (q.filter().isEmpty() ? "(none)" : q.filter()), 1,
                                    Integer::sum);
                        }
                    }
                }
            }
            System.out.printf("%s: calls answered from session_fact (no view holds them): %s%n", name,
                    fallbacks.isEmpty() ? "none" : fallbacks);
            System.out.printf("%s: the two slowest timed calls of each answer:%n", name);
            calls.forEach((a, list) -> list.stream().sorted(java.util.Comparator.reverseOrder()).limit(2)
                    .forEach(c -> System.out.printf("  %-10s %s%n", a, c.replaceFirst("^0+(?=\\d)", ""))));
            Map<String, double[]> result = new LinkedHashMap<>();
            times.forEach((k, v) -> result.put(k, percentiles(v)));
            if (timeFill) {
                timeFill(name, app, site.id());
            }
            return result;
        }
    }

    /** --no-fill skips timing the fill of the views after lattice 1 (minutes at 10M sessions). */
    private static boolean timeFill;

    /** Empties the news site's views after lattice 1, marks it as migrations V8 and V9 do, and times filling them. */
    static void timeFill(String name, ConfigurableApplicationContext app, long siteId) {
        try (Connection c = app.getBean(DataSource.class).getConnection(); Statement s = c.createStatement()) {
            for (Cuboid v : Cuboid.SESSION) {
                if (v.lattice() > 1) {
                    s.execute("DELETE FROM rollup_session WHERE site_id = " + siteId + " AND cuboid = " + v.id());
                }
            }
            for (Cuboid v : Cuboid.PAGE) {
                if (v.lattice() > 1) {
                    s.execute("DELETE FROM rollup_page WHERE site_id = " + siteId + " AND cuboid = " + v.id());
                }
            }
            for (int lattice = 2; lattice <= Cuboid.LATTICE; lattice++) {
                s.execute("INSERT INTO rollup_fill (site_id, lattice, state) VALUES (" + siteId + ", " + lattice
                        + ", 'pending')");
            }
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
        RollupFill fill = app.getBean(RollupFill.class);
        for (int lattice = 2; lattice <= Cuboid.LATTICE; lattice++) {
            long t0 = System.nanoTime();
            RollupFill.Report report = fill.fill(siteId, lattice);
            double seconds = (System.nanoTime() - t0) / 1e9;
            System.out.printf("%s: filled the lattice-%d views of the news site (%,d sessions, %d days) in %.1f s "
                    + "(%,.0f sessions/s)%n", name, lattice, report.sessions(), report.days(), seconds,
                    report.sessions() / seconds);
        }
    }

    static Object call(MetricsService metrics, MetricRequestFactory requests, Site site, Question q, LocalDate last) {
        String query = "from=" + last.minusDays(q.days() - 1L) + "&to=" + last + (q.filter().isEmpty() ? "" : "&" + q.filter());
        return switch (q.answer()) {
            case "overview" -> metrics.overview(requests.request(site, "overview", query + "&compare=previous"));
            case "density" -> metrics.density(requests.request(site, "density", query));
            case "depth" -> metrics.depth(requests.request(site, "depth", query));
            case "engagement" -> metrics.engagement(requests.request(site, "engagement", query));
            case "geography" -> metrics.geography(requests.request(site, "geography", query));
            case "pages" -> metrics.pages(requests.request(site, "pages", query));
            default -> metrics.timeseries(requests.request(site, "timeseries", query + "&metric=bounceRate"
                    + (q.days() <= 7 ? "&grain=hour" : "")));
        };
    }

    /** The view an answer was read from (every answer record has {@code scope().answeredFrom()}). */
    static String answeredFrom(Object answer) {
        try {
            var scopeMethod = answer.getClass().getMethod("scope");
            scopeMethod.setAccessible(true);
            Object scope = scopeMethod.invoke(answer);
            var from = scope.getClass().getMethod("answeredFrom");
            from.setAccessible(true);
            return (String) from.invoke(scope);
        } catch (ReflectiveOperationException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Rows per rollup view of the benchmarked site, against its stored sessions. */
    static void printViewSizes(String name, DataSource ds, long siteId) {
        try (Connection c = ds.getConnection(); Statement s = c.createStatement()) {
            long facts = count(s, "SELECT COUNT(*) FROM session_fact WHERE site_id = " + siteId);
            StringBuilder out = new StringBuilder();
            for (String table : List.of("rollup_session", "rollup_page")) {
                long total = 0;
                out.append(String.format("%n  %s rows per view:", table));
                try (ResultSet rs = s.executeQuery("SELECT cuboid, COUNT(*) FROM " + table + " WHERE site_id = " + siteId
                        + " GROUP BY cuboid ORDER BY cuboid")) {
                    while (rs.next()) {
                        out.append(String.format(" %d:%,d", rs.getInt(1), rs.getLong(2)));
                        total += rs.getLong(2);
                    }
                }
                out.append(String.format("  (total %,d)", total));
            }
            System.out.printf("%s: news site has %,d stored sessions over 90 days%s%n", name, facts, out);
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
    }

    private static long count(Statement s, String sql) throws Exception {
        try (ResultSet rs = s.executeQuery(sql)) {
            rs.next();
            return rs.getLong(1);
        }
    }

    /** The news site's closed sessions, kept for the DuckDB side of the comparison. */
    /** The news site's closed sessions as CSV for DuckDB, written once while streaming them (10M do not fit -Xmx512m). */
    private static Path exported;
    private static long exportedRows;
    private static LocalDate exportedLast;

    private static void exportOnce(DataSource ds) {
        if (exported != null) {
            return;
        }
        try (Connection c = ds.getConnection()) {
            c.setAutoCommit(false);   // PostgreSQL streams a result only inside a transaction, with a fetch size
            exported = Files.createTempFile("foldline-sessions", ".csv");
            try (Statement s = c.createStatement(); var out = Files.newBufferedWriter(exported)) {
                s.setFetchSize(10_000);
                try (ResultSet rs = s.executeQuery("""
                        SELECT f.local_day, f.local_hour, f.pageviews, f.bounce, f.engaged_ms, f.entry_path, f.entry_ads,
                               f.source, f.device, f.browser, f.country, f.region, f.variant, f.revenue_micros,
                               f.impressions, f.viewable_impressions, f.clicks
                        FROM session_fact f JOIN site s ON s.id = f.site_id
                        WHERE s.domain = 'harborview-daily.example' AND f.closed = TRUE""")) {
                    StringBuilder line = new StringBuilder();
                    while (rs.next()) {
                        line.setLength(0);
                        LocalDate day = rs.getObject(1, LocalDate.class);
                        line.append(day);
                        for (int i = 2; i <= 17; i++) {
                            line.append(',');
                            Object v = rs.getObject(i);
                            if (v instanceof String text) {
                                line.append('"').append(text.replace("\"", "\"\"")).append('"');
                            } else if (v != null) {
                                line.append(v);
                            }
                        }
                        out.write(line.append('\n').toString());
                        exportedRows++;
                        if (exportedLast == null || day.isAfter(exportedLast)) {
                            exportedLast = day;
                        }
                    }
                }
            }
            c.commit();
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
    }

    static Map<String, double[]> duckdb(List<Question> questions) throws Exception {
        Map<String, List<Double>> times = new LinkedHashMap<>();
        try (Connection c = DriverManager.getConnection("jdbc:duckdb:")) {
            try (Statement s = c.createStatement()) {
                s.execute("""
                        CREATE TABLE sessions (local_day DATE, local_hour INTEGER, pageviews INTEGER, bounce BOOLEAN,
                          engaged_ms BIGINT, entry_path VARCHAR, entry_ads INTEGER, source VARCHAR, device VARCHAR,
                          browser VARCHAR, country VARCHAR, region VARCHAR, variant VARCHAR, revenue_micros BIGINT,
                          impressions INTEGER, viewable_impressions INTEGER, clicks INTEGER)""");
            }
            // loaded through a CSV file so that this class needs no DuckDB type at compile time (bench profile only)
            try (Statement s = c.createStatement()) {
                s.execute("COPY sessions FROM '" + exported + "' (FORMAT csv, HEADER false)");
            }
            Files.delete(exported);
            System.out.printf("DuckDB: %,d raw sessions of the news site loaded%n", exportedRows);
            for (int warm = 0; warm < 2; warm++) {
                for (Question q : questions) {
                    String sql = duckSql(q);
                    if (sql == null) {
                        continue;
                    }
                    long start = System.nanoTime();
                    try (Statement s = c.createStatement(); ResultSet rs = s.executeQuery(sql)) {
                        while (rs.next()) {
                            rs.getObject(1);
                        }
                    }
                    if (warm == 1) {
                        times.computeIfAbsent(q.answer(), k -> new ArrayList<>()).add((System.nanoTime() - start) / 1e6);
                    }
                }
            }
        }
        Map<String, double[]> result = new LinkedHashMap<>();
        times.forEach((k, v) -> result.put(k, percentiles(v)));
        return result;
    }

    static String duckSql(Question q) {
        String where = "local_day BETWEEN DATE '" + exportedLast.minusDays(q.days() - 1L) + "' AND DATE '" + exportedLast
                + "'";
        for (String part : q.filter().split("&")) {
            if (!part.isEmpty()) {
                String[] kv = part.split("=");
                where += " AND " + kv[0] + " = '" + kv[1] + "'";
            }
        }
        String sums = "count(*), sum(CASE WHEN bounce THEN 1 ELSE 0 END), sum(pageviews), sum(revenue_micros), "
                + "sum(engaged_ms), sum(impressions), sum(viewable_impressions), sum(clicks)";
        return switch (q.answer()) {
            case "overview" -> "SELECT " + sums + " FROM sessions WHERE " + where;
            case "density" -> "SELECT entry_ads, " + sums + " FROM sessions WHERE " + where + " GROUP BY entry_ads";
            case "depth" -> "SELECT least(pageviews, 11), " + sums + " FROM sessions WHERE " + where + " GROUP BY 1";
            case "geography" -> "SELECT country, " + sums + " FROM sessions WHERE " + where + " GROUP BY country";
            case "pages" -> "SELECT entry_path, " + sums + " FROM sessions WHERE " + where
                    + " GROUP BY entry_path ORDER BY 2 DESC LIMIT 20";
            case "timeseries" -> "SELECT local_day" + (q.days() <= 7 ? ", local_hour" : "") + ", " + sums
                    + " FROM sessions WHERE " + where + " GROUP BY ALL";
            default -> null; // engagement is page-level; the raw sessions table has no pages
        };
    }

    static double[] percentiles(List<Double> values) {
        double[] v = values.stream().mapToDouble(Double::doubleValue).toArray();
        Arrays.sort(v);
        return new double[]{v[v.length / 2], v[(int) Math.ceil(0.95 * v.length) - 1]};
    }

    static String fmt(double[] p) {
        return String.format("%.1f / %.1f", p[0], p[1]);
    }

}
