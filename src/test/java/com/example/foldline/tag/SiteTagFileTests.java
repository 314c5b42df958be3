package com.example.foldline.tag;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.zip.GZIPOutputStream;

import org.junit.jupiter.api.Test;

/** Issue #8: guards on the site tag's file itself, as Foldline serves it (frontend/tag/tag.js, no build step). */
class SiteTagFileTests {

    private static final Path TAG = Path.of("frontend", "tag", "tag.js");

    @Test
    void servedFileStaysUnderTheFiveKilobyteBudgetGzipped() throws IOException {
        // Tomcat compresses with java.util.zip's default level, as GZIPOutputStream does here. The budget is for
        // the minified tag; the readable file is kept under it too, so no build step is needed (docs/tag.md).
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (GZIPOutputStream gzip = new GZIPOutputStream(out)) {
            gzip.write(Files.readAllBytes(TAG));
        }
        assertThat(out.size()).as("gzipped bytes of " + TAG).isLessThan(5 * 1024);
    }

    @Test
    void tagNeitherSetsNorReadsCookies() throws IOException {
        assertThat(Files.readString(TAG, StandardCharsets.UTF_8)).doesNotContain("document.cookie", "cookieStore");
    }
}
