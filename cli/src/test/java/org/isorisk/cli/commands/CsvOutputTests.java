package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import java.util.stream.Stream;
import org.isorisk.cli.Run;
import org.isorisk.cli.SpreadsheetView;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every CSV the tool writes guards the asset, group and scenario names a spreadsheet would run as formulas (OWASP,
 * "CSV Injection") and never its numbers, and the tool reads each one back with the names as given: a {@code solve}
 * CSV is a {@code risk --weights} input, {@code estimate}'s and the repair's tables are {@code solve} inputs.
 * The assets are invented; their names are the hostile ones.
 */
class CsvOutputTests {

    /** Names a spreadsheet would run as formulas, one with a comma, one harmless. */
    static final List<String> NAMES = List.of("=SUM(A1:A9)", "+Plus", "-Minus", "@At", "-10 Minus, Start",
            "=cmd|' /C calc'!A0", "Cash");

    @TempDir
    Path dir;

    String mu;
    String cov;

    private static String quoted(String name) {
        return name.contains(",") ? "\"" + name + "\"" : name;
    }

    @BeforeEach
    void universe() throws IOException {
        // invented: volatilities 4 % to 22 %, every correlation 0.3 (positive definite), returns 2 % to 8 %
        int n = NAMES.size();
        StringBuilder m = new StringBuilder("asset,expected_return\n");
        StringBuilder c = new StringBuilder("asset");
        for (String a : NAMES) {
            c.append(',').append(quoted(a));
        }
        c.append('\n');
        for (int i = 0; i < n; i++) {
            m.append(quoted(NAMES.get(i))).append(',').append(0.02 + 0.01 * i).append('\n');
            c.append(quoted(NAMES.get(i)));
            for (int j = 0; j < n; j++) {
                double vi = 0.04 + 0.03 * i;
                double vj = 0.04 + 0.03 * j;
                c.append(',').append(String.format(Locale.ROOT, "%.10f", (i == j ? 1.0 : 0.3) * vi * vj));
            }
            c.append('\n');
        }
        mu = Run.file(dir, "mu.csv", m.toString());
        cov = Run.file(dir, "cov.csv", c.toString());
    }

    /** The file is guarded: no cell a spreadsheet would run, no number turned into text. */
    private static String guarded(String csv) {
        assertEquals(List.of(), SpreadsheetView.formulas(csv), csv);
        for (String cell : SpreadsheetView.cells(csv)) {
            assertTrue(!cell.matches("'[-+]?[0-9.]+([eE][-+]?[0-9]+)?"), "a number is never guarded: " + cell);
        }
        assertTrue(csv.contains("'=SUM(A1:A9)"), csv);
        return csv;
    }

    private static List<String> column(CsvTable t, int c) {
        return t.rows().stream().map(r -> r.cell(c)).toList();
    }

    @Test
    void aSolveCsvIsGuardedAndIsTheRiskCommandsWeightsInput() throws IOException {
        Path w = dir.resolve("weights.csv");
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.09", "--format",
                "csv", "--out", w.toString());
        assertEquals(0, r.code(), r.toString());
        guarded(Files.readString(w));
        assertTrue(Files.readString(w).contains("\n'=SUM(A1:A9),-0.97"), "a short position: the name guarded, the "
                + "negative weight a number");
        JsonNode solved = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.09",
                "--format", "json").json().get("weights");
        Run risk = Run.of("risk", "--covariance", cov, "--weights", w.toString(), "--format", "json");
        assertEquals(0, risk.code(), risk.toString());
        JsonNode c = risk.json().get("portfolio").get("contributions");
        for (int i = 0; i < NAMES.size(); i++) {
            assertEquals(NAMES.get(i), c.get(i).get("asset").asText());
            assertEquals(solved.get(NAMES.get(i)).doubleValue(), c.get(i).get("weight").doubleValue(),
                    "full precision survives: " + NAMES.get(i));
        }
    }

    @Test
    void everyCommandsCsvIsGuardedAndReadsBackWithTheNamesAsGiven() throws IOException {
        Run f = Run.of("frontier", "--expected-returns", mu, "--covariance", cov, "--points", "3", "--format", "csv");
        assertEquals(0, f.code(), f.toString());
        CsvTable t = Csv.parse("frontier.csv", "frontier", guarded(f.out()));
        assertEquals(NAMES, t.header().subList(t.header().size() - NAMES.size(), t.header().size()));

        String weights = Run.file(dir, "w.csv", "asset,weight\n\"=SUM(A1:A9)\",0.5\n-Minus,0.3\nCash,0.2\n");
        Run risk = Run.of("risk", "--covariance", cov, "--weights", weights, "--benchmark", weights, "--format", "csv");
        assertEquals(0, risk.code(), risk.toString());
        assertEquals(NAMES, column(Csv.parse("risk.csv", "risk", guarded(risk.out())), 0));

        Run check = Run.of("check", "--expected-returns", mu, "--covariance", cov, "--format", "csv");
        assertEquals(0, check.code(), check.toString());
        assertEquals(NAMES, column(Csv.parse("check.csv", "check", guarded(check.out())), 0));

        Run reb = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--holdings", weights,
                "--target-return", "0.05", "--format", "csv");
        assertEquals(0, reb.code(), reb.toString());
        assertEquals(NAMES, column(Csv.parse("rebalance.csv", "rebalance", guarded(reb.out())), 0));

        String scenarios = Run.file(dir, "s.yaml", "scenarios:\n  - name: \"=cmd|' /C calc'!A0\"\n    shocks:\n"
                + "      - volatility: {scope: \"-Minus\", multiplier: 1.5}\n");
        Run stress = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--targets", "0.04:0.05:0.01",
                "--scenarios", scenarios, "--quiet", "--format", "csv");
        assertEquals(0, stress.code(), stress.toString());
        String csv = stress.out();
        assertEquals(List.of(), SpreadsheetView.formulas(csv), csv);
        assertEquals(List.of("base", "base", "=cmd|' /C calc'!A0", "=cmd|' /C calc'!A0"),
                column(Csv.parse("stress.csv", "stress", csv), 0));
    }

    /** Invented monthly prices of the hostile-named assets (a fixed seed; illustrative, not data). */
    private String prices() {
        Random rnd = new Random(11);
        StringBuilder sb = new StringBuilder("date");
        for (String a : NAMES) {
            sb.append(',').append(quoted(a));
        }
        sb.append('\n');
        double[] p = new double[NAMES.size()];
        java.util.Arrays.fill(p, 100);
        LocalDate d = LocalDate.of(2020, 1, 31);
        for (int t = 0; t < 60; t++) {
            sb.append(d);
            for (int i = 0; i < p.length; i++) {
                p[i] *= 1 + 0.005 + 0.01 * (i + 1) * rnd.nextGaussian();
                sb.append(',').append(String.format(Locale.ROOT, "%.6f", p[i]));
            }
            sb.append('\n');
            d = d.plusMonths(1).withDayOfMonth(d.plusMonths(1).lengthOfMonth());
        }
        return Run.file(dir, "prices.csv", sb.toString());
    }

    private static void allGuarded(Path folder) throws IOException {
        try (Stream<Path> s = Files.list(folder)) {
            for (Path p : s.filter(x -> x.toString().endsWith(".csv")).toList()) {
                guarded(Files.readString(p));
            }
        }
    }

    @Test
    void estimatesTablesAreGuardedAndAreSolveInputs() throws IOException {
        Path out = dir.resolve("assumptions");
        Run e = Run.of("estimate", "--history", prices(), "--kind", "prices", "--out-dir", out.toString(),
                "--format", "csv");
        assertEquals(0, e.code(), e.toString());
        guarded(e.out());
        allGuarded(out);
        Run s = Run.of("solve", "--expected-returns", out.resolve("expected_returns.csv").toString(), "--covariance",
                out.resolve("covariance.csv").toString(), "--format", "json");
        assertEquals(0, s.code(), s.toString());
        List<String> names = new ArrayList<>();
        s.json().get("weights").fieldNames().forEachRemaining(names::add);
        assertEquals(NAMES, names);
        Run v = Run.of("solve", "--expected-returns", out.resolve("expected_returns.csv").toString(), "--volatilities",
                out.resolve("volatilities.csv").toString(), "--correlation", out.resolve("correlation.csv").toString(),
                "--format", "json");
        assertEquals(0, v.code(), v.toString());
    }

    @Test
    void theRepairsTablesAreGuardedAndAreSolveInputs() throws IOException {
        // invented: three correlations that cannot hold together (not positive semi-definite)
        String corr = Run.file(dir, "corr.csv", "asset,=SUM(A1:A9),-Minus,@At\n=SUM(A1:A9),1,0.9,0.9\n"
                + "-Minus,0.9,1,-0.9\n@At,0.9,-0.9,1\n");
        Path out = dir.resolve("repaired");
        Path report = dir.resolve("repair.csv");
        Run r = Run.of("check", "--repair", "--correlation", corr, "--out-dir", out.toString(), "--format", "csv",
                "--out", report.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.out(), "--out takes the report");
        assertEquals(List.of(), SpreadsheetView.formulas(Files.readString(report)), Files.readString(report));
        CsvTable pairs = Csv.parse("repair.csv", "repair", Files.readString(report));
        List<String> named = new ArrayList<>(column(pairs, 0));
        named.addAll(column(pairs, 1));
        assertEquals(java.util.Set.of("=SUM(A1:A9)", "-Minus", "@At"), java.util.Set.copyOf(named),
                "the pairs read back");
        allGuarded(out);
        String vols = Run.file(dir, "vols.csv", "asset,volatility\n=SUM(A1:A9),0.1\n-Minus,0.2\n@At,0.15\n");
        String means = Run.file(dir, "means.csv", "asset,expected_return\n=SUM(A1:A9),0.03\n-Minus,0.05\n@At,0.04\n");
        Run s = Run.of("solve", "--expected-returns", means, "--volatilities", vols, "--correlation",
                out.resolve("correlation.csv").toString(), "--format", "json");
        assertEquals(0, s.code(), s.toString());
        assertEquals(3, s.json().get("weights").size());
    }
}
