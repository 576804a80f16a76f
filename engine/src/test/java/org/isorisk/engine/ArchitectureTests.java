package org.isorisk.engine;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The numerical core does no I/O and knows nothing of files, terminals or charts (DESIGN.md, STYLE.md rule 1):
 * its packages import nothing from {@code java.io}, {@code java.nio.file}, {@code java.awt}, the engine's
 * {@code io} or {@code chart} packages, and print nothing.
 */
class ArchitectureTests {

    /** Packages that must stay free of I/O; the first four exist from the start, the others once they are written. */
    private static final List<String> NUMERICAL = List.of("model", "linalg", "solve", "risk", "estimate", "frontier",
            "stress", "rebalance", "explain", "views", "random", "resampling", "batch");

    private static final List<String> FORBIDDEN = List.of("java.io.", "java.nio.file.", "java.awt.", "javax.imageio",
            "org.isorisk.engine.io.", "org.isorisk.engine.chart.", "System.out", "System.err");

    @Test
    void numericalPackagesImportNothingForInputOrOutput() throws IOException {
        Path root = Path.of("src/main/java/org/isorisk/engine");
        assertTrue(Files.isDirectory(root), "run from the engine module: " + root.toAbsolutePath());
        List<String> found = new ArrayList<>();
        int checked = 0;
        for (String pkg : NUMERICAL) {
            Path dir = root.resolve(pkg);
            if (!Files.isDirectory(dir)) {
                continue;
            }
            try (Stream<Path> files = Files.walk(dir)) {
                for (Path f : files.filter(p -> p.toString().endsWith(".java")).toList()) {
                    checked++;
                    List<String> lines = Files.readAllLines(f);
                    for (int i = 0; i < lines.size(); i++) {
                        String line = lines.get(i).trim();
                        boolean code = !line.startsWith("*") && !line.startsWith("//") && !line.startsWith("/*");
                        for (String bad : FORBIDDEN) {
                            if (code && line.contains(bad)) {
                                found.add(pkg + "/" + f.getFileName() + ":" + (i + 1) + ": " + line);
                            }
                        }
                    }
                }
            }
        }
        assertTrue(checked > 20, "expected the numerical packages' sources, found " + checked + " files");
        assertEquals(List.of(), found);
    }
}
