package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class CriticalLineRefusalTests {

    private static final AssetUniverse U = FactorModels.universe(5, 77);

    private static AllocationRequest forced(Mandate m, Objective o) {
        return new AllocationRequest(U, m, o, Method.CRITICAL_LINE, null);
    }

    @Test
    void groupLimitsAreLeftToTheNumericalMethod() {
        Mandate m = new Mandate(1.0, new double[5], filled(0.5), Map.of(),
                List.of(new Group("Equity", List.of(0, 1), 0.1, 0.4)), List.of());
        assertFalse(Allocator.criticalLineApplies(m));
        InputException e = assertThrows(InputException.class, () -> Allocator.solve(forced(m,
                Objective.minimumVariance())));
        assertEquals("the critical line method takes only the budget, per-asset bounds and fixed weights, but the "
                + "mandate has group limits; fix: drop --method critical-line (auto picks the numerical method)",
                e.getMessage());
    }

    @Test
    void oneAssetWithoutAMinimumAndAnotherWithoutAMaximumLeaveTheRangeUnbounded() {
        // Short the one without limit, buy the other without limit: returns have no highest value.
        double[] lo = new double[5];
        lo[1] = Double.NEGATIVE_INFINITY;
        double[] hi = filled(0.5);
        hi[3] = Double.POSITIVE_INFINITY;
        Mandate m = new Mandate(1.0, lo, hi, Map.of(), List.of(), List.of());
        assertFalse(Allocator.criticalLineApplies(m));
        InputException e = assertThrows(InputException.class, () -> Allocator.solve(forced(m,
                Objective.minimumVariance())));
        assertEquals("asset 'A0002': the critical line method needs every asset bounded on both sides (directly or "
                + "through the other assets' bounds and the budget), but this asset has no lower bound; fix: give "
                + "every asset a min and a max (e.g. a default of min 0 and max 1), or use the numerical method",
                e.getMessage());
    }

    @Test
    void oneAssetWithoutALowerBoundIsBoundedByTheOthers() {
        // Its weight is at least the budget less the others' maxima (4 × 50 % = 200 %): −100 %.
        double[] lo = new double[5];
        lo[2] = Double.NEGATIVE_INFINITY;
        Mandate m = new Mandate(1.0, lo, filled(0.5), Map.of(), List.of(), List.of());
        assertTrue(Allocator.criticalLineApplies(m));
        var s = Allocator.solve(forced(m, Objective.minimumVariance()));
        assertTrue(s.multiplier("lower:" + U.assets().get(2)).isEmpty(), "no lower bound, no price");
        assertTrue(s.certificate().passes());
    }

    @Test
    void theTangencyPortfolioIsNotACriticalLineObjectiveHere() {
        InputException e = assertThrows(InputException.class, () -> Allocator.solve(forced(FactorModels.boxed(5, 0,
                0.5), Objective.tangency(0.01))));
        assertTrue(e.getMessage().startsWith("the critical line method here solves minimum-variance and "
                + "target-return problems"), e.getMessage());
    }

    @Test
    void everyAssetFixedLeavesNoMultiplierUnique() {
        Mandate m = new Mandate(1.0, new double[5], filled(1), Map.of(0, 0.2, 1, 0.2, 2, 0.2, 3, 0.2, 4, 0.2),
                List.of(), List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> Allocator.solve(forced(m,
                Objective.minimumVariance())));
        assertEquals(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, e.reason());
    }

    @Test
    void aCovarianceThatIsNotPositiveDefiniteIsRefused() {
        double[][] s = U.covariance();
        for (int j = 0; j < 5; j++) {
            s[4][j] = s[3][j];
            s[j][4] = s[j][3];
        }
        s[4][4] = s[3][3];
        AssetUniverse twin = U.withAssumptions(U.expectedReturns(), s);
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> Allocator.solve(
                new AllocationRequest(twin, FactorModels.boxed(5, 0, 0.5), Objective.minimumVariance(),
                        Method.CRITICAL_LINE, null)));
        assertEquals(NoSolutionException.Reason.NOT_CONVEX, e.reason());
    }

    private static double[] filled(double v) {
        double[] a = new double[5];
        Arrays.fill(a, v);
        return a;
    }
}
