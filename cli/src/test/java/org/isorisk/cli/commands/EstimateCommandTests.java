package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.DayOfWeek;
import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import org.isorisk.cli.Run;
import org.isorisk.engine.ExternalTools;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.AssumptionTables;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class EstimateCommandTests {

    @TempDir
    Path dir;

    /** Invented daily prices of three fictional funds (illustrative, not real data). */
    private String prices(int rows) throws IOException {
        Random rnd = new Random(5);
        StringBuilder sb = new StringBuilder("date,Bond Fund,Equity Fund,Property Fund\n");
        double[] p = {100, 100, 100};
        LocalDate d = LocalDate.of(2021, 1, 4);
        for (int t = 0; t < rows; t++) {
            while (d.getDayOfWeek() == DayOfWeek.SATURDAY || d.getDayOfWeek() == DayOfWeek.SUNDAY) {
                d = d.plusDays(1);
            }
            double f = 0.01 * rnd.nextGaussian();
            p[0] *= 1 + 0.0001 + 0.1 * f + 0.002 * rnd.nextGaussian();
            p[1] *= 1 + 0.0004 + f + 0.004 * rnd.nextGaussian();
            p[2] *= 1 + 0.0003 + 0.5 * f + 0.006 * rnd.nextGaussian();
            sb.append(d).append(String.format(Locale.ROOT, ",%.4f,%.4f,%.4f%n", p[0], p[1], p[2]));
            d = d.plusDays(1);
        }
        return Run.file(dir, "prices.csv", sb.toString());
    }

    @Test
    void writesTheTablesSolveReadsAndPrintsTheReportWithTheCaution() throws IOException {
        String h = prices(300);
        Path out = dir.resolve("assumptions");
        Run r = Run.of("estimate", "--history", h, "--kind", "prices", "--method", "ledoit-wolf-constant-correlation",
                "--out-dir", out.toString());
        assertEquals(0, r.code(), r.toString());
        for (String f : List.of("expected_returns.csv", "covariance.csv", "volatilities.csv", "correlation.csv",
                "data_quality.txt", "data_quality.json")) {
            assertTrue(Files.exists(out.resolve(f)), f);
        }
        assertTrue(r.out().contains("Ledoit-Wolf shrinkage towards constant correlation"), r.out());
        assertTrue(r.out().contains("warning: the expected returns are historical means"), r.out());
        assertTrue(r.out().strip().endsWith("Caution: " + Caution.TEXT), r.out());
        assertTrue(Files.readString(out.resolve("data_quality.txt")).contains("Caution: " + Caution.TEXT));
        assertEquals(Caution.TEXT, Run.json(out.resolve("data_quality.json")).get("caution").asText());
        // The layouts solve reads: solve accepts the written tables as they are.
        Run solve = Run.of("solve", "--expected-returns", out.resolve("expected_returns.csv").toString(),
                "--covariance", out.resolve("covariance.csv").toString(), "--format", "json");
        assertEquals(0, solve.code(), solve.toString());
        assertEquals("optimal", solve.json().get("status").asText());
    }

    @Test
    void jsonCarriesTheIntensityTheConditioningTimingAndTheCaution() throws IOException {
        String h = prices(200);
        Path out = dir.resolve("lw");
        Run r = Run.of("estimate", "--history", h, "--kind", "prices", "--method", "ledoit-wolf-identity",
                "--periods-per-year", "260", "--out-dir", out.toString(), "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        assertEquals("ok", j.get("status").asText());
        assertEquals(260, j.at("/frequency/periods_per_year").asInt());
        assertEquals("daily", j.at("/frequency/frequency").asText());
        double delta = j.at("/method/shrinkage_intensity").asDouble();
        assertTrue(delta > 0 && delta < 1, "intensity " + delta);
        assertTrue(j.at("/conditioning/after/condition_number").asDouble()
                <= j.at("/conditioning/before/condition_number").asDouble());
        assertTrue(j.at("/timing_ms/total").isNumber());
        assertTrue(j.at("/timing_ms/read").isNumber());
        assertEquals(6, j.get("files").size());
        assertEquals(Caution.TEXT, j.get("caution").asText());
        assertTrue(r.err().contains("isorisk: warning: the expected returns are historical means"), r.err());
    }

    @Test
    void badHistoriesAndOptionsExitTwoWithOneLineAndWriteNothing() throws IOException {
        String h = Run.file(dir, "dup.csv", "date,A,B\n2021-01-04,100,50\n2021-01-05,101,51\n2021-01-05,102,52\n"
                + "2021-01-06,103,50\n");
        Path out = dir.resolve("never");
        Run r = Run.of("estimate", "--history", h, "--kind", "prices", "--out-dir", out.toString());
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: " + h + ": date 2021-01-05 appears twice (rows 3 and 4); fix: keep one row per "
                + "date\n", r.err());
        assertEquals("", r.out());
        assertFalse(Files.exists(out));

        String good = prices(50);
        r = Run.of("estimate", "--history", good, "--kind", "prices", "--mean", "file", "--out-dir", out.toString());
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: --mean file needs the table of expected returns; fix: give --expected-returns "
                + "FILE (columns asset,expected_return)\n", r.err());
        r = Run.of("estimate", "--history", good, "--kind", "quotes", "--out-dir", out.toString());
        assertEquals("isorisk: error: unknown value for --kind (value 'quotes'); fix: use one of prices, returns\n",
                r.err());
        r = Run.of("estimate", "--history", good, "--kind", "prices", "--out-dir", dir.toString());
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: " + dir + ": the --out-dir folder holds the --history file " + good
                + ", and would be replaced as a whole; an output never replaces an input of the same run; fix: choose "
                + "another --out-dir folder that holds none of the inputs\n", r.err());
        r = Run.of("estimate", "--history", good, "--kind", "prices", "--method", "ewma", "--frequency", "monthly",
                "--out-dir", out.toString(), "--format", "json");
        assertEquals(2, r.code(), r.toString());
        assertEquals("invalid-input", r.json().get("status").asText());
        assertFalse(Files.exists(out));
    }

    @Test
    void theInputIsNeverModified() throws IOException {
        String h = prices(80);
        byte[] before = Files.readAllBytes(Path.of(h));
        Run r = Run.of("estimate", "--history", h, "--kind", "prices", "--out-dir", dir.resolve("o").toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals(new String(before), Files.readString(Path.of(h)));
    }

    @Test
    void euStockMarketsThroughTheCommandMatchesRsColMeansAndCov() throws IOException {
        // R's open dataset datasets::EuStockMarkets (Debian r-base-core), exported by the engine's reference script.
        String rscript = ExternalTools.rscript();
        Path ref = dir.resolve("ref");
        Files.createDirectories(ref);
        ExternalTools.runOrFail(List.of(rscript, ExternalTools.scripts().resolve("eustockmarkets_reference.R")
                .toString(), ref.toString()), 120);
        Map<String, Double> reference = new HashMap<>();
        List<String> lines = Files.readAllLines(ref.resolve("reference.csv"));
        for (String line : lines.subList(1, lines.size())) {
            String[] f = line.split(",", -1);
            reference.put(f[0] + "|" + f[1] + "|" + f[2], Double.parseDouble(f[3]));
        }
        for (String type : List.of("simple", "log")) {
            Path out = dir.resolve("eu-" + type);
            Run r = Run.of("estimate", "--history", ref.resolve("eustockmarkets.csv").toString(), "--kind", "prices",
                    "--returns", type, "--periods-per-year", "260", "--out-dir", out.toString());
            assertEquals(0, r.code(), r.toString());
            Map<String, Double> mu = AssumptionTables.readColumn(out.resolve("expected_returns.csv"),
                    "expected-returns", "expected_return");
            AssumptionTables.Matrix cov = AssumptionTables.readMatrix(out.resolve("covariance.csv"), "covariance");
            for (String a : List.of("DAX", "SMI", "CAC", "FTSE")) {
                assertEquals(reference.get("mean_" + type + "|" + a + "|"), mu.get(a), Tolerances.CLOSED_FORM,
                        "R colMeans, " + type + ", " + a);
                for (String b : List.of("DAX", "SMI", "CAC", "FTSE")) {
                    assertEquals(reference.get("cov_" + type + "|" + a + "|" + b),
                            cov.matrix()[cov.assets().indexOf(a)][cov.assets().indexOf(b)], Tolerances.CLOSED_FORM,
                            "R cov, " + type + ", " + a + "," + b);
                }
            }
        }
    }
}
