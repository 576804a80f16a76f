package org.isorisk.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Fast checks of the benchmark harness (the benchmark itself is run by bench/run, never by the build). */
class BenchTests {

    @Test
    void listNamesEveryRegisteredCase() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"list"}, print(out), print(err));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        for (String name : Cases.all().keySet()) {
            assertTrue(text.contains(name), text);
        }
        assertTrue(text.startsWith("closed-form "), text);
    }

    @Test
    void unknownCasesAndOptionsAreUsageErrors() {
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        assertEquals(2, Bench.run(new String[] {"no-such-case"}, print(new ByteArrayOutputStream()), print(err)));
        assertEquals("bench: unknown case 'no-such-case' (bench/run list shows the cases)\n",
                err.toString(StandardCharsets.UTF_8));
        ByteArrayOutputStream err2 = new ByteArrayOutputStream();
        assertEquals(2, Bench.run(new String[] {"closed-form", "--sizes", "ten"}, print(new ByteArrayOutputStream()),
                print(err2)));
        assertTrue(err2.toString(StandardCharsets.UTF_8).startsWith("bench: --sizes takes a whole number, not 'ten'"));
    }

    @Test
    void aTinyRunOfTheClosedFormCasePrintsItsTable() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"closed-form", "--sizes", "20", "--reps", "1", "--warmup", "0",
                "--no-reference"}, print(out), print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("java ms"), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("20 ")), text);
        assertTrue(!text.contains("WARNING"), text);
    }

    @Test
    void aTinyRunOfTheCriticalLineCasePrintsItsTable() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int code = Bench.run(new String[] {"critical-line", "--sizes", "30", "--reps", "1", "--warmup", "0",
                "--no-reference"}, print(out), print(new ByteArrayOutputStream()));
        assertEquals(0, code);
        String text = out.toString(StandardCharsets.UTF_8);
        assertTrue(text.contains("frontier ms"), text);
        assertTrue(text.lines().anyMatch(l -> l.trim().startsWith("30 ")), text);
        assertTrue(!text.contains("WARNING"), text);
    }

    @Test
    void generatedProblemsAreReproducibleAndPositiveDefinite() {
        AssetUniverse a = FactorModel.universe(150, 3);
        AssetUniverse b = FactorModel.universe(150, 3);
        assertEquals(a, b);
        assertTrue(Cholesky.factor(a.covariance()) != null);
    }

    @Test
    void matricesAreWrittenAsLittleEndianRowMajorDoubles(@TempDir Path dir) throws Exception {
        double[][] m = {{1.5, -2.0}, {3.25, 1e-300}};
        Path f = dir.resolve("m.f8");
        NumpyReference.writeMatrix(f, m);
        ByteBuffer b = ByteBuffer.wrap(Files.readAllBytes(f)).order(ByteOrder.LITTLE_ENDIAN);
        assertEquals(32, b.capacity());
        assertEquals(1.5, b.getDouble(0));
        assertEquals(-2.0, b.getDouble(8));
        assertEquals(3.25, b.getDouble(16));
        assertEquals(1e-300, b.getDouble(24));
    }

    private static PrintStream print(ByteArrayOutputStream o) {
        return new PrintStream(o, true, StandardCharsets.UTF_8);
    }
}
