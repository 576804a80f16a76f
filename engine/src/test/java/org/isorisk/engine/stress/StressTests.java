package org.isorisk.engine.stress;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.Random;
import java.util.stream.IntStream;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.junit.jupiter.api.Test;

class StressTests {

    static AssetUniverse randomUniverse(int n, long seed) {
        return org.isorisk.engine.TestUniverses.random(n, seed);
    }

    @Test
    void aVolatilityMultiplierScalesTheMinimumVolatilityAndLeavesTheWeightsUnchanged() {
        // follows from the mathematics: Σ → k²Σ scales every objective value by k² and keeps the minimiser
        AssetUniverse u = randomUniverse(6, 7);
        double k = 1.7;
        Scenario sc = new Scenario("vol", "", List.of(new Shock.VolatilityMultiplier(Scope.all(6), k)));
        StressRequest r = new StressRequest(u, Mandate.fullyInvested(6), org.isorisk.engine.frontier.Grid.parse("0.03:0.07:0.01").targets(Double.NaN, Double.NaN),
                List.of(sc), null, null);
        StressResult res = Stress.run(r, null);
        ScenarioResult s = res.scenarios().get(0);
        for (int i = 0; i < 5; i++) {
            TargetPoint b = res.base().points().get(i);
            ScenarioPoint p = s.points().get(i);
            assertEquals(k * b.volatility(), p.volatility(), Tolerances.CLOSED_FORM);
            assertEquals(0, p.turnover(), Tolerances.CLOSED_FORM, "weights unchanged");
            assertEquals(p.volatility(), p.baseRisk(), Tolerances.CLOSED_FORM);
            assertEquals(k * b.marginalRisk(), p.marginalRisk(), Tolerances.CLOSED_FORM);
        }
    }

    @Test
    void underBoundsAVolatilityMultiplierAlsoScalesTheMinimumVolatilityAndKeepsTheWeights() {
        // follows from the mathematics: the feasible set does not depend on Σ, and Σ → k²Σ scales the objective
        int n = 10;
        AssetUniverse u = randomUniverse(n, 17);
        double[] hi = new double[n];
        Arrays.fill(hi, 0.25);
        Mandate m = Mandate.fullyInvested(n).withBounds(new double[n], hi);
        double k = 0.8;
        double[] range = Stress.returnRange(u, m);
        double[] t = new double[8];
        for (int i = 0; i < t.length; i++) {
            t[i] = range[0] + (range[1] - range[0]) * (i + 0.5) / t.length;
        }
        Scenario sc = new Scenario("calm", "", List.of(new Shock.VolatilityMultiplier(Scope.all(n), k)));
        StressResult res = Stress.run(new StressRequest(u, m, t, List.of(sc), null, null), null);
        for (int i = 0; i < t.length; i++) {
            TargetPoint b = res.base().points().get(i);
            ScenarioPoint p = res.scenarios().get(0).points().get(i);
            assertTrue(b.feasible() && p.feasible());
            assertEquals(k * b.volatility(), p.volatility(), Tolerances.NUMERICAL);
            assertEquals(0, p.turnover(), Tolerances.NUMERICAL, "weights unchanged at target " + t[i]);
            assertEquals(b.binding(), p.binding());
        }
        assertFalse(res.base().changes().isEmpty(), "bounds come and go along the sweep");
    }

    @Test
    void underBoundsTheSweepIsExactFromTheCornersAndAgreesWithTheActiveSetQp() {
        // two independent methods: the critical line method (Markowitz 1956; corners) and the active-set QP,
        // forced by a group limit that never binds
        int n = 8;
        AssetUniverse u = randomUniverse(n, 23);
        double[] hi = new double[n];
        Arrays.fill(hi, 0.3);
        Mandate m = Mandate.fullyInvested(n).withBounds(new double[n], hi);
        double[] range = Stress.returnRange(u, m);
        double[] t = new double[25];
        for (int i = 0; i < t.length; i++) {
            t[i] = range[0] + (range[1] - range[0]) * i / (t.length - 1.0);
        }
        Sweep exact = Stress.run(new StressRequest(u, m, t, List.of(), null, null), null).base();
        Mandate withGroup = new Mandate(1.0, new double[n], hi, java.util.Map.of(), List.of(
                new org.isorisk.engine.model.Group("All", java.util.stream.IntStream.range(0, n).boxed().toList(),
                        Double.NEGATIVE_INFINITY, 2.0)), List.of());
        Sweep qp = Stress.run(new StressRequest(u, withGroup, t, List.of(), null, null), null).base();
        int changes = 0;
        for (BindingChange c : exact.changes()) {
            assertTrue(c.exact());
            assertTrue(c.from() <= c.at() && c.at() <= c.to(), c.toString());
            changes++;
        }
        assertTrue(changes >= 2, "bounds come and go along the frontier: " + exact.changes());
        for (int i = 0; i < t.length; i++) {
            TargetPoint a = exact.points().get(i);
            TargetPoint b = qp.points().get(i);
            assertEquals(a.feasible(), b.feasible(), "target " + t[i]);
            if (a.feasible()) {
                assertEquals(a.volatility(), b.volatility(), Tolerances.NUMERICAL, "target " + t[i]);
                assertEquals(a.marginalRisk(), b.marginalRisk(), 1e-6, "target " + t[i]);
            }
        }
        // each exact change matches what the grid points on either side show
        for (BindingChange c : exact.changes()) {
            int k = Arrays.binarySearch(t, c.to());
            if (k > 0 && c.from() < c.at() && c.at() < c.to()) {
                List<String> before = exact.points().get(k - 1).binding();
                List<String> after = exact.points().get(k).binding();
                for (String e : c.entered()) {
                    assertTrue(after.contains(e) && !before.contains(e), e + " at " + c);
                }
                for (String l : c.left()) {
                    assertTrue(before.contains(l) && !after.contains(l), l + " at " + c);
                }
            }
        }
    }

    @Test
    void aCorrelationShiftKeepsAUnitDiagonalAndPositiveSemiDefiniteness() {
        // follows from the mathematics: (1 − f)R + f·11' is a convex combination of PSD unit-diagonal matrices
        AssetUniverse u = randomUniverse(12, 11);
        for (double f : new double[] {0.0, 0.25, 0.5, 0.9, 1.0}) {
            Scenario sc = new Scenario("c", "", List.of(new Shock.CorrelationShift(Scope.all(12), f)));
            Shocked sh = Shocks.apply(u, sc, null);
            assertFalse(sh.repaired());
            double[][] c = Shocks.correlation(sh.universe().covariance());
            double[][] c0 = Shocks.correlation(u.covariance());
            for (int i = 0; i < 12; i++) {
                assertEquals(1.0, c[i][i], Tolerances.TIGHT);
                assertEquals(u.covariance(i, i), sh.universe().covariance(i, i), Tolerances.TIGHT, "variances kept");
                for (int j = 0; j < 12; j++) {
                    if (i != j) {
                        assertEquals(c0[i][j] + f * (1 - c0[i][j]), c[i][j], Tolerances.TIGHT);
                    }
                }
            }
            assertTrue(Spectrum.of(c).smallest() >= -Tolerances.TIGHT, "PSD at f = " + f);
        }
    }

    @Test
    void theMaximumAchievableTargetEqualsTheGreedyFillOfTheHighestReturnAssets() {
        // follows from the mathematics (the LP max μ'w, 1'w = 1, l ≤ w ≤ u is solved by filling the highest returns
        // first, a fractional knapsack); the engine computes it by linear programming (ojAlgo simplex)
        for (long seed = 1; seed <= 20; seed++) {
            int n = 8;
            AssetUniverse u = randomUniverse(n, seed);
            Random rnd = new Random(seed * 31);
            double[] lo = new double[n];
            double[] hi = new double[n];
            for (int i = 0; i < n; i++) {
                lo[i] = rnd.nextDouble() < 0.3 ? 0.02 : 0.0;
                hi[i] = 0.1 + 0.3 * rnd.nextDouble();
            }
            Mandate m = Mandate.fullyInvested(n).withBounds(lo, hi);
            double[] mu = u.expectedReturns();
            double[] w = lo.clone();
            double left = 1 - Arrays.stream(lo).sum();
            Integer[] order = IntStream.range(0, n).boxed().sorted(Comparator.comparingDouble(i -> -mu[i]))
                    .toArray(Integer[]::new);
            for (int i : order) {
                double add = Math.min(hi[i] - lo[i], left);
                w[i] += add;
                left -= add;
            }
            if (left > 1e-12) {
                continue; // bounds do not allow full investment; not this check's case
            }
            double greedy = 0;
            for (int i = 0; i < n; i++) {
                greedy += mu[i] * w[i];
            }
            assertEquals(greedy, Stress.returnRange(u, m)[1], Tolerances.GENERAL, "seed " + seed);
        }
    }

    @Test
    void targetsOutsideTheMandatesRangeAreReportedInfeasible() {
        AssetUniverse u = randomUniverse(4, 3);
        Mandate m = Mandate.fullyInvested(4).withBounds(new double[4], new double[] {0.5, 0.5, 0.5, 0.5});
        double[] range = Stress.returnRange(u, m);
        StressRequest r = new StressRequest(u, m, new double[] {range[1] + 0.001}, List.of(), null, null);
        TargetPoint p = Stress.run(r, null).base().points().get(0);
        assertFalse(p.feasible());
        assertTrue(p.reason().contains("above the highest return the mandate allows"), p.reason());
    }

    @Test
    void aGroupCorrelationThatBreaksPositiveSemiDefinitenessIsRefusedWithoutARepair() {
        // three assets pairwise −0.9 correlated cannot exist: 1 + 2(−0.9) < 0 is an eigenvalue of that block
        AssetUniverse u = randomUniverse(5, 5);
        Scope g = new Scope(Scope.Kind.GROUP, "G", List.of(0, 1, 2));
        Scenario sc = new Scenario("bad", "", List.of(new Shock.CorrelationSet(g, -0.9)));
        assertThrows(org.isorisk.engine.error.NoSolutionException.class, () -> Shocks.apply(u, sc, null));
    }

    @Test
    void aGroupCorrelationThatBreaksPositiveSemiDefinitenessIsRepairedAndReported() {
        // the block of three assets pairwise at −0.9 has the eigenvalue 1 + 2(−0.9) = −0.8 (follows from the
        // mathematics); Higham's (2002) nearest correlation matrix must be valid and differ from the shocked one
        AssetUniverse u = randomUniverse(5, 5);
        Scope g = new Scope(Scope.Kind.GROUP, "G", List.of(0, 1, 2));
        Scenario sc = new Scenario("bad", "", List.of(new Shock.CorrelationSet(g, -0.9)));
        Shocked sh = Shocks.apply(u, sc, CorrelationRepair.higham(u.assets()));
        assertTrue(sh.repaired());
        assertTrue(sh.smallestEigenvalue() < -0.5, "eigenvalue before " + sh.smallestEigenvalue());
        assertTrue(sh.repairDistance() > 0.1 && sh.largestChange() > 0.05, sh.toString());
        double[][] c = Shocks.correlation(sh.universe().covariance());
        for (int i = 0; i < 5; i++) {
            assertEquals(1.0, c[i][i], Tolerances.TIGHT);
            assertEquals(u.covariance(i, i), sh.universe().covariance(i, i), Tolerances.TIGHT, "volatilities kept");
        }
        assertTrue(Spectrum.of(c).smallest() >= 0, "repaired matrix is PSD");
        assertTrue(sh.notes().get(0).contains("nearest valid correlation matrix (Higham 2002)"), sh.notes().get(0));
        // and the sweep runs on the repaired assumptions
        StressResult r = Stress.run(new StressRequest(u, Mandate.fullyInvested(5), new double[] {0.05}, List.of(sc),
                CorrelationRepair.higham(u.assets()), null), null);
        assertTrue(r.scenarios().get(0).points().get(0).feasible());
        assertTrue(r.scenarios().get(0).shocked().repaired());
    }
}
