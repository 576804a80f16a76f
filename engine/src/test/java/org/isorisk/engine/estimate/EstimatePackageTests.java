package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/** The estimate package is numerical: it does no I/O and knows nothing of files, terminals or charts. */
class EstimatePackageTests {

    private static final List<String> FORBIDDEN = List.of("java.io.", "java.nio.file.", "java.awt.",
            "org.isorisk.engine.io.", "org.isorisk.engine.chart.", "System.out", "System.err");

    @Test
    void importsNothingForInputOrOutput() throws IOException {
        Path dir = Path.of("src/main/java/org/isorisk/engine/estimate");
        assertTrue(Files.isDirectory(dir), "run from the engine module: " + dir.toAbsolutePath());
        List<String> found = new ArrayList<>();
        try (Stream<Path> files = Files.list(dir)) {
            for (Path f : files.filter(p -> p.toString().endsWith(".java")).toList()) {
                List<String> lines = Files.readAllLines(f);
                for (int i = 0; i < lines.size(); i++) {
                    String line = lines.get(i);
                    boolean code = !line.trim().startsWith("*") && !line.trim().startsWith("//");
                    for (String bad : FORBIDDEN) {
                        if (code && line.contains(bad)) {
                            found.add(f.getFileName() + ":" + (i + 1) + ": " + line.trim());
                        }
                    }
                }
            }
        }
        assertEquals(List.of(), found);
    }
}
