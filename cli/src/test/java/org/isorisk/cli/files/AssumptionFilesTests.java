package org.isorisk.cli.files;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.AssumptionTables;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The assumption tables {@code estimate} and the repair write read back through the engine's readers. */
class AssumptionFilesTests {

    private static final List<String> NAMES = List.of("Bonds", "Equity, World", "Cash");

    @Test
    void aWrittenMatrixReadsBackToTheSameDoublesAndRowsAreMatchedByName(@TempDir Path dir) throws IOException {
        double[][] m = {{0.0016, 1.0 / 3e4, -2e-5}, {1.0 / 3e4, 0.0289, 0.0}, {-2e-5, 0.0, 1e-7}};
        StringWriter w = new StringWriter();
        AssumptionFiles.writeMatrix(w, NAMES, m);
        Path file = dir.resolve("c.csv");
        Files.writeString(file, w.toString());
        AssumptionTables.Matrix back = AssumptionTables.readMatrix(file, "covariance");
        assertEquals(NAMES, back.assets());
        for (int i = 0; i < 3; i++) {
            assertArrayEquals(m[i], back.matrix()[i], 0);
        }
        String[] rows = w.toString().split("\n");
        assertTrue(rows[0].startsWith("asset,Bonds,\"Equity, World\",Cash"), rows[0]);
        Files.writeString(file, rows[0] + "\n" + rows[3] + "\n" + rows[1] + "\n" + rows[2] + "\n");
        AssumptionTables.Matrix shuffled = AssumptionTables.readMatrix(file, "covariance");
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                int si = shuffled.assets().indexOf(NAMES.get(i));
                int sj = shuffled.assets().indexOf(NAMES.get(j));
                assertEquals(m[i][j], shuffled.matrix()[si][sj], 0, "matched by name");
            }
        }
    }

    @Test
    void aWrittenColumnReadsBack(@TempDir Path dir) throws IOException {
        StringWriter w = new StringWriter();
        AssumptionFiles.writeColumn(w, "expected_return", NAMES, new double[] {0.03, 0.065, 0.01});
        assertEquals("asset,expected_return\nBonds,0.03\n\"Equity, World\",0.065\nCash,0.01\n", w.toString());
        Path file = dir.resolve("mu.csv");
        Files.writeString(file, w.toString());
        Map<String, Double> back = AssumptionTables.readColumn(file, "expected-returns", "expected_return");
        assertEquals(0.065, back.get("Equity, World"), 0);
        Files.writeString(file, "name,mu\nA,1\n");
        InputException e = assertThrows(InputException.class,
                () -> AssumptionTables.readColumn(file, "expected-returns", "expected_return"));
        assertTrue(e.getMessage().contains("no column named 'asset'"), e.getMessage());
    }
}
