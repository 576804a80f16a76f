package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.StringReader;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.EstimationSettings;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.Estimator;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.estimate.ValueKind;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class TablesTests {

    private static final List<String> NAMES = List.of("Bonds", "Equity, World", "Cash");

    @Test
    void aWrittenMatrixReadsBackToTheSameDoublesAndRowsAreMatchedByName() throws IOException {
        double[][] m = {{0.0016, 1.0 / 3e4, -2e-5}, {1.0 / 3e4, 0.0289, 0.0}, {-2e-5, 0.0, 1e-6}};
        StringWriter w = new StringWriter();
        TableWriter.writeMatrix(w, NAMES, m);
        AssumptionTables.NamedMatrix back = AssumptionTables.readMatrix(new StringReader(w.toString()), "c.csv");
        assertEquals(NAMES, back.assets());
        for (int i = 0; i < 3; i++) {
            assertArrayEquals(m[i], back.matrix()[i], 0);
        }
        String lines = w.toString();
        String[] rows = lines.split("\n");
        String shuffled = rows[0] + "\n" + rows[3] + "\n" + rows[1] + "\n" + rows[2] + "\n";
        assertArrayEquals(m[2], AssumptionTables.readMatrix(new StringReader(shuffled), "c.csv").matrix()[2], 0);
        assertTrue(rows[0].startsWith("asset,Bonds,\"Equity, World\",Cash"), rows[0]);
    }

    @Test
    void aWrittenColumnReadsBack() throws IOException {
        StringWriter w = new StringWriter();
        TableWriter.writeColumn(w, "expected_return", NAMES, new double[] {0.03, 0.065, 0.01});
        assertEquals("asset,expected_return\nBonds,0.03\n\"Equity, World\",0.065\nCash,0.01\n", w.toString());
        Map<String, Double> back = AssumptionTables.readColumn(new StringReader(w.toString()), "mu.csv",
                "expected_return");
        assertEquals(0.065, back.get("Equity, World"), 0);
    }

    @Test
    void matrixProblemsNameTheAsset() {
        InputException e = assertThrows(InputException.class, () -> AssumptionTables.readMatrix(
                new StringReader("asset,A,B\nA,1,0.5\nC,0.5,1\n"), "c.csv"));
        assertEquals("c.csv, row 3, asset 'C': the row's asset is not in the header; fix: add it to the header or "
                + "remove the row", e.getMessage());
        e = assertThrows(InputException.class, () -> AssumptionTables.readMatrix(
                new StringReader("asset,A,B\nA,1,0.5\n"), "c.csv"));
        assertEquals("c.csv, asset 'B': asset of the header has no row; fix: add a row for it", e.getMessage());
        e = assertThrows(InputException.class, () -> AssumptionTables.readColumn(
                new StringReader("name,mu\nA,1\n"), "mu.csv", "expected_return"));
        assertEquals("mu.csv, row 1: the header needs the columns 'asset' and 'expected_return' (value 'name,mu'); "
                + "fix: name the columns asset,expected_return", e.getMessage());
    }

    @Test
    void outputIsAllOrNothingAndNeverOverwritesWithoutForce(@TempDir Path dir) throws IOException {
        Path out = dir.resolve("out");
        List<Path> written = new AtomicOutput(out).add("a.csv", w -> w.write("a\n")).add("b.csv", w -> w.write("b\n"))
                .commit(false, List.of());
        assertEquals(2, written.size());
        assertEquals("a\n", Files.readString(out.resolve("a.csv")));
        InputException e = assertThrows(InputException.class,
                () -> new AtomicOutput(out).add("a.csv", w -> w.write("new\n")).commit(false, List.of()));
        assertTrue(e.getMessage().endsWith("the output file exists already; fix: choose another --out-dir, or add "
                + "--force to replace it"), e.getMessage());
        assertEquals("a\n", Files.readString(out.resolve("a.csv")));
        // A failure while writing the second file leaves the first one untouched and no temporary files.
        assertThrows(InputException.class, () -> new AtomicOutput(out).add("a.csv", w -> w.write("new\n"))
                .add("c.csv", w -> {
                    throw new IOException("disk full");
                }).commit(true, List.of()));
        assertEquals("a\n", Files.readString(out.resolve("a.csv")));
        assertFalse(Files.exists(out.resolve("c.csv")));
        try (Stream<Path> s = Files.list(out)) {
            assertEquals(2, s.count(), "only a.csv and b.csv");
        }
        e = assertThrows(InputException.class, () -> new AtomicOutput(out).add("a.csv", w -> w.write("x"))
                .commit(true, List.of(out.resolve("a.csv"))));
        assertTrue(e.getMessage().contains("the output would overwrite an input"), e.getMessage());
    }

    @Test
    void theReportsCarryTheCautionAndParseBack() throws IOException {
        double[][] p = new double[60][2];
        java.time.LocalDate[] d = new java.time.LocalDate[60];
        java.util.Random rnd = new java.util.Random(3);
        for (int t = 0; t < 60; t++) {
            d[t] = java.time.LocalDate.of(2015, 1, 31).plusMonths(t);
            p[t][0] = 100 * Math.exp(0.01 * t + 0.03 * rnd.nextGaussian());
            p[t][1] = 50 * Math.exp(0.005 * t + 0.05 * rnd.nextGaussian());
        }
        History h = new History("m.csv", List.of("Bonds", "Equity"), d, null, p, ValueKind.PRICES);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults()
                .withMethod(CovarianceMethod.LEDOIT_WOLF_CONSTANT_CORRELATION), null);
        StringWriter text = new StringWriter();
        EstimateReport.text(text, e, 50);
        assertTrue(text.toString().contains("frequency:      monthly (detected from the dates"), text.toString());
        assertTrue(text.toString().contains("12 periods a year"));
        assertTrue(text.toString().contains("Caution: " + Caution.TEXT));
        StringWriter json = new StringWriter();
        EstimateReport.writeJson(json, EstimateReport.json(e));
        JsonNode n = new ObjectMapper().readTree(json.toString());
        assertEquals(Caution.TEXT, n.get("caution").asText());
        assertEquals(e.shrinkage().intensity(), n.at("/method/shrinkage_intensity").asDouble(), 0);
        assertEquals(e.after().smallest(), n.at("/conditioning/after/smallest_eigenvalue").asDouble(), 0);
        assertEquals("historical-mean", n.at("/issues/0/code").asText());
        assertEquals(e.expectedReturns()[1], n.at("/assets/1/expected_return").asDouble(), 0);
    }
}
