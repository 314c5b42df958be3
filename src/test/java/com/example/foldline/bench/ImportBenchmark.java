package com.example.foldline.bench;

import java.io.BufferedWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.util.Comparator;
import java.util.SplittableRandom;
import java.util.stream.Stream;

import org.flywaydb.core.Flyway;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.boot.web.server.context.WebServerApplicationContext;
import org.springframework.context.ConfigurableApplicationContext;

import com.example.foldline.FoldlineApplication;
import com.example.foldline.accounts.Accounts;
import com.example.foldline.accounts.ApiTokens;
import com.example.foldline.sessions.Sessionizer;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

/**
 * Issue #8 benchmark: a session-level NDJSON file of N sessions (default 1,000,000; {@code --sessions N}) generated
 * from a fixed seed, imported through the import job API (server-path option, background job, commits of 5,000 lines)
 * into a fresh H2 file database; in the same run the same rows are inserted by plain JDBC batches of 5,000 (commit
 * per batch) into session_fact of another fresh H2 file. Prints both rates and their ratio. {@code --rollup} also
 * times the sessionizer's rollup of the imported sessions. Run with -Xmx512m (the bench profile does).
 */
final class ImportBenchmark {

    static final int BATCH = 5_000;
    static final String[] DEVICES = {"phone", "desktop", "tablet"};
    static final String[] SOURCES = {"search", "social", "direct", "referral", "email"};
    static final String[] COUNTRIES = {"PT", "ES", "FR", "DE", "US", "GB"};

    private ImportBenchmark() {
    }

    /** One generated session, as the import file carries it. */
    record Session(String id, String visitor, Instant start, Instant end, int pageviews, long engagedMs,
                   String entryPath, int entryAds, Double laterAds, long revenueMicros, int impressions,
                   int viewable, int clicks, String device, String source, String country) {

        String json() {
            return "{\"type\":\"session\",\"id\":\"" + id + "\",\"visitor\":\"" + visitor + "\",\"start\":"
                    + start.toEpochMilli() + ",\"end\":" + end.toEpochMilli() + ",\"pageviews\":" + pageviews
                    + ",\"engagedMs\":" + engagedMs + ",\"entryPath\":\"" + entryPath + "\",\"entryAds\":" + entryAds
                    + (laterAds == null ? "" : ",\"laterAds\":" + laterAds) + ",\"revenueMicros\":" + revenueMicros
                    + ",\"impressions\":" + impressions + ",\"viewableImpressions\":" + viewable + ",\"clicks\":"
                    + clicks + ",\"device\":\"" + device + "\",\"source\":\"" + source + "\",\"country\":\"" + country
                    + "\",\"browser\":\"Lumen\"}";
        }
    }

    /** Session {@code n} of the deterministic stream: a year of history before {@code base}. */
    static Session session(long n, long total, Instant base) {
        SplittableRandom r = new SplittableRandom(20261202L * 31 + n);
        Instant start = base.minusSeconds(360L * 86_400 * (total - n) / total).plusSeconds(r.nextInt(600));
        int pages = 1 + (r.nextInt(10) < 4 ? 0 : r.nextInt(8));
        int entryAds = r.nextInt(13);
        int impressions = r.nextInt(entryAds + 1) + (pages - 1) * r.nextInt(4);
        int viewable = impressions == 0 ? 0 : r.nextInt(impressions + 1);
        return new Session("s-" + n, "v" + r.nextInt((int) Math.max(1, total / 3)), start,
                start.plusSeconds(pages == 1 ? 0 : 30L * pages + r.nextInt(600)), pages,
                1000L * r.nextInt(30 * pages + 1), "/article/" + r.nextInt(5_000), entryAds,
                pages == 1 ? null : r.nextInt(25) / 2.0, impressions * (long) r.nextInt(3_000), impressions,
                viewable, r.nextInt(100) == 0 ? 1 : 0, DEVICES[r.nextInt(3)], SOURCES[r.nextInt(5)],
                COUNTRIES[r.nextInt(6)]);
    }

    public static void main(String[] args) throws Exception {
        long total = Bench.arg(args, "sessions", 1_000_000);
        boolean rollup = Bench.flag(args, "rollup");
        boolean pg = Bench.flag(args, "pg");
        Instant base = Instant.now().minusSeconds(86_400).truncatedTo(java.time.temporal.ChronoUnit.SECONDS);
        Path work = Files.createTempDirectory("foldline-bench-import");
        try {
            run(total, rollup, pg, base, work);
        } finally {
            try (Stream<Path> files = Files.walk(work)) {
                files.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    private static void run(long total, boolean rollup, boolean pg, Instant base, Path work) throws Exception {
        Path allowed = Files.createDirectories(work.resolve("allowed"));
        Path file = allowed.resolve("sessions.ndjson");
        long t0 = System.nanoTime();
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            for (long n = 0; n < total; n++) {
                w.write(session(n, total, base).json());
                w.write('\n');
            }
        }
        long bytes = Files.size(file);
        System.out.printf("import benchmark: %,d sessions, file %,d MB written in %.1f s, max heap %d MB, %d cores, %s%n",
                total, bytes >> 20, (System.nanoTime() - t0) / 1e9, Runtime.getRuntime().maxMemory() >> 20,
                Runtime.getRuntime().availableProcessors(), pg ? "PostgreSQL" : "H2 files");

        double importRate;
        Path appDir = Files.createDirectories(work.resolve("app"));
        // on PostgreSQL the job writes to schema public of foldline_bench and the reference to schema
        // bench_reference: the same server, the same schema (Flyway) and indexes
        String appUrl = pg ? Bench.freshPostgresSchema("public")
                : "jdbc:h2:file:" + appDir.resolve("foldline") + IngestBenchmark.H2_OPTIONS;
        try (ConfigurableApplicationContext app = new SpringApplicationBuilder(FoldlineApplication.class).run(
                "--server.port=0", "--spring.main.banner-mode=off", "--logging.level.root=WARN",
                "--spring.datasource.url=" + appUrl,
                "--spring.datasource.username=" + (pg ? "foldline" : "sa"),
                "--spring.datasource.password=" + (pg ? "foldline" : ""),
                "--foldline.demo.enabled=false", "--foldline.admin.initial-password=bench-password",
                "--foldline.sessions.enabled=false", "--foldline.imports.allowed-dir=" + allowed,
                "--foldline.imports.spool-dir=" + appDir.resolve("imports"),
                "--foldline.imports.lines-per-commit=" + BATCH)) {
            int port = ((WebServerApplicationContext) app).getWebServer().getPort();
            Site site = app.getBean(Sites.class).create(new SiteSettings("Bench", "bench.example", "UTC", "EUR", null,
                    null, 3660));
            String api = "http://127.0.0.1:" + port + "/api/v1/sites/" + site.id() + "/imports";
            // an API token, not basic auth: a password check (bcrypt) on every poll would take CPU from the job
            long admin = app.getBean(Accounts.class).find("admin").orElseThrow().id();
            String auth = "Bearer " + app.getBean(ApiTokens.class).create(admin, "bench").token();
            HttpClient http = HttpClient.newHttpClient();
            long start = System.nanoTime();
            HttpResponse<String> created = http.send(HttpRequest.newBuilder(URI.create(api))
                    .header("Authorization", auth).header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofString("{\"path\":\"sessions.ndjson\"}")).build(),
                    HttpResponse.BodyHandlers.ofString());
            if (created.statusCode() != 202) {
                throw new IllegalStateException("HTTP " + created.statusCode() + ": " + created.body());
            }
            String id = field(created.body(), "id");
            String job;
            long lastPrint = start;
            while (true) {
                Thread.sleep(1000);
                job = http.send(HttpRequest.newBuilder(URI.create(api + "/" + id)).header("Authorization", auth)
                        .build(), HttpResponse.BodyHandlers.ofString()).body();
                String state = field(job, "state");
                if (!state.equals("queued") && !state.equals("reading")) {
                    break;
                }
                if (System.nanoTime() - lastPrint > 15e9) {
                    lastPrint = System.nanoTime();
                    System.out.printf("  ... %s lines, %.0f%%, estimated finish %s%n", field(job, "linesRead"),
                            100 * Double.parseDouble(field(job, "progress")), field(job, "estimatedFinish"));
                }
            }
            double seconds = (System.nanoTime() - start) / 1e9;
            long stored = Long.parseLong(field(job, "stored"));
            if (!field(job, "state").equals("done") || stored != total) {
                throw new IllegalStateException("the import did not store every session: " + job);
            }
            importRate = stored / seconds;
            System.out.printf("import job (NDJSON file, parse + validate + pseudonymise + store): %,d sessions in "
                    + "%.1f s = %,.0f sessions/s (%.1f MB/s)%n", stored, seconds, importRate, bytes / seconds / 1e6);
            if (rollup) {
                long r0 = System.nanoTime();
                Sessionizer.Report report = app.getBean(Sessionizer.class).run(site.id());
                double rs = (System.nanoTime() - r0) / 1e9;
                System.out.printf("sessionizer rollup of the imported sessions: %,d in %.1f s = %,.0f sessions/s%n",
                        report.importsRolledUp(), rs, report.importsRolledUp() / rs);
            }
        }

        Path refDir = Files.createDirectories(work.resolve("reference"));
        String url = pg ? Bench.freshPostgresSchema("bench_reference")
                : "jdbc:h2:file:" + refDir.resolve("reference") + IngestBenchmark.H2_OPTIONS;
        String user = pg ? "foldline" : "sa";
        String password = pg ? "foldline" : "";
        Flyway.configure().dataSource(url, user, password)
                .locations("classpath:db/migration/common", "classpath:db/migration/" + (pg ? "postgresql" : "h2"))
                .load().migrate();
        long start = System.nanoTime();
        long rows = 0;
        try (Connection c = DriverManager.getConnection(url, user, password)) {
            c.setAutoCommit(false);
            try (PreparedStatement ps = c.prepareStatement("""
                    INSERT INTO session_fact (site_id, id, visitor, start_ts, end_ts, local_day, local_hour,
                                              page_detail, pageviews, bounce, engaged_ms, entry_path, entry_ads,
                                              later_ads, source, device, browser, country, revenue_micros, impressions,
                                              viewable_impressions, clicks, origin, closed, updated_at)
                    VALUES (1, ?, ?, ?, ?, ?, ?, '', ?, ?, ?, ?, ?, ?, ?, ?, 'Lumen', ?, ?, ?, ?, ?, 'import', TRUE, ?)
                    ON CONFLICT DO NOTHING""")) {
                Timestamp now = Timestamp.from(Instant.now());
                for (long n = 0; n < total; n++) {
                    Session s = session(n, total, base);
                    ZonedDateTime local = s.start().atZone(ZoneOffset.UTC);
                    ps.setString(1, s.id());
                    ps.setString(2, s.visitor());
                    ps.setTimestamp(3, Timestamp.from(s.start()));
                    ps.setTimestamp(4, Timestamp.from(s.end()));
                    ps.setObject(5, local.toLocalDate());
                    ps.setInt(6, local.getHour());
                    ps.setInt(7, s.pageviews());
                    ps.setBoolean(8, s.pageviews() == 1);
                    ps.setLong(9, s.engagedMs());
                    ps.setString(10, s.entryPath());
                    ps.setInt(11, s.entryAds());
                    ps.setObject(12, s.laterAds());
                    ps.setString(13, s.source());
                    ps.setString(14, s.device());
                    ps.setString(15, s.country());
                    ps.setLong(16, s.revenueMicros());
                    ps.setInt(17, s.impressions());
                    ps.setInt(18, s.viewable());
                    ps.setInt(19, s.clicks());
                    ps.setTimestamp(20, now);
                    ps.addBatch();
                    if (++rows % BATCH == 0) {
                        ps.executeBatch();
                        c.commit();
                    }
                }
                ps.executeBatch();
                c.commit();
            }
        }
        double seconds = (System.nanoTime() - start) / 1e9;
        double jdbcRate = rows / seconds;
        System.out.printf("plain JDBC batch insert of the same rows (1 connection, no parsing): %,d rows in %.1f s = "
                + "%,.0f rows/s%n", rows, seconds, jdbcRate);
        System.out.printf("ratio import job / plain JDBC = %.2f%n", importRate / jdbcRate);
    }

    /** A top-level field of a flat JSON answer, without a JSON library (the values read here are simple). */
    static String field(String json, String name) {
        int i = json.indexOf("\"" + name + "\":");
        if (i < 0) {
            return "";
        }
        i += name.length() + 3;
        if (json.charAt(i) == '"') {
            return json.substring(i + 1, json.indexOf('"', i + 1));
        }
        int end = i;
        while (end < json.length() && json.charAt(end) != ',' && json.charAt(end) != '}') {
            end++;
        }
        return json.substring(i, end);
    }
}
