package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.NumberText;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Bad inputs: exit code and the exact one-line message, never a stack trace, nothing on stdout. */
class SolveErrorTests {

    @TempDir
    Path dir;

    private static final String MU = "asset,expected_return\nA,0.04\nB,0.06\n";
    private static final String COV = "asset,A,B\nA,0.01,0.002\nB,0.002,0.04\n";

    private Run solve(String mu, String cov, String... more) {
        String m = Run.file(dir, "mu.csv", mu);
        String c = Run.file(dir, "cov.csv", cov);
        String[] args = new String[5 + more.length];
        args[0] = "solve";
        args[1] = "--expected-returns";
        args[2] = m;
        args[3] = "--covariance";
        args[4] = c;
        System.arraycopy(more, 0, args, 5, more.length);
        return Run.of(args);
    }

    private void fails(Run r, int code, String message) {
        assertEquals(code, r.code(), r.toString());
        assertEquals("isorisk: error: " + message + "\n", r.err());
        assertEquals("", r.out());
    }

    private String p(String name) {
        return dir.resolve(name).toString();
    }

    @Test
    void aMissingFileIsNamed() {
        Run.file(dir, "cov.csv", COV);
        fails(Run.of("solve", "--expected-returns", p("nope.csv"), "--covariance", p("cov.csv")), 2,
                p("nope.csv") + ": the expected returns file does not exist; fix: check the path; a relative path "
                        + "starts from the current folder");
    }

    @Test
    void anUnknownAssetInTheCovarianceIsNamed() {
        fails(solve(MU, "asset,A,D\nA,0.01,0.002\nD,0.002,0.04\n"), 2, p("cov.csv") + ", row 3, asset 'D': the asset "
                + "is not in the expected returns file (" + p("mu.csv") + "); fix: add it to " + p("mu.csv")
                + ", or delete it from " + p("cov.csv"));
    }

    @Test
    void anAssetMissingFromTheCovarianceIsNamed() {
        fails(solve("asset,expected_return\nA,0.04\nB,0.06\nC,0.05\n", COV), 2, p("cov.csv") + ", asset 'C': the "
                + "asset of " + p("mu.csv") + " row 4 is missing from this file; fix: add it to " + p("cov.csv")
                + ", or remove it from " + p("mu.csv"));
    }

    @Test
    void aDuplicateNameIsNamedWithBothRows() {
        fails(solve("asset,expected_return\nA,0.04\nB,0.06\nA,0.05\n", COV), 2, p("mu.csv") + ", row 4, column "
                + "'asset', asset 'A': the asset is named twice (rows 2 and 4); fix: give each asset one row; merge or "
                + "rename the duplicates");
    }

    @Test
    void aDecimalCommaIsNamedWithTheFix() {
        fails(solve("asset,expected_return\nA,0,04\nB,0.06\n", COV), 2, p("mu.csv") + ", row 2: the row has more "
                + "cells than the header: '0,04' looks like a number written with a decimal comma or thousands separator "
                + "(value 'A,0,04'); fix: " + NumberText.DECIMAL_COMMA_FIX);
        fails(solve("asset;expected_return\nA;0,04\nB;0,06\n", COV), 2, p("mu.csv") + ", row 1: the file is "
                + "separated by semicolons, not commas (value 'asset;expected_return'); fix: save it as CSV with commas "
                + "between cells and a decimal point in numbers (0.05, not 0,05)");
    }

    @Test
    void anAsymmetricMatrixIsNamedWithThePair() {
        fails(solve(MU, "asset,A,B\nA,0.01,0.002\nB,0.003,0.04\n"), 2, p("cov.csv") + ", row 2, column 'B', asset "
                + "'A': the matrix is not symmetric: the entry for (A, B) is 0.002 but the entry for (B, A) is 0.003 "
                + "(value '0.002'); fix: make the two entries equal (a covariance matrix is symmetric)");
    }

    @Test
    void aMatrixThatIsNotPositiveDefiniteReportsItsSmallestEigenvalue() {
        // [[0.01, 0.02], [0.02, 0.01]] has eigenvalues 0.01 ± 0.02 (hand-computed).
        fails(solve(MU, "asset,A,B\nA,0.01,0.02\nB,0.02,0.01\n"), 2, p("cov.csv") + ": the covariance matrix is not "
                + "positive definite: smallest eigenvalue -0.01 (largest 0.03); the implied correlation of 'A' and 'B' "
                + "is 2, outside [-1, 1], so the minimum-variance portfolio is not unique (value '-0.01'); fix: correct "
                + "the matrix, drop one asset of a perfectly correlated pair, or repair it to the nearest valid matrix "
                + "with 'isorisk check --repair'");
    }

    @Test
    void oneAssetIsRefused() {
        fails(solve("asset,expected_return\nA,0.04\n", "asset,A\nA,0.01\n"), 2, p("mu.csv") + ": the file names only "
                + "one asset ('A'): with one asset there is nothing to allocate; fix: give at least two assets");
    }

    @Test
    void equalExpectedReturnsFailTheConstraintQualification() {
        String msg = "the constraint qualification fails: constraint 'target_return' depends on 'budget': every "
                + "asset has the same expected return (5.00 %), so the return target's gradient μ is parallel to the "
                + "budget's gradient 1 and adds no direction of its own; every portfolio within the budget returns "
                + "5.00 %, so the target 5.00 % is met by all of them and its multiplier is not unique; fix: drop "
                + "'target_return' or one of the constraints it depends on";
        fails(solve("asset,expected_return\nA,0.05\nB,0.05\n", COV, "--target-return", "0.05"), 3, msg);
        Run j = solve("asset,expected_return\nA,0.05\nB,0.05\n", COV, "--target-return", "0.05", "--format", "json");
        assertEquals(3, j.code());
        assertEquals("isorisk: error: " + msg + "\n", j.err());
        JsonNode o = j.json();
        assertEquals("infeasible", o.get("status").asText());
        assertEquals("constraint-qualification", o.get("reason").asText());
        assertEquals(msg, o.get("error").asText());
        assertEquals("budget", o.get("constraints").get(0).asText());
        assertEquals("target_return", o.get("constraints").get(1).asText());
        assertEquals(Caution.TEXT, o.get("caution").asText());
    }

    @Test
    void badInputInJsonFormatAlsoPrintsAJsonObject() {
        Run r = solve(MU, "asset,A,B\nA,0.01,0.002\nB,0.003,0.04\n", "--format", "json");
        assertEquals(2, r.code());
        JsonNode o = r.json();
        assertEquals("invalid-input", o.get("status").asText());
        assertEquals(r.err().substring("isorisk: error: ".length()).strip(), o.get("error").asText());
        assertEquals(Caution.TEXT, o.get("caution").asText());
    }

    @Test
    void aRiskFreeRateAboveTheMinimumVarianceReturnIsRefused() {
        fails(solve(MU, COV, "--risk-free", "0.05"), 3, "no tangency portfolio: the risk-free rate 5.00 % is at or "
                + "above the minimum-variance portfolio's return 4.35 %, so no frontier portfolio earns a positive excess "
                + "return per unit of risk on the efficient branch; fix: use a risk-free rate below 4.35 %");
    }

    @Test
    void usageErrorsAreOneLineWithWhereToFindHelp() {
        fails(solve(MU, COV, "--target-return", "0.05", "--risk-free", "0.01"), 2, "give --target-return (minimum "
                + "variance for that return) or --risk-free (tangency), not both (see 'isorisk solve --help')");
        fails(solve(MU, COV, "--target-return", "0,05"), 2, "Invalid value for option '--target-return': '0,05': the "
                + "number uses a decimal comma; fix: " + NumberText.DECIMAL_COMMA_FIX + " (see 'isorisk solve --help')");
        fails(solve(MU, COV, "--format", "xml"), 2, "Invalid value for option '--format': 'xml' is not a format; use "
                + "table, csv or json (see 'isorisk solve --help')");
        fails(solve(MU, COV, "--fix", "Gold=0.1"), 2, "asset 'Gold': --fix names an asset that is not in the "
                + "expected-returns file (value 'Gold=0.1'); fix: use one of the asset names: A, B");
        fails(Run.of("solve", "--covariance", Run.file(dir, "c.csv", COV)), 2, "'isorisk solve' needs the expected "
                + "returns; fix: give --expected-returns FILE (columns asset,expected_return)");
        Run j = solve(MU, COV, "--format", "json", "--nonsense");
        assertEquals(2, j.code());
        assertEquals("invalid-input", j.json().get("status").asText());
    }
}
