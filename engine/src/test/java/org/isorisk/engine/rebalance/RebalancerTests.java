package org.isorisk.engine.rebalance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.Set;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.Test;

class RebalancerTests {

    /** Accuracy of the lifted problem's solver on these small problems (measured: about 1e-7). */
    static final double LIFTED = 1e-8;

    /** Invented four-asset universe (illustrative numbers, not market data). */
    static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Domestic Equity", "Emerging Equity");
    static final double[] MU = {0.02, 0.035, 0.065, 0.08};
    static final double[] VOL = {0.01, 0.06, 0.16, 0.22};
    static final double[][] CORR = {
            {1.0, 0.1, 0.0, 0.0},
            {0.1, 1.0, 0.2, 0.1},
            {0.0, 0.2, 1.0, 0.7},
            {0.0, 0.1, 0.7, 1.0}};
    static final double[] W0 = {0.10, 0.40, 0.35, 0.15};

    static AssetUniverse universe() {
        double[][] s = new double[4][4];
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                s[i][j] = CORR[i][j] * VOL[i] * VOL[j];
            }
        }
        return new AssetUniverse(ASSETS, MU, s);
    }

    static Mandate bounded() {
        return Mandate.fullyInvested(4).withBounds(new double[] {0, 0, 0, 0}, new double[] {0.5, 0.7, 0.5, 0.2});
    }

    static RebalanceRequest request(Mandate m, TradingLimits lim, RebalanceObjective o) {
        return new RebalanceRequest(universe(), m, Holdings.ofWeights(ASSETS, W0, 1_000_000), lim, o, null);
    }

    static double vol(double[] w) {
        AssetUniverse u = universe();
        double v = 0;
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                v += w[i] * u.covariance(i, j) * w[j];
            }
        }
        return Math.sqrt(v);
    }

    @Test
    void aTurnoverLimitOfZeroReturnsTheCurrentPortfolioWhenItIsFeasible() {
        // follows from the mathematics: with τ = 0 the only feasible point is w0 (b = s = 0)
        double target = 0.045; // below μ'w0 = 0.0475, so w0 meets it
        RebalanceResult r = Rebalancer.rebalance(request(bounded(), TradingLimits.none(4).withMaxTurnover(0),
                new RebalanceObjective.TargetReturn(target)));
        for (int i = 0; i < 4; i++) {
            assertEquals(W0[i], r.proposal().weight(i), Tolerances.NUMERICAL);
        }
        assertEquals(0, r.turnover(), Tolerances.NUMERICAL);
        assertTrue(r.proposal().certificate().passes(), r.proposal().certificate().toString());
    }

    @Test
    void aLooseTurnoverLimitReturnsTheUnconstrainedOptimum() {
        // reference: the closed-form minimum-variance portfolio at the target (Merton 1972), budget only
        Mandate budgetOnly = Mandate.fullyInvested(4);
        double target = 0.05;
        Solution ref = Allocator.solve(AllocationRequest.of(universe(), budgetOnly, Objective.targetReturn(target)));
        RebalanceResult r = Rebalancer.rebalance(request(budgetOnly, TradingLimits.none(4).withMaxTurnover(10),
                new RebalanceObjective.TargetReturn(target)));
        // ojAlgo's active set (the lifted problem's solver for now) reaches about 1e-7 on this problem
        for (int i = 0; i < 4; i++) {
            assertEquals(ref.weight(i), r.proposal().weight(i), LIFTED);
        }
        assertEquals(ref.volatility(), r.proposedVolatility(), LIFTED);
        Multiplier t = r.turnoverPrice().orElseThrow();
        assertEquals(0, t.variancePerUnit(), Tolerances.TIGHT);
        // the target's shadow price equals the closed form's ∂V*/∂m
        assertEquals(ref.multiplier("target_return").orElseThrow().variancePerUnit(),
                r.proposal().multiplier("target_return").orElseThrow().variancePerUnit(), LIFTED);
    }

    @Test
    void volatilityIsNonIncreasingInTheTurnoverLimit() {
        // follows from the mathematics: a larger τ enlarges the feasible set
        double previous = Double.POSITIVE_INFINITY;
        for (double tau = 0.02; tau <= 0.6; tau += 0.02) {
            RebalanceResult r = Rebalancer.rebalance(request(bounded(), TradingLimits.none(4).withMaxTurnover(tau),
                    new RebalanceObjective.TargetReturn(0.045)));
            assertTrue(r.turnover() <= tau + Tolerances.NUMERICAL);
            assertTrue(r.proposedVolatility() <= previous + Tolerances.NUMERICAL, "tau " + tau);
            previous = r.proposedVolatility();
        }
    }

    @Test
    void theTurnoverShadowPriceEqualsACentralFiniteDifference() {
        // envelope theorem: ∂V*/∂τ equals the derivative of the optimal variance (DESIGN.md sign convention)
        double tau = 0.10;
        double h = 1e-5;
        TradingLimits lim = TradingLimits.none(4);
        RebalanceObjective o = new RebalanceObjective.TargetReturn(0.045);
        RebalanceResult r = Rebalancer.rebalance(request(bounded(), lim.withMaxTurnover(tau), o));
        double up = Rebalancer.rebalance(request(bounded(), lim.withMaxTurnover(tau + h), o)).proposal().variance();
        double dn = Rebalancer.rebalance(request(bounded(), lim.withMaxTurnover(tau - h), o)).proposal().variance();
        double fd = (up - dn) / (2 * h);
        Multiplier t = r.turnoverPrice().orElseThrow();
        assertTrue(t.binding());
        assertTrue(t.variancePerUnit() < 0, "a binding turnover limit has ∂V*/∂τ < 0");
        assertEquals(fd, t.variancePerUnit(), 1e-6 * Math.max(1, Math.abs(fd)));
        assertEquals(t.variancePerUnit() / (2 * r.proposedVolatility()), t.volatilityPerUnit(), Tolerances.TIGHT);
        assertTrue(r.sentences().get(0).startsWith("Allowing 1 % more turnover would lower volatility by"),
                r.sentences().get(0));
    }

    @Test
    void costsAreDeductedFromTheReturnTheTargetMustReachAsComputedByHand() {
        // by hand: w0 = (0.6, 0.4, 0); Government Bonds on the no-trade list, so the only trade moves x from Cash
        // to Equity: net return = 0.02(0.6 − x) + 0.05·0.4 + 0.08x − (0.0010 + 0.0050)x = 0.032 + 0.054x.
        // Variance rises with x here (Equity is far riskier), so the target 0.0374 binds at x = 0.1 exactly;
        // cost = 0.0010·0.1 + 0.0050·0.1 = 0.0006, gross return 0.038.
        List<String> a = List.of("Cash", "Government Bonds", "Domestic Equity");
        double[][] s = {{0.0001, 0, 0}, {0, 0.0036, 0.0024}, {0, 0.0024, 0.04}};
        AssetUniverse u = new AssetUniverse(a, new double[] {0.02, 0.05, 0.08}, s);
        Mandate m = Mandate.fullyInvested(3).withBounds(new double[3], new double[] {1, 1, 1});
        TradingLimits lim = new TradingLimits(Double.POSITIVE_INFINITY, new double[] {1, 1, 1},
                new double[] {10, 20, 50}, 0, Set.of(1));
        RebalanceResult r = Rebalancer.rebalance(new RebalanceRequest(u, m,
                Holdings.ofWeights(a, new double[] {0.6, 0.4, 0}, 2_000_000), lim,
                new RebalanceObjective.TargetReturn(0.0374), null));
        assertEquals(-0.1, r.trades().get(0).trade(), LIFTED);
        assertEquals(0.0, r.trades().get(1).trade(), LIFTED);
        assertEquals(0.1, r.trades().get(2).trade(), LIFTED);
        assertEquals(0.0006, r.cost(), LIFTED * 0.01);
        assertEquals(0.0006 * 2_000_000, r.costAmount(), 1e-6 * 2_000_000 * 0.01);
        assertEquals(0.038, r.proposedReturn(), LIFTED * 0.1);
        assertEquals(0.0374, r.proposedNetReturn(), LIFTED * 0.1);
        assertEquals(0.2, r.turnover(), LIFTED);
        // risk contributions from engine.risk add up to the volatility (Euler); tracking error against today
        assertEquals(r.proposedVolatility(), java.util.Arrays.stream(r.proposedRisk().component()).sum(),
                Tolerances.TIGHT);
        assertEquals(r.currentVolatility(), r.currentRisk().volatility(), Tolerances.TIGHT);
        assertEquals(r.trackingError(), r.activeRisk().value(), Tolerances.TIGHT);
        assertEquals(0.1, r.buys(), LIFTED);
        assertEquals(-200_000, r.trades().get(0).amount(), 1);
        assertEquals(Trade.Side.SELL, r.trades().get(0).side());
        assertEquals("no-trade", r.trades().get(1).frozen());
        assertTrue(r.proposal().certificate().passes(), r.proposal().certificate().toString());
    }

    @Test
    void tradesBelowTheMinimumSizeAreDroppedAndTheAssetFrozenAtItsCurrentWeight() {
        // common practice, no source: the rule drops small trades and re-solves; the outcome must equal solving
        // with the dropped assets on the no-trade list, and every remaining trade must be at least the minimum
        TradingLimits base = TradingLimits.none(4).withMaxTurnover(0.3);
        RebalanceObjective o = new RebalanceObjective.TargetReturn(0.045);
        RebalanceResult free = Rebalancer.rebalance(request(bounded(), base, o));
        double smallest = Double.POSITIVE_INFINITY;
        for (Trade t : free.trades()) {
            if (Math.abs(t.trade()) > 1e-6) {
                smallest = Math.min(smallest, Math.abs(t.trade()));
            }
        }
        double min = smallest * 1.01; // just above the smallest trade: that one must go
        RebalanceResult r = Rebalancer.rebalance(request(bounded(), base.withMinTrade(min), o));
        assertTrue(r.rounds() >= 2);
        assertFalse(r.frozen().isEmpty());
        java.util.Set<Integer> frozen = new java.util.TreeSet<>();
        for (int i = 0; i < 4; i++) {
            Trade t = r.trades().get(i);
            assertTrue(t.trade() == 0 || Math.abs(t.trade()) >= min, t.toString());
            if ("min-trade".equals(t.frozen())) {
                frozen.add(i);
                assertEquals(W0[i], t.target(), Tolerances.TIGHT);
            }
        }
        RebalanceResult same = Rebalancer.rebalance(request(bounded(), base.withNoTrade(frozen), o));
        for (int i = 0; i < 4; i++) {
            assertEquals(same.proposal().weight(i), r.proposal().weight(i), LIFTED);
        }
        assertTrue(r.proposal().multiplier("min_trade:" + ASSETS.get(frozen.iterator().next())).isPresent());
    }

    @Test
    void holdingsThatBreakThePolicyAreReportedWithTheTradesThatCureThem() {
        // Emerging Equity at 15 % is above its 10 % maximum: the proposal must sell at least 5 %
        Mandate m = Mandate.fullyInvested(4).withBounds(new double[4], new double[] {0.5, 0.7, 0.5, 0.10});
        RebalanceResult r = Rebalancer.rebalance(request(m, TradingLimits.none(4).withMaxTurnover(0.3),
                new RebalanceObjective.TargetReturn(0.04)));
        assertEquals(1, r.breaches().size());
        Breach b = r.breaches().get(0);
        assertEquals("upper:Emerging Equity", b.constraint());
        assertEquals(0.05, b.excess(), Tolerances.TIGHT);
        assertTrue(r.proposal().weight(3) <= 0.10 + Tolerances.NUMERICAL);
        assertEquals(1, b.cures().size());
        assertEquals(Trade.Side.SELL, b.cures().get(0).side());
        assertTrue(b.description().startsWith("Emerging Equity is at 15.00 % today, above its maximum 10.00 % by "
                + "5.00 %; the proposal trades: sell"), b.description());
    }

    @Test
    void curingBreachesWithTooLittleTurnoverIsReportedWithTheTurnoverNeeded() {
        // the least turnover that cures a 5 % excess is 10 % two-way (sell 5 %, buy 5 %): follows from the mathematics
        Mandate m = Mandate.fullyInvested(4).withBounds(new double[4], new double[] {0.5, 0.7, 0.5, 0.10});
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> Rebalancer.rebalance(request(m,
                TradingLimits.none(4).withMaxTurnover(0.06), new RebalanceObjective.TargetReturn(0.04))));
        assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
        assertTrue(e.getMessage().startsWith("meeting the policy needs a turnover of at least 10.00 %, above the "
                + "turnover limit 6.00 %"), e.getMessage());
    }

    @Test
    void theSameRiskObjectiveKeepsTodaysVolatilityAndRaisesTheReturn() {
        RebalanceResult r = Rebalancer.rebalance(request(bounded(), TradingLimits.none(4).withMaxTurnover(0.2),
                new RebalanceObjective.SameRisk()));
        assertEquals(r.currentVolatility(), r.proposedVolatility(), 1e-9);
        assertTrue(r.proposedNetReturn() > r.currentReturn());
        // no other portfolio on the turnover-limited frontier at a higher target stays within today's risk
        RebalanceResult above = Rebalancer.rebalance(request(bounded(), TradingLimits.none(4).withMaxTurnover(0.2),
                new RebalanceObjective.TargetReturn(r.proposedNetReturn() + 1e-4)));
        assertTrue(above.proposedVolatility() > r.currentVolatility());
    }

    @Test
    void theNearestObjectiveFindsTheEfficientPortfolioWithTheSmallestTrackingError() {
        TradingLimits lim = TradingLimits.none(4).withMaxTurnover(0.5);
        RebalanceResult r = Rebalancer.rebalance(request(bounded(), lim, new RebalanceObjective.Nearest()));
        // compare with a fine scan of targets (independent of the golden-section refinement)
        for (double t = 0.03; t <= 0.07; t += 0.001) {
            RebalanceResult s;
            try {
                s = Rebalancer.rebalance(request(bounded(), lim, new RebalanceObjective.TargetReturn(t)));
            } catch (NoSolutionException e) {
                continue;
            }
            assertTrue(r.trackingError() <= s.trackingError() + 1e-6, "target " + t);
        }
    }

    @Test
    void withOnlyTheBudgetTheNearestObjectiveMatchesTheClosedFormProjectionOntoTheFrontier() {
        // Merton (1972): with only the budget, efficient weights are affine in the target, w(m) = g + h·m, so the
        // tracking error² (g + hm − w0)'Σ(g + hm − w0) is least at m* = h'Σ(w0 − g) / h'Σh (above the minimum-
        // variance return). g and h come from two closed-form solves.
        Mandate m = Mandate.fullyInvested(4);
        AssetUniverse u = universe();
        double[] w1 = Allocator.solve(AllocationRequest.of(u, m, Objective.targetReturn(0.04))).weights();
        double[] w2 = Allocator.solve(AllocationRequest.of(u, m, Objective.targetReturn(0.06))).weights();
        double[] h = new double[4];
        double[] g = new double[4];
        for (int i = 0; i < 4; i++) {
            h[i] = (w2[i] - w1[i]) / 0.02;
            g[i] = w1[i] - 0.04 * h[i];
        }
        double num = 0;
        double den = 0;
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                num += h[i] * u.covariance(i, j) * (W0[j] - g[j]);
                den += h[i] * u.covariance(i, j) * h[j];
            }
        }
        double best = num / den;
        RebalanceResult r = Rebalancer.rebalance(request(m, TradingLimits.none(4), new RebalanceObjective.Nearest()));
        assertEquals(best, r.proposedReturn(), 1e-7, "the nearest efficient portfolio's return");
        for (int i = 0; i < 4; i++) {
            assertEquals(g[i] + h[i] * best, r.proposal().weight(i), 1e-7, ASSETS.get(i));
        }
    }

    @Test
    void withOnlyTheBudgetTheSameRiskObjectiveReachesTodaysVolatility() {
        // Merton (1972): V*(m) = (Cm² − 2Am + B)/D grows without bound, so today's variance is reached at a finite
        // target; above it the minimum volatility is higher.
        Mandate m = Mandate.fullyInvested(4);
        RebalanceResult r = Rebalancer.rebalance(request(m, TradingLimits.none(4), new RebalanceObjective.SameRisk()));
        assertEquals(r.currentVolatility(), r.proposedVolatility(), 1e-9);
        assertTrue(r.proposedNetReturn() > r.currentReturn());
        RebalanceResult above = Rebalancer.rebalance(request(m, TradingLimits.none(4),
                new RebalanceObjective.TargetReturn(r.proposedNetReturn() + 1e-4)));
        assertTrue(above.proposedVolatility() > r.currentVolatility());
    }
}
