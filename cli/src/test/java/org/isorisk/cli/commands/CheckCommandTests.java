package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.risk.AssumptionSummary;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CheckCommandTests {

    @TempDir
    Path dir;

    @Test
    void theSampleFundChecksOutWithItsConditioning() {
        Run.sample(dir);
        String mu = dir.resolve("expected_returns.csv").toString();
        String cov = dir.resolve("covariance.csv").toString();
        Run r = Run.of("check", "--expected-returns", mu, "--covariance", cov, "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov)));
        AssumptionSummary s = AssumptionSummary.of(u.universe(), u.spectrum());
        assertEquals("valid", j.get("status").asText());
        assertEquals(12, j.get("assets").asInt());
        assertEquals(s.conditionNumber(), j.get("condition_number").doubleValue());
        assertEquals(s.smallestEigenvalue(), j.get("smallest_eigenvalue").doubleValue());
        assertEquals("Cash", j.get("volatility").get("lowest").get("asset").asText());
        assertEquals("Emerging Equity", j.get("volatility").get("highest").get("asset").asText());
        assertEquals(0, j.get("warnings").size());
        assertEquals(12, j.get("per_asset").size());
        assertEquals(Caution.TEXT, j.get("caution").asText());
        assertTrue(j.get("timing_ms").get("total").isNumber());
    }

    @Test
    void theTableReportsRangesEigenvaluesAndWarnings() {
        String mu = Run.file(dir, "mu.csv", "asset,expected_return\nA,4\nB,6\n");
        String cov = Run.file(dir, "cov.csv", "asset,A,B\nA,0.01,0.005\nB,0.005,0.01\n");
        Run r = Run.of("check", "--expected-returns", mu, "--covariance", cov);
        assertEquals(0, r.code(), r.toString());
        // Eigenvalues of [[0.01, 0.005], [0.005, 0.01]] are 0.015 and 0.005 (hand-computed), condition number 3.
        assertTrue(r.out().contains("  Smallest eigenvalue  0.005\n"), r.out());
        assertTrue(r.out().contains("  Largest eigenvalue   0.015\n"), r.out());
        assertTrue(r.out().contains("  Condition number     3\n"), r.out());
        assertTrue(r.out().contains("  Volatilities         10.00 % (A) to 10.00 % (A)\n"), r.out());
        String flat = r.out().replaceAll("\\s+", " ");
        assertTrue(flat.contains("Warnings: - " + mu + ": expected returns look like percent ('B' has 6, which in "
                + "decimals means 600.00 % a year); if they are percent, add --units percent"), r.out());
        assertTrue(flat.contains("Result: the inputs are valid."));
        assertTrue(flat.endsWith("Caution: " + Caution.TEXT + " "), r.out());
    }

    @Test
    void volatilitiesWithACorrelationMatrixCanStandInForTheCovariance() {
        Run.sample(dir);
        Run r = Run.of("check", "--volatilities", dir.resolve("volatilities.csv").toString(), "--correlation",
                dir.resolve("correlation.csv").toString(), "--format", "csv");
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("\nasset,expected_return,volatility\nCash,,0.008\n"), r.out());
    }

    @Test
    void aMatrixThatIsNotPositiveDefiniteFailsTheCheck() {
        String cov = Run.file(dir, "cov.csv", "asset,A,B,C\nA,0.04,0.04,0\nB,0.04,0.04,0\nC,0,0,0.09\n");
        Run r = Run.of("check", "--covariance", cov);
        assertEquals(2, r.code());
        assertTrue(r.err().startsWith("isorisk: error: " + cov + ": the covariance matrix is not positive definite: "
                + "smallest eigenvalue "), r.err());
        assertTrue(r.err().contains("; 'A' and 'B' are perfectly correlated (correlation 1), so the minimum-variance "
                + "portfolio is not unique"), r.err());
        assertTrue(r.err().endsWith("'isorisk check --repair'\n"), r.err());
        assertEquals(1, r.err().lines().count());
        assertEquals("", r.out());
    }

    @Test
    void theAsOfOptionIsValidated() {
        Run.sample(dir);
        Run r = Run.of("check", "--covariance", dir.resolve("covariance.csv").toString(), "--as-of", "June");
        assertEquals(2, r.code());
        assertEquals("isorisk: error: --as-of is not a date (value 'June'); fix: write the date as YYYY-MM-DD, e.g. "
                + "2025-06-30\n", r.err());
        JsonNode j = Run.of("check", "--covariance", dir.resolve("covariance.csv").toString(), "--as-of",
                "2025-07-01", "--format", "json").json();
        assertEquals("2025-07-01", j.get("inputs").get("as_of").asText());
        assertEquals("--as-of", j.get("inputs").get("as_of_source").asText());
    }
}
