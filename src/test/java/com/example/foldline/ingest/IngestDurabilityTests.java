package com.example.foldline.ingest;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.OutputStream;
import java.net.Socket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Instant;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.boot.web.server.context.WebServerApplicationContext;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.jdbc.core.simple.JdbcClient;

import com.example.foldline.FoldlineApplication;
import com.example.foldline.sites.Sites;
import com.example.foldline.support.TestData;

/**
 * Issue #2: acknowledged events survive a restart on the same H2 file, and a saturated write path answers 503 with
 * Retry-After. Runs the real application with an HTTP server on loopback.
 */
class IngestDurabilityTests {

    @TempDir
    Path data;

    private ConfigurableApplicationContext start(int maxConcurrent) {
        return new SpringApplicationBuilder(FoldlineApplication.class).run(
                "--server.port=0",
                "--spring.datasource.url=jdbc:h2:file:" + data.resolve("foldline")
                        + ";MODE=PostgreSQL;DATABASE_TO_LOWER=TRUE;CASE_INSENSITIVE_IDENTIFIERS=TRUE;"
                        + "DEFAULT_NULL_ORDERING=HIGH;NON_KEYWORDS=VALUE,KEY;WRITE_DELAY=0",
                "--foldline.admin.initial-password=admin-secret",
                "--foldline.ingest.max-concurrent-requests=" + maxConcurrent,
                "--foldline.demo.enabled=false",
                "--spring.main.banner-mode=off");
    }

    @Test
    void acknowledgedEventsSurviveARestartAndSaturationAnswers503() throws Exception {
        HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
        long siteId;
        String key;
        try (ConfigurableApplicationContext app = start(1)) {
            int port = ((WebServerApplicationContext) app).getWebServer().getPort();
            TestData.SiteWithKey site = TestData.site(app.getBean(Sites.class), "Europe/Berlin");
            siteId = site.site().id();
            key = site.key();
            URI uri = URI.create("http://127.0.0.1:" + port + "/api/v1/sites/" + siteId + "/events");

            // a slow client holds the only write slot while its body trickles in (raw socket: full control)
            String first = TestData.pageview("slow-1", Instant.now().minusSeconds(5), "v", "/s", 1) + "\n";
            String second = TestData.pageview("slow-2", Instant.now().minusSeconds(4), "v", "/s", 2) + "\n";
            byte[] body = (first + second).getBytes(StandardCharsets.UTF_8);
            try (Socket slow = new Socket("127.0.0.1", port)) {
                OutputStream out = slow.getOutputStream();
                out.write(("POST /api/v1/sites/" + siteId + "/events HTTP/1.1\r\nHost: 127.0.0.1\r\n"
                        + "Authorization: Bearer " + key + "\r\nContent-Type: application/x-ndjson\r\n"
                        + "Content-Length: " + body.length + "\r\nConnection: close\r\n\r\n")
                        .getBytes(StandardCharsets.US_ASCII));
                out.write(first.getBytes(StandardCharsets.UTF_8));
                out.flush();
                Thread.sleep(700);

                HttpResponse<String> rejected = http.send(HttpRequest.newBuilder(uri)
                                .header("Authorization", "Bearer " + key).header("Content-Type", "application/x-ndjson")
                                .POST(HttpRequest.BodyPublishers.ofString(
                                        TestData.pageview("fast-1", Instant.now(), "v", "/f", 1))).build(),
                        HttpResponse.BodyHandlers.ofString());
                assertThat(rejected.statusCode()).isEqualTo(503);
                assertThat(rejected.headers().firstValue("Retry-After")).hasValue("2");

                out.write(second.getBytes(StandardCharsets.UTF_8));
                out.flush();
                String response = new String(slow.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
                assertThat(response).startsWith("HTTP/1.1 200").contains("\"accepted\":2");
            }
        }
        try (ConfigurableApplicationContext again = start(4)) {
            long stored = again.getBean(JdbcClient.class).sql("SELECT count(*) FROM pageview WHERE site_id = :s")
                    .param("s", siteId).query(Long.class).single();
            assertThat(stored).isEqualTo(2);
            assertThat(again.getBean(Sites.class).acceptsIngestKey(siteId, key)).isTrue();
        }
    }
}
