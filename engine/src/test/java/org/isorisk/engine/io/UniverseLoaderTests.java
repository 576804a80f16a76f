package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;

class UniverseLoaderTests {

    private static CsvTable mu(String text) {
        return Csv.parse("mu.csv", "expected-returns", text);
    }

    private static CsvTable cov(String text) {
        return Csv.parse("cov.csv", "covariance", text);
    }

    private static LoadedUniverse load(String mu, String cov) {
        return UniverseLoader.build(mu(mu), cov(cov), null, null, Units.DECIMAL, null);
    }

    private static String error(String mu, String cov) {
        return assertThrows(InputException.class, () -> load(mu, cov)).getMessage();
    }

    private static final String MU = "asset,expected_return\nA,0.04\nB,0.06\nC,0.08\n";
    // Σ for volatilities 0.1, 0.2, 0.3 and correlations ρAB = 0.5, ρAC = 0.2, ρBC = 0.4 (hand-computed products)
    private static final double[][] SIGMA = {{0.01, 0.01, 0.006}, {0.01, 0.04, 0.024}, {0.006, 0.024, 0.09}};

    @Test
    void theCovarianceIsMatchedToTheReturnsByNameInAnyOrder() {
        String cov = "asset,B,C,A\nC,0.024,0.09,0.006\nA,0.01,0.006,0.01\nB,0.04,0.024,0.01\n";
        LoadedUniverse u = load(MU, cov);
        assertEquals(List.of("A", "B", "C"), u.assets());
        assertArrayEquals(new double[] {0.04, 0.06, 0.08}, u.universe().expectedReturns());
        for (int i = 0; i < 3; i++) {
            assertArrayEquals(SIGMA[i], u.universe().covariance()[i]);
        }
        assertTrue(u.hasExpectedReturns());
        assertTrue(u.warnings().isEmpty(), u.warnings().toString());
    }

    @Test
    void volatilitiesAndACorrelationMatrixGiveTheSameCovariance() {
        CsvTable vol = Csv.parse("vol.csv", "volatilities", "asset,volatility\nC,0.3\nA,0.1\nB,0.2\n");
        CsvTable cor = Csv.parse("cor.csv", "correlation",
                "asset,A,B,C\nA,1,0.5,0.2\nB,0.5,1,0.4\nC,0.2,0.4,1\n");
        LoadedUniverse u = UniverseLoader.build(mu(MU), null, vol, cor, Units.DECIMAL, null);
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                assertEquals(SIGMA[i][j], u.universe().covariance(i, j), Tolerances.TIGHT);
            }
        }
    }

    @Test
    void percentUnitsAreConvertedToDecimals() {
        LoadedUniverse u = UniverseLoader.build(mu("asset,expected_return\nA,4\nB,6\n"),
                cov("asset,A,B\nA,100,100\nB,100,400\n"), null, null, Units.PERCENT, null);
        assertArrayEquals(new double[] {0.04, 0.06}, u.universe().expectedReturns(), Tolerances.TIGHT);
        assertEquals(0.01, u.universe().covariance(0, 0), Tolerances.TIGHT);
        assertEquals(0.04, u.universe().covariance(1, 1), Tolerances.TIGHT);
        assertTrue(u.warnings().isEmpty(), u.warnings().toString());
    }

    @Test
    void valuesThatLookLikePercentGetAWarningNamingTheFlag() {
        LoadedUniverse u = load("asset,expected_return\nA,4\nB,6\n", "asset,A,B\nA,100,100\nB,100,400\n");
        assertEquals(List.of("cov.csv: variances look like percent squared ('B' has variance 400, a volatility above "
                        + "100 %); if they are, add --units percent (divides covariances by 10 000)",
                "mu.csv: expected returns look like percent ('B' has 6, which in decimals means 600.00 % a year); if "
                        + "they are percent, add --units percent"), u.warnings());
    }

    @Test
    void decimalsReadAsPercentGetAWarningToo() {
        LoadedUniverse u = UniverseLoader.build(mu("asset,expected_return\nA,0.04\nB,0.06\n"),
                cov("asset,A,B\nA,100,100\nB,100,400\n"), null, null, Units.PERCENT, null);
        assertEquals(List.of("mu.csv: expected returns look like decimals (largest 0.06) but --units percent divides "
                + "them by 100; drop --units percent if they are decimals"), u.warnings());
    }

    @Test
    void anUnknownAssetInTheCovarianceIsNamedWithItsRow() {
        assertEquals("cov.csv, row 4, asset 'D': the asset is not in the expected returns file (mu.csv); fix: add it to "
                        + "mu.csv, or delete it from cov.csv",
                error("asset,expected_return\nA,0.04\nB,0.06\nC,0.08\n",
                        "asset,A,B,D\nA,0.01,0.01,0.006\nB,0.01,0.04,0.024\nD,0.006,0.024,0.09\n"));
    }

    @Test
    void aNameThatDiffersOnlyInCaseGetsADidYouMean() {
        assertEquals("cov.csv, row 3, asset 'b': the asset is not in the expected returns file (mu.csv); fix: did you "
                        + "mean 'B'? Names must match exactly",
                error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,b\nA,0.01,0.01\nb,0.01,0.04\n"));
    }

    @Test
    void anAssetMissingFromTheCovarianceIsNamed() {
        assertEquals("cov.csv, asset 'C': the asset of mu.csv row 4 is missing from this file; fix: add it to cov.csv, "
                + "or remove it from mu.csv", error(MU, "asset,A,B\nA,0.01,0.01\nB,0.01,0.04\n"));
    }

    @Test
    void aRowWithoutItsColumnIsNamed() {
        assertEquals("cov.csv, row 3, asset 'B': the row's asset has no column of the same name in the header; fix: "
                        + "the matrix needs one row and one column per asset, with the same names",
                error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,X\nA,0.01,0.01\nB,0.01,0.04\n"));
    }

    @Test
    void duplicateAndBlankNamesAreRefused() {
        assertEquals("mu.csv, row 3, column 'asset', asset 'A': the asset is named twice (rows 2 and 3); fix: give each "
                        + "asset one row; merge or rename the duplicates",
                error("asset,expected_return\nA,0.04\nA,0.06\n", "asset,A,B\nA,0.01,0.01\nB,0.01,0.04\n"));
        assertEquals("mu.csv, row 3, column 'asset': the asset name is blank; fix: name the asset, or delete the row",
                error("asset,expected_return\nA,0.04\n,0.06\n", "asset,A,B\nA,0.01,0.01\nB,0.01,0.04\n"));
    }

    @Test
    void aMissingColumnIsNamedWithTheLayout() {
        assertEquals("mu.csv: no column named 'expected_return' in the header (row 1) (value 'asset,mu'); fix: the "
                        + "layout is " + UniverseLoader.RETURNS_LAYOUT,
                error("asset,mu\nA,0.04\nB,0.06\n", "asset,A,B\nA,0.01,0.01\nB,0.01,0.04\n"));
    }

    @Test
    void anAsymmetricMatrixBeyondTheToleranceIsRefusedNamingThePair() {
        assertEquals("cov.csv, row 2, column 'B', asset 'A': the matrix is not symmetric: the entry for (A, B) is 0.01 "
                        + "but the entry for (B, A) is 0.02 (value '0.01'); fix: make the two entries equal (a covariance "
                        + "matrix is symmetric)",
                error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,B\nA,0.01,0.01\nB,0.02,0.04\n"));
    }

    @Test
    void aMatrixAsymmetricWithinTheToleranceIsSymmetrisedWithAWarning() {
        LoadedUniverse u = load("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,B\nA,0.01,0.0100000001\nB,0.01,0.04\n");
        assertEquals(0.01000000005, u.universe().covariance(0, 1), Tolerances.TIGHT);
        assertEquals(u.universe().covariance(0, 1), u.universe().covariance(1, 0));
        assertEquals(1, u.warnings().size());
        assertTrue(u.warnings().get(0).startsWith("cov.csv: the matrix was not exactly symmetric and was symmetrised"),
                u.warnings().get(0));
    }

    @Test
    void negativeAndZeroVariancesAreRefused() {
        assertEquals("cov.csv, row 3, column 'B', asset 'B': the variance is negative (value '-0.04'); fix: a variance "
                        + "is a squared volatility and cannot be negative; check the sign",
                error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,B\nA,0.01,0.001\nB,0.001,-0.04\n"));
        assertTrue(error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,B\nA,0,0\nB,0,0.04\n")
                .contains("the variance is zero: a riskless asset makes the covariance matrix singular"));
    }

    @Test
    void aMatrixThatIsNotPositiveDefiniteIsRefusedWithItsSmallestEigenvalue() {
        // [[a, b], [b, a]] has eigenvalues a − b and a + b (hand-computed): here −0.01 and 0.03.
        assertEquals("cov.csv: the covariance matrix is not positive definite: smallest eigenvalue -0.01 (largest 0.03);"
                        + " the implied correlation of 'A' and 'B' is 2, outside [-1, 1], so the minimum-variance portfolio is not unique (value '-0.01'); fix: correct the matrix, drop "
                        + "one asset of a perfectly correlated pair, or repair it to the nearest valid matrix with "
                        + "'isorisk check --repair'",
                error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,B\nA,0.01,0.02\nB,0.02,0.01\n"));
    }

    @Test
    void aPerfectlyCorrelatedPairIsNamed() {
        String msg = error("asset,expected_return\nA,0.04\nB,0.06\n", "asset,A,B\nA,0.01,0.02\nB,0.02,0.04\n");
        assertTrue(msg.contains("'A' and 'B' are perfectly correlated (correlation 1)"), msg);
    }

    @Test
    void oneAssetIsRefused() {
        assertEquals("mu.csv: the file names only one asset ('A'): with one asset there is nothing to allocate; fix: "
                + "give at least two assets", error("asset,expected_return\nA,0.04\n", "asset,A\nA,0.01\n"));
    }

    @Test
    void equalExpectedReturnsGetAWarning() {
        LoadedUniverse u = load("asset,expected_return\nA,0.05\nB,0.05\n", "asset,A,B\nA,0.01,0.001\nB,0.001,0.04\n");
        assertEquals(List.of("mu.csv: every asset has the same expected return (0.05), so a return target or a tangency "
                + "portfolio cannot be set (only the minimum-variance portfolio)"), u.warnings());
    }

    @Test
    void correlationsAreChecked() {
        CsvTable vol = Csv.parse("vol.csv", "volatilities", "asset,volatility\nA,0.1\nB,0.2\n");
        CsvTable diag = Csv.parse("cor.csv", "correlation", "asset,A,B\nA,0.9,0.5\nB,0.5,1\n");
        assertEquals("cor.csv, row 2, column 'A', asset 'A': the diagonal of a correlation matrix must be 1 (value "
                        + "'0.9'); fix: write 1 on the diagonal (an asset is perfectly correlated with itself)",
                assertThrows(InputException.class,
                        () -> UniverseLoader.build(null, null, vol, diag, Units.DECIMAL, null)).getMessage());
        CsvTable big = Csv.parse("cor.csv", "correlation", "asset,A,B\nA,1,1.5\nB,1.5,1\n");
        assertEquals("cor.csv, row 2, column 'B', asset 'A': a correlation lies outside [-1, 1] (value '1.5'); fix: "
                        + "correlations are between -1 and 1; if these are covariances, use --covariance",
                assertThrows(InputException.class,
                        () -> UniverseLoader.build(null, null, vol, big, Units.DECIMAL, null)).getMessage());
        CsvTable vneg = Csv.parse("vol.csv", "volatilities", "asset,volatility\nA,-0.1\nB,0.2\n");
        CsvTable ok = Csv.parse("cor.csv", "correlation", "asset,A,B\nA,1,0.5\nB,0.5,1\n");
        assertEquals("vol.csv, row 2, column 'volatility', asset 'A': the volatility is negative (value '-0.1'); fix: a "
                        + "volatility (standard deviation) cannot be negative; check the sign",
                assertThrows(InputException.class,
                        () -> UniverseLoader.build(null, null, vneg, ok, Units.DECIMAL, null)).getMessage());
    }

    @Test
    void withoutReturnsTheRiskFileGivesTheOrderAndReturnsAreZero() {
        LoadedUniverse u = UniverseLoader.build(null, cov("asset,B,A\nB,0.04,0.01\nA,0.01,0.01\n"), null, null,
                Units.DECIMAL, null);
        assertEquals(List.of("B", "A"), u.assets());
        assertFalse(u.hasExpectedReturns());
        assertArrayEquals(new double[] {0, 0}, u.universe().expectedReturns());
    }

    @Test
    void theAsOfDateComesFromTheOptionOrTheFiles() {
        String m = "# as_of: 2025-06-30\nasset,expected_return\nA,0.04\nB,0.06\n";
        String c = "# as_of: 2025-03-31\nasset,A,B\nA,0.01,0.001\nB,0.001,0.04\n";
        LoadedUniverse u = load(m, c);
        assertEquals(LocalDate.of(2025, 6, 30), u.provenance().asOf());
        assertEquals("mu.csv", u.provenance().asOfSource());
        assertEquals(List.of("the input files give different as-of dates (mu.csv 2025-06-30, cov.csv 2025-03-31); "
                + "results use 2025-06-30 from mu.csv (pass --as-of to choose)"), u.warnings());
        LoadedUniverse o = UniverseLoader.build(mu(m), cov(c), null, null, Units.DECIMAL, LocalDate.of(2024, 12, 31));
        assertEquals(LocalDate.of(2024, 12, 31), o.provenance().asOf());
        assertEquals("--as-of", o.provenance().asOfSource());
        assertTrue(o.warnings().isEmpty());
        assertEquals(List.of("expected-returns", "covariance"),
                o.provenance().inputs().stream().map(SourceFile::role).toList());
        String bad = "# as_of: 30/06/2025\nasset,expected_return\nA,0.04\nB,0.06\n";
        assertEquals("mu.csv, row 1: the as_of line is not a date (value '30/06/2025'); fix: write the date as "
                + "YYYY-MM-DD, e.g. 2025-06-30", error(bad, c));
    }

    @Test
    void bothOrNeitherRiskInputIsRefused() {
        assertThrows(InputException.class, () -> new UniverseFiles(null, null, null, null, null, null));
        InputException e = assertThrows(InputException.class, () -> new UniverseFiles(null,
                java.nio.file.Path.of("c.csv"), java.nio.file.Path.of("v.csv"), null, null, null));
        assertEquals("both a covariance matrix and volatilities/correlation were given; fix: give --covariance FILE, "
                + "or --volatilities FILE with --correlation FILE, not both", e.getMessage());
    }

    @Test
    void theLoadedUniverseIsAnOrdinaryAssetUniverse() {
        AssetUniverse u = load(MU, "asset,A,B,C\nA,0.01,0.01,0.006\nB,0.01,0.04,0.024\nC,0.006,0.024,0.09\n")
                .universe();
        assertEquals(3, u.size());
        assertEquals(0.09, u.covariance(2, 2));
    }
}
