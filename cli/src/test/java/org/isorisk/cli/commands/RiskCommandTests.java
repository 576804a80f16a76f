package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RiskCommandTests {

    @TempDir
    Path dir;

    String mu;
    String cov;
    String holdings;

    @BeforeEach
    void sample() {
        Run.sample(dir);
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
        holdings = dir.resolve("holdings.csv").toString();
    }

    @Test
    void theHoldingsDecomposeAsTheEngineComputesAndAgainstABenchmark() {
        String bench = Run.file(dir, "bench.csv", "asset,weight\nGovernment Bonds,0.4\nDomestic Equity,0.3\n"
                + "Foreign Developed Equity,0.3\n");
        Run r = Run.of("risk", "--expected-returns", mu, "--covariance", cov, "--weights", holdings, "--benchmark", bench,
                "--format", "json");
        assertEquals(0, r.code(), r.toString());
        LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov)));
        double[] w = PortfolioReader.read(Path.of(holdings), "weights", u.assets(), Units.DECIMAL).weights();
        double[] b = PortfolioReader.read(Path.of(bench), "benchmark", u.assets(), Units.DECIMAL).weights();
        RiskDecomposition d = RiskAnalysis.decompose(u.universe(), w);
        TrackingError te = RiskAnalysis.trackingError(u.universe(), w, b);
        JsonNode j = r.json();
        assertEquals("ok", j.get("status").asText());
        JsonNode p = j.get("portfolio");
        assertEquals(d.volatility(), p.get("volatility").doubleValue());
        assertEquals(d.expectedReturn(), p.get("expected_return").doubleValue());
        assertEquals(2_417_050_000.0, p.get("market_value").doubleValue());
        assertEquals(12, p.get("contributions").size());
        assertEquals(d.component()[6], p.get("contributions").get(6).get("component").doubleValue());
        assertEquals("Domestic Equity", p.get("contributions").get(6).get("asset").asText());
        assertEquals(te.value(), j.get("tracking_error").get("value").doubleValue());
        assertEquals(te.active().component()[1],
                j.get("tracking_error").get("contributions").get(1).get("component").doubleValue());
        assertEquals(4, j.get("inputs").get("files").size());
        assertEquals(1, j.get("warnings").size(), "the benchmark leaves nine assets unlisted");
        assertEquals(Caution.TEXT, j.get("caution").asText());
        assertTrue(r.err().startsWith("isorisk: warning: " + bench + ": 9 assets are not listed and count as weight 0"),
                r.err());
    }

    @Test
    void theTableShowsContributionsTheEulerCheckAndTheCaution() {
        Run r = Run.of("risk", "--covariance", cov, "--weights", holdings);
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("Risk of the portfolio in holdings.csv (from market values, total "
                + "2,417,050,000)\n"), r.out());
        assertTrue(r.out().contains("Euler check: the risk contributions add up to the volatility"), r.out());
        assertFalse(r.out().contains("Expected return"), "no expected returns were given");
        LoadedUniverse u = UniverseLoader.load(new UniverseFiles(null, Path.of(cov), null, null, null, null));
        double[] w = PortfolioReader.read(Path.of(holdings), "weights", u.assets(), Units.DECIMAL).weights();
        assertTrue(r.out().contains("  Volatility       " + Explain.percent(RiskAnalysis.decompose(u.universe(), w)
                .volatility())), r.out());
        assertTrue(r.out().replaceAll("\\s+", " ").contains("Caution: " + Caution.TEXT));
    }

    @Test
    void anUnknownAssetInTheWeightsIsNamed() {
        String w = Run.file(dir, "w.csv", "asset,weight\nCash,0.5\nGold,0.5\n");
        Run r = Run.of("risk", "--covariance", cov, "--weights", w);
        assertEquals(2, r.code());
        assertEquals("isorisk: error: " + w + ", row 3, column 'asset', asset 'Gold': the asset is not in the asset "
                + "universe (the expected-returns and covariance files); fix: use the names of the expected-returns "
                + "file, or delete the row\n", r.err());
    }

    @Test
    void theWeightsFileIsRequired() {
        Run r = Run.of("risk", "--covariance", cov);
        assertEquals(2, r.code());
        assertEquals("isorisk: error: Missing required option: '--weights=FILE' (see 'isorisk risk --help')\n",
                r.err());
    }
}
