package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SolveCommandTests {

    @TempDir
    Path dir;

    String mu;
    String cov;

    @BeforeEach
    void sample() {
        Run.sample(dir);
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
    }

    /** The same solve done directly through the engine, to compare the printed numbers with. */
    private Solution engine(Objective o) {
        LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov)));
        return Allocator.solve(AllocationRequest.of(u.universe(), Mandate.fullyInvested(u.assets().size()), o));
    }

    private static List<String> fieldNames(JsonNode n) {
        List<String> names = new ArrayList<>();
        for (Iterator<String> it = n.fieldNames(); it.hasNext(); ) {
            names.add(it.next());
        }
        return names;
    }

    @Test
    void jsonMeetsTheContractAndCarriesTheEnginesNumbers() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05", "--format",
                "json");
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.err());
        JsonNode j = r.json();
        Solution s = engine(Objective.targetReturn(0.05));
        assertEquals("optimal", j.get("status").asText());
        assertEquals("closed-form", j.get("method").asText());
        assertEquals(s.assets(), fieldNames(j.get("weights")));
        for (int i = 0; i < s.assets().size(); i++) {
            assertEquals(s.weight(i), j.get("weights").get(s.assets().get(i)).doubleValue());
        }
        assertEquals(s.expectedReturn(), j.get("expected_return").doubleValue());
        assertEquals(s.variance(), j.get("variance").doubleValue());
        assertEquals(s.volatility(), j.get("volatility").doubleValue());
        JsonNode ms = j.get("multipliers");
        assertEquals(s.multipliers().size(), ms.size());
        for (int k = 0; k < ms.size(); k++) {
            Multiplier m = s.multipliers().get(k);
            JsonNode e = ms.get(k);
            assertEquals(List.of("constraint", "variance_per_unit", "volatility_per_unit", "binding", "sentence"),
                    fieldNames(e));
            assertEquals(m.constraint(), e.get("constraint").asText());
            assertEquals(m.variancePerUnit(), e.get("variance_per_unit").doubleValue());
            assertEquals(m.volatilityPerUnit(), e.get("volatility_per_unit").doubleValue());
            assertTrue(e.get("binding").asBoolean());
            assertEquals(Explain.sentence(m), e.get("sentence").asText());
        }
        assertEquals(List.of("budget", "target_return"), List.of(ms.get(0).get("constraint").asText(),
                ms.get(1).get("constraint").asText()));
        JsonNode c = j.get("certificate");
        for (String f : new String[] {"stationarity", "primal", "dual", "complementarity", "condition_number"}) {
            assertTrue(c.get(f).isNumber(), f);
        }
        assertEquals(s.certificate().stationarity(), c.get("stationarity").doubleValue());
        assertTrue(c.get("passes").asBoolean());
        assertTrue(j.get("timing_ms").get("solve").doubleValue() >= 0);
        assertTrue(j.get("timing_ms").get("total").doubleValue() >= j.get("timing_ms").get("solve").doubleValue());
        assertEquals(Caution.TEXT, j.get("caution").asText());
        List<String> notes = new ArrayList<>();
        j.get("notes").forEach(n -> notes.add(n.asText()));
        assertTrue(notes.contains(Allocator.SHORTS_NOTE), notes.toString());
        assertEquals("target-return", j.get("objective").get("kind").asText());
        assertEquals(0.05, j.get("objective").get("target_return").doubleValue());
        assertEquals("2025-06-30", j.get("inputs").get("as_of").asText());
        assertEquals(2, j.get("inputs").get("files").size());
        assertEquals(RiskAnalysis.decompose(
                        UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov))).universe(), s.weights())
                .volatility(), j.get("risk").get("volatility").doubleValue());
    }

    @Test
    void withoutATargetItSolvesTheMinimumVariancePortfolio() {
        JsonNode j = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--format", "json").json();
        Solution s = engine(Objective.minimumVariance());
        assertEquals(s.volatility(), j.get("volatility").doubleValue());
        assertEquals("minimum-variance", j.get("objective").get("kind").asText());
        assertEquals(1, j.get("multipliers").size());
    }

    @Test
    void aRiskFreeRateGivesTheTangencyPortfolioWithItsSharpeRatio() {
        JsonNode j = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--risk-free", "0.024",
                "--format", "json").json();
        Solution s = engine(Objective.tangency(0.024));
        assertEquals(s.expectedReturn(), j.get("expected_return").doubleValue());
        assertEquals("tangency", j.get("objective").get("kind").asText());
        assertEquals(RiskAnalysis.sharpeRatio(s.expectedReturn(), s.volatility(), 0.024),
                j.get("objective").get("sharpe_ratio").doubleValue());
    }

    @Test
    void fixedWeightsBecomeConstraintsWithTheirOwnShadowPrice() {
        JsonNode j = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05",
                "--fix", "Cash=0.02", "--fix", "Government Bonds=0.25", "--format", "json").json();
        assertEquals(0.02, j.get("weights").get("Cash").doubleValue(), 1e-12);
        assertEquals(0.25, j.get("weights").get("Government Bonds").doubleValue(), 1e-12);
        List<String> names = new ArrayList<>();
        j.get("multipliers").forEach(m -> names.add(m.get("constraint").asText()));
        assertEquals(List.of("budget", "fixed:Cash", "fixed:Government Bonds", "target_return"), names);
        assertEquals(0.02, j.get("fixed").get("Cash").doubleValue());
    }

    @Test
    void percentUnitsConvertFilesAndOptions() throws IOException {
        Path p = Files.createDirectory(dir.resolve("pct"));
        String m = Run.file(p, "mu.csv", "asset,expected_return\nA,4\nB,6\n");
        String c = Run.file(p, "cov.csv", "asset,A,B\nA,100,20\nB,20,400\n");
        JsonNode pct = Run.of("solve", "--expected-returns", m, "--covariance", c, "--target-return", "5", "--units",
                "percent", "--format", "json").json();
        String md = Run.file(p, "mud.csv", "asset,expected_return\nA,0.04\nB,0.06\n");
        String cd = Run.file(p, "covd.csv", "asset,A,B\nA,0.01,0.002\nB,0.002,0.04\n");
        JsonNode dec = Run.of("solve", "--expected-returns", md, "--covariance", cd, "--target-return", "0.05",
                "--format", "json").json();
        assertEquals(dec.get("volatility").doubleValue(), pct.get("volatility").doubleValue(), 1e-12);
        assertEquals(0.5, pct.get("weights").get("A").doubleValue(), 1e-12);
    }

    @Test
    void theTableExplainsMultipliersAndCarriesTheNotesAndTheCaution() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05");
        assertEquals(0, r.code(), r.toString());
        String flat = r.out().replaceAll("\\s+", " ");
        Solution s = engine(Objective.targetReturn(0.05));
        assertTrue(r.out().startsWith("Minimum-variance portfolio for a target return of 5.00 % (method: closed-form)"));
        assertTrue(flat.contains(Explain.sentence(s.multiplier("target_return").orElseThrow())), r.out());
        assertTrue(flat.contains("the marginal risk of tightening the return target"));
        assertTrue(flat.contains(Allocator.SHORTS_NOTE), r.out());
        assertTrue(flat.contains("the Lagrange (first-order) condition is sufficient"), r.out());
        assertTrue(flat.contains("Caution: " + Caution.TEXT), r.out());
        assertTrue(flat.contains("Volatility " + Explain.percent(s.volatility())), r.out());
    }

    @Test
    void csvOutputReadsBackWithTheProjectsOwnReader() {
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05", "--format",
                "csv");
        assertEquals(0, r.code(), r.toString());
        CsvTable t = Csv.parse("out.csv", "weights", r.out());
        assertEquals(List.of("asset", "weight", "marginal", "component", "share"), t.header());
        assertEquals(Caution.TEXT, t.meta("caution").orElseThrow().value());
        Solution s = engine(Objective.targetReturn(0.05));
        for (int i = 0; i < s.assets().size(); i++) {
            assertEquals(s.assets().get(i), t.rows().get(i).cell(0));
            assertEquals(s.weight(i), t.number(t.rows().get(i), 1, null));
        }
    }

    @Test
    void outWritesTheFileAtomicallyAndPrintsNothingOnStdout() throws IOException {
        Path target = Files.createDirectories(dir.resolve("results")).resolve("solve.json");
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--format", "json", "--out",
                target.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.out());
        assertEquals("isorisk: wrote " + target + "\n", r.err());
        assertEquals("optimal", Run.json(target).get("status").asText());
        try (Stream<Path> s = Files.list(target.getParent())) {
            assertEquals(List.of("solve.json"), s.map(p -> p.getFileName().toString()).toList());
        }
    }

    @Test
    void aFailedRunLeavesAnEarlierOutputFileUntouched() throws IOException {
        Path target = dir.resolve("solve.json");
        Files.writeString(target, "earlier result");
        String bad = Run.file(dir, "bad.csv", "asset,Cash\nCash,0.01\n");
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", bad, "--out", target.toString());
        assertEquals(2, r.code());
        assertEquals("earlier result", Files.readString(target));
        try (Stream<Path> s = Files.list(dir)) {
            assertFalse(s.anyMatch(p -> p.getFileName().toString().endsWith(".tmp")));
        }
    }

    @Test
    void theInputFilesAreNotModified() throws IOException {
        Map<Path, byte[]> before = new java.util.HashMap<>();
        Map<Path, java.nio.file.attribute.FileTime> times = new java.util.HashMap<>();
        try (Stream<Path> s = Files.list(dir)) {
            for (Path p : s.toList()) {
                before.put(p, Files.readAllBytes(p));
                times.put(p, Files.getLastModifiedTime(p));
            }
        }
        String h = dir.resolve("holdings.csv").toString();
        assertEquals(0, Run.of("check", "--expected-returns", mu, "--covariance", cov).code());
        assertEquals(0, Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05",
                "--fix", "Cash=0.02").code());
        assertEquals(0, Run.of("solve", "--expected-returns", mu, "--volatilities", dir.resolve("volatilities.csv")
                .toString(), "--correlation", dir.resolve("correlation.csv").toString(), "--format", "csv").code());
        assertEquals(0, Run.of("risk", "--expected-returns", mu, "--covariance", cov, "--weights", h, "--benchmark", h)
                .code());
        assertEquals(0, Run.of("demo", "--data", dir.toString(), "--out", dir.resolve("demo").toString()).code());
        for (Map.Entry<Path, byte[]> e : before.entrySet()) {
            assertTrue(java.util.Arrays.equals(e.getValue(), Files.readAllBytes(e.getKey())), e.getKey().toString());
            assertEquals(times.get(e.getKey()), Files.getLastModifiedTime(e.getKey()), e.getKey().toString());
        }
    }

    @Test
    void numbersAreFormattedTheSameWhateverTheDefaultLocale() {
        java.util.Locale before = java.util.Locale.getDefault();
        try {
            java.util.Locale.setDefault(java.util.Locale.GERMANY);
            Run table = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05");
            assertTrue(table.out().contains("  Expected return  5.00 %\n"), table.out());
            Run csv = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--target-return", "0.05",
                    "--format", "csv");
            CsvTable t = Csv.parse("out.csv", "weights", csv.out());
            assertEquals(engine(Objective.targetReturn(0.05)).weight(0), t.number(t.rows().get(0), 1, null));
            Run risk = Run.of("risk", "--covariance", cov, "--weights", dir.resolve("holdings.csv").toString());
            assertTrue(risk.out().contains("total 2,417,050,000"), risk.out());
        } finally {
            java.util.Locale.setDefault(before);
        }
    }
}
