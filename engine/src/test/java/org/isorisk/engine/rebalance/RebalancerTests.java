package org.isorisk.engine.rebalance;

import static org.junit.jupiter.api.Assertions.assertEquals;
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
    static final double LIFTED = 1e-6;

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
}
