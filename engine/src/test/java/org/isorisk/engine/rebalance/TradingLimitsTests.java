package org.isorisk.engine.rebalance;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringReader;
import java.util.List;
import java.util.OptionalDouble;
import java.util.Set;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Policy;
import org.junit.jupiter.api.Test;

class TradingLimitsTests {

    static final List<String> ASSETS = RebalancerTests.ASSETS;

    @Test
    void aPolicysTradingSectionBecomesItsLimitsAndMissingKeysLimitNothing() {
        Policy p = PolicyReader.read(new StringReader("""
                budget: 1.0
                turnover: {max: 0.20}
                costs_bps: {default: 10, assets: {Cash: 0}}
                trading:
                  max_trade: {default: 0.10, assets: {Emerging Equity: 0.02}}
                  min_trade: 0.0025
                  no_trade: [Government Bonds]
                """), "policy.yaml", null, ASSETS);
        TradingLimits l = TradingLimits.of(p);
        assertEquals(0.20, l.maxTurnover());
        assertArrayEquals(new double[]{0, 10, 10, 10}, l.costBps());
        assertArrayEquals(new double[]{0.10, 0.10, 0.10, 0.02}, l.maxTrade());
        assertEquals(0.0025, l.minTrade());
        assertEquals(Set.of(1), l.noTrade());
        assertTrue(l.restrictsTrading());

        TradingLimits none = TradingLimits.of(new Policy(Mandate.fullyInvested(4), OptionalDouble.empty(),
                OptionalDouble.empty(), null, "budget only"));
        assertEquals(TradingLimits.none(4), none);
        assertFalse(none.restrictsTrading());
    }

    @Test
    void eachLimitAloneRestrictsTradingButCostsAloneDoNot() {
        TradingLimits none = TradingLimits.none(4);
        assertFalse(none.withCostBps(new double[]{5, 5, 5, 5}).restrictsTrading(), "costs price trades only");
        assertTrue(none.withMaxTurnover(0.5).restrictsTrading());
        assertTrue(none.withMinTrade(0.001).restrictsTrading());
        assertTrue(none.withNoTrade(Set.of(2)).restrictsTrading());
        double inf = Double.POSITIVE_INFINITY;
        assertTrue(none.withMaxTrade(new double[]{inf, inf, 0.05, inf}).restrictsTrading());
    }

    @Test
    void turnoverAndCostOfAMoveAreThoseTheRebalancerReports() {
        // the rebalancer's own totals on a move it made are the two-way turnover and cost of that move
        TradingLimits lim = TradingLimits.none(4).withCostBps(new double[]{0, 3, 10, 25}).withMaxTurnover(0.10);
        RebalanceResult r = Rebalancer.rebalance(RebalancerTests.request(RebalancerTests.bounded(), lim,
                new RebalanceObjective.TargetReturn(0.05)));
        double[] w = r.proposal().weights();
        assertEquals(r.turnover(), TradingLimits.turnover(r.current(), w), Tolerances.GENERAL);
        assertEquals(r.cost(), lim.cost(r.current(), w), Tolerances.GENERAL);
        // by hand: 0.1 sold of Cash and 0.1 bought of Emerging Equity cost 0.1 × 25 bps (hand arithmetic)
        double[] from = {0.3, 0.2, 0.3, 0.2};
        double[] to = {0.2, 0.2, 0.3, 0.3};
        assertEquals(0.2, TradingLimits.turnover(from, to), Tolerances.TIGHT);
        assertEquals(0.1 * 25e-4, lim.cost(from, to), Tolerances.TIGHT);
    }
}
