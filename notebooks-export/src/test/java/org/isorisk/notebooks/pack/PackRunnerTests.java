package org.isorisk.notebooks.pack;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringReader;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Optional;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.Table;
import org.junit.jupiter.api.Test;

class PackRunnerTests {

    /** Three invented assets, volatilities 2 %, 8 %, 16 %, correlations 0.1 / 0.2 / 0.5. */
    static AssetUniverse universe() {
        double[] s = {0.02, 0.08, 0.16};
        double[][] rho = {{1, 0.1, 0.2}, {0.1, 1, 0.5}, {0.2, 0.5, 1}};
        double[][] cov = new double[3][3];
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                cov[i][j] = rho[i][j] * s[i] * s[j];
            }
        }
        return new AssetUniverse(List.of("Cash", "Bonds", "Equity"), new double[]{0.02, 0.04, 0.07}, cov);
    }

    static PackSpec spec(String extra) {
        return PackSpecReader.read(new StringReader("""
                fund: {name: Test Fund, currency: EUR, note: Invented.}
                as_of: 2025-06-30
                targets: [0.04, 0.05]
                proposed: 0.05
                risk_free: 0.01
                frontier: {points: 6}
                fund_size: 1000000
                """ + extra), "pack.yaml");
    }

    static PackRunner.Outcome run(PackSpec spec, Optional<double[]> holdings) {
        return PackRunner.run(new PackRunner.Request(universe(), Mandate.fullyInvested(3), spec, holdings, "",
                "0.1.0-test", OffsetDateTime.parse("2025-06-30T12:00:00Z"), List.of(), List.of(), List.of(), List.of(), r -> List.of()));
    }

    @Test
    void everyPortfolioIsTheEnginesAnswerToTheSameQuestion() {
        PackRunner.Outcome o = run(spec(""), Optional.empty());
        AllocationRequest base = AllocationRequest.of(universe(), Mandate.fullyInvested(3), Objective.minimumVariance());
        Solution direct = Allocator.solve(base.withObjective(Objective.targetReturn(0.05)));
        assertEquals(direct, o.results().proposal());
        assertEquals(Allocator.solve(base), o.results().minimum());
        PackContent c = o.content();
        assertEquals(List.of("Minimum variance", "Target 4.00 %", "Target 5.00 %", "Tangency (risk-free 1.00 %)"),
                c.portfolios().stream().map(PackContent.Portfolio::label).toList());
        assertEquals("Target 5.00 %", c.proposal().label());
        assertEquals(direct.volatility(), c.proposal().volatility());
        // weights table: the proposal's column holds the engine's weights
        Table w = c.weights();
        assertEquals("target_5", w.columns().get(3).key());
        for (int i = 0; i < 3; i++) {
            assertEquals(direct.weight(i), ((Table.Cell.Number) w.rows().get(i).get(3)).value());
        }
    }

    @Test
    void riskContributionsAddUpToTheProposalsVolatility() {
        // Euler's theorem for the degree-one homogeneous σ(w): Σ w_i ∂σ/∂w_i = σ.
        PackRunner.Outcome o = run(spec(""), Optional.empty());
        double sum = 0;
        for (double c : o.results().risk().component()) {
            sum += c;
        }
        assertEquals(o.results().proposal().volatility(), sum, 1e-15);
    }

    @Test
    void everyBindingMultiplierBecomesItsSentence() {
        PackRunner.Outcome o = run(spec(""), Optional.empty());
        List<Multiplier> binding = o.results().proposal().binding();
        List<PackContent.Binding> shown = o.content().binding().stream()
                .filter(b -> b.portfolio().equals("Target 5.00 %")).toList();
        assertEquals(binding.size(), shown.size());
        for (int k = 0; k < binding.size(); k++) {
            assertEquals(Explain.sentence(binding.get(k)), shown.get(k).sentence());
            assertEquals(binding.get(k).variancePerUnit(), shown.get(k).variancePerUnit());
        }
        assertTrue(shown.stream().anyMatch(b -> b.constraint().equals("target_return")));
    }

    @Test
    void theTradeListIsTheProposalMinusTheHoldingsInWeightAndMoney() {
        double[] current = {0.5, 0.3, 0.2};
        PackRunner.Outcome o = run(spec(""), Optional.of(current));
        Table t = o.content().trades().orElseThrow();
        double[] w = o.results().proposal().weights();
        for (int i = 0; i < 3; i++) {
            List<Table.Cell> row = t.rows().get(i);
            assertEquals(w[i] - current[i], ((Table.Cell.Number) row.get(3)).value(), 0.0);
            assertEquals((w[i] - current[i]) * 1e6, ((Table.Cell.Number) row.get(4)).value(), 0.0);
        }
        assertEquals("Amount (EUR)", t.columns().get(4).label());
        PackContent.Portfolio held = o.content().current().orElseThrow();
        assertEquals(org.isorisk.engine.risk.RiskAnalysis.decompose(universe(), current).volatility(), held.volatility());
        assertEquals(List.of("Target 5.00 %"), o.content().binding().stream().map(PackContent.Binding::portfolio)
                .filter(p -> p.equals("Target 5.00 %") || p.equals(held.label())).distinct().toList(),
                "the holdings were given, so no constraint is reported for them");
    }

    @Test
    void theFrontierRunsFromTheMinimumVarianceReturnUpwardWithIncreasingRisk() {
        PackRunner.Outcome o = run(spec(""), Optional.empty());
        List<Solution> f = o.results().frontier().points();
        assertEquals(6, f.size());
        // the frontier's first point is the minimum-variance portfolio, solved by the sweep (to rounding)
        assertEquals(o.results().minimum().expectedReturn(), f.get(0).expectedReturn(), 1e-12);
        for (int k = 1; k < f.size(); k++) {
            assertTrue(f.get(k).expectedReturn() > f.get(k - 1).expectedReturn());
            assertTrue(f.get(k).volatility() >= f.get(k - 1).volatility(), "efficient branch");
        }
    }

    @Test
    void aTargetTheMandateCannotReachIsNamed() {
        PackSpec s = PackSpecReader.read(new StringReader(
                "fund: {name: F, currency: EUR}\nas_of: 2025-06-30\ntargets: [0.05]\n"), "p.yaml");
        double inf = Double.POSITIVE_INFINITY;
        double[] lo = {-inf, -inf, -inf};
        double[] hi = {inf, inf, inf};
        // Cash and Bonds fixed: Equity is pinned by the budget, so no return target can be met as well.
        Mandate pinned = new Mandate(1.0, lo, hi, java.util.Map.of(0, 0.5, 1, 0.5), List.of(), List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> PackRunner.run(new PackRunner.Request(
                universe(), pinned, s, Optional.empty(), "", "t", OffsetDateTime.now(), List.of(), List.of(), List.of(), List.of(),
                r -> List.of())));
        assertTrue(e.getMessage().startsWith("target return 5.00 % of the pack file: "), e.getMessage());
    }

    @Test
    void columnKeysAreUniquePythonIdentifiers() {
        assertEquals(List.of("government_bonds", "government_bonds_2", "asset_3_10y", "cafe", "asset_5"),
                PackRunner.columnKeys(List.of("Government Bonds", "Government-Bonds", "10y", "Café", "€")));
    }
}
