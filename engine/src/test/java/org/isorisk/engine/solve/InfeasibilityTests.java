package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.ReturnRange;
import org.junit.jupiter.api.Test;

/** Each contradiction the diagnosis names, with its exact message. Four assets A0001..A0004. */
class InfeasibilityTests {
    private static final AssetUniverse U = GeneratedProblems.universe(4, 31);
    private static final String A = "A0001";
    private static final String B = "A0002";
    private static final String C = "A0003";
    private static final String D = "A0004";

    private static double[] fill(double v) {
        double[] a = new double[4];
        Arrays.fill(a, v);
        return a;
    }

    private static NoSolutionException fail(Mandate m, Objective o) {
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(new AllocationRequest(U, m, o, Method.NUMERICAL, null)));
        assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
        return e;
    }

    @Test
    void lowerBoundsAboveTheBudgetAreNamed() {
        Mandate m = new Mandate(1.0, new double[] {0.3, 0.3, 0.3, 0.2}, fill(1), Map.of(), List.of(), List.of());
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("the lower bounds and fixed weights add up to 110.00 %, above the budget of 100.00 %; fix: lower "
                + "some minimum or fixed weights so that they add up to at most 100.00 %", e.getMessage());
        assertEquals(List.of("budget", "lower:" + A, "lower:" + B, "lower:" + C, "lower:" + D), e.constraints());
    }

    @Test
    void upperBoundsBelowTheBudgetAreNamed() {
        Mandate m = new Mandate(1.0, fill(0), fill(0.2), Map.of(), List.of(), List.of());
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("the upper bounds and fixed weights add up to 80.00 %, below the budget of 100.00 %; fix: raise "
                + "some maximum weights so that they add up to at least 100.00 %", e.getMessage());
        assertEquals(List.of("budget", "upper:" + A, "upper:" + B, "upper:" + C, "upper:" + D), e.constraints());
    }

    @Test
    void aFixedWeightOutsideItsBoundsIsNamed() {
        Mandate m = new Mandate(1.0, fill(0), fill(0.5), Map.of(3, 0.6), List.of(), List.of());
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("the fixed weight of 'A0004' (60.00 %) lies above its upper bound 50.00 %; fix: change the fixed "
                + "weight or the bounds of 'A0004'", e.getMessage());
        assertEquals(List.of("fixed:" + D, "upper:" + D), e.constraints());
    }

    @Test
    void aGroupMinimumAboveItsMembersUpperBoundsIsNamed() {
        Group g = new Group("Growth", List.of(0, 1), 0.5, 0.9);
        Mandate m = new Mandate(1.0, fill(0), fill(0.2), Map.of(), List.of(g), List.of()).withBounds(fill(0),
                new double[] {0.2, 0.2, 1, 1});
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("group 'Growth' must hold at least 50.00 %, but the upper bounds of its members add up to only "
                + "40.00 %; fix: lower the group minimum to at most 40.00 % or raise its members' maximum weights",
                e.getMessage());
        assertEquals(List.of("group:Growth:min", "upper:" + A, "upper:" + B), e.constraints());
    }

    @Test
    void aGroupMaximumTheOtherAssetsCannotMakeUpIsNamed() {
        Group g = new Group("Growth", List.of(0, 1), Double.NEGATIVE_INFINITY, 0.3);
        Mandate m = new Mandate(1.0, fill(0), new double[] {1, 1, 0.25, 0.25}, Map.of(), List.of(g), List.of());
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("group 'Growth' may hold at most 30.00 %, but the assets outside it can hold at most 50.00 % "
                + "(their upper bounds and fixed weights), so at least 50.00 % of the budget of 100.00 % must go into "
                + "it; fix: raise the group maximum to at least 50.00 % or the other assets' maximum weights",
                e.getMessage());
        assertEquals(List.of("group:Growth:max", "budget", "upper:" + C, "upper:" + D), e.constraints());
    }

    @Test
    void aGroupInsideAnotherWithContradictingLimitsIsNamed() {
        Group inner = new Group("Equity", List.of(0), 0.4, 1);
        Group outer = new Group("Risky", List.of(0, 1), 0, 0.3);
        Mandate m = new Mandate(1.0, fill(0), fill(1), Map.of(), List.of(inner, outer), List.of());
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("group 'Equity' must hold at least 40.00 %, but every member of it also belongs to group 'Risky', "
                + "which may hold at most 30.00 %; fix: lower the minimum of 'Equity' or raise the maximum of 'Risky'",
                e.getMessage());
        assertEquals(List.of("group:Equity:min", "group:Risky:max"), e.constraints());
    }

    @Test
    void twoDisjointGroupsWhoseMinimumsExceedTheBudgetAreNamed() {
        Group x = new Group("Bonds", List.of(0, 1), 0.6, 1);
        Group y = new Group("Stocks", List.of(2, 3), 0.5, 1);
        Mandate m = new Mandate(1.0, fill(0), fill(1), Map.of(), List.of(x, y), List.of());
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("groups 'Bonds' and 'Stocks' share no asset and must hold at least 60.00 % and 50.00 %, together "
                + "110.00 %, but the budget leaves only 100.00 % for them; fix: lower one of the two group minimums",
                e.getMessage());
        assertEquals(List.of("group:Bonds:min", "group:Stocks:min", "budget"), e.constraints());
    }

    @Test
    void otherContradictionsAreReducedToAMinimalSetOfConstraints() {
        // A general constraint against a group: the deletion filter keeps exactly the two rows and the budget
        // is not needed to see the contradiction.
        Group g = new Group("Pair", List.of(0, 1), 0.6, 1);
        LinearConstraint c = new LinearConstraint("tilt", new double[] {1, 1, 0, 0}, Relation.AT_MOST, 0.5);
        LinearConstraint unrelated = new LinearConstraint("spread", new double[] {0, 0, 1, -1}, Relation.AT_MOST, 0.9);
        Mandate m = new Mandate(1.0, fill(0), fill(1), Map.of(), List.of(g), List.of(c, unrelated));
        NoSolutionException e = fail(m, Objective.minimumVariance());
        assertEquals("no portfolio meets these constraints together: group:Pair:min (>= 60.00 %), tilt (<= 50.00 %); "
                + "fix: relax one of them", e.getMessage());
        assertEquals(List.of("group:Pair:min", "tilt"), e.constraints());
    }

    @Test
    void aTargetAboveTheMaximumReportsTheRangeAndThePortfolioAtItsEnd() {
        Mandate m = new Mandate(1.0, fill(0), fill(0.4), Map.of(), List.of(), List.of());
        ReturnRange rr = Allocator.returnRange(U, m);
        double target = rr.max() + 0.01;
        NoSolutionException e = fail(m, Objective.targetReturn(target));
        double[] top = rr.maxPortfolio();
        assertEquals(String.format(java.util.Locale.ROOT, "the target return %s is above the highest expected return "
                        + "the mandate allows, %s (achievable range %s to %s); the portfolio at that end holds %s; fix: "
                        + "choose a target between %s and %s", pct(target), pct(rr.max()), pct(rr.min()), pct(rr.max()),
                Feasibility.holdings(top, U.assets()), pct(rr.min()), pct(rr.max())), e.getMessage());
        assertEquals(List.of("target_return"), e.constraints());
        assertArrayEquals(new double[] {rr.min(), rr.max()}, e.achievableReturns().orElseThrow(), 0.0);
        assertEquals(U.assets().size(), e.endPortfolio().orElseThrow().size());
        // the top end of a long-only, 40 %-capped mandate: the two best assets at 40 %, the third at 20 %
        double[] mu = U.expectedReturns();
        Integer[] order = {0, 1, 2, 3};
        Arrays.sort(order, (i, j) -> Double.compare(mu[j], mu[i]));
        assertEquals(0.4, top[order[0]], Tolerances.TIGHT);
        assertEquals(0.4, top[order[1]], Tolerances.TIGHT);
        assertEquals(0.2, top[order[2]], Tolerances.TIGHT);
        assertEquals(0.4 * mu[order[0]] + 0.4 * mu[order[1]] + 0.2 * mu[order[2]], rr.max(), Tolerances.TIGHT);
    }

    @Test
    void aTargetBelowTheMinimumSaysSo() {
        Mandate m = new Mandate(1.0, fill(0), fill(0.4), Map.of(), List.of(), List.of());
        ReturnRange rr = Allocator.returnRange(U, m);
        NoSolutionException e = fail(m, Objective.targetReturn(rr.min() - 0.001));
        assertTrue(e.getMessage().startsWith("the target return " + pct(rr.min() - 0.001) + " is below the lowest "
                + "expected return the mandate allows, " + pct(rr.min())), e.getMessage());
    }

    private static String pct(double v) {
        return org.isorisk.engine.explain.Explain.percent(v);
    }
}
