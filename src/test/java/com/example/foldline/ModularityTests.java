package com.example.foldline;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;

import org.junit.jupiter.api.Test;
import org.springframework.modulith.core.ApplicationModules;

/** Guards the package-by-feature structure: no cycles, no reaching into another module's internals. */
class ModularityTests {

    @Test
    void modulesRespectTheirBoundaries() {
        ApplicationModules.of(FoldlineApplication.class).verify();
    }

    /** The statistics core stays plain Java: no Spring and no other Foldline module (docs/methods.md). */
    @Test
    void statisticsCoreImportsNoFrameworkAndNoOtherModule() throws IOException {
        Path stats = Path.of("src/main/java/com/example/foldline/stats");
        if (!Files.isDirectory(stats)) {
            return;
        }
        try (Stream<Path> files = Files.walk(stats)) {
            List<String> offending = files.filter(f -> f.toString().endsWith(".java"))
                    .flatMap(f -> {
                        try {
                            return Files.readAllLines(f).stream()
                                    .filter(l -> l.startsWith("import "))
                                    .filter(l -> !l.startsWith("import java.") && !l.startsWith("import static java.")
                                            && !l.startsWith("import com.example.foldline.stats."))
                                    .map(l -> f.getFileName() + ": " + l);
                        } catch (IOException e) {
                            throw new IllegalStateException(e);
                        }
                    }).toList();
            assertThat(offending).isEmpty();
        }
    }
}
