package org.isorisk.cli.usecase;

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
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.Trade;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.pack.PackComposer;
import org.isorisk.notebooks.pack.PackResults;
import org.isorisk.notebooks.pack.PackSpec;
import org.isorisk.notebooks.report.Table;
import org.junit.jupiter.api.Test;

/**
 * The pack's analyses ({@link PackAnalysis}) and their layout ({@link PackComposer}) against the engine's own
 * answers.
 */
class PackAnalysisTests {

    /** What a pack run produced: the analyses' results and their layout. */
    record Outcome(PackResults results, PackContent content) {
    }

    /** Runs the analyses of {@code r} and lays them out, without charts. */
    static Outcome make(PackAnalysis.Request r) {
        PackResults res = PackAnalysis.run(r);
        return new Outcome(res, PackComposer.compose(res, new PackComposer.Request("", "0.1.0-test",
                OffsetDateTime.parse("2025-06-30T12:00:00Z"), List.of(), List.of(), List.of(), x -> List.of())));
    }

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

    static Outcome run(PackSpec spec, Optional<double[]> holdings) {
        return make(new PackAnalysis.Request(universe(), Mandate.fullyInvested(3), spec, holdings, List.of(), null));
    }

    /** Today's invented holdings of the three assets: expected return 3.60 %, short of the 5 % proposal. */
    static final double[] HELD = {0.5, 0.3, 0.2};

    /** A long-only mandate (each weight between 0 and 1), so that the move toward a target is bounded. */
    static Mandate longOnly() {
        return new Mandate(1.0, new double[3], new double[]{1, 1, 1}, java.util.Map.of(), List.of(), List.of());
    }

    /** The request of a pack run under trading limits, the holdings {@link #HELD}. */
    static PackAnalysis.Request limited(Mandate m, TradingLimits limits) {
        return new PackAnalysis.Request(universe(), m, spec(""), Optional.of(HELD), List.of(), limits);
    }

    /** Costs of 10, 20 and 30 basis points (invented) and a turnover limit. */
    static TradingLimits turnover(double tau) {
        return TradingLimits.none(3).withCostBps(new double[]{10, 20, 30}).withMaxTurnover(tau);
    }

    static double number(Table t, int row, String key) {
        for (int c = 0; c < t.columns().size(); c++) {
            if (t.columns().get(c).key().equals(key)) {
                return ((Table.Cell.Number) t.rows().get(row).get(c)).value();
            }
        }
        throw new AssertionError("no column " + key + " in " + t.name());
    }

    @Test
    void everyPortfolioIsTheEnginesAnswerToTheSameQuestion() {
        Outcome o = run(spec(""), Optional.empty());
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
        Outcome o = run(spec(""), Optional.empty());
        double sum = 0;
        for (double c : o.results().risk().component()) {
            sum += c;
        }
        assertEquals(o.results().proposal().volatility(), sum, 1e-15);
    }

    @Test
    void everyBindingMultiplierBecomesItsSentence() {
        Outcome o = run(spec(""), Optional.empty());
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
        Outcome o = run(spec(""), Optional.of(current));
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
    void withoutTradingLimitsOrCostsTheTradeListIsTheFullMoveAndOnePortfolioIsShown() {
        Outcome o = make(limited(Mandate.fullyInvested(3), TradingLimits.none(3)));
        RebalanceResult rb = o.results().rebalance().orElseThrow();
        // the proposal is the rebalancer's post-trade portfolio, which is the target portfolio to the solvers' accuracy
        assertEquals(rb.proposal(), o.results().proposal());
        double[] target = o.results().targetPortfolio().weights();
        for (int i = 0; i < 3; i++) {
            assertEquals(target[i], rb.proposal().weight(i), PackResults.SAME_WEIGHTS);
        }
        assertTrue(!o.results().proposalDiffersFromTarget());
        PackContent.Trading t = o.content().trading().orElseThrow();
        assertEquals(PackContent.Trading.Mode.FULL_MOVE, t.mode());
        assertTrue(t.headline().startsWith("No trading limit or cost applies (the policy sets none), so the trade list "
                + "is the full move from the current holdings to the least-risk portfolio at the 5.00 % target"),
                t.headline());
        // one portfolio, labelled by its target, is the proposal; nothing is shown beside it
        assertEquals("Target 5.00 %", o.content().proposal().label());
        assertTrue(o.content().besideProposal().isEmpty());
        assertTrue(o.content().portfolios().stream().noneMatch(p -> p.label().startsWith("Proposed (")));
        Table trades = o.content().trades().orElseThrow();
        assertEquals(PackComposer.FULL_MOVE_TITLE, trades.title());
        double[] w = o.results().proposal().weights();
        double turnover = 0;
        for (int i = 0; i < 3; i++) {
            assertEquals(rb.trades().get(i).trade(), number(trades, i, "change"), 0.0);
            assertEquals(w[i], number(trades, i, "proposed"), 0.0);
            turnover += Math.abs(w[i] - HELD[i]);
        }
        // the comparison: today, then the full move with its two-way turnover Σ|w − w0| (DESIGN.md)
        Table cmp = t.comparison();
        assertEquals(2, cmp.rows().size());
        assertEquals(turnover, number(cmp, 1, "turnover"), 1e-15);
        assertEquals(rb.trackingError(), number(cmp, 1, "tracking_error"), 0.0);
        assertTrue(t.headline().contains(Explain.percent(turnover)), t.headline());
    }

    @Test
    void costsAloneKeepTheTradesFromTheTargetPortfolioSoBothAreShownSideBySide() {
        TradingLimits costs = TradingLimits.none(3).withCostBps(new double[]{10, 20, 30});
        Outcome o = make(limited(Mandate.fullyInvested(3), costs));
        RebalanceResult rb = o.results().rebalance().orElseThrow();
        assertEquals(rb.proposal(), o.results().proposal());
        assertTrue(o.results().proposalDiffersFromTarget(), "costs are deducted from the return the target must reach");
        PackContent c = o.content();
        assertEquals(PackContent.Trading.Mode.WITHIN_LIMITS, c.trading().orElseThrow().mode());
        assertEquals("Proposed (after trading costs)", c.proposal().label());
        assertEquals(rb.proposal().volatility(), c.proposal().volatility());
        PackContent.Portfolio target = c.besideProposal().orElseThrow();
        assertEquals("Target 5.00 %", target.label());
        assertEquals("the proposed target before trading costs: the trades do not reach it", target.remark());
        assertEquals(o.results().targetPortfolio().volatility(), target.volatility());
        assertEquals(PackComposer.WITHIN_LIMITS_TITLE, c.trades().orElseThrow().title());
        assertTrue(c.trading().get().reading().startsWith("No trading limit binds here: the proposal differs from the "
                + "target portfolio because trading costs are deducted"), c.trading().get().reading());
        assertTrue(c.keyPoints().stream().anyMatch(k -> k.label().equals("Target portfolio, side by side")));
    }

    @Test
    void underATurnoverLimitTheTradeListIsTheRebalancersMoveAndStaysWithinIt() {
        Mandate m = longOnly();
        double full = TradingLimits.turnover(HELD, make(limited(m, TradingLimits.none(3))).results()
                .targetPortfolio().weights());
        // The cheapest way to gain 1.40 % of return after costs is Cash into Equity: 5 % more return less 0.40 % of
        // costs per unit, 0.30 each way, two-way turnover 0.61; a limit between that and the full move binds and
        // can be met (hand arithmetic on the invented numbers).
        assertTrue(full > 0.72, "the full move trades " + full);
        TradingLimits limits = turnover(0.70);
        PackAnalysis.Request req = limited(m, limits);
        Outcome o = make(req);
        RebalanceResult direct = Rebalancer.rebalance(new RebalanceRequest(universe(), m,
                Holdings.ofWeights(universe().assets(), HELD, 1e6), limits, new RebalanceObjective.TargetReturn(0.05),
                null));
        RebalanceResult shown = o.results().rebalance().orElseThrow();
        assertEquals(direct.trades(), shown.trades(), "the pack's move is the rebalancer's on the same inputs");
        assertEquals(direct.turnover(), shown.turnover());
        PackContent.Trading t = o.content().trading().orElseThrow();
        assertEquals(PackContent.Trading.Mode.WITHIN_LIMITS, t.mode());
        Table trades = o.content().trades().orElseThrow();
        assertEquals(PackComposer.WITHIN_LIMITS_TITLE, trades.title());
        double turnover = 0;
        for (int i = 0; i < 3; i++) {
            Trade x = direct.trades().get(i);
            assertEquals(x.target(), number(trades, i, "proposed"), 0.0);
            assertEquals(x.trade(), number(trades, i, "change"), 0.0);
            assertEquals(x.amount(), number(trades, i, "amount"), 0.0);
            turnover += Math.abs(number(trades, i, "change"));
        }
        // the limit Σ|w − w0| ≤ τ holds to the solver's feasibility tolerance, and the limit binds
        double tol = SolverSettings.defaults().numericalTolerance();
        assertTrue(turnover <= 0.70 + tol, "turnover " + turnover);
        assertEquals(0.70, turnover, tol);
        // the return after costs reaches the target
        assertTrue(direct.proposedNetReturn() >= 0.05 - tol);
        // the comparison shows the full move beside the move within the limit
        Table cmp = t.comparison();
        assertEquals(List.of(PackComposer.CURRENT, "Full move to the target portfolio (5.00 %)",
                "Proposed (after trading limits and costs)"), // the turnover limit binds, and costs apply
                cmp.rows().stream().map(r -> ((Table.Cell.Text) r.get(0)).value()).toList());
        assertEquals(full, number(cmp, 1, "turnover"), 1e-15);
        assertEquals(direct.turnover(), number(cmp, 2, "turnover"), 0.0);
        assertEquals(direct.proposedVolatility(), number(cmp, 2, "volatility"), 0.0);
        assertEquals(direct.proposedReturn(), number(cmp, 2, "expected_return"), 0.0);
        assertEquals(direct.trackingError(), number(cmp, 2, "tracking_error"), 0.0);
        assertTrue(number(cmp, 2, "volatility") > number(cmp, 1, "volatility"), "the binding limit costs risk");
        // the turnover limit's shadow price in the engine's own sentence, first
        assertEquals(direct.sentences(), t.sentences());
        assertTrue(t.sentences().get(0).startsWith("Allowing 1 % more turnover would lower volatility by"),
                t.sentences().get(0));
        assertTrue(t.limits().contains("Turnover (two-way: buys plus sells) at most 70.00 % of the fund."), t.limits().toString());
        assertTrue(t.headline().contains("(limit 70.00 %)"), t.headline());
        assertTrue(t.reading().startsWith("The trading limits bind: keeping to them and paying the costs moves the "
                + "volatility from " + Explain.percent(number(cmp, 1, "volatility")) + " (the target portfolio) to "
                + Explain.percent(direct.proposedVolatility()) + " (the proposal)"), t.reading());
        // one story: the proposal the pack describes is the portfolio the trades reach
        assertEquals(direct.proposal().volatility(), o.content().proposal().volatility());
        for (int i = 0; i < 3; i++) {
            assertEquals(direct.proposal().weight(i), number(o.content().risk(), i, "weight"), 0.0);
        }
    }

    @Test
    void aTurnoverLimitThatDoesNotBindIsReadAsSuchAndTheCostsMakeTheDifference() {
        // a limit far above any move: the rebalancer's answer is the least-risk portfolio for the target after costs
        Outcome o = make(limited(longOnly(), turnover(1.9)));
        PackContent.Trading t = o.content().trading().orElseThrow();
        assertEquals(PackContent.Trading.Mode.WITHIN_LIMITS, t.mode());
        assertTrue(t.sentences().get(0).startsWith("The turnover limit 190.00 % is not binding"), t.sentences().get(0));
        double fullNet = number(t.comparison(), 1, "return_after_costs");
        assertTrue(fullNet < 0.05, "the full move pays costs out of the target's return");
        assertEquals("No trading limit binds here: the proposal differs from the target portfolio because trading "
                + "costs are deducted from the return the target must reach; the full move would return "
                + Explain.percent(fullNet) + " after costs, short of the 5.00 % target.", t.reading());
        // the same limit without costs: the move within the limits is the full move, and one portfolio is shown
        Outcome free = make(limited(longOnly(), TradingLimits.none(3).withMaxTurnover(1.9)));
        double[] full = free.results().targetPortfolio().weights();
        double[] moved = free.results().rebalance().orElseThrow().proposal().weights();
        for (int i = 0; i < 3; i++) {
            assertEquals(full[i], moved[i], SolverSettings.defaults().numericalTolerance());
        }
        PackContent.Trading ft = free.content().trading().orElseThrow();
        assertEquals(PackContent.Trading.Mode.FULL_MOVE, ft.mode());
        assertTrue(ft.headline().startsWith("The policy's trading limits do not change the answer here, so the trade "
                + "list is the full move"), ft.headline());
        assertTrue(free.content().besideProposal().isEmpty());
    }

    @Test
    void aTargetOutOfReachWithinTheLimitsIsSaidPlainlyAndThePackStaysComplete() {
        // 1 % of turnover cannot lift the return from 3.60 % to 5 %
        TradingLimits limits = turnover(0.01);
        NoSolutionException direct = assertThrows(NoSolutionException.class, () -> Rebalancer.rebalance(
                new RebalanceRequest(universe(), longOnly(), Holdings.ofWeights(universe().assets(), HELD, 1e6),
                        limits, new RebalanceObjective.TargetReturn(0.05), null)));
        Outcome o = make(limited(longOnly(), limits));
        PackContent.Trading t = o.content().trading().orElseThrow();
        assertEquals(PackContent.Trading.Mode.OUT_OF_REACH, t.mode());
        assertTrue(t.headline().startsWith("The proposal's target 5.00 % cannot be reached within the policy's "
                + "trading limits, so the pack proposes no trade list: "), t.headline());
        assertTrue(t.headline().contains(direct.getMessage()), t.headline());
        assertTrue(o.content().trades().isEmpty(), "no trade list is proposed");
        assertTrue(o.results().rebalance().isEmpty());
        // the rest of the pack is there: the proposal, the full move's figures, every table
        assertEquals("Target 5.00 %", o.content().proposal().label());
        assertEquals(2, t.comparison().rows().size());
        assertTrue(o.content().tables().stream().anyMatch(x -> x.name().equals("trade_summary")));
    }

    @Test
    void theNoTradeListAndTheMinimumTradeReachTheRebalancer() {
        // Bonds on the no-trade list: the move goes through Cash and Equity alone
        TradingLimits limits = TradingLimits.none(3).withNoTrade(java.util.Set.of(1)).withMinTrade(0.001);
        Outcome o = make(limited(longOnly(), limits));
        assertEquals(PackContent.Trading.Mode.WITHIN_LIMITS, o.content().trading().orElseThrow().mode());
        Table trades = o.content().trades().orElseThrow();
        assertEquals(0.0, number(trades, 1, "change"));
        assertEquals("on the no-trade list", ((Table.Cell.Text) trades.rows().get(1).get(trades.columns().size() - 1))
                .value());
        assertTrue(o.content().trading().get().limits().contains("Not traded: Bonds."));
    }

    @Test
    void theFrontierRunsFromTheMinimumVarianceReturnUpwardWithIncreasingRisk() {
        Outcome o = run(spec(""), Optional.empty());
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
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> PackAnalysis.run(
                new PackAnalysis.Request(universe(), pinned, s, Optional.empty(), List.of(), null)));
        assertTrue(e.getMessage().startsWith("target return 5.00 % of the pack file: "), e.getMessage());
    }

}
