package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Workers;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

/**
 * {@link Allocator#solveWith}: a universe factored once gives, for every request, the solution of
 * {@link Allocator#solve} to the last bit (weights, every multiplier, the certificate, notes), on one thread or
 * several. The reference is the allocator's own single-request path, so these are consistency checks; the
 * solutions themselves are checked against outside references in the other solver tests.
 */
class PreparedSolveTests {

    @Test
    void aSharedFactorGivesTheSingleRequestAnswerBitForBitOnEveryMethod() {
        for (int n : new int[] {8, 30, 90}) {
            AssetUniverse u = FactorModels.signedUniverse(n, 11 + n);
            Factored once = Allocator.prepare(u, SolverSettings.defaults().withThreads(1));
            List<Mandate> mandates = mandates(n);
            for (Mandate m : mandates) {
                double[] mu = u.expectedReturns();
                double lo = Arrays.stream(mu).min().orElseThrow();
                double hi = Arrays.stream(mu).max().orElseThrow();
                if (!m.equalitiesOnly()) { // bounded: the mandate's own range (the budget alone has none)
                    ReturnRange range = Allocator.returnRange(u, m);
                    lo = range.min();
                    hi = range.max();
                }
                List<Objective> objectives = new ArrayList<>();
                objectives.add(Objective.minimumVariance());
                for (double f : new double[] {0.02, 0.3, 0.55, 0.8, 0.999}) {
                    objectives.add(Objective.targetReturn(lo + f * (hi - lo)));
                }
                objectives.add(Objective.targetReturn(hi + 0.01)); // out of reach when bounded: same message
                for (Objective o : objectives) {
                    AllocationRequest fresh = new AllocationRequest(u, m, o, Method.AUTO, SolverSettings.defaults());
                    AllocationRequest single = new AllocationRequest(u, m, o, Method.AUTO,
                            SolverSettings.defaults().withThreads(1));
                    Object expected = outcome(() -> Allocator.solve(fresh));
                    Object got = outcome(() -> Workers.onCallingThread(() -> Allocator.solveWith(once, single)));
                    assertSame(expected, got, "n=" + n + " " + o);
                }
            }
        }
    }

    @Test
    void aMandateSolvedAgainReadsItsKeptWalksAndGivesTheSameBitsAtEveryTarget() {
        // Mirror-image assets (the same return, variance and covariances) make corners where two events happen at
        // one λ, merged into one corner: a kept whole walk must give the stopped walk's corners, not the merged
        // ones further down. Targets at and around every corner's return, on both branches, and out of reach.
        int n = 6;
        double[] mu = {0.07, 0.07, 0.05, 0.04, 0.03, 0.02};
        double[] vol = {0.20, 0.20, 0.15, 0.10, 0.07, 0.04};
        double[][] sigma = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double rho = i == j ? 1 : (i < 2 && j < 2) ? 0.5 : 0.2;
                sigma[i][j] = rho * vol[i] * vol[j];
            }
        }
        List<AssetUniverse> universes = List.of(new AssetUniverse(List.of("A", "B", "C", "D", "E", "F"), mu, sigma),
                FactorModels.signedUniverse(40, 9), FactorModels.universe(40, 4));
        for (AssetUniverse u : universes) {
            int k = u.size();
            Mandate m = FactorModels.boxed(k, 0.0, Math.max(0.3, 2.0 / k));
            Factored once = Allocator.prepare(u, SolverSettings.defaults().withThreads(1));
            List<Double> targets = new ArrayList<>();
            for (var c : Allocator.mandateFrontier(u, m, new double[0], null).corners()) {
                double r = c.expectedReturn();
                targets.addAll(List.of(r, Math.nextUp(r), Math.nextDown(r), r + 1e-7, r - 1e-7));
            }
            ReturnRange range = Allocator.returnRange(u, m);
            targets.addAll(List.of(range.max() + 1e-3, range.min() - 1e-3, range.max(), range.min()));
            java.util.Collections.shuffle(targets, new java.util.Random(5));
            for (double t : targets) {
                AllocationRequest r = new AllocationRequest(u, m, Objective.targetReturn(t), Method.AUTO,
                        SolverSettings.defaults().withThreads(1));
                assertSame(outcome(() -> Allocator.solve(r)), outcome(() -> Allocator.solveWith(once, r)),
                        "n=" + k + " target " + t);
            }
            AllocationRequest minVar = new AllocationRequest(u, m, Objective.minimumVariance(), Method.AUTO, null);
            assertSame(outcome(() -> Allocator.solve(minVar)), outcome(() -> Allocator.solveWith(once, minVar)),
                    "minimum variance");
        }
    }

    @Test
    void solvesInAnyOrderDoNotLeaveTracesInTheSharedFactor() {
        // The factor remembers solves Σ⁻¹a; a solve with a fixed weight (an extra gradient) after others must
        // still solve its gradients together, as a fresh factor does.
        int n = 12;
        AssetUniverse u = FactorModels.signedUniverse(n, 5);
        Factored once = Allocator.prepare(u, null);
        Mandate plain = Mandate.fullyInvested(n);
        Mandate fixedOne = new Mandate(1.0, inf(n, -1), inf(n, 1), Map.of(3, 0.05), List.of(), List.of());
        for (Mandate m : List.of(plain, fixedOne, plain, fixedOne)) {
            AllocationRequest r = AllocationRequest.of(u, m, Objective.targetReturn(0.03));
            assertSame(outcome(() -> Allocator.solve(r)), outcome(() -> Allocator.solveWith(once, r)), "fixed weight");
        }
    }

    @Test
    void aFactorOfAnotherUniverseIsRefused() {
        AssetUniverse u = FactorModels.signedUniverse(5, 1);
        AssetUniverse v = FactorModels.signedUniverse(5, 1);
        Factored f = Allocator.prepare(u, null);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Allocator.solveWith(f,
                AllocationRequest.of(v, Mandate.fullyInvested(5), Objective.minimumVariance())));
        assertEquals("the prepared factor belongs to another universe", e.getMessage());
    }

    @Test
    void onTheCallingThreadEverySplitRunsOnThatThreadInOrder() {
        Set<String> threads = new HashSet<>();
        List<Integer> order = new ArrayList<>();
        Workers.onCallingThread(() -> {
            Workers.run(4, part -> {
                synchronized (order) {
                    threads.add(Thread.currentThread().getName());
                    order.add(part);
                }
            });
            return null;
        });
        assertEquals(Set.of(Thread.currentThread().getName()), threads);
        assertEquals(List.of(0, 1, 2, 3), order);
    }

    /** Budget only; long-only boxes (critical line; some targets interior); a group (numerical QP). */
    private static List<Mandate> mandates(int n) {
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(hi, Math.max(0.12, 2.5 / n));
        double[] wide = new double[n];
        Arrays.fill(wide, 0.9);
        double[] neg = new double[n];
        Arrays.fill(neg, -0.5);
        List<Integer> members = List.of(0, 1, 2);
        return List.of(Mandate.fullyInvested(n),
                new Mandate(1.0, lo, hi, Map.of(), List.of(), List.of()),
                new Mandate(1.0, neg, wide, Map.of(), List.of(), List.of()),
                new Mandate(1.0, lo, hi, Map.of(n - 1, 0.02), List.of(), List.of()),
                new Mandate(1.0, lo, hi, Map.of(), List.of(new Group("Head", members, 0.0, 0.2)), List.of()));
    }

    private static double[] inf(int n, int sign) {
        double[] a = new double[n];
        Arrays.fill(a, sign * Double.POSITIVE_INFINITY);
        return a;
    }

    private static Object outcome(java.util.function.Supplier<Solution> s) {
        try {
            return s.get();
        } catch (NoSolutionException e) {
            return e;
        }
    }

    private static void assertSame(Object expected, Object got, String what) {
        if (expected instanceof NoSolutionException e) {
            NoSolutionException g = (NoSolutionException) got;
            assertEquals(e.getMessage(), g.getMessage(), what);
            assertEquals(e.constraints(), g.constraints(), what);
            return;
        }
        Solution a = (Solution) expected;
        Solution b = (Solution) got;
        assertEquals(a.method(), b.method(), what);
        assertArrayEquals(a.weights(), b.weights(), 0.0, what);
        assertEquals(Double.doubleToLongBits(a.variance()), Double.doubleToLongBits(b.variance()), what);
        assertEquals(Double.doubleToLongBits(a.expectedReturn()), Double.doubleToLongBits(b.expectedReturn()), what);
        assertEquals(a.multipliers().size(), b.multipliers().size(), what);
        for (int k = 0; k < a.multipliers().size(); k++) {
            Multiplier x = a.multipliers().get(k);
            Multiplier y = b.multipliers().get(k);
            assertEquals(x.constraint(), y.constraint(), what);
            assertEquals(Double.doubleToLongBits(x.variancePerUnit()), Double.doubleToLongBits(y.variancePerUnit()),
                    what + " " + x.constraint());
            assertEquals(x.binding(), y.binding(), what);
        }
        assertEquals(a.certificate(), b.certificate(), what);
        assertEquals(a.notes(), b.notes(), what);
    }
}
