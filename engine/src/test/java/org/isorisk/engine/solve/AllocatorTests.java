package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.junit.jupiter.api.Test;

/** Degenerate inputs through the front door, each with the exact error text a user reads. */
class AllocatorTests {

    private static final double[][] THREE_SIGMA = {
            {0.0100, 0.0030, 0.0020},
            {0.0030, 0.0400, 0.0060},
            {0.0020, 0.0060, 0.0225}};
    private static final List<String> THREE = List.of("Bonds", "Equity", "Property");

    @Test
    void equalExpectedReturnsWithAnUnreachableTargetFailTheConstraintQualification() {
        AssetUniverse u = new AssetUniverse(THREE, new double[] {0.05, 0.05, 0.05}, THREE_SIGMA);
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(3), Objective.targetReturn(0.06))));
        assertEquals(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, e.reason());
        assertEquals("the constraint qualification fails: constraint 'target_return' depends on 'budget': every asset "
                + "has the same expected return (5.00 %), so the return target's gradient μ is parallel to the "
                + "budget's gradient 1 and adds no direction of its own; every portfolio within the budget returns "
                + "5.00 %, so the target 6.00 % is met by none of them; fix: drop 'target_return' or one of the "
                + "constraints it depends on", e.getMessage());
        assertEquals(List.of("budget", "target_return"), e.constraints());
    }

    @Test
    void equalExpectedReturnsWithTheCommonReturnAsTargetStillGiveNoUniqueMultiplier() {
        AssetUniverse u = new AssetUniverse(THREE, new double[] {0.05, 0.05, 0.05}, THREE_SIGMA);
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(3), Objective.targetReturn(0.05))));
        assertEquals("the constraint qualification fails: constraint 'target_return' depends on 'budget': every asset "
                + "has the same expected return (5.00 %), so the return target's gradient μ is parallel to the "
                + "budget's gradient 1 and adds no direction of its own; every portfolio within the budget returns "
                + "5.00 %, so the target 5.00 % is met by all of them and its multiplier is not unique; fix: drop "
                + "'target_return' or one of the constraints it depends on", e.getMessage());
    }

    @Test
    void twoPerfectlyCorrelatedAssetsMakeTheCovarianceSingular() {
        // Equity and Leveraged Equity: correlation exactly 1 (volatilities 20 % and 40 %), so Σ has rank 2.
        double[][] sigma = {
                {0.0100, 0.0020, 0.0040},
                {0.0020, 0.0400, 0.0800},
                {0.0040, 0.0800, 0.1600}};
        AssetUniverse u = new AssetUniverse(List.of("Bonds", "Equity", "Leveraged Equity"),
                new double[] {0.03, 0.06, 0.10}, sigma);
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(3), Objective.minimumVariance())));
        assertEquals(NoSolutionException.Reason.NOT_CONVEX, e.reason());
        assertEquals("the covariance matrix is not positive definite (smallest eigenvalue 0 to working precision: "
                + "singular); assets 'Equity' and 'Leveraged Equity' are perfectly correlated (1.000000), so the "
                + "minimum-variance portfolio is not unique; fix: remove one of a perfectly correlated pair, or repair "
                + "the matrix to the nearest valid one (isorisk check --repair)", e.getMessage());
        assertEquals(List.of("Equity", "Leveraged Equity"), e.constraints());
    }

    @Test
    void aCovarianceWithANegativeEigenvalueIsRefusedWithThatEigenvalue() {
        // Pairwise valid but jointly impossible correlations: ρ12 = ρ13 = 0.9, ρ23 = −0.9, all volatilities 10 %.
        // Worked by hand: the correlation matrix has eigenvalues 1.9 (twice) and −0.8 (on span{e1, e2 + e3} it is
        // [[1, 0.9√2], [0.9√2, 0.1]], trace 1.1, determinant −1.52), so Σ = 0.01·R has smallest eigenvalue −0.008.
        double[][] sigma = {
                {0.01, 0.009, 0.009},
                {0.009, 0.01, -0.009},
                {0.009, -0.009, 0.01}};
        AssetUniverse u = new AssetUniverse(THREE, new double[] {0.03, 0.06, 0.05}, sigma);
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(3), Objective.minimumVariance())));
        assertEquals(NoSolutionException.Reason.NOT_CONVEX, e.reason());
        assertEquals("the covariance matrix is not positive definite (smallest eigenvalue -0.00800000), so the "
                + "minimum-variance portfolio is not unique; fix: remove one of a perfectly correlated pair, or repair "
                + "the matrix to the nearest valid one (isorisk check --repair)", e.getMessage());
    }

    @Test
    void aSingleAssetIsItsOwnMinimumVariancePortfolio() {
        AssetUniverse u = new AssetUniverse(List.of("Cash"), new double[] {0.03}, new double[][] {{0.0004}});
        Solution s = Allocator.solve(AllocationRequest.of(u, Mandate.budgetOnly(1, 0.8), Objective.minimumVariance()));
        assertEquals(0.8, s.weight(0), Tolerances.TIGHT);
        // V*(b) = σ²b², so ∂V*/∂b = 2σ²b (by hand).
        assertEquals(0.0004 * 0.64, s.variance(), Tolerances.TIGHT);
        assertEquals(2 * 0.0004 * 0.8, ClosedFormTests.price(s, "budget"), Tolerances.TIGHT);
        assertEquals(0.03 * 0.8, s.expectedReturn(), Tolerances.TIGHT);
        assertTrue(s.certificate().passes(), s.certificate().toString());
    }

    @Test
    void aSingleAssetCannotMeetATargetOtherThanItsOwnReturn() {
        AssetUniverse u = new AssetUniverse(List.of("Cash"), new double[] {0.03}, new double[][] {{0.0004}});
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(1), Objective.targetReturn(0.05))));
        assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
        assertEquals("only one asset ('Cash'): the only portfolio that meets 'budget' holds 100.00 % of it and returns "
                + "3.00 %, so the return target 5.00 % cannot be met; fix: set the target to 3.00 %, drop it, or add "
                + "assets", e.getMessage());
        assertEquals(List.of("budget", "target_return"), e.constraints());
    }

    @Test
    void aGroupEqualityThatRepeatsAnotherIsNamedAsDependent() {
        AssetUniverse u = Problems.universe(6, 9);
        Mandate free = Mandate.fullyInvested(6);
        List<Integer> growth = List.of(1, 2, 4);
        Mandate m = new Mandate(1.0, free.lower(), free.upper(), Map.of(),
                List.of(new Group("Equity", growth, 0.5, 0.5), new Group("Growth", growth, 0.5, 0.5)), List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, m, Objective.minimumVariance())));
        assertEquals(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, e.reason());
        assertEquals("the constraint qualification fails: constraint 'group:Growth' depends on 'group:Equity': it has "
                + "the same coefficients as 'group:Equity' (it repeats it); the limits agree, so it adds nothing and "
                + "the multipliers are not unique; fix: drop 'group:Growth' or one of the constraints it depends on",
                e.getMessage());
        assertEquals(List.of("group:Equity", "group:Growth"), e.constraints());

        Mandate contradicting = new Mandate(1.0, free.lower(), free.upper(), Map.of(),
                List.of(new Group("Equity", growth, 0.5, 0.5), new Group("Growth", growth, 0.4, 0.4)), List.of());
        NoSolutionException c = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, contradicting, Objective.minimumVariance())));
        assertEquals("the constraint qualification fails: constraint 'group:Growth' depends on 'group:Equity': it has "
                + "the same coefficients as 'group:Equity' (it repeats it); the limits contradict each other, so no "
                + "portfolio meets all of them; fix: drop 'group:Growth' or one of the constraints it depends on",
                c.getMessage());
    }

    @Test
    void aGroupThatAddsUpFixedWeightsAndTheBudgetIsACombinationOfThem() {
        AssetUniverse u = Problems.universe(3, 4);
        Mandate free = Mandate.fullyInvested(3);
        // Assets 2 and 3 fixed, so the group {1} = budget − fixed:2 − fixed:3 adds nothing new.
        Mandate m = new Mandate(1.0, free.lower(), free.upper(), Map.of(1, 0.3, 2, 0.2),
                List.of(new Group("First", List.of(0), 0.5, 0.5)), List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Allocator.solve(AllocationRequest.of(u, m, Objective.minimumVariance())));
        assertEquals(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, e.reason());
        assertTrue(e.getMessage().startsWith("the constraint qualification fails: constraint 'group:First' depends on "
                + "'budget', "), e.getMessage());
        assertTrue(e.getMessage().contains("its gradient is a linear combination of the gradients of 'budget', "),
                e.getMessage());
        assertTrue(e.getMessage().contains("; the limits agree, so it adds nothing"), e.getMessage());
        assertEquals(4, e.constraints().size());
        assertEquals("group:First", e.constraints().get(3));
    }

    @Test
    void theClosedFormIsRefusedWhenTheMandateHasBounds() {
        AssetUniverse u = new AssetUniverse(THREE, new double[] {0.03, 0.06, 0.05}, THREE_SIGMA);
        double[] lo = new double[3];
        double[] hi = new double[3];
        Arrays.fill(hi, 0.6);
        Mandate bounded = Mandate.fullyInvested(3).withBounds(lo, hi);
        AllocationRequest r = new AllocationRequest(u, bounded, Objective.minimumVariance(), Method.CLOSED_FORM,
                SolverSettings.defaults());
        InputException e = assertThrows(InputException.class, () -> Allocator.solve(r));
        assertEquals("the closed form applies only when every constraint is an equality, but the policy has bounds or "
                + "inequality limits; fix: drop --method closed-form (auto picks a bounded method) or remove the "
                + "bounds", e.getMessage());
    }

    @Test
    void anAssetNamedTwiceIsRefused() {
        InputException e = assertThrows(InputException.class, () -> new AssetUniverse(List.of("Bonds", "Bonds", "Cash"),
                new double[] {0.03, 0.04, 0.01}, THREE_SIGMA));
        assertEquals("asset 'Bonds': asset named twice; fix: give each asset one row", e.getMessage());
    }

    @Test
    void oneAndTwoThreadsGiveTheSameSolution() {
        AssetUniverse u = Problems.universe(450, 77);
        AllocationRequest one = new AllocationRequest(u, Mandate.fullyInvested(450), Objective.targetReturn(0.05),
                Method.AUTO, SolverSettings.defaults().withThreads(1));
        AllocationRequest two = new AllocationRequest(u, Mandate.fullyInvested(450), Objective.targetReturn(0.05),
                Method.AUTO, SolverSettings.defaults().withThreads(2));
        // The split over threads does not change the order of any floating-point operation: identical bits.
        assertTrue(Arrays.equals(Allocator.solve(one).weights(), Allocator.solve(two).weights()));
    }
}
