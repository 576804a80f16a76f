package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.AssumptionTables;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code isorisk check --repair}, and {@code solve}'s refusal of a broken matrix that points at it. */
class RepairCommandTests {

    @TempDir
    Path dir;

    /** Volatilities 5 %, 15 %, 20 %; correlations 0.9, 0.9 and 0.1: not positive semi-definite (hand-edited). */
    private static final String BROKEN = "asset,Bonds,Equity,Property\n"
            + "Bonds,0.0025,0.00675,0.009\n"
            + "Equity,0.00675,0.0225,0.0003\n"
            + "Property,0.009,0.0003,0.04\n";

    @Test
    void solveRefusesABrokenMatrixAndPointsAtTheRepair() {
        String cov = Run.file(dir, "cov.csv", BROKEN);
        String mu = Run.file(dir, "mu.csv", "asset,expected_return\nBonds,0.02\nEquity,0.06\nProperty,0.05\n");
        Run r = Run.of("solve", "--expected-returns", mu, "--covariance", cov);
        assertTrue(r.code() == 2 || r.code() == 3, r.toString());
        assertTrue(r.err().contains("isorisk check --repair"), r.err());
    }

    @Test
    void theRepairKeepsVolatilitiesWritesTheMatrixAndReportsTheChanges() throws IOException {
        String cov = Run.file(dir, "cov.csv", BROKEN);
        Path out = dir.resolve("repaired");
        Run r = Run.of("check", "--repair", "--covariance", cov, "--out-dir", out.toString(), "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        assertTrue(j.get("changed").asBoolean());
        assertTrue(j.at("/before/smallest_eigenvalue").asDouble() < 0);
        assertTrue(j.at("/after/smallest_eigenvalue").asDouble() > 0);
        assertTrue(j.get("frobenius_distance").asDouble() > 0);
        assertEquals(3, j.get("largest_changes").size());
        assertEquals(Caution.TEXT, j.get("caution").asText());
        AssumptionTables.Matrix m = AssumptionTables.readMatrix(out.resolve("covariance.csv"), "covariance");
        assertEquals(0.0025, m.matrix()[0][0], 0);
        assertEquals(0.0225, m.matrix()[1][1], 0);
        assertEquals(0.04, m.matrix()[2][2], 0);
        assertEquals(BROKEN, Files.readString(Path.of(cov)), "the input is not modified");
        // The repaired matrix passes the project's own check, and solve accepts it.
        Run check = Run.of("check", "--covariance", out.resolve("covariance.csv").toString());
        assertEquals(0, check.code(), check.toString());
        assertTrue(Files.readString(out.resolve("repair_report.txt")).contains("Largest changes of correlation"));
        String mu = Run.file(dir, "mu.csv", "asset,expected_return\nBonds,0.02\nEquity,0.06\nProperty,0.05\n");
        Run solve = Run.of("solve", "--expected-returns", mu, "--covariance", out.resolve("covariance.csv").toString(),
                "--target-return", "0.04", "--format", "json");
        assertEquals(0, solve.code(), solve.toString());
        assertTrue(solve.json().at("/certificate/passes").asBoolean(), "the repaired matrix is well enough conditioned");
    }

    @Test
    void theTableSaysWhatChangedAndAValidMatrixIsLeftAlone() {
        String cov = Run.file(dir, "cov.csv", BROKEN);
        Path out = dir.resolve("fixed");
        Run r = Run.of("check", "--repair", "--covariance", cov, "--out-dir", out.toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("Equity / Property: 0.0100 -> "), r.out());
        assertTrue(r.out().contains("volatilities kept"), r.out());
        assertTrue(r.out().strip().endsWith("Caution: " + Caution.TEXT), r.out());
        String good = Run.file(dir, "good.csv", "asset,A,B\nA,0.04,0.01\nB,0.01,0.09\n");
        Path none = dir.resolve("none");
        r = Run.of("check", "--repair", "--covariance", good, "--out-dir", none.toString());
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("Nothing written: the matrix needs no repair."), r.out());
        assertFalse(Files.exists(none));
    }

    @Test
    void repairOptionsAreCheckedBeforeAnythingIsRead() {
        String cov = Run.file(dir, "cov.csv", BROKEN);
        Run r = Run.of("check", "--repair", "--covariance", cov);
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: --repair writes the repaired matrix to a folder; fix: give --out-dir DIR\n",
                r.err());
        r = Run.of("check", "--covariance", cov, "--out-dir", dir.resolve("x").toString());
        assertEquals("isorisk: error: --out-dir and --min-eigenvalue go with --repair; fix: add --repair, or drop "
                + "them\n", r.err());
    }
}
