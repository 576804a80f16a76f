package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.support.OjAlgoReference;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class CriticalLineRandomTests {

    @Test
    void randomMandatesWithMinimumsMaximumsFixedWeightsAndTiesAgreeWithOjAlgo() {
        // Independent reference: ojAlgo's active-set QP (weights only). Fixed seeds; mandates drawn so that they are
        // feasible, with ties in the expected returns, assets pinned by equal bounds, and maxima that barely
        // cover the budget in some of them.
        Random rnd = new Random(99);
        int solved = 0;
        for (int trial = 0; trial < 90; trial++) {
            int n = 4 + rnd.nextInt(12);
            AssetUniverse base = FactorModels.universe(n, 1000 + trial);
            double[] mu = base.expectedReturns();
            if (trial % 3 == 0) {
                mu[1] = mu[0]; // a tie
            }
            if (trial % 5 == 0) {
                mu[n - 1] = mu[2];
                mu[n - 2] = mu[2];
            }
            if (trial % 7 == 0) {
                for (int i = 0; i < n; i++) {
                    mu[i] = Math.rint(mu[i] * 100) / 100; // coarse returns: many ties
                }
            }
            AssetUniverse u = base.withAssumptions(mu, base.covariance());
            double[] lo = new double[n];
            double[] hi = new double[n];
            double sumLo = 0;
            for (int i = 0; i < n; i++) {
                lo[i] = rnd.nextDouble() < 0.3 ? Math.rint(rnd.nextDouble() * 0.5 / n * 100) / 100 : 0;
                sumLo += lo[i];
            }
            double cap = Math.max(1.3 / n, 0.05 + rnd.nextDouble() * 0.4);
            double sumHi = 0;
            for (int i = 0; i < n; i++) {
                hi[i] = Math.max(lo[i], Math.rint(cap * (0.6 + 0.8 * rnd.nextDouble()) * 100) / 100);
                sumHi += hi[i];
            }
            if (trial % 6 == 2 && sumHi > 1) {
                // Maxima that barely cover the budget: each minimum is then implied by the others' maxima.
                double scale = 1.02 / sumHi;
                sumHi = 0;
                for (int i = 0; i < n; i++) {
                    hi[i] = Math.max(lo[i], hi[i] * scale);
                    sumHi += hi[i];
                }
            }
            if (sumLo > 1 || sumHi < 1) {
                continue;
            }
            Map<Integer, Double> fixed = new HashMap<>();
            if (trial % 4 == 1) {
                lo[0] = hi[0];
                fixed.put(n - 1, lo[n - 1]);
            }
            Mandate m = new Mandate(1.0, lo, hi, fixed, List.of(), List.of());
            Frontier fr;
            try {
                fr = CriticalLineTests.frontier(u, m);
            } catch (org.isorisk.engine.error.NoSolutionException e) {
                assertTrue(e.getMessage().contains("sum to"), e.getMessage());
                continue;
            }
            for (Corner c : fr.corners()) {
                CriticalLineTests.assertFeasible(c.portfolio(), m);
            }
            for (Corner c : fr.inefficientCorners()) {
                CriticalLineTests.assertFeasible(c.portfolio(), m);
            }
            double[] l2 = lo.clone();
            double[] h2 = hi.clone();
            for (Map.Entry<Integer, Double> e : fixed.entrySet()) {
                l2[e.getKey()] = e.getValue();
                h2[e.getKey()] = e.getValue();
            }
            Mandate plain = m.withBounds(l2, h2);
            for (double f : new double[] {-0.5, 0.0, 0.3, 0.8, 1.0}) {
                double t = f >= 0 ? fr.minReturn() + f * (fr.maxReturn() - fr.minReturn())
                        : fr.minReturn() + f * (fr.minReturn() - fr.lowestReturn());
                Solution s = CriticalLineTests.target(u, m, t);
                CriticalLineTests.assertFeasible(s, m);
                double[] ref = OjAlgoReference.weights(u, plain, t);
                if (ref == null && f == 1.0) {
                    continue; // the top of the range is a single vertex; ojAlgo may call it infeasible
                }
                assertNotNull(ref, "ojAlgo optimal, trial " + trial + ", f " + f);
                CriticalLineTests.assertWeights(ref, s.weights(), 1e-6, "trial " + trial + " n " + n + " f " + f);
                solved++;
            }
        }
        assertTrue(solved > 250, "enough comparisons: " + solved);
    }
}
