package com.example.foldline.web;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Base64;
import java.util.List;
import java.util.zip.Deflater;
import java.util.zip.GZIPOutputStream;

import org.junit.jupiter.api.Test;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.test.context.ActiveProfiles;

/**
 * Issue #5: the front end's own code (HTML, CSS and JavaScript, Chart.js not counted) stays under 100 KB
 * uncompressed; issue #8: the site tag stays under 5 KB minified and gzipped. Both are measured on what a browser
 * downloads from a running server over HTTP, without compression.
 */
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
@ActiveProfiles("test")
class ServedCodeBudgetTests {

    @LocalServerPort
    int port;

    private final HttpClient http = HttpClient.newHttpClient();

    @Test
    void theBrowserUiDownloadsUnder100000BytesOfItsOwnCode() throws Exception {
        // every file of frontend/app but its Node tests, as the server sends it
        Path app = Path.of("frontend/app");
        long served = 0;
        long written = 0;
        int files = 0;
        List<Path> sources;
        try (var walk = Files.walk(app)) {
            sources = walk.filter(p -> p.toString().matches(".*\\.(js|css|html)"))
                    .filter(p -> !p.startsWith(app.resolve("js/test"))).toList();
        }
        for (Path source : sources) {
            String path = app.relativize(source).toString().replace('\\', '/');
            HttpResponse<byte[]> answer = get("/" + path);
            assertThat(answer.statusCode()).as(path).isEqualTo(200);
            assertThat(answer.headers().firstValue("Content-Encoding")).as(path).isEmpty();
            served += answer.body().length;
            written += Files.size(source);
            files++;
        }
        System.out.printf("browser UI: %d files, %,d bytes written, %,d bytes served%n", files, written, served);
        assertThat(files).isGreaterThan(20);
        assertThat(served).as("served bytes (source files hold %d)", written).isLessThan(100_000).isLessThan(written);
    }

    @Test
    void theTagIsServedUnder5KilobytesMinifiedAndGzipped() throws Exception {
        HttpResponse<byte[]> tag = get("/tag.js");
        assertThat(tag.statusCode()).isEqualTo(200);
        assertThat(new String(tag.body(), StandardCharsets.UTF_8)).doesNotContain("\n  ").contains("sendBeacon");
        System.out.printf("site tag: %,d bytes served, %,d gzipped%n", tag.body().length, gzip(tag.body()));
        assertThat(gzip(tag.body())).isLessThan(5 * 1024);
    }

    @Test
    void minifiedFilesAreRevalidatedSoANewReleaseIsSeenAtOnce() throws Exception {
        HttpResponse<byte[]> js = get("/js/main.js");
        assertThat(js.headers().firstValue("Cache-Control")).hasValueSatisfying(v -> assertThat(v).contains("no-cache"));
        assertThat(js.headers().firstValue("Content-Type")).hasValueSatisfying(v -> assertThat(v).contains("javascript"));
    }

    private HttpResponse<byte[]> get(String path) throws IOException, InterruptedException {
        String basic = Base64.getEncoder().encodeToString("admin:admin-secret".getBytes(StandardCharsets.UTF_8));
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + path))
                .header("Authorization", "Basic " + basic).build(), HttpResponse.BodyHandlers.ofByteArray());
    }

    private static int gzip(byte[] bytes) throws IOException {
        var out = new ByteArrayOutputStream();
        try (var gz = new GZIPOutputStream(out) { { def.setLevel(Deflater.BEST_COMPRESSION); } }) {
            gz.write(bytes);
        }
        return out.size();
    }
}
