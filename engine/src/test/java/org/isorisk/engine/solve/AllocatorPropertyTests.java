package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Test;

/**
 * Invariants on seeded random problems, a bounded number of tries each: the budget is met, the certificate
 * passes, and the frontier variance is convex in the target (a quadratic with positive leading coefficient
 * C/D, Merton 1972).
 */
class AllocatorPropertyTests {

    private static final int TRIES = 40;

    @Test
    void everySolutionMeetsItsBudgetAndPassesItsCertificate() {
        SplittableRandom r = new SplittableRandom(2024);
        for (int t = 0; t < TRIES; t++) {
            int n = 2 + r.nextInt(60);
            double budget = 0.2 + 1.8 * r.nextDouble();
            AssetUniverse u = Problems.universe(n, r.nextLong());
            Objective o = r.nextBoolean() ? Objective.minimumVariance()
                    : Objective.targetReturn(budget * (0.01 + 0.1 * r.nextDouble()));
            Solution s = Allocator.solve(AllocationRequest.of(u, Mandate.budgetOnly(n, budget), o));
            double sum = 0;
            for (double w : s.weights()) {
                sum += w;
            }
            String where = "try " + t + " n=" + n + " budget=" + budget + " " + o;
            assertTrue(Math.abs(sum - budget) <= Tolerances.CLOSED_FORM * Math.max(1, budget), where + " sum " + sum);
            assertTrue(s.certificate().passes(), where + " " + s.certificate());
            if (o instanceof Objective.TargetReturn tr) {
                assertTrue(Math.abs(s.expectedReturn() - tr.target()) <= Tolerances.CLOSED_FORM, where);
            }
        }
    }

    @Test
    void frontierVarianceIsConvexInTheTarget() {
        SplittableRandom r = new SplittableRandom(7);
        for (int t = 0; t < TRIES / 2; t++) {
            int n = 2 + r.nextInt(40);
            AssetUniverse u = Problems.universe(n, r.nextLong());
            Factored f = Factored.of(u);
            Mandate m = Mandate.fullyInvested(n);
            AllocationRequest req = AllocationRequest.of(u, m, Objective.minimumVariance());
            double start = -0.05 + 0.1 * r.nextDouble();
            double step = 0.002 + 0.02 * r.nextDouble();
            double[] v = new double[9];
            for (int k = 0; k < v.length; k++) {
                v[k] = Allocator.closedForm(f, m, Objective.targetReturn(start + k * step), req).variance();
            }
            for (int k = 1; k + 1 < v.length; k++) {
                double second = v[k - 1] - 2 * v[k] + v[k + 1];
                assertTrue(second >= -Tolerances.CLOSED_FORM * Math.max(v[k], 1e-12),
                        "try " + t + ": second difference " + second + " at k=" + k);
                // A quadratic's second difference is the same everywhere: 2(C/D)·step².
                double first = v[0] - 2 * v[1] + v[2];
                assertTrue(Math.abs(second - first) <= 1e-8 * Math.max(v[k], Math.abs(first)), "try " + t);
            }
            // Every frontier point lies on or above the global minimum variance.
            double gmv = Allocator.closedForm(f, m, Objective.minimumVariance(), req).variance();
            for (double x : v) {
                assertTrue(x >= gmv * (1 - Tolerances.CLOSED_FORM), "try " + t);
            }
        }
    }
}
