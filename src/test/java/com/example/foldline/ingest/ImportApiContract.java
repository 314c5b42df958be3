package com.example.foldline.ingest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.simple.JdbcClient;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.web.servlet.assertj.MockMvcTester;
import org.springframework.test.web.servlet.assertj.MvcTestResult;

import com.example.foldline.sessions.Sessionizer;
import com.example.foldline.sites.Site;
import com.example.foldline.sites.SiteSettings;
import com.example.foldline.sites.Sites;
import com.example.foldline.support.Events;
import com.example.foldline.support.TestData;

import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;

/**
 * Issue #8, bulk backfill: import jobs end up in sessions and metrics like live data, CSV exports map onto events,
 * and a re-run stores nothing new. Run on H2 and PostgreSQL by the subclasses; the files named by path live in
 * {@code foldline.imports.allowed-dir} of application-test.yml, and jobs commit every 7 lines there.
 */
abstract class ImportApiContract {

    static final Path ALLOWED = Path.of("target/import-tests/allowed");

    @Autowired
    MockMvcTester mvc;
    @Autowired
    Sites sites;
    @Autowired
    Sessionizer sessionizer;
    @Autowired
    JdbcClient jdbc;
    @Autowired
    ObjectMapper json;

    Site site;
    /** Three days ago (UTC, the site's zone): history, well inside the default retention. */
    LocalDate day;
    final List<Path> created = new ArrayList<>();

    @BeforeEach
    void newSite() throws IOException {
        site = sites.create(new SiteSettings("Backfill " + System.nanoTime(), "backfill" + System.nanoTime()
                + ".example", "UTC", "EUR", null, null, null));
        day = LocalDate.now(ZoneOffset.UTC).minusDays(3);
        Files.createDirectories(ALLOWED);
    }

    @AfterEach
    void removeFiles() throws IOException {
        for (Path p : created) {
            Files.deleteIfExists(p);
        }
    }

    String at(String time) {
        return day + "T" + time + "Z";
    }

    /** Writes a file into the allowed directory; returns its name there. */
    String serverFile(String suffix, String content) throws IOException {
        String name = TestData.unique("import") + suffix;
        Path file = ALLOWED.resolve(name);
        Files.writeString(file, content, StandardCharsets.UTF_8);
        created.add(file);
        return name;
    }

    String base() {
        return "/api/v1/sites/" + site.id() + "/imports";
    }

    MvcTestResult startServer(String body, String user, String password) {
        return mvc.post().uri(base()).with(httpBasic(user, password)).contentType(MediaType.APPLICATION_JSON)
                .content(body).exchange();
    }

    JsonNode startServerFile(String name) {
        MvcTestResult r = startServer("{\"path\":\"" + name + "\"}", "admin", "admin-secret");
        assertThat(r).hasStatus(HttpStatus.ACCEPTED);
        return read(r);
    }

    JsonNode read(MvcTestResult r) {
        return json.readTree(r.getResponse().getContentAsByteArray());
    }

    JsonNode job(long id) {
        MvcTestResult r = mvc.get().uri(base() + "/" + id).with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(r).hasStatusOk();
        return read(r);
    }

    /** Polls the job until it has finished (done, failed or cancelled). */
    JsonNode awaitEnd(long id) throws InterruptedException {
        long until = System.currentTimeMillis() + 120_000;
        while (System.currentTimeMillis() < until) {
            JsonNode j = job(id);
            String state = j.get("state").stringValue();
            if (state.equals("done") || state.equals("failed") || state.equals("cancelled")) {
                return j;
            }
            Thread.sleep(25);
        }
        throw new AssertionError("import job " + id + " did not finish: " + job(id));
    }

    long count(String table) {
        return jdbc.sql("SELECT count(*) FROM " + table + " WHERE site_id = :site").param("site", site.id())
                .query(Long.class).single();
    }

    JsonNode overview() {
        MvcTestResult r = mvc.get().uri("/api/v1/sites/" + site.id() + "/metrics/overview?from=" + day + "&to=" + day)
                .with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(r).hasStatusOk();
        return read(r).get("current");
    }

    /*
     * The fixture of MetricsApiContract, three days ago, as an import file (page-ends and impressions partly before
     * their pageviews, and spread over two commits of 7 lines):
     *  A: a1 10:00 ads 2, impressions 1000 (viewable, clicked) + 500, engaged 8 s; a2 10:10 ads 4, 2000 (viewable), 30 s
     *  B: b1 12:00 ads 2, engaged 3 s                                 -> bounce
     *  C: c1 13:00 ads 5, 4000 (viewable); c2 14:00 (60 min later)    -> two bounces
     * Totals: 4 sessions, 5 pageviews, 3 bounces, revenue 7500, 4 impressions, 3 viewable, 1 click, engaged 41 s.
     */
    String historyFile() {
        return new Events()
                .impression("i1", "a1", 1000, true, true)
                .pageEnd("a1", 8000)
                .pageview("a1", at("10:00:00"), "A", "/x", 2, "phone", "search", "PT")
                .pageview("a2", at("10:10:00"), "A", "/y", 4, "phone", "search", "PT")
                .impression("i2", "a1", 500, false, false)
                .impression("i3", "a2", 2000, true, false)
                .pageEnd("a2", 30000)
                .pageview("b1", at("12:00:00"), "B", "/x", 2, "phone", "search", "PT")
                .pageEnd("b1", 3000)
                .pageview("c1", at("13:00:00"), "C", "/z", 5, "desktop", "direct", "ES")
                .impression("i4", "c1", 4000, true, false)
                .pageview("c2", at("14:00:00"), "C", "/z", 5, "desktop", "direct", "ES")
                .ndjson() + "\n";
    }

    @Test
    void ndjsonImportEndsUpInSessionsAndMetrics() throws Exception {
        JsonNode started = startServerFile(serverFile(".ndjson", historyFile()));
        assertThat(started.get("state").stringValue()).isIn("queued", "reading", "done");
        JsonNode done = awaitEnd(started.get("id").asLong());
        assertThat(done.get("state").stringValue()).isEqualTo("done");
        assertThat(done.get("stored").asLong()).isEqualTo(12);
        assertThat(done.get("duplicates").asLong()).isZero();
        assertThat(done.get("rejected").asLong()).isZero();
        assertThat(done.get("linesRead").asLong()).isEqualTo(12);
        assertThat(done.get("bytesRead").asLong()).isEqualTo(done.get("bytesTotal").asLong());
        assertThat(done.get("progress").asDouble()).isEqualTo(1.0);
        assertThat(done.get("finishedAt").isNull()).isFalse();

        sessionizer.run(site.id());
        // imported history is closed at once: its sessions end long before the site's newest event and wall time
        assertThat(jdbc.sql("SELECT count(*) FROM session_fact WHERE site_id = :s AND closed = FALSE")
                .param("s", site.id()).query(Long.class).single()).isZero();
        JsonNode o = overview();
        assertThat(o.get("sessions").asLong()).isEqualTo(4);
        assertThat(o.get("pageviews").asLong()).isEqualTo(5);
        assertThat(o.get("bounces").asLong()).isEqualTo(3);
        assertThat(o.get("revenueMicros").asLong()).isEqualTo(7500);
        assertThat(o.get("engagedMsPerSession").asDouble()).isEqualTo(41_000 / 4.0);
        assertThat(o.get("viewabilityRate").asDouble()).isEqualTo(0.75);
        assertThat(o.get("ctr").asDouble()).isEqualTo(0.25);
    }

    @Test
    void reRunningTheSameFileStoresNothingNew() throws Exception {
        StringBuilder file = new StringBuilder(historyFile());
        for (int i = 0; i < 20; i++) {
            file.append("""
                    {"type":"session","id":"s%d","visitor":"old-%d","start":"%s","end":"%s","pageviews":%d,\
                    "engagedMs":%d,"entryPath":"/story/%d","entryAds":%d,"laterAds":2.5,"revenueMicros":%d,\
                    "impressions":4,"viewableImpressions":2,"clicks":0,"device":"desktop","source":"search"}
                    """.formatted(i, i, at("08:00:00"), at("08:05:00"), 1 + i % 3, 1000 * i, i, i % 6, 100 * i));
        }
        String name = serverFile(".ndjson", file.toString());
        JsonNode first = awaitEnd(startServerFile(name).get("id").asLong());
        assertThat(first.get("stored").asLong()).isEqualTo(32);
        sessionizer.run(site.id());
        long[] before = {count("pageview"), count("impression"), count("page_end"), count("session_fact")};
        JsonNode overviewBefore = overview();

        JsonNode second = awaitEnd(startServerFile(name).get("id").asLong());
        assertThat(second.get("state").stringValue()).isEqualTo("done");
        assertThat(second.get("stored").asLong()).isZero();
        assertThat(second.get("duplicates").asLong()).isEqualTo(32);
        assertThat(second.get("rejected").asLong()).isZero();
        sessionizer.run(site.id());
        assertThat(new long[]{count("pageview"), count("impression"), count("page_end"), count("session_fact")})
                .containsExactly(before);
        assertThat(before[0]).isEqualTo(5);
        assertThat(overview()).isEqualTo(overviewBefore);
        assertThat(overviewBefore.get("sessions").asLong()).isEqualTo(24);
    }

    /** A session-level warehouse export, with a byte-order mark, quoted fields and one bad row. */
    @Test
    void csvSessionExportWithAColumnMapping() throws Exception {
        String csv = "\uFEFFsession_id,visitor_id,started_at,ended_at,pages,engaged_ms,landing_page,ads_first,"
                + "ads_later,revenue_micros,imps,viewable_imps,clicks,channel,device,country,layout\r\n"
                + "x1,r1," + day + " 09:00:00+00:00," + day + " 09:12:00+00:00,3,95000,\"/soup,green\",2,4.5,9000,8,5,"
                + "1,search,phone,pt,\"Layout \"\"B\"\"\"\r\n"
                + "x2,r2," + at("10:00:00") + "," + at("10:00:00") + ",1,2000,/news,6,,0,3,1,0,social,desktop,ES,\r\n"
                + "x3,r3," + at("11:00:00") + "," + at("11:20:00") + ",many,1,/bad,1,,0,0,0,0,direct,phone,PT,\r\n"
                + "x4,r4," + at("12:00:00") + "," + at("12:30:00") + ",2.0,61000,/long,3,\"3\",1500,2,2,0,"
                + "email,tablet,,\r\n";
        String mapping = """
                {"type":"session","columns":{"id":"session_id","visitor":"visitor_id","start":"started_at",
                 "end":"ended_at","pageviews":"pages","engagedMs":"engaged_ms","entryPath":"landing_page",
                 "entryAds":"ads_first","laterAds":"ads_later","revenueMicros":"revenue_micros",
                 "impressions":"imps","viewableImpressions":"viewable_imps","clicks":"clicks","source":"channel",
                 "device":"device","country":"country","variant":"layout"}}""";
        MvcTestResult r = mvc.post().multipart().uri(base()).with(httpBasic("admin", "admin-secret"))
                .file(new MockMultipartFile("file", "sessions-export.csv", "text/csv",
                        csv.getBytes(StandardCharsets.UTF_8)))
                .param("mapping", mapping).exchange();
        assertThat(r).hasStatus(HttpStatus.ACCEPTED);
        JsonNode started = read(r);
        assertThat(started.get("format").stringValue()).isEqualTo("csv");
        assertThat(started.get("origin").stringValue()).isEqualTo("upload");
        assertThat(started.get("file").stringValue()).isEqualTo("sessions-export.csv");
        JsonNode done = awaitEnd(started.get("id").asLong());
        assertThat(done.get("state").stringValue()).isEqualTo("done");
        assertThat(done.get("stored").asLong()).isEqualTo(3);
        assertThat(done.get("rejected").asLong()).isEqualTo(1);
        assertThat(done.get("linesRead").asLong()).isEqualTo(5);

        MvcTestResult rejections = mvc.get().uri(base() + "/" + done.get("id").asLong() + "/rejections")
                .with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(rejections).hasStatusOk();
        JsonNode line = json.readTree(rejections.getResponse().getContentAsString().strip());
        assertThat(line.get("line").asLong()).isEqualTo(4);
        assertThat(line.get("field").stringValue()).isEqualTo("pageviews");

        Map<String, Object> x1 = jdbc.sql("""
                        SELECT entry_path, variant, country, later_ads, bounce FROM session_fact
                        WHERE site_id = :s AND id = 'x1'""").param("s", site.id()).query().singleRow();
        assertThat(x1).containsEntry("entry_path", "/soup,green").containsEntry("variant", "Layout \"B\"")
                .containsEntry("country", "PT").containsEntry("later_ads", 4.5).containsEntry("bounce", false);

        sessionizer.run(site.id());
        JsonNode o = overview();
        assertThat(o.get("sessions").asLong()).isEqualTo(3);
        assertThat(o.get("pageviews").asLong()).isEqualTo(6);
        assertThat(o.get("bounces").asLong()).isEqualTo(1);
        assertThat(o.get("revenueMicros").asLong()).isEqualTo(10_500);
        // the spooled upload is removed once the job has ended
        try (var spooled = Files.list(Path.of("target/import-tests/spool"))) {
            assertThat(spooled.map(Path::toString).filter(p -> p.endsWith(".csv")).toList()).isEmpty();
        }
    }
}
