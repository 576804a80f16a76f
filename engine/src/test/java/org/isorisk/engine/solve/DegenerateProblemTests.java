package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Test;

/** Ties, repeated constraints and an asset exactly at a bound with a zero multiplier (degenerate cases). */
class DegenerateProblemTests {

    private static Solution solve(AssetUniverse u, Mandate m, Objective o) {
        return Allocator.solve(new AllocationRequest(u, m, o, Method.NUMERICAL, null));
    }

    @Test
    void identicalAssetsAndRepeatedLimitsStillSolveWithACertificate() {
        // Twelve exchangeable assets (equal variance, equal correlation, equal return in pairs): every ratio test
        // and every multiplier check ties. The same group limit is given twice under two names.
        int n = 12;
        double[][] s = new double[n][n];
        double[] mu = new double[n];
        List<String> names = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                s[i][j] = i == j ? 0.04 : 0.01;
            }
            mu[i] = i < 6 ? 0.05 : 0.07;
            names.add("X" + i);
        }
        AssetUniverse u = new AssetUniverse(names, mu, s);
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(hi, 0.15);
        List<Integer> firstSix = List.of(0, 1, 2, 3, 4, 5);
        Group g1 = new Group("Low", firstSix, 0.30, 1);
        Group g2 = new Group("LowAgain", firstSix, 0.30, 1);
        double[] c = new double[n];
        for (int i : firstSix) {
            c[i] = 1;
        }
        LinearConstraint again = new LinearConstraint("low_third_time", c, Relation.AT_LEAST, 0.30);
        Mandate m = new Mandate(1.0, lo, hi, Map.of(), List.of(g1, g2), List.of(again));
        for (double target : new double[] {0.058, 0.061, 0.0639}) {
            Solution sol = solve(u, m, Objective.targetReturn(target));
            assertTrue(sol.certificate().worst() <= 1e-9, sol.certificate().toString());
            // by symmetry every low-return asset holds the same weight, and so does every high-return one
            for (int i = 1; i < 6; i++) {
                assertEquals(sol.weight(0), sol.weight(i), Tolerances.GENERAL);
                assertEquals(sol.weight(6), sol.weight(6 + i), Tolerances.GENERAL);
            }
            assertEquals(target, sol.expectedReturn(), Tolerances.TIGHT);
        }
    }

    @Test
    void dependentBindingConstraintsAreReportedAsNonUniqueMultipliers() {
        // The sample fund's minimum-variance portfolio under the sample policy: cash and the real assets sit at
        // their bounds, so budget = Equity + Fixed Income + those bounds, and both group limits bind: the budget,
        // the two group rows and the bounds are dependent. The weights are unique, the multipliers are not.
        Mandate m = org.isorisk.engine.io.PolicyReader.read(org.isorisk.engine.SampleFund.DATA.resolve("policy.yaml"),
                org.isorisk.engine.SampleFund.ASSETS).mandate();
        Solution s = solve(org.isorisk.engine.SampleFund.universe(), m, Objective.minimumVariance());
        assertTrue(s.certificate().worst() <= 1e-9, s.certificate().toString());
        String note = s.notes().stream().filter(x -> x.startsWith(SolverSession.NOT_UNIQUE)).findFirst().orElseThrow();
        assertTrue(note.contains("the constraint qualification fails here"), note);
        assertTrue(s.multiplier("group:Equity:min").orElseThrow().binding());
        assertTrue(s.multiplier("group:Fixed Income:max").orElseThrow().binding());
    }

    @Test
    void anAssetExactlyAtItsBoundWithAZeroMultiplierIsBindingAndFree() {
        // Put an upper bound exactly at the weight the asset takes without it: the bound holds with equality but
        // costs nothing, so its multiplier is zero and the solution is unchanged.
        int n = 10;
        AssetUniverse u = GeneratedProblems.universe(n, 77);
        Mandate m = GeneratedProblems.withGroups(n);
        Solution free = solve(u, m, Objective.minimumVariance());
        int i = 0;
        for (int k = 0; k < n; k++) {
            if (free.weight(k) > 1e-3 && free.weight(k) < m.upper(k) - 1e-3) {
                i = k;
            }
        }
        double[] hi = m.upper();
        hi[i] = free.weight(i);
        Mandate tight = m.withBounds(m.lower(), hi);
        Solution s = solve(u, tight, Objective.minimumVariance());
        assertTrue(s.certificate().worst() <= 1e-9, s.certificate().toString());
        for (int k = 0; k < n; k++) {
            assertEquals(free.weight(k), s.weight(k), Tolerances.GENERAL);
        }
        Multiplier up = s.multiplier("upper:" + u.assets().get(i)).orElseThrow();
        assertTrue(up.binding());
        assertEquals(0.0, up.variancePerUnit(), 1e-10);
    }
}
