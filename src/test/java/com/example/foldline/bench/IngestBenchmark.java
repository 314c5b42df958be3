package com.example.foldline.bench;

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
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicLong;

import org.flywaydb.core.Flyway;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.boot.web.server.context.WebServerApplicationContext;
import org.springframework.context.ConfigurableApplicationContext;

import com.example.foldline.FoldlineApplication;
import com.example.foldline.sites.NewIngestKey;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;

/**
 * Issue #2 benchmark: N pageview events (default 1,000,000, fixed seed) posted as NDJSON in batches of 5,000 from 2
 * concurrent clients to the running service on an H2 file, and, in the same run, the same rows inserted by plain
 * JDBC batches (5,000 per batch, commit per batch) into a fresh H2 file with the same table and key. Prints both
 * rates and their ratio. Run with -Xmx512m (the bench profile does).
 */
final class IngestBenchmark {

    static final int BATCH = 5_000;
    static final String H2_OPTIONS = ";MODE=PostgreSQL;DATABASE_TO_LOWER=TRUE;CASE_INSENSITIVE_IDENTIFIERS=TRUE;"
            + "DEFAULT_NULL_ORDERING=HIGH;NON_KEYWORDS=VALUE,KEY" + System.getProperty("h2.extra", ";WRITE_DELAY=0");

    private IngestBenchmark() {
    }

    /** One generated pageview. */
    record Row(String id, Instant ts, String visitor, String path, String device, String source, String country,
               int ads) {
        String json() {
            return "{\"type\":\"pageview\",\"id\":\"" + id + "\",\"ts\":" + ts.toEpochMilli() + ",\"visitor\":\""
                    + visitor + "\",\"path\":\"" + path + "\",\"device\":\"" + device + "\",\"source\":\"" + source
                    + "\",\"country\":\"" + country + "\",\"browser\":\"Lumen\",\"ads\":" + ads + "}";
        }
    }

    static final String[] DEVICES = {"phone", "desktop", "tablet"};
    static final String[] SOURCES = {"search", "social", "direct", "referral", "email"};
    static final String[] COUNTRIES = {"PT", "ES", "FR", "DE", "US", "GB"};

    /** Batch {@code b} of the deterministic event stream. */
    static List<Row> batch(int b, Instant base) {
        SplittableRandom r = new SplittableRandom(20261202L * 31 + b);
        List<Row> rows = new ArrayList<>(BATCH);
        for (int i = 0; i < BATCH; i++) {
            long n = (long) b * BATCH + i;
            rows.add(new Row("pv-" + n, base.plusMillis(n * 7), "v" + r.nextInt(400_000), "/article/" + r.nextInt(5_000),
                    DEVICES[r.nextInt(3)], SOURCES[r.nextInt(5)], COUNTRIES[r.nextInt(6)], r.nextInt(13)));
        }
        return rows;
    }

    public static void main(String[] args) throws Exception {
        long events = Bench.arg(args, "events", 1_000_000);
        boolean direct = Bench.flag(args, "direct");
        boolean pg = Bench.flag(args, "pg");
        int batches = (int) Math.max(1, events / BATCH);
        Instant base = Instant.now().minusSeconds(3 * 86_400);
        System.out.printf("ingest benchmark: %,d pageviews in batches of %,d, max heap %d MB%s%s%n",
                (long) batches * BATCH, BATCH, Runtime.getRuntime().maxMemory() >> 20,
                direct ? ", loaded by JDBC (no HTTP)" : "", pg ? ", PostgreSQL" : ", H2 file");

        String appUrl;
        String user = pg ? "foldline" : "sa";
        String password = pg ? "foldline" : "";
        if (pg) {
            appUrl = Bench.freshPostgresSchema(System.getProperty("pg.schema", "public"));
        } else {
            appUrl = "jdbc:h2:file:" + Files.createTempDirectory("foldline-bench-app").resolve("foldline") + H2_OPTIONS;
        }
        double httpRate = 0;
        try (ConfigurableApplicationContext app = new SpringApplicationBuilder(FoldlineApplication.class).run(
                "--server.port=0", "--spring.main.banner-mode=off", "--logging.level.root=WARN",
                "--spring.datasource.url=" + appUrl, "--spring.datasource.username=" + user,
                "--spring.datasource.password=" + password,
                "--foldline.demo.enabled=false", "--foldline.admin.initial-password=bench-password",
                "--foldline.sessions.enabled=false", "--foldline.alerts.scheduler-enabled=false")) {
            int port = ((WebServerApplicationContext) app).getWebServer().getPort();
            Sites sites = app.getBean(Sites.class);
            Site site = sites.create(new SiteSettings("Bench", "bench.example", "UTC", "EUR", null, null, null));
            NewIngestKey key = sites.createIngestKey(site.id(), "bench");
            URI uri = URI.create("http://127.0.0.1:" + port + "/api/v1/sites/" + site.id() + "/events");
            HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
            AtomicLong accepted = new AtomicLong();
            if (direct) {
                long start = System.nanoTime();
                accepted.set(load(app.getBean(javax.sql.DataSource.class), site.id(), batches, base));
                System.out.printf("JDBC load into the application's database: %,d pageviews in %.1f s%n",
                        accepted.get(), (System.nanoTime() - start) / 1e9);
            } else {
                // warm-up on a separate id range, not counted
                post(http, uri, key.key(), batch(batches + 1, base));
                long start = System.nanoTime();
                List<Thread> clients = new ArrayList<>();
                for (int c = 0; c < 2; c++) {
                    int client = c;
                    Thread t = new Thread(() -> {
                        for (int b = client; b < batches; b += 2) {
                            accepted.addAndGet(post(http, uri, key.key(), batch(b, base)));
                        }
                    });
                    clients.add(t);
                    t.start();
                }
                for (Thread t : clients) {
                    t.join();
                }
                double seconds = (System.nanoTime() - start) / 1e9;
                httpRate = accepted.get() / seconds;
                System.out.printf("HTTP ingest (2 clients, NDJSON): %,d accepted in %.1f s = %,.0f events/s%n",
                        accepted.get(), seconds, httpRate);
            }
            // the sessionizer on the same pageviews (issue #3 asks for at least 100,000 pageviews/s)
            long s0 = System.nanoTime();
            var report = app.getBean(com.example.foldline.sessions.Sessionizer.class).run(site.id());
            double sessionizerSeconds = (System.nanoTime() - s0) / 1e9;
            double sessionizerRate = accepted.get() / sessionizerSeconds;
            System.out.printf("sessionizer: %,d pageviews into %,d sessions in %.1f s = %,.0f pageviews/s%n",
                    accepted.get(), report.sessionsWritten(), sessionizerSeconds, sessionizerRate);
            // reference in the same database: one plain ordered read of the same pageview rows, the floor of any
            // sessionizer (it has to read them at least once, in visitor and time order)
            double readRate = orderedRead(app.getBean(javax.sql.DataSource.class), site.id());
            System.out.printf("ratio sessionizer / plain ordered read = %.2f%n", sessionizerRate / readRate);
        }
        if (direct) {
            return;
        }

        Path refDir = Files.createTempDirectory("foldline-bench-ref");
        String url = "jdbc:h2:file:" + refDir.resolve("reference") + H2_OPTIONS;
        Flyway.configure().dataSource(url, "sa", "").locations("classpath:db/migration/common").load().migrate();
        long start = System.nanoTime();
        long rows = 0;
        try (Connection c = DriverManager.getConnection(url, "sa", "")) {
            c.setAutoCommit(false);
            try (PreparedStatement ps = c.prepareStatement("""
                    INSERT INTO pageview (site_id, id, ts, visitor, path, source, device, browser, country, ads,
                                          received_at, ingest_batch) VALUES (1, ?, ?, ?, ?, ?, ?, 'Lumen', ?, ?, ?, 1)""")) {
                Timestamp received = Timestamp.from(Instant.now());
                for (int b = 0; b < batches; b++) {
                    for (Row row : batch(b, base)) {
                        ps.setString(1, row.id());
                        ps.setTimestamp(2, Timestamp.from(row.ts()));
                        ps.setString(3, row.visitor());
                        ps.setString(4, row.path());
                        ps.setString(5, row.source());
                        ps.setString(6, row.device());
                        ps.setString(7, row.country());
                        ps.setInt(8, row.ads());
                        ps.setTimestamp(9, received);
                        ps.addBatch();
                    }
                    ps.executeBatch();
                    c.commit();
                    rows += BATCH;
                }
            }
        }
        double seconds = (System.nanoTime() - start) / 1e9;
        double jdbcRate = rows / seconds;
        System.out.printf("plain JDBC batch insert (1 connection): %,d rows in %.1f s = %,.0f rows/s%n", rows, seconds,
                jdbcRate);
        System.out.printf("ratio HTTP / plain JDBC = %.2f (goal >= 0.50)%n", httpRate / jdbcRate);
    }

    /**
     * Writes the event stream straight into the application's tables as the ingest API would (one ingest_batch row
     * per 5,000 pageviews, a commit each), for runs that time the sessionizer only.
     */
    private static long load(javax.sql.DataSource ds, long siteId, int batches, Instant base) throws Exception {
        long rows = 0;
        try (Connection c = ds.getConnection()) {
            c.setAutoCommit(false);
            Timestamp received = Timestamp.from(Instant.now());
            for (int b = 0; b < batches; b++) {
                long batchId;
                Instant newest = null;
                try (PreparedStatement ps = c.prepareStatement("INSERT INTO ingest_batch (site_id) VALUES (?)",
                        new String[]{"id"})) {
                    ps.setLong(1, siteId);
                    ps.executeUpdate();
                    try (var keys = ps.getGeneratedKeys()) {
                        keys.next();
                        batchId = keys.getLong(1);
                    }
                }
                try (PreparedStatement ps = c.prepareStatement("""
                        INSERT INTO pageview (site_id, id, ts, visitor, path, source, device, browser, country, ads,
                                              received_at, ingest_batch) VALUES (?, ?, ?, ?, ?, ?, ?, 'Lumen', ?, ?, ?, ?)""")) {
                    for (Row row : batch(b, base)) {
                        ps.setLong(1, siteId);
                        ps.setString(2, row.id());
                        ps.setTimestamp(3, Timestamp.from(row.ts()));
                        ps.setString(4, row.visitor());
                        ps.setString(5, row.path());
                        ps.setString(6, row.source());
                        ps.setString(7, row.device());
                        ps.setString(8, row.country());
                        ps.setInt(9, row.ads());
                        ps.setTimestamp(10, received);
                        ps.setLong(11, batchId);
                        ps.addBatch();
                        newest = newest == null || row.ts().isAfter(newest) ? row.ts() : newest;
                        rows++;
                    }
                    ps.executeBatch();
                }
                try (PreparedStatement ps = c.prepareStatement("UPDATE ingest_batch SET newest_ts = ? WHERE id = ?")) {
                    ps.setTimestamp(1, Timestamp.from(newest));
                    ps.setLong(2, batchId);
                    ps.executeUpdate();
                }
                c.commit();
            }
        }
        return rows;
    }

    /** Reads every pageview of the site once, ordered by visitor and time, as plain JDBC; returns rows per second. */
    static double orderedRead(javax.sql.DataSource ds, long siteId) throws Exception {
        long start = System.nanoTime();
        long rows = 0;
        long check = 0;
        try (Connection c = ds.getConnection()) {
            c.setAutoCommit(false); // PostgreSQL streams with a fetch size only inside a transaction
            try (PreparedStatement ps = c.prepareStatement("""
                    SELECT id, ts, visitor, client_session, path, source, device, browser, os, country, region, variant,
                           ads, engaged_ms
                    FROM pageview WHERE site_id = ? ORDER BY visitor, ts, id""")) {
                ps.setFetchSize(5_000);
                ps.setLong(1, siteId);
                try (var rs = ps.executeQuery()) {
                    while (rs.next()) {
                        rows++;
                        check += rs.getString(1).length() + rs.getTimestamp(2).getNanos() + rs.getString(3).length()
                                + rs.getString(5).length() + rs.getInt(13);
                    }
                }
            }
            c.commit();
        }
        double seconds = (System.nanoTime() - start) / 1e9;
        System.out.printf("reference, plain JDBC read of the same pageviews ordered by visitor and time: %,d rows in "
                + "%.1f s = %,.0f rows/s (checksum %d)%n", rows, seconds, rows / seconds, check % 1000);
        return rows / seconds;
    }

    private static long post(HttpClient http, URI uri, String key, List<Row> rows) {
        StringBuilder body = new StringBuilder(rows.size() * 200);
        for (Row r : rows) {
            body.append(r.json()).append('\n');
        }
        try {
            HttpResponse<String> response = http.send(HttpRequest.newBuilder(uri)
                            .header("Authorization", "Bearer " + key).header("Content-Type", "application/x-ndjson")
                            .POST(HttpRequest.BodyPublishers.ofString(body.toString(), StandardCharsets.UTF_8)).build(),
                    HttpResponse.BodyHandlers.ofString());
            if (response.statusCode() == 503) {
                Thread.sleep(200);
                return post(http, uri, key, rows);
            }
            if (response.statusCode() != 200) {
                throw new IllegalStateException("HTTP " + response.statusCode() + ": " + response.body());
            }
            String b = response.body();
            int i = b.indexOf("\"accepted\":") + 11;
            return Long.parseLong(b.substring(i, b.indexOf(',', i)));
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
    }
}
