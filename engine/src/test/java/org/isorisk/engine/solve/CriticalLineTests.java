package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.support.OjAlgoReference;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class CriticalLineTests {

    /** What the brief asks of every critical-line certificate (well inside the numerical threshold). */
    static final double CERTIFICATE = 1e-9;

    static Solution target(AssetUniverse u, Mandate m, double t) {
        return Allocator.solve(new AllocationRequest(u, m, Objective.targetReturn(t), Method.CRITICAL_LINE, null));
    }

    static Solution minimumVariance(AssetUniverse u, Mandate m) {
        return Allocator.solve(new AllocationRequest(u, m, Objective.minimumVariance(), Method.CRITICAL_LINE, null));
    }

    static Frontier frontier(AssetUniverse u, Mandate m, double... targets) {
        return Allocator.mandateFrontier(u, m, targets, SolverSettings.defaults());
    }

    static double price(Solution s, String name) {
        return s.multiplier(name).orElseThrow(() -> new AssertionError("no multiplier " + name)).variancePerUnit();
    }

    static void assertWeights(double[] expected, double[] actual, double tol, String what) {
        assertEquals(expected.length, actual.length);
        for (int i = 0; i < expected.length; i++) {
            assertEquals(expected[i], actual[i], tol, what + ", asset " + i);
        }
    }

    static void assertFeasible(Solution s, Mandate m) {
        double sum = 0;
        for (int i = 0; i < s.assets().size(); i++) {
            sum += s.weight(i);
            assertTrue(s.weight(i) >= m.lower(i) - Tolerances.TIGHT, "lower bound of asset " + i);
            assertTrue(s.weight(i) <= m.upper(i) + Tolerances.TIGHT, "upper bound of asset " + i);
        }
        assertEquals(m.budget(), sum, Tolerances.TIGHT, "budget");
        assertTrue(s.certificate().worst() <= CERTIFICATE, "certificate " + s.certificate());
        assertTrue(s.certificate().passes(), "certificate passes");
    }

    // ------------------------------------------------------------------ outside references

    @Test
    void agreesWithTheClosedFormWhereNoBoundBinds() {
        // Merton (1972): with only the budget and a target, w is affine in m and V*(m) = (Cm² − 2Abm + Bb²)/D.
        AssetUniverse u = FactorModels.universe(8, 3);
        Mandate loose = FactorModels.boxed(8, -5, 5);
        MertonScalars ms = Allocator.merton(u, 1.0);
        Mandate free = Mandate.fullyInvested(8);
        for (double dm : new double[] {-0.004, 0.0, 0.003, 0.008}) {
            double t = ms.minimumVarianceReturn() + dm;
            Solution closed = Allocator.solve(AllocationRequest.of(u, free, Objective.targetReturn(t)));
            for (double w : closed.weights()) {
                assertTrue(Math.abs(w) < 4.9, "no bound binds at this target");
            }
            Solution cl = target(u, loose, t);
            assertEquals(Method.CRITICAL_LINE, cl.method());
            assertWeights(closed.weights(), cl.weights(), Tolerances.CLOSED_FORM, "closed form vs critical line");
            assertEquals(ms.variance(t), cl.variance(), Tolerances.CLOSED_FORM);
            assertEquals(ms.returnMultiplier(t), price(cl, "target_return"), Tolerances.CLOSED_FORM);
            assertEquals(ms.budgetMultiplier(t), price(cl, "budget"), Tolerances.CLOSED_FORM);
            for (Multiplier x : cl.multipliers()) {
                if (x.constraint().startsWith("lower:") || x.constraint().startsWith("upper:")) {
                    assertEquals(0.0, x.variancePerUnit(), 0.0, x.constraint());
                    assertFalse(x.binding(), x.constraint());
                }
            }
        }
    }

    @Test
    void matchesOjAlgosActiveSetQpOnFactorModelsFromTenToThreeHundredAssets() {
        // Independent general-purpose QP: ojAlgo 57.1 ConvexSolver, active set forced; weights only (its duals are
        // scaled and reordered, see LIBRARIES.md).
        // ojAlgo's active set needs seconds per solve at a few hundred assets, so the larger sizes check fewer
        // targets: every size from 10 to 300 is covered at mid-frontier.
        for (int n : new int[] {10, 40, 120, 200, 300}) {
            AssetUniverse u = FactorModels.universe(n, FactorModels.DEFAULT_SEED + n);
            Mandate m = FactorModels.longOnlyCapped(n);
            Frontier fr = frontier(u, m);
            double mv = fr.minReturn();
            double top = fr.maxReturn();
            double low = fr.lowestReturn();
            List<Double> targets = new ArrayList<>(List.of(mv + 0.5 * (top - mv), mv + 0.1 * (top - mv),
                    mv + 0.9 * (top - mv), low + 0.5 * (mv - low)));
            if (n >= 120) {
                targets = targets.subList(0, n >= 200 ? 1 : 2);
            }
            for (double t : targets) {
                Solution s = target(u, m, t);
                assertFeasible(s, m);
                assertEquals(t, s.expectedReturn(), Tolerances.TIGHT);
                double[] ref = OjAlgoReference.weights(u, m, t);
                assertNotNull(ref, "ojAlgo reports optimal at n=" + n + ", target " + t);
                assertWeights(ref, s.weights(), Tolerances.NUMERICAL, "ojAlgo vs critical line, n=" + n + ", m=" + t);
            }
            if (n <= 40) {
                double[] ref = OjAlgoReference.weights(u, m, Double.NaN);
                assertNotNull(ref);
                Solution s = minimumVariance(u, m);
                assertFeasible(s, m);
                assertWeights(ref, s.weights(), Tolerances.NUMERICAL, "minimum variance, n=" + n);
            }
        }
    }

    @Test
    void multipliersAreTheDerivativesOfTheOptimalVarianceByCentralDifferences() {
        // Envelope theorem: the shadow price of a limit is dV*/d(limit); V* is piecewise quadratic, so a central
        // difference inside one stretch is exact up to rounding.
        AssetUniverse u = FactorModels.universe(14, 5);
        double[] lo = new double[14];
        double[] hi = new double[14];
        Arrays.fill(hi, 0.2);
        lo[3] = 0.04;
        Mandate m = new Mandate(1.0, lo, hi, Map.of(5, 0.06), List.of(), List.of());
        Frontier fr = frontier(u, m);
        double t = fr.minReturn() + 0.45 * (fr.maxReturn() - fr.minReturn());
        Solution s = target(u, m, t);
        double h = 1e-6;
        double tol = 1e-6;
        // Target return.
        double dv = (target(u, m, t + h).variance() - target(u, m, t - h).variance()) / (2 * h);
        assertEquals(dv, price(s, "target_return"), tol * Math.max(1, Math.abs(dv)), "target_return");
        // Budget (target held fixed).
        dv = (target(u, m.withBudget(1 + h), t).variance() - target(u, m.withBudget(1 - h), t).variance()) / (2 * h);
        assertEquals(dv, price(s, "budget"), tol * Math.max(1, Math.abs(dv)), "budget");
        // Fixed weight.
        Mandate up = new Mandate(1.0, lo, hi, Map.of(5, 0.06 + h), List.of(), List.of());
        Mandate down = new Mandate(1.0, lo, hi, Map.of(5, 0.06 - h), List.of(), List.of());
        dv = (target(u, up, t).variance() - target(u, down, t).variance()) / (2 * h);
        assertEquals(dv, price(s, "fixed:" + u.assets().get(5)), tol * Math.max(1, Math.abs(dv)), "fixed");
        // Every binding bound.
        int checked = 0;
        for (int i = 0; i < 14; i++) {
            for (boolean upper : new boolean[] {false, true}) {
                String name = (upper ? "upper:" : "lower:") + u.assets().get(i);
                Multiplier x = s.multiplier(name).orElseThrow();
                if (!x.binding() || i == 5) {
                    continue;
                }
                double[] a = (upper ? hi : lo).clone();
                double[] b = (upper ? hi : lo).clone();
                a[i] += h;
                b[i] -= h;
                Mandate ma = upper ? withBounds(m, lo, a) : withBounds(m, a, hi);
                Mandate mb = upper ? withBounds(m, lo, b) : withBounds(m, b, hi);
                dv = (target(u, ma, t).variance() - target(u, mb, t).variance()) / (2 * h);
                assertEquals(dv, x.variancePerUnit(), tol * Math.max(1, Math.abs(dv)), name);
                assertTrue(upper ? x.variancePerUnit() <= 0 : x.variancePerUnit() >= 0, name + " sign");
                checked++;
            }
        }
        assertTrue(checked >= 5, "several binding bounds checked: " + checked);
    }

    private static Mandate withBounds(Mandate m, double[] lo, double[] hi) {
        return m.withBounds(lo, hi);
    }

    // ------------------------------------------------------------------ properties

    @Test
    void theFrontierMeetsItsInvariantsAtEveryCornerAndSampledPoint() {
        // Common practice, no source: properties any correct mandate frontier has.
        AssetUniverse u = FactorModels.universe(60, 21);
        Mandate m = FactorModels.boxed(60, 0.0, 0.08);
        Frontier probe = frontier(u, m);
        double[] grid = new double[41];
        for (int k = 0; k < grid.length; k++) {
            grid[k] = probe.minReturn() + (probe.maxReturn() - probe.minReturn()) * k / (grid.length - 1);
        }
        Frontier fr = frontier(u, m, grid);
        assertEquals(grid.length, fr.points().size());
        assertTrue(fr.rejected().isEmpty());
        List<Corner> corners = fr.corners();
        for (Corner c : corners) {
            assertFeasible(c.portfolio(), m);
        }
        for (Corner c : fr.inefficientCorners()) {
            assertFeasible(c.portfolio(), m);
        }
        for (int k = 1; k < corners.size(); k++) {
            Corner a = corners.get(k - 1);
            Corner b = corners.get(k);
            assertTrue(b.expectedReturn() >= a.expectedReturn() - Tolerances.TIGHT, "corners increase in return");
            assertTrue(b.returnMultiplier() >= a.returnMultiplier() - Tolerances.TIGHT, "λ increases along the branch");
            // The stretch between two corners: its midpoint is the average of the two corners' weights.
            if (b.expectedReturn() - a.expectedReturn() < 1e-9) {
                continue; // a kink: two corners with the same portfolio and different multipliers
            }
            double mid = 0.5 * (a.expectedReturn() + b.expectedReturn());
            Solution s = target(u, m, mid);
            double[] avg = new double[60];
            for (int i = 0; i < 60; i++) {
                avg[i] = 0.5 * (a.portfolio().weight(i) + b.portfolio().weight(i));
            }
            assertWeights(avg, s.weights(), Tolerances.CLOSED_FORM, "affine between corners " + (k - 1) + ", " + k);
        }
        // The free set on the stretch below corner k (towards the minimum-variance end) differs from the one above
        // it (the stretch below corner k+1) by exactly the assets that change at corner k.
        for (int k = 0; k + 1 < corners.size(); k++) {
            Corner c = corners.get(k);
            Set<String> below = new HashSet<>(c.free());
            Set<String> above = new HashSet<>(corners.get(k + 1).free());
            Set<String> diff = new HashSet<>(below);
            diff.addAll(above);
            Set<String> both = new HashSet<>(below);
            both.retainAll(above);
            diff.removeAll(both);
            int events = c.asset() == null ? 0 : c.asset().split(", ").length;
            assertEquals(events, diff.size(), "free sets around corner " + k + ": " + c.description());
            if (k > 0 && !c.change().equals("several")) {
                assertEquals(1, diff.size(), "a non-degenerate corner changes one asset: " + c.description());
            }
        }
        List<Solution> pts = fr.points();
        for (Solution s : pts) {
            assertFeasible(s, m);
        }
        for (int k = 1; k < pts.size(); k++) {
            assertTrue(pts.get(k).volatility() > pts.get(k - 1).volatility(), "volatility increases above the MV point");
        }
        for (int k = 1; k + 1 < pts.size(); k++) {
            double second = pts.get(k + 1).variance() - 2 * pts.get(k).variance() + pts.get(k - 1).variance();
            assertTrue(second >= -Tolerances.TIGHT, "variance convex in the target at point " + k);
        }
    }

    // ------------------------------------------------------------------ degenerate corners

    @Test
    void tiedExpectedReturnsGiveTheExactMaximumReturnPortfolioDeterministically() {
        // Three assets share the highest expected return: the maximum-return end is the least-variance mix of them.
        AssetUniverse base = FactorModels.universe(12, 9);
        double[] mu = base.expectedReturns();
        double top = Arrays.stream(mu).max().orElseThrow() + 0.01;
        mu[2] = top;
        mu[7] = top;
        mu[10] = top;
        AssetUniverse u = base.withAssumptions(mu, base.covariance());
        Mandate m = FactorModels.boxed(12, 0.0, 0.3);
        Frontier a = frontier(u, m);
        Frontier b = frontier(u, m);
        assertEquals(a.corners().size(), b.corners().size());
        for (int k = 0; k < a.corners().size(); k++) {
            assertWeights(a.corners().get(k).portfolio().weights(), b.corners().get(k).portfolio().weights(), 0.0,
                    "deterministic");
        }
        Corner end = a.corners().get(a.corners().size() - 1);
        double next = Arrays.stream(base.expectedReturns()).max().orElseThrow();
        for (int i : new int[] {2, 7, 10}) {
            assertEquals(0.3, end.portfolio().weight(i), Tolerances.TIGHT, "tied asset " + i + " full");
        }
        double second = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < 12; i++) {
            if (i != 2 && i != 7 && i != 10) {
                second = Math.max(second, mu[i]);
            }
        }
        assertTrue(second <= next);
        assertEquals(0.9 * top + 0.1 * second, end.expectedReturn(), Tolerances.TIGHT, "three tied at 30 %, 10 % next");
        // With three assets of 30 % each the rest, 10 %, goes to the next best: compare the whole range with ojAlgo.
        for (double f : new double[] {0.999, 0.9, 0.5, 0.1}) {
            double t = a.minReturn() + f * (a.maxReturn() - a.minReturn());
            Solution s = target(u, m, t);
            assertFeasible(s, m);
            double[] ref = OjAlgoReference.weights(u, m, t);
            assertNotNull(ref);
            assertWeights(ref, s.weights(), Tolerances.NUMERICAL, "ties, target " + t);
        }
        for (Corner c : a.corners()) {
            assertFeasible(c.portfolio(), m);
        }
    }

    @Test
    void tiedReturnsAtTheMarginalAssetStartFromTheLeastVarianceMixOfTheTiedAssets() {
        // Budget runs out inside a tie: the start must be the minimum-variance split of the tied assets.
        AssetUniverse base = FactorModels.universe(10, 13);
        double[] mu = base.expectedReturns();
        Integer[] order = new Integer[10];
        for (int i = 0; i < 10; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (x, y) -> Double.compare(mu[y], mu[x]));
        mu[order[3]] = mu[order[2]];
        mu[order[4]] = mu[order[2]];
        AssetUniverse u = base.withAssumptions(mu, base.covariance());
        Mandate m = FactorModels.boxed(10, 0.0, 0.4);
        Frontier fr = frontier(u, m);
        Solution end = fr.corners().get(fr.corners().size() - 1).portfolio();
        double[] ref = OjAlgoReference.weights(u, m, fr.maxReturn() - 1e-10);
        assertNotNull(ref);
        assertWeights(ref, end.weights(), 1e-6, "maximum-return end inside a tie");
        for (double f : new double[] {0.95, 0.6, 0.2}) {
            double t = fr.minReturn() + f * (fr.maxReturn() - fr.minReturn());
            double[] r = OjAlgoReference.weights(u, m, t);
            assertNotNull(r);
            assertWeights(r, target(u, m, t).weights(), Tolerances.NUMERICAL, "tie at the margin, " + t);
        }
    }

    @Test
    void mirrorImageAssetsChangeTheFreeSetAtTheSameCorner() {
        // Assets 0 and 1 are exchangeable (same return, variance and covariances): every event happens to both at
        // once, so corners are degenerate with two changes.
        int n = 6;
        double[] mu = {0.07, 0.07, 0.05, 0.04, 0.03, 0.02};
        double[] vol = {0.20, 0.20, 0.15, 0.10, 0.07, 0.04};
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double rho = i == j ? 1 : (i < 2 && j < 2) ? 0.5 : 0.2;
                s[i][j] = rho * vol[i] * vol[j];
            }
        }
        AssetUniverse u = new AssetUniverse(List.of("A", "B", "C", "D", "E", "F"), mu, s);
        Mandate m = FactorModels.boxed(n, 0.0, 0.3);
        Frontier fr = frontier(u, m);
        boolean several = fr.corners().stream().anyMatch(c -> c.change().equals("several") || c.asset() != null
                && c.asset().contains(", "));
        assertTrue(several, "a corner where two assets change at once");
        for (Corner c : fr.corners()) {
            assertFeasible(c.portfolio(), m);
            assertEquals(c.portfolio().weight(0), c.portfolio().weight(1), Tolerances.TIGHT, "symmetry kept");
        }
        for (double f : new double[] {0.05, 0.3, 0.6, 0.95}) {
            double t = fr.minReturn() + f * (fr.maxReturn() - fr.minReturn());
            double[] ref = OjAlgoReference.weights(u, m, t);
            assertNotNull(ref);
            assertWeights(ref, target(u, m, t).weights(), Tolerances.NUMERICAL, "mirror assets, " + t);
        }
    }

    @Test
    void anAssetExactlyAtItsBoundWithAZeroMultiplierIsHandled() {
        // Built so that Σ(½, ½, 0) = 0.025·1: the unconstrained minimum-variance portfolio puts exactly nothing in
        // C, so under long-only C sits at its lower bound with a zero multiplier (worked out by hand).
        double[][] s = {{0.04, 0.01, 0.025}, {0.01, 0.04, 0.025}, {0.025, 0.025, 0.09}};
        AssetUniverse u = new AssetUniverse(List.of("A", "B", "C"), new double[] {0.05, 0.06, 0.09}, s);
        Mandate m = FactorModels.boxed(3, 0.0, 1.0);
        Solution mv = minimumVariance(u, m);
        assertWeights(new double[] {0.5, 0.5, 0.0}, mv.weights(), Tolerances.CLOSED_FORM, "minimum variance");
        assertEquals(0.0, price(mv, "lower:C"), Tolerances.CLOSED_FORM);
        assertEquals(0.025, mv.variance(), Tolerances.CLOSED_FORM);
        assertFeasible(mv, m);
        Frontier fr = frontier(u, m);
        for (Corner c : fr.corners()) {
            assertFeasible(c.portfolio(), m);
        }
        for (double f : new double[] {0.0, 0.2, 0.7}) {
            double t = fr.minReturn() + f * (fr.maxReturn() - fr.minReturn());
            double[] ref = OjAlgoReference.weights(u, m, t);
            assertNotNull(ref);
            assertWeights(ref, target(u, m, t).weights(), Tolerances.NUMERICAL, "at-bound degenerate, " + t);
        }
    }

    @Test
    void everyCornerListsItsMultipliersInContractOrderWithTheStationarityPricesOfItsBounds() {
        // Stationarity of the KKT conditions (Nocedal and Wright, "Numerical Optimization", 2006, Theorem 12.1)
        // in the project's convention: 2(Σw)_i = ν + τμ_i + γ_i, with γ_i the price of asset i's binding bound
        // (or its fixed weight) and 0 for an asset strictly between its bounds; recomputed here from Σ and w.
        int n = 9;
        AssetUniverse u = FactorModels.universe(n, 17);
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(hi, 0.3);
        Map<Integer, Double> fixed = new java.util.LinkedHashMap<>();
        fixed.put(4, 0.1);
        fixed.put(0, 0.05);
        Mandate m = new Mandate(1.0, lo, hi, fixed, List.of(), List.of());
        List<String> expectedNames = new ArrayList<>(List.of("budget", "fixed:" + u.assets().get(4),
                "fixed:" + u.assets().get(0), "target_return"));
        for (String a : u.assets()) {
            expectedNames.add("lower:" + a);
            expectedNames.add("upper:" + a);
        }
        Frontier fr = frontier(u, m);
        double[] mu = u.expectedReturns();
        for (Corner c : fr.corners()) {
            Solution s = c.portfolio();
            List<Multiplier> ms = s.multipliers();
            assertEquals(expectedNames, ms.stream().map(Multiplier::constraint).toList());
            assertEquals(List.copyOf(ms), ms);
            assertThrows(UnsupportedOperationException.class, () -> ms.add(ms.get(0)));
            assertEquals(ms.stream().filter(Multiplier::binding).toList(), s.binding());
            double nu = price(s, "budget");
            double tau = price(s, "target_return");
            for (int i = 0; i < n; i++) {
                double g = 0;
                for (int j = 0; j < n; j++) {
                    g += 2 * u.covariance(i, j) * s.weight(j);
                }
                double gamma = g - nu - tau * mu[i];
                String a = u.assets().get(i);
                Multiplier low = s.multiplier("lower:" + a).orElseThrow();
                Multiplier up = s.multiplier("upper:" + a).orElseThrow();
                assertEquals(Math.abs(s.weight(i)) <= Tolerances.TIGHT, low.binding(), a);
                assertEquals(Math.abs(s.weight(i) - 0.3) <= Tolerances.TIGHT, up.binding(), a);
                if (fixed.containsKey(i)) {
                    assertEquals(gamma, price(s, "fixed:" + a), Tolerances.GENERAL, a);
                    assertEquals(0.0, low.variancePerUnit(), 0.0, a);
                    assertEquals(0.0, up.variancePerUnit(), 0.0, a);
                } else {
                    assertEquals(gamma, low.variancePerUnit() + up.variancePerUnit(), Tolerances.GENERAL, a);
                }
                assertEquals(low.variancePerUnit() / (2 * s.volatility()), low.volatilityPerUnit(), 0.0, a);
            }
        }
        Solution mv = minimumVariance(u, m);
        assertTrue(mv.multiplier("target_return").isEmpty());
        List<String> noTarget = new ArrayList<>(expectedNames);
        noTarget.remove("target_return");
        assertEquals(noTarget, mv.multipliers().stream().map(Multiplier::constraint).toList());
    }

    @Test
    void fixedWeightsStayFixedAndCarryTheirOwnShadowPrice() {
        AssetUniverse u = FactorModels.universe(9, 17);
        double[] lo = new double[9];
        double[] hi = new double[9];
        Arrays.fill(hi, 0.3);
        Mandate m = new Mandate(1.0, lo, hi, Map.of(0, 0.05, 4, 0.1), List.of(), List.of());
        Frontier fr = frontier(u, m);
        for (Corner c : fr.corners()) {
            assertEquals(0.05, c.portfolio().weight(0), 0.0);
            assertEquals(0.1, c.portfolio().weight(4), 0.0);
            assertFalse(c.free().contains(u.assets().get(0)));
            assertFeasible(c.portfolio(), m);
            assertTrue(c.portfolio().multiplier("fixed:" + u.assets().get(0)).orElseThrow().binding());
        }
        double[] l2 = lo.clone();
        double[] h2 = hi.clone();
        l2[0] = h2[0] = 0.05;
        l2[4] = h2[4] = 0.1;
        Mandate asBounds = FactorModels.boxed(9, 0, 0.3).withBounds(l2, h2);
        for (double f : new double[] {0.1, 0.5, 0.9}) {
            double t = fr.minReturn() + f * (fr.maxReturn() - fr.minReturn());
            Solution s = target(u, m, t);
            double[] ref = OjAlgoReference.weights(u, asBounds, t);
            assertNotNull(ref);
            assertWeights(ref, s.weights(), Tolerances.NUMERICAL, "fixed weights, " + t);
            // The same holdings pinned by equal bounds give the same portfolio, with the price on a bound.
            Solution b = target(u, asBounds, t);
            assertWeights(s.weights(), b.weights(), Tolerances.CLOSED_FORM, "fixed as bounds");
            double fixed = price(s, "fixed:" + u.assets().get(0));
            double viaBound = price(b, "lower:" + u.assets().get(0)) + price(b, "upper:" + u.assets().get(0));
            assertEquals(fixed, viaBound, Tolerances.CLOSED_FORM);
        }
    }

    // ------------------------------------------------------------------ ends of the range

    @Test
    void targetsOnTheInefficientBranchAreSolvedAndSaySo() {
        AssetUniverse u = FactorModels.universe(25, 31);
        Mandate m = FactorModels.boxed(25, 0.0, 0.15);
        Frontier fr = frontier(u, m);
        assertTrue(fr.lowestReturn() < fr.minReturn());
        double t = 0.5 * (fr.lowestReturn() + fr.minReturn());
        Solution s = target(u, m, t);
        assertFeasible(s, m);
        assertEquals(t, s.expectedReturn(), Tolerances.TIGHT);
        assertTrue(price(s, "target_return") < 0, "raising the target lowers risk on the inefficient branch");
        assertTrue(s.notes().stream().anyMatch(x -> x.contains("inefficient branch")), s.notes().toString());
        double[] ref = OjAlgoReference.weights(u, m, t);
        assertNotNull(ref);
        assertWeights(ref, s.weights(), Tolerances.NUMERICAL, "inefficient branch");
        // Envelope theorem on this branch too.
        double h = 1e-6;
        double dv = (target(u, m, t + h).variance() - target(u, m, t - h).variance()) / (2 * h);
        assertEquals(dv, price(s, "target_return"), 1e-6 * Math.max(1, Math.abs(dv)));
        // The lowest return itself is reachable; the inefficient corners end at the minimum-variance portfolio.
        assertFeasible(target(u, m, fr.lowestReturn()), m);
        List<Corner> ic = fr.inefficientCorners();
        assertWeights(fr.corners().get(0).portfolio().weights(), ic.get(ic.size() - 1).portfolio().weights(),
                Tolerances.CLOSED_FORM, "both branches meet at the minimum-variance portfolio");
    }

    @Test
    void theHighestReturnEndIsTheGreedyFillByExpectedReturn() {
        // Linear programming over a box and a budget (common practice, no source): fill the best assets first.
        AssetUniverse u = FactorModels.universe(30, 41);
        Mandate m = FactorModels.boxed(30, 0.0, 0.12);
        Frontier fr = frontier(u, m);
        double[] mu = u.expectedReturns();
        double[] sorted = mu.clone();
        Arrays.sort(sorted);
        double expect = 0;
        double left = 1;
        for (int k = 29; k >= 0 && left > 0; k--) {
            double add = Math.min(0.12, left);
            expect += add * sorted[k];
            left -= add;
        }
        assertEquals(expect, fr.maxReturn(), Tolerances.TIGHT);
        double low = 0;
        left = 1;
        for (int k = 0; k < 30 && left > 0; k++) {
            double add = Math.min(0.12, left);
            low += add * sorted[k];
            left -= add;
        }
        assertEquals(low, fr.lowestReturn(), Tolerances.TIGHT);
    }

    @Test
    void autoPicksTheCriticalLineForBoundsAndTheClosedFormWithout() {
        AssetUniverse u = FactorModels.universe(10, 2);
        Solution a = Allocator.solve(AllocationRequest.of(u, FactorModels.boxed(10, 0, 0.3), Objective.minimumVariance()));
        assertEquals(Method.CRITICAL_LINE, a.method());
        assertTrue(a.multiplier("target_return").isEmpty(), "no target row for the minimum-variance objective");
        Solution b = Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(10), Objective.minimumVariance()));
        assertEquals(Method.CLOSED_FORM, b.method());
        assertTrue(Allocator.criticalLineApplies(FactorModels.boxed(10, 0, 0.3)));
        assertFalse(Allocator.criticalLineApplies(Mandate.fullyInvested(10)));
    }

    @Test
    void longOnlyWithoutMaximaIsBoundedThroughTheBudget() {
        // min 0 and no max: each weight is at most the budget, so the method still applies.
        AssetUniverse u = FactorModels.universe(8, 4);
        double[] lo = new double[8];
        double[] hi = new double[8];
        Arrays.fill(hi, Double.POSITIVE_INFINITY);
        Mandate m = new Mandate(1.0, lo, hi, Map.of(), List.of(), List.of());
        Frontier fr = frontier(u, m);
        double best = Arrays.stream(u.expectedReturns()).max().orElseThrow();
        assertEquals(best, fr.maxReturn(), Tolerances.TIGHT, "all in the best asset");
        for (Corner c : fr.corners()) {
            assertFeasible(c.portfolio(), m);
            for (Multiplier x : c.portfolio().multipliers()) {
                assertFalse(x.constraint().startsWith("upper:"), "no upper bound to price");
            }
        }
        for (double f : new double[] {0.2, 0.6, 0.97}) {
            double t = fr.minReturn() + f * (fr.maxReturn() - fr.minReturn());
            double[] ref = OjAlgoReference.weights(u, m, t);
            assertNotNull(ref);
            assertWeights(ref, target(u, m, t).weights(), Tolerances.NUMERICAL, "long-only, " + t);
        }
    }

    // ------------------------------------------------------------------ infeasible mandates and targets

    private static AssetUniverse three() {
        double[][] s = {{0.01, 0.002, 0.001}, {0.002, 0.04, 0.01}, {0.001, 0.01, 0.09}};
        return new AssetUniverse(List.of("A", "B", "C"), new double[] {0.02, 0.05, 0.08}, s);
    }

    @Test
    void lowerBoundsAboveTheBudgetAreDiagnosedWithTheirSum() {
        Mandate m = new Mandate(1.0, new double[] {0.5, 0.4, 0.2}, new double[] {1, 1, 1}, Map.of(), List.of(),
                List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> minimumVariance(three(), m));
        assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
        assertEquals("the lower bounds sum to 110.00 %, above the budget 100.00 % (A min 50.00 %, B min 40.00 %, "
                + "C min 20.00 %); fix: lower the minimums by at least 10.00 % in total, or raise the budget",
                e.getMessage());
        assertEquals(List.of("budget", "lower:A", "lower:B", "lower:C"), e.constraints());
    }

    @Test
    void upperBoundsBelowTheBudgetAreDiagnosedWithTheirSum() {
        Mandate m = new Mandate(1.0, new double[3], new double[] {0.3, 0.3, 0.3}, Map.of(), List.of(), List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> target(three(), m, 0.04));
        assertEquals("the upper bounds sum to 90.00 %, below the budget 100.00 % (A max 30.00 %, B max 30.00 %, "
                + "C max 30.00 %); fix: raise the maximums by at least 10.00 % in total, or lower the budget",
                e.getMessage());
        assertEquals(List.of("budget", "upper:A", "upper:B", "upper:C"), e.constraints());
    }

    @Test
    void aFixedWeightOutsideItsBoundsIsDiagnosed() {
        Mandate m = new Mandate(1.0, new double[3], new double[] {0.6, 0.6, 0.6}, Map.of(2, 0.7), List.of(), List.of());
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> minimumVariance(three(), m));
        assertEquals("the fixed weight of C, 70.00 %, is above its upper bound 60.00 %; fix: move the fixed weight "
                + "inside the bounds or change the bound", e.getMessage());
        assertEquals(List.of("fixed:C", "upper:C"), e.constraints());
    }

    @Test
    void aTargetAboveTheHighestReturnNamesTheRangeAndTheEndPortfolio() {
        Mandate m = FactorModels.boxed(3, 0.0, 0.5);
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> target(three(), m, 0.09));
        assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
        // Worked by hand: C and B at 50 % each give 6.50 %; A and B at 50 % give 3.50 %.
        assertEquals("target return 9.00 % is above the highest return the mandate allows, 6.50 % (B at its upper "
                + "bound 50.00 %, C at its upper bound 50.00 %, every other asset at its lower bound); achievable "
                + "returns run from 3.50 % to 6.50 %; fix: choose a target of at most 6.50 % or loosen the upper "
                + "bounds", e.getMessage());
        assertTrue(e.constraints().contains("target_return"));
    }

    @Test
    void aTargetBelowTheLowestReturnNamesTheRangeAndTheEndPortfolio() {
        Mandate m = FactorModels.boxed(3, 0.1, 0.6);
        NoSolutionException e = assertThrows(NoSolutionException.class, () -> target(three(), m, 0.01));
        // Worked by hand: A 60 %, B 30 %, C 10 % give 1.20 % + 1.50 % + 0.80 % = 3.50 %; the top is
        // C 60 %, B 30 %, A 10 %: 4.80 % + 1.50 % + 0.20 % = 6.50 %.
        assertEquals("target return 1.00 % is below the lowest return the mandate allows, 3.50 % (A at its upper "
                + "bound 60.00 %, B 30.00 %, every other asset at its lower bound); achievable returns run from "
                + "3.50 % to 6.50 %; fix: choose a target of at least 3.50 % or loosen the bounds", e.getMessage());
    }

    @Test
    void theTargetAtEitherEndIsReachedExactly() {
        Mandate m = FactorModels.boxed(3, 0.1, 0.6);
        Solution top = target(three(), m, 0.065);
        assertWeights(new double[] {0.1, 0.3, 0.6}, top.weights(), Tolerances.TIGHT, "top");
        assertFeasible(top, m);
        Solution low = target(three(), m, 0.035);
        assertWeights(new double[] {0.6, 0.3, 0.1}, low.weights(), Tolerances.TIGHT, "bottom");
        assertFeasible(low, m);
    }

    @Test
    void twoThreadsGiveTheSameCornersToTheLastBitAsOne() {
        // Common practice, no source: splitting independent work over threads must not change the arithmetic.
        // 700 assets, most of them free near the minimum-variance end, so the corners' work is split there.
        // The signed factor recipe (invented numbers): long-only, nearly every asset is held near the end.
        int n = 700;
        AssetUniverse u = FactorModels.signedUniverse(n, 41);
        double[][] sigma = u.covariance();
        double[] mu = u.expectedReturns();
        double[] hi = new double[n];
        Arrays.fill(hi, 0.05);
        CriticalLine.Problem p = CriticalLine.effective(sigma, 1, new double[n], hi, new boolean[n],
                new boolean[n], new boolean[n], new double[n]);
        List<CriticalLine.Point> one = CriticalLine.walk(p, mu, Double.NEGATIVE_INFINITY, 10_000, 1);
        List<CriticalLine.Point> two = CriticalLine.walk(p, mu, Double.NEGATIVE_INFINITY, 10_000, 2);
        assertEquals(one.size(), two.size());
        int largestFree = 0;
        for (int j = 0; j < one.size(); j++) {
            assertEquals(one.get(j).lambda(), two.get(j).lambda());
            org.junit.jupiter.api.Assertions.assertArrayEquals(one.get(j).weights(), two.get(j).weights());
            org.junit.jupiter.api.Assertions.assertArrayEquals(one.get(j).state(), two.get(j).state());
            int free = 0;
            for (byte s : one.get(j).state()) {
                free += s == CriticalLine.FREE ? 1 : 0;
            }
            largestFree = Math.max(largestFree, free);
        }
        assertTrue(largestFree >= 400, "largest free set " + largestFree + " (too small to split the work)");
    }
}
