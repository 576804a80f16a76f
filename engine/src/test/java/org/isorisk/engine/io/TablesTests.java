package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.estimate.EstimationSettings;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.Estimator;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.ValueKind;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class TablesTests {

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
        ResultJson.write(EstimateReport.json(e), json);
        JsonNode n = new ObjectMapper().readTree(json.toString());
        assertEquals(Caution.TEXT, n.get("caution").asText());
        assertEquals(e.shrinkage().intensity(), n.at("/method/shrinkage_intensity").asDouble(), 0);
        assertEquals(e.after().smallest(), n.at("/conditioning/after/smallest_eigenvalue").asDouble(), 0);
        assertEquals("historical-mean", n.at("/issues/0/code").asText());
        assertEquals(e.expectedReturns()[1], n.at("/assets/1/expected_return").asDouble(), 0);
    }
}
