package com.example.foldline.ingest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import com.example.foldline.system.BadRequestException;

/** Issue #8: a server path is read only inside the allowed directory, after normalising it and following links. */
class ImportFilesTests {

    @TempDir
    Path root;

    ImportFiles files(String allowed) {
        return new ImportFiles(new ImportProperties(allowed, root.resolve("spool"), 5000, Duration.ofSeconds(5), 1,
                1 << 20));
    }

    @Test
    void refusesEverythingWhenNoDirectoryIsAllowed() throws Exception {
        Files.writeString(root.resolve("a.ndjson"), "{}");
        assertThatThrownBy(() -> files("").allowedFile(root.resolve("a.ndjson").toString()))
                .isInstanceOf(BadRequestException.class).hasMessageContaining("switched off");
        assertThatThrownBy(() -> files("   ").allowedFile("a.ndjson")).hasMessageContaining("switched off");
    }

    @Test
    void acceptsFilesInsideAndRefusesEverythingOutside() throws Exception {
        Path allowed = Files.createDirectories(root.resolve("allowed"));
        Files.createDirectories(allowed.resolve("sub"));
        Path inside = Files.writeString(allowed.resolve("sub/in.ndjson"), "{}");
        Files.writeString(root.resolve("secret.ndjson"), "{}");
        ImportFiles files = files(allowed.toString());

        assertThat(files.allowedFile("sub/in.ndjson")).isEqualTo(inside.toRealPath());
        assertThat(files.allowedFile(inside.toString())).isEqualTo(inside.toRealPath());
        assertThat(files.allowedFile("sub/../sub/./in.ndjson")).isEqualTo(inside.toRealPath());
        for (String bad : new String[]{"../secret.ndjson", "sub/../../secret.ndjson", root.resolve("secret.ndjson")
                .toString(), "/etc/passwd", ".", "sub", "missing.ndjson", "", "a\0b"}) {
            assertThatThrownBy(() -> files.allowedFile(bad)).as(bad).isInstanceOf(BadRequestException.class)
                    .satisfies(e -> assertThat(((BadRequestException) e).errors().get(0).field()).isEqualTo("path"));
        }
    }

    @Test
    void aLinkInsideThatPointsOutsideIsRefused() throws Exception {
        Path allowed = Files.createDirectories(root.resolve("allowed"));
        Path secret = Files.writeString(root.resolve("secret.ndjson"), "{}");
        Files.createSymbolicLink(allowed.resolve("link.ndjson"), secret);
        Files.createSymbolicLink(allowed.resolve("dir"), root);
        assertThatThrownBy(() -> files(allowed.toString()).allowedFile("link.ndjson"))
                .hasMessageContaining("inside the directory");
        assertThatThrownBy(() -> files(allowed.toString()).allowedFile("dir/secret.ndjson"))
                .hasMessageContaining("inside the directory");
    }
}
