package com.example.foldline.ingest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.httpBasic;

import java.io.BufferedWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;

import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.HttpStatus;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.context.ActiveProfiles;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.assertj.MvcTestResult;

import com.example.foldline.accounts.Accounts;
import com.example.foldline.accounts.SiteAccess;
import com.example.foldline.accounts.SiteRole;
import com.example.foldline.support.Events;
import com.example.foldline.support.TestData;

import tools.jackson.databind.JsonNode;

/** Issue #8 import contract on H2, plus rejections, cancelling, resuming, path and role checks. */
@SpringBootTest
@AutoConfigureMockMvc
@ActiveProfiles("test")
@TestPropertySource(properties = "foldline.ingest.max-body-bytes=65536")
class ImportApiH2Tests extends ImportApiContract {

    @Autowired
    Accounts accounts;
    @Autowired
    SiteAccess access;
    @Autowired
    ImportJobRepository jobs;
    @Autowired
    ImportWorker worker;

    @Test
    void rejectedLinesAppearInTheRejectionFileWithLineNumbers() throws Exception {
        String file = String.join("\n",
                TestData.pageview("ok1", Instant.parse(at("10:00:00")), "v", "/a", 1),
                "{not json",
                "",
                TestData.pageview("many", Instant.parse(at("10:01:00")), "v", "/a", 101),
                TestData.pageview("ok2", Instant.parse(at("10:02:00")), "v", "/b", 2),
                TestData.pageview("old", Instant.now().minus(401, ChronoUnit.DAYS), "v", "/a", 1),
                "{\"type\":\"click\",\"id\":\"c\"}") + "\n";
        JsonNode done = awaitEnd(startServerFile(serverFile(".ndjson", file)).get("id").asLong());
        assertThat(done.get("state").stringValue()).isEqualTo("done");
        assertThat(done.get("stored").asLong()).isEqualTo(2);
        assertThat(done.get("rejected").asLong()).isEqualTo(4);
        assertThat(done.get("linesRead").asLong()).isEqualTo(7);
        String url = done.get("rejections").stringValue();

        MvcTestResult ndjson = mvc.get().uri(url).with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(ndjson).hasStatusOk().hasContentType("application/x-ndjson");
        String[] lines = ndjson.getResponse().getContentAsString().strip().split("\n");
        assertThat(lines).hasSize(4);
        long[] numbers = new long[4];
        String[] fields = new String[4];
        for (int i = 0; i < 4; i++) {
            JsonNode r = json.readTree(lines[i]);
            numbers[i] = r.get("line").asLong();
            fields[i] = r.get("field").stringValue();
        }
        assertThat(numbers).containsExactly(2, 4, 6, 7);
        assertThat(fields).containsExactly("", "ads", "ts", "type");
        assertThat(json.readTree(lines[2]).get("message").stringValue()).contains("retention of 400 days");

        MvcTestResult csv = mvc.get().uri(url + "?format=csv").with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(csv).hasStatusOk();
        assertThat(csv.getResponse().getContentType()).startsWith("text/csv");
        assertThat(csv.getResponse().getHeader("Content-Disposition")).contains("rejections.csv");
        assertThat(csv.getResponse().getContentAsString(StandardCharsets.UTF_8).split("\r?\n"))
                .startsWith("line,field,message")
                .contains("4,\"ads\",\"must be from 0 to 100, got 101\"");
    }

    @Test
    void cancelStopsARunningJobAndKeepsWhatItStored() throws Exception {
        // 40,000 lines committed 7 at a time: several seconds of work, so the cancel lands mid-file
        Path file = ALLOWED.resolve(TestData.unique("large") + ".ndjson");
        created.add(file);
        Instant base = Instant.parse(at("00:00:00"));
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            for (int i = 0; i < 40_000; i++) {
                w.write(TestData.pageview("big-" + i, base.plusSeconds(i), "v" + (i % 500), "/p/" + (i % 50), i % 7));
                w.write('\n');
            }
        }
        long id = startServerFile(file.getFileName().toString()).get("id").asLong();
        long until = System.currentTimeMillis() + 60_000;
        while (job(id).get("linesRead").asLong() == 0 && System.currentTimeMillis() < until) {
            Thread.sleep(10);
        }
        MvcTestResult cancel = mvc.post().uri(base() + "/" + id + "/cancel").with(httpBasic("admin", "admin-secret"))
                .exchange();
        assertThat(cancel).hasStatusOk();
        assertThat(read(cancel).get("cancelRequested").asBoolean()).isTrue();
        JsonNode end = awaitEnd(id);
        assertThat(end.get("state").stringValue()).isEqualTo("cancelled");
        assertThat(end.get("linesRead").asLong()).isPositive().isLessThan(40_000);
        assertThat(end.get("progress").asDouble()).isLessThan(1.0);
        // what was committed before the cancel stays stored, and the counts say so
        assertThat(count("pageview")).isEqualTo(end.get("stored").asLong()).isEqualTo(end.get("linesRead").asLong());
        assertThat(mvc.post().uri(base() + "/" + id + "/cancel").with(httpBasic("admin", "admin-secret")))
                .hasStatus(HttpStatus.CONFLICT);
    }

    @Test
    void anInterruptedJobResumesFromItsLastCommit() throws Exception {
        String history = historyFile();
        String[] lines = history.split("\n");
        String firstSeven = String.join("\n", java.util.Arrays.copyOf(lines, 7)) + "\n";
        // the first commit (7 lines) as a finished job; then the whole file as a job whose worker died after it
        awaitEnd(startServerFile(serverFile(".ndjson", firstSeven)).get("id").asLong());
        String name = serverFile(".ndjson", history);
        Path path = ALLOWED.resolve(name).toRealPath();
        Instant now = Instant.now();
        long id = jobs.insert(new ImportJobRepository.NewJob(site.id(), "ndjson", "server", name, path.toString(),
                null, "admin", Files.size(path), now));
        jdbc.sql("""
                UPDATE import_job SET state = 'reading', bytes_read = :offset, lines_read = 7, stored = 7,
                                      started_at = :t, heartbeat_at = :t WHERE id = :id""")
                .param("offset", firstSeven.getBytes(StandardCharsets.UTF_8).length)
                .param("t", java.sql.Timestamp.from(now.minus(ImportWorker.STALE).minusSeconds(1)))
                .param("id", id).update();
        worker.recover();
        JsonNode done = awaitEnd(id);
        assertThat(done.get("state").stringValue()).isEqualTo("done");
        // the resumed run read only lines 8 to 12: nothing was read twice, so nothing counts as a duplicate
        assertThat(done.get("stored").asLong()).isEqualTo(12);
        assertThat(done.get("duplicates").asLong()).isZero();
        assertThat(done.get("linesRead").asLong()).isEqualTo(12);
        assertThat(count("pageview")).isEqualTo(5);
    }

    @Test
    void aServerPathOutsideTheAllowedDirectoryIsRefused() throws Exception {
        Path outside = ALLOWED.getParent().resolve(TestData.unique("outside") + ".ndjson");
        Files.writeString(outside, TestData.pageview("o1", Instant.parse(at("10:00:00")), "v", "/a", 1));
        created.add(outside);
        for (String path : new String[]{"../" + outside.getFileName(), outside.toAbsolutePath().toString(),
                "sub/../../" + outside.getFileName(), "/etc/hostname", "no-such-file.ndjson", ""}) {
            MvcTestResult r = startServer("{\"path\":\"" + path + "\"}", "admin", "admin-secret");
            assertThat(r).as(path).hasStatus(HttpStatus.BAD_REQUEST);
            assertThat(read(r).get("errors").get(0).get("field").stringValue()).as(path).isEqualTo("path");
        }
        assertThat(count("pageview")).isZero();
        assertThat(jdbc.sql("SELECT count(*) FROM import_job WHERE site_id = :s").param("s", site.id())
                .query(Long.class).single()).isZero();
    }

    @Test
    void aViewerCannotStartOrCancelAnImport() throws Exception {
        String viewer = TestData.unique("viewer");
        accounts.create(viewer, "password-for-tests", false);
        access.grantUser(site.id(), viewer, SiteRole.VIEWER);
        String name = serverFile(".ndjson", historyFile());
        assertThat(startServer("{\"path\":\"" + name + "\"}", viewer, "password-for-tests"))
                .hasStatus(HttpStatus.FORBIDDEN);
        assertThat(mvc.post().multipart().uri(base()).with(httpBasic(viewer, "password-for-tests"))
                .file(new MockMultipartFile("file", "x.ndjson", "application/x-ndjson", historyFile().getBytes())))
                .hasStatus(HttpStatus.FORBIDDEN);
        long id = startServerFile(name).get("id").asLong();
        assertThat(mvc.get().uri(base()).with(httpBasic(viewer, "password-for-tests"))).hasStatusOk();
        assertThat(mvc.post().uri(base() + "/" + id + "/cancel").with(httpBasic(viewer, "password-for-tests")))
                .hasStatus(HttpStatus.FORBIDDEN);
        awaitEnd(id);
    }

    @Test
    void aCsvMappingIsCheckedAgainstTheHeaderBeforeTheJobIsQueued() throws Exception {
        String name = serverFile(".csv", "sid,who,from,to\nx,y,z,w\n");
        MvcTestResult r = startServer("""
                {"path":"%s","mapping":{"type":"session","columns":{"id":"sid","visitor":"who","start":"begin",
                 "end":"to","pageviews":"to","entryPath":"to","entryAds":"to","colour":"to"}}}""".formatted(name),
                "admin", "admin-secret");
        assertThat(r).hasStatus(HttpStatus.BAD_REQUEST);
        assertThat(r.getResponse().getContentAsString()).contains("mapping.columns.colour");
        r = startServer("""
                {"path":"%s","mapping":{"type":"session","columns":{"id":"sid","visitor":"who","start":"begin",
                 "end":"to","pageviews":"to","entryPath":"to","entryAds":"to"}}}""".formatted(name),
                "admin", "admin-secret");
        assertThat(r).hasStatus(HttpStatus.BAD_REQUEST);
        assertThat(read(r).get("errors").get(0).get("field").stringValue()).isEqualTo("mapping.columns.start");
        assertThat(read(r).get("errors").get(0).get("message").stringValue()).contains("'begin'");
        assertThat(startServer("{\"path\":\"" + name + "\"}", "admin", "admin-secret"))
                .hasStatus(HttpStatus.BAD_REQUEST);
        assertThat(startServer("{\"path\":\"" + serverFile(".ndjson", new Events().ndjson()) + "\",\"mapping\":{}}",
                "admin", "admin-secret")).hasStatus(HttpStatus.BAD_REQUEST);
    }

    @Test
    void listsTheSitesJobsNewestFirst() throws Exception {
        long first = startServerFile(serverFile(".ndjson", historyFile())).get("id").asLong();
        long second = startServerFile(serverFile(".ndjson", historyFile())).get("id").asLong();
        awaitEnd(first);
        awaitEnd(second);
        MvcTestResult r = mvc.get().uri(base()).with(httpBasic("admin", "admin-secret")).exchange();
        assertThat(r).hasStatusOk();
        JsonNode list = read(r);
        assertThat(list.size()).isEqualTo(2);
        assertThat(list.get(0).get("id").asLong()).isEqualTo(second);
        assertThat(list.get(1).get("createdBy").stringValue()).isEqualTo("admin");
        assertThat(mvc.get().uri(base() + "/999999999").with(httpBasic("admin", "admin-secret")))
                .hasStatus(HttpStatus.NOT_FOUND);
    }
}
