package org.isorisk.engine.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

/** Which branch of the frontier a target portfolio is on, from its own return-target shadow price. */
class BranchTests {

    @Test
    void theReturnTargetsPriceIsNegativeExactlyBelowTheMinimumVarianceReturn() {
        // Merton (1972): V*(m) = (Cm² − 2Am + B)/D, so ∂V*/∂m = 2(Cm − A)/D changes sign at m = A/C.
        AssetUniverse u = SampleFund.universe();
        Mandate budget = Mandate.fullyInvested(u.size());
        AllocationRequest base = AllocationRequest.of(u, budget, Objective.minimumVariance());
        MertonScalars ms = Frontiers.unconstrained(u, 1.0, Grid.none(), null).unconstrained();
        double m0 = ms.minimumVarianceReturn();
        for (double m : new double[] {m0 - 0.01, m0 - 0.001, m0 + 0.001, m0 + 0.01}) {
            Solution s = Allocator.solve(base.withObjective(Objective.targetReturn(m)));
            double price = s.multiplier("target_return").orElseThrow().variancePerUnit();
            assertEquals(ms.returnMultiplier(m), price, Tolerances.CLOSED_FORM * Math.max(1, Math.abs(price)));
            assertEquals(m < m0, Branch.inefficient(s), "m = " + m);
            assertEquals(m < m0, Branch.annotated(s).notes().contains(Branch.INEFFICIENT_NOTE));
        }
        // at the minimum-variance return itself the price is zero up to round-off: efficient
        Solution at = Allocator.solve(base.withObjective(Objective.targetReturn(m0)));
        assertFalse(Branch.inefficient(at));
        // the minimum-variance portfolio has no return target at all
        assertFalse(Branch.inefficient(Allocator.solve(base)));
    }

    @Test
    void annotatingTwiceAddsTheNoteOnce() {
        AssetUniverse u = SampleFund.universe();
        MertonScalars ms = Frontiers.unconstrained(u, 1.0, Grid.none(), null).unconstrained();
        Solution s = Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(u.size()),
                Objective.targetReturn(ms.minimumVarianceReturn() - 0.005)));
        Solution once = Branch.annotated(s);
        assertSame(once, Branch.annotated(once));
        assertEquals(1, once.notes().stream().filter(Branch.INEFFICIENT_NOTE::equals).count());
    }

    @Test
    void frontiersSampledByTheQpAndInClosedFormSaySoBelowTheMinimumVarianceReturn() {
        // groups and a general row: the active-set QP samples the frontier (no critical line method)
        AssetUniverse u = FactorModels.universe(30, FactorModels.DEFAULT_SEED);
        Mandate m = FactorModels.grouped(30);
        double m0 = Allocator.solve(AllocationRequest.of(u, m, Objective.minimumVariance())).expectedReturn();
        Frontier f = Frontiers.sampled(u, m, Grid.targets(m0 - 0.004, m0 + 0.004, 0.002), null);
        assertEquals(5, f.points().size());
        for (Solution s : f.points()) {
            boolean below = s.expectedReturn() < m0 - 1e-9;
            assertEquals(below, s.notes().contains(Branch.INEFFICIENT_NOTE), "at " + s.expectedReturn());
            assertEquals(below, s.multiplier("target_return").orElseThrow().variancePerUnit() < 0);
        }
        MertonScalars ms = Frontiers.unconstrained(u, 1.0, Grid.none(), null).unconstrained();
        double g = ms.minimumVarianceReturn();
        Frontier closed = Frontiers.unconstrained(u, 1.0, Grid.targets(g - 0.01, g + 0.01, 0.01), null);
        List<Boolean> said = closed.points().stream().map(s -> s.notes().contains(Branch.INEFFICIENT_NOTE)).toList();
        assertEquals(List.of(true, false, false), said);
        assertTrue(closed.points().get(0).expectedReturn() < g);
    }
}
