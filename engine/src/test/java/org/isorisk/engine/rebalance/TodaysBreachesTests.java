package org.isorisk.engine.rebalance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Set;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.junit.jupiter.api.Test;

/** Today's breaches of the mandate without a proposal, and the notes and sentences of a move that a pack shows. */
class TodaysBreachesTests {

    @Test
    void todaysBreachesAreTheRebalancersWithoutTheCure() {
        // RebalancerTests' invented universe: Emerging Equity at 15 % above a 10 % cap, equity at 50 % above 45 %
        Mandate m = Mandate.fullyInvested(4).withBounds(new double[] {0, 0, 0, 0}, new double[] {0.5, 0.7, 0.5, 0.1});
        m = new Mandate(1.0, m.lower(), m.upper(), m.fixed(), List.of(new Group("Equity", List.of(2, 3),
                Double.NEGATIVE_INFINITY, 0.45)), List.of());
        List<Breach> today = Rebalancer.breaches(RebalancerTests.universe(), m, RebalancerTests.W0);
        assertEquals(List.of("Emerging Equity is at 15.00 % today, above its maximum 10.00 % by 5.00 %.",
                "Group Equity is at 50.00 % today, above its maximum 45.00 % by 5.00 %."),
                today.stream().map(Breach::description).toList());
        assertTrue(today.stream().allMatch(b -> b.cures().isEmpty() && Double.isNaN(b.proposed())));
        // the same limits, found by a move: the same constraints and amounts, each with the trades that cure it
        RebalanceResult move = Rebalancer.rebalance(new RebalanceRequest(RebalancerTests.universe(), m,
                Holdings.ofWeights(RebalancerTests.ASSETS, RebalancerTests.W0, 1e6), TradingLimits.none(4),
                new RebalanceObjective.TargetReturn(0.04), null));
        assertEquals(today.stream().map(Breach::constraint).toList(),
                move.breaches().stream().map(Breach::constraint).toList());
        for (int k = 0; k < today.size(); k++) {
            assertEquals(today.get(k).excess(), move.breaches().get(k).excess(), 0.0);
            String cured = move.breaches().get(k).description();
            String bare = today.get(k).description();
            assertTrue(cured.startsWith(bare.substring(0, bare.length() - 1) + "; the proposal trades: "), cured);
        }
    }

    @Test
    void marketValuesThatAddUpToTheBudgetOnlyToRoundingAreNotSaidToBeRescaled() {
        // 0.3 + 0.3 + 0.3 + 0.1 in binary adds up to 0.9999999999999999: to rounding, nothing to tell the reader
        Holdings h = Holdings.ofMarketValues(RebalancerTests.ASSETS, new double[] {3, 3, 3, 1}, Double.NaN);
        double sum = 0;
        for (double w : h.weights()) {
            sum += w;
        }
        assertTrue(sum != 1.0, "the case needs a sum that misses 1 by rounding");
        RebalanceResult r = Rebalancer.rebalance(new RebalanceRequest(RebalancerTests.universe(),
                RebalancerTests.bounded(), h, TradingLimits.none(4), new RebalanceObjective.TargetReturn(0.04), null));
        assertTrue(r.notes().stream().noneMatch(n -> n.contains("rescaled")), r.notes().toString());
        // weights that visibly miss the budget still are
        RebalanceResult off = Rebalancer.rebalance(new RebalanceRequest(RebalancerTests.universe(),
                RebalancerTests.bounded(), Holdings.ofWeights(RebalancerTests.ASSETS,
                new double[] {0.1, 0.4, 0.35, 0.1504}, 1e6), TradingLimits.none(4),
                new RebalanceObjective.TargetReturn(0.04), null));
        assertTrue(off.notes().stream().anyMatch(n -> n.startsWith("The holding weights add up to 1.000400; they "
                + "were rescaled")), off.notes().toString());
    }

    @Test
    void aMoveNamesTheTradingLimitsItBreaks() {
        double[] from = {0.10, 0.40, 0.35, 0.15};
        double[] to = {0.05, 0.40, 0.40, 0.15}; // two-way turnover 10 %: 5 % out of Cash into Domestic Equity
        List<String> a = RebalancerTests.ASSETS;
        assertEquals(List.of(), TradingLimits.none(4).brokenBy(from, to, a));
        assertEquals(List.of(), TradingLimits.none(4).withMaxTurnover(0.10).brokenBy(from, to, a), "at the limit");
        assertEquals(List.of("turnover", "trade_limit:Cash", "trade_limit:Domestic Equity", "no_trade:Cash"),
                TradingLimits.none(4).withMaxTurnover(0.09).withMaxTrade(new double[] {0.04, 1, 0.04, 1})
                        .withNoTrade(Set.of(0, 1)).brokenBy(from, to, a));
        // the minimum trade size drops small trades, it refuses none
        assertEquals(List.of(), TradingLimits.none(4).withMinTrade(0.5).brokenBy(from, to, a));
    }

    @Test
    void theTurnoverAndTradeLimitsReadAsLimitsInASentence() {
        assertEquals("Raising the turnover limit by 1.00 % lowers volatility by 0.07 %.",
                Explain.sentence(new Multiplier("turnover", -0.011, -0.07, true)));
        assertEquals("Raising the trade limit of Cash by 1.00 % lowers volatility by 0.02 %.",
                Explain.sentence(new Multiplier("trade_limit:Cash", -0.001, -0.02, true)));
    }
}
