package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Set;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RebalanceCommandTests {

    @TempDir
    Path dir;

    String mu;
    String cov;
    String holdings;
    String policy;

    @BeforeEach
    void sample() throws Exception {
        Run.sample(dir);
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
        holdings = dir.resolve("holdings.csv").toString();
        Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        policy = dir.resolve("policy.yaml").toString();
    }

    @Test
    void theJsonProposalCarriesTheEnginesNumbersTheTradesAndTheCaution() {
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--holdings",
                holdings, "--target-return", "0.05", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        // the same request through the engine directly
        LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(Path.of(mu), Path.of(cov)));
        Policy p = PolicyReader.read(Path.of(policy), u.assets());
        var held = PortfolioReader.read(Path.of(holdings), "holdings", u.assets(), Units.DECIMAL);
        TradingLimits lim = new TradingLimits(p.turnoverMax().getAsDouble(), inf(12), p.costsBps(), 0, Set.of());
        RebalanceResult e = Rebalancer.rebalance(new RebalanceRequest(u.universe(), p.mandate(), Holdings.ofWeights(
                u.assets(), held.weights(), held.marketValue().getAsDouble()), lim,
                new RebalanceObjective.TargetReturn(0.05), null));
        JsonNode j = r.json();
        assertEquals("optimal", j.get("status").asText());
        assertEquals("target", j.get("objective").asText());
        assertEquals(e.turnover(), j.get("turnover").get("two_way").doubleValue());
        assertEquals(e.proposedVolatility(), j.get("proposed").get("volatility").doubleValue());
        assertEquals(e.cost(), j.get("cost").get("fraction_of_fund").doubleValue());
        assertEquals(12, j.get("trades").size());
        double sum = 0;
        for (JsonNode t : j.get("trades")) {
            sum += t.get("trade_weight").doubleValue();
            assertEquals(t.get("trade_weight").doubleValue() * 2_417_050_000.0, t.get("trade_amount").doubleValue(),
                    1e-3);
        }
        assertEquals(0, sum, 1e-9, "a fully invested fund's trades net to zero");
        assertTrue(j.get("turnover").get("two_way").doubleValue() <= 0.20 + 1e-9);
        assertTrue(j.get("proposal").get("certificate").get("passes").booleanValue());
        assertTrue(j.get("turnover_convention").asText().startsWith("Turnover is two-way"));
        assertEquals(Caution.TEXT, j.get("caution").asText());
        assertTrue(j.get("timing_ms").get("total").doubleValue() > 0);
    }

    @Test
    void holdingsThatBreakThePolicyAreReportedFirstWithTheCuringTrades() {
        // Emerging Equity at 15 % is above the sample policy's 10 % maximum
        String h = Run.file(dir, "h.csv", "asset,weight\nCash,0.03\nGovernment Bonds,0.22\nInflation-Linked Bonds,0.07\n"
                + "Investment-Grade Credit,0.13\nHigh Yield,0.04\nEmerging Market Debt,0.02\nDomestic Equity,0.12\n"
                + "Foreign Developed Equity,0.15\nEmerging Equity,0.15\nListed Real Estate,0.03\nInfrastructure,0.03\n"
                + "Commodities,0.01\n");
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--holdings", h,
                "--objective", "same-risk", "--fund-size", "1000000");
        assertEquals(0, r.code(), r.toString());
        int breach = r.out().indexOf("Today's holdings break the policy:");
        int trades = r.out().indexOf("Trades");
        assertTrue(breach > 0 && breach < trades, r.out());
        String flat = r.out().replaceAll("\\s+", " ");
        assertTrue(flat.contains("Emerging Equity is at 15.00 % today, above its maximum 10.00 % by 5.00 %; the "
                + "proposal trades: sell 5.00 %, to 10.00 %."), r.out());
        assertTrue(flat.contains("Constraint credit_and_emerging_risk is at 13.50 % today, above its limit 12.00 % by "
                + "1.50 %; the proposal trades:"), r.out());
        assertTrue(r.out().contains("Caution: "), r.out());
    }

    @Test
    void aTargetOutOfReachExitsWithCodeThreeAndSaysWhatIsReachable() {
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--holdings",
                holdings, "--target-return", "0.09");
        assertEquals(3, r.code(), r.toString());
        assertEquals("", r.out());
        assertTrue(r.err().startsWith("isorisk: error: "), r.err());
        assertFalse(r.err().contains("\tat "), "no stack trace");
    }

    @Test
    void holdingWeightsOffTheBudgetAreBadInputNamingTheHoldingsFile() {
        String h = Run.file(dir, "pct.csv", "asset,weight\nCash,30\nGovernment Bonds,70\n");
        Path out = dir.resolve("r.txt");
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--holdings", h,
                "--target-return", "0.05", "--out", out.toString());
        assertEquals(2, r.code(), r.toString());
        // the check is Holdings.ofWeights'; the CLI adds the file the weights were read from
        assertEquals("isorisk: error: " + h + ": the holding weights add up to 100.000000, not to the budget "
                + "1.000000; fix: cash is an asset: add or correct the cash row so that the weights add up to the "
                + "budget\n", r.err());
        assertEquals("", r.out());
        assertFalse(Files.exists(out));
    }

    @Test
    void anUnknownAssetOnTheNoTradeListIsBadInput() {
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--holdings",
                holdings, "--target-return", "0.05", "--no-trade", "Gold");
        assertEquals(2, r.code(), r.toString());
        assertTrue(r.err().startsWith("isorisk: error: asset 'Gold': --no-trade names an asset that is not in the "
                + "expected-returns file"), r.err());
        assertEquals("", r.out());
    }

    @Test
    void theProposalGoesToTheOutFileAndTheInputsStayUntouched() throws Exception {
        byte[] before = Files.readAllBytes(Path.of(holdings));
        Path out = dir.resolve("proposal.csv");
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--holdings",
                holdings, "--target-return", "0.05", "--min-trade", "0.005", "--format", "csv", "--out",
                out.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.out());
        String csv = Files.readString(out);
        assertTrue(csv.contains("# caution: " + Caution.TEXT), csv);
        assertTrue(csv.contains("asset,current_weight,target_weight,trade_weight,trade_amount,side,cost,frozen"), csv);
        for (String line : csv.split("\n")) {
            if (!line.startsWith("#") && !line.startsWith("asset,")) {
                double trade = Double.parseDouble(line.split(",")[3]);
                assertTrue(trade == 0 || Math.abs(trade) >= 0.005, line);
            }
        }
        assertTrue(java.util.Arrays.equals(before, Files.readAllBytes(Path.of(holdings))));
        try (var s = Files.list(dir)) {
            assertTrue(s.noneMatch(f -> f.getFileName().toString().endsWith(".tmp")), "no temporary file left");
        }
    }

    @Test
    void thePolicysTradingSectionFreezesItsNoTradeAssetsAndLimitsTrades() throws Exception {
        String text = Files.readString(Path.of(policy)) + "\ntrading:\n  max_trade: {default: 0.04}\n"
                + "  no_trade: [Infrastructure]\n";
        String p2 = Run.file(dir, "policy-trading.yaml", text);
        Run r = Run.of("rebalance", "--expected-returns", mu, "--covariance", cov, "--policy", p2, "--holdings",
                holdings, "--target-return", "0.05", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        for (JsonNode t : r.json().get("trades")) {
            assertTrue(Math.abs(t.get("trade_weight").doubleValue()) <= 0.04 + 1e-9, t.toString());
            if (t.get("asset").asText().equals("Infrastructure")) {
                assertEquals(0.0, t.get("trade_weight").doubleValue());
                assertEquals("no-trade", t.get("frozen").asText());
            }
        }
    }

    private static double[] inf(int n) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, Double.POSITIVE_INFINITY);
        return a;
    }
}
