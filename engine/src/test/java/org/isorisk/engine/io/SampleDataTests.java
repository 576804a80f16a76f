package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.LocalDate;
import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.linalg.Spectrum;
import org.junit.jupiter.api.Test;

/** The invented sample fund in {@code sample-data/} is complete, consistent and valid. */
class SampleDataTests {

    static final Path DATA = Path.of("..", "sample-data");

    /** The asset classes other parts of the project (policy files, charts) are written against. */
    static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    private static LoadedUniverse covarianceRoute() {
        return UniverseLoader.load(UniverseFiles.of(DATA.resolve("expected_returns.csv"), DATA.resolve("covariance.csv")));
    }

    @Test
    void theSampleFundHasTheTwelveAgreedAssetClassesAndLoadsWithoutWarnings() {
        LoadedUniverse u = covarianceRoute();
        assertEquals(ASSETS, u.assets());
        assertTrue(u.warnings().isEmpty(), u.warnings().toString());
        assertEquals(LocalDate.of(2025, 6, 30), u.provenance().asOf());
    }

    @Test
    void theCovarianceFileIsTheProductOfTheVolatilitiesAndCorrelations() {
        LoadedUniverse c = covarianceRoute();
        LoadedUniverse v = UniverseLoader.load(new UniverseFiles(DATA.resolve("expected_returns.csv"), null,
                DATA.resolve("volatilities.csv"), DATA.resolve("correlation.csv"), Units.DECIMAL, null));
        for (int i = 0; i < ASSETS.size(); i++) {
            for (int j = 0; j < ASSETS.size(); j++) {
                assertEquals(v.universe().covariance(i, j), c.universe().covariance(i, j), Tolerances.TIGHT);
            }
        }
    }

    @Test
    void theCorrelationMatrixIsPositiveDefiniteAsAnIndependentLibraryFound() {
        CsvTable t = Csv.read(DATA.resolve("correlation.csv"), "correlation");
        NamedMatrix m = NamedMatrix.read(t, UniverseLoader.CORRELATION_LAYOUT);
        Spectrum s = Spectrum.of(m.values());
        // numpy 1.24 linalg.eigvalsh (LAPACK dsyevd) on the same matrix when the data were written: 0.1448632284, 5.2134922265.
        assertEquals(0.1448632284, s.smallest(), 1e-9);
        assertEquals(5.2134922265, s.largest(), 1e-9);
    }

    @Test
    void theHoldingsAreAboutTwoPointFourBillionAndCoverEveryAsset() {
        PortfolioFile h = PortfolioReader.read(DATA.resolve("holdings.csv"), "holdings", ASSETS, Units.DECIMAL);
        assertEquals(2_417_050_000.0, h.marketValue().orElseThrow());
        double sum = 0;
        for (double w : h.weights()) {
            assertTrue(w > 0);
            sum += w;
        }
        assertEquals(1.0, sum, Tolerances.TIGHT);
        assertTrue(h.warnings().isEmpty(), h.warnings().toString());
    }

    @Test
    void theBenchmarkListsEveryAssetAndAddsUpToOne() {
        PortfolioFile b = PortfolioReader.read(DATA.resolve("benchmark.csv"), "benchmark", ASSETS, Units.DECIMAL);
        double sum = 0;
        for (double w : b.weights()) {
            assertTrue(w > 0);
            sum += w;
        }
        assertEquals(1.0, sum, Tolerances.TIGHT);
        assertTrue(b.warnings().isEmpty(), b.warnings().toString());
    }
}
