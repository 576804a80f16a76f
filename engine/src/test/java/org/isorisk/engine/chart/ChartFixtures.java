package org.isorisk.engine.chart;

import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.Factored;
import org.ojalgo.matrix.store.R064Store;
import org.ojalgo.optimisation.Optimisation;
import org.ojalgo.optimisation.convex.ConvexSolver;

/**
 * Test frontiers for the charts, built from the engine's closed form (Allocator) so that every number a chart
 * draws is an engine number: a bounded frontier point is the closed-form solution with the bound-binding assets
 * fixed at their bounds, the binding set found by ojAlgo's convex solver (an independent library). Corners are
 * located by bisection on the target between grid points whose binding sets differ. This is a fixture for chart
 * tests, not a frontier method: the engine's own frontier lives in {@code engine.frontier}.
 */
final class ChartFixtures {
    private ChartFixtures() {
    }

    static final List<String> SAMPLE_ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    /** Invented, illustrative assumptions of the sample fund (decimal, annualised). */
    static AssetUniverse sampleFund() {
        double[] mu = {0.020, 0.030, 0.032, 0.039, 0.055, 0.060, 0.070, 0.073, 0.085, 0.065, 0.062, 0.045};
        double[] vol = {0.005, 0.055, 0.065, 0.065, 0.100, 0.110, 0.160, 0.170, 0.230, 0.180, 0.130, 0.190};
        // Loadings on four invented factors (rates, credit, equity, inflation) in correlation units; the rest of
        // each asset's variance is its own, so the correlation matrix is positive definite by construction.
        double[][] l = {
                {0.10, 0.00, 0.00, 0.10}, {0.95, 0.00, -0.15, 0.00}, {0.75, 0.00, -0.05, 0.45},
                {0.70, 0.50, 0.20, 0.00}, {0.20, 0.60, 0.55, 0.05}, {0.35, 0.50, 0.45, 0.20},
                {-0.10, 0.20, 0.90, 0.05}, {-0.10, 0.20, 0.88, 0.10}, {-0.05, 0.25, 0.80, 0.25},
                {0.15, 0.20, 0.70, 0.10}, {0.25, 0.15, 0.60, 0.20}, {-0.10, 0.05, 0.30, 0.70}};
        return universe(SAMPLE_ASSETS, mu, vol, l);
    }

    /** An invented universe of {@code n} assets from a four-factor model with a fixed seed. */
    static AssetUniverse large(int n, long seed) {
        Random r = new Random(seed);
        List<String> names = new ArrayList<>();
        double[] mu = new double[n];
        double[] vol = new double[n];
        double[][] l = new double[n][4];
        for (int i = 0; i < n; i++) {
            names.add(String.format(java.util.Locale.ROOT, "Asset %03d", i + 1));
            vol[i] = 0.04 + 0.22 * r.nextDouble();
            mu[i] = 0.015 + 0.3 * vol[i] + 0.01 * r.nextGaussian();
            double norm = 0;
            for (int f = 0; f < 4; f++) {
                l[i][f] = 0.6 * r.nextGaussian() / 2;
                norm += l[i][f] * l[i][f];
            }
            if (norm > 0.8) {
                for (int f = 0; f < 4; f++) {
                    l[i][f] *= Math.sqrt(0.8 / norm);
                }
            }
        }
        return universe(names, mu, vol, l);
    }

    private static AssetUniverse universe(List<String> names, double[] mu, double[] vol, double[][] l) {
        int n = names.size();
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double c = 0;
                for (int f = 0; f < l[i].length; f++) {
                    c += l[i][f] * l[j][f];
                }
                s[i][j] = (i == j ? 1.0 : c) * vol[i] * vol[j];
            }
        }
        return new AssetUniverse(names, mu, s);
    }

    private static Frontier sampleFrontier;

    /** The sample fund's bounded frontier on 16 targets, corners at the grid points where the binding set changes. */
    static synchronized Frontier sampleFrontier() {
        if (sampleFrontier == null) {
            AssetUniverse u = sampleFund();
            double[][] b = sampleBounds(u);
            sampleFrontier = boundedFrontier(u, b[0], b[1], 16, false);
        }
        return sampleFrontier;
    }

    static ChartContext context() {
        return new ChartContext(LocalDate.of(2025, 6, 30), "3f9a0c1d7e5b2a4c6d8e", "Example Pension Fund (invented)");
    }

    /** The sample fund's illustrative mandate bounds: 0–35 % each, Government Bonds 10–60 %, Cash at most 20 %. */
    static double[][] sampleBounds(AssetUniverse u) {
        int n = u.size();
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(hi, 0.35);
        lo[1] = 0.10;
        hi[1] = 0.60;
        hi[0] = 0.20;
        return new double[][] {lo, hi};
    }

    /** Only the budget: the closed-form frontier sampled at {@code points} targets. */
    static Frontier closedFormFrontier(AssetUniverse u, int points, double lo, double hi) {
        Factored f = Factored.of(u);
        MertonScalars ms = Allocator.merton(f, 1.0);
        Mandate m = Mandate.fullyInvested(u.size());
        List<Solution> sols = new ArrayList<>();
        for (int i = 0; i < points; i++) {
            double t = lo + (hi - lo) * i / Math.max(1, points - 1);
            sols.add(Allocator.closedForm(f, m, Objective.targetReturn(t),
                    AllocationRequest.of(u, m, Objective.targetReturn(t))));
        }
        return new Frontier(List.of(), sols, ms, ms.minimumVarianceReturn(), Double.POSITIVE_INFINITY);
    }

    /** The bounded frontier under {@code lo ≤ w ≤ hi}, budget 1, with corners. */
    static Frontier boundedFrontier(AssetUniverse u, double[] lo, double[] hi, int points, boolean bisect) {
        Factored f = Factored.of(u);
        int n = u.size();
        double mMax = maxReturn(u, lo, hi);
        Solution mv = solveBounded(u, f, lo, hi, Double.NaN);
        double mMin = mv.expectedReturn();
        List<Solution> sols = new ArrayList<>();
        List<Map<Integer, Double>> sets = new ArrayList<>();
        List<Double> ms = new ArrayList<>();
        for (int i = 0; i < points; i++) {
            double t = mMin + (mMax - mMin) * i / (points - 1);
            // keep clear of the very ends, where the target row and the bounds become dependent
            t = Math.min(Math.max(t, mMin + 1e-7 * (mMax - mMin)), mMax - 1e-5 * (mMax - mMin));
            Solution s = solveBounded(u, f, lo, hi, t);
            sols.add(s);
            sets.add(activeSet(s, lo, hi));
            ms.add(t);
        }
        List<Corner> corners = new ArrayList<>();
        corners.add(new Corner(mv, null, "start", "minimum-variance portfolio under the mandate"));
        for (int i = 1; i < points; i++) {
            double a = ms.get(i - 1);
            double end = ms.get(i);
            Map<Integer, Double> setA = sets.get(i - 1);
            Map<Integer, Double> setEnd = sets.get(i);
            // Several corners may lie between two grid points: find the first change, step past it, repeat.
            while (!setA.equals(setEnd)) {
                double b = end;
                Map<Integer, Double> setB = setEnd;
                Solution at = sols.get(i);
                if (bisect) {
                    for (int it = 0; it < 45; it++) {
                        double c = 0.5 * (a + b);
                        Solution sc = solveBounded(u, f, lo, hi, c);
                        Map<Integer, Double> setC = activeSet(sc, lo, hi);
                        if (setC.equals(setA)) {
                            a = c;
                        } else {
                            b = c;
                            setB = setC;
                        }
                    }
                    // the corner itself: the lower stretch's binding set at the boundary, refined where the changing
                    // asset's weight (or multiplier) reaches its limit exactly: both are affine in the target there
                    a = refine(u, f, lo, hi, setA, setB, a);
                    at = closedFormFixed(u, f, lo, hi, setA, a);
                }
                at = flagBinding(at, setB, lo);
                String asset = null;
                String change = "changes";
                for (int k = 0; k < n; k++) {
                    if (setA.containsKey(k) != setB.containsKey(k)) {
                        asset = u.assets().get(k);
                        change = setA.containsKey(k) ? "enters" : "leaves";
                        break;
                    }
                }
                corners.add(new Corner(at, asset, change, asset + " " + change + " the free set"));
                if (!bisect) {
                    break;
                }
                a = b;
                setA = setB;
            }
        }
        Solution top = solveBounded(u, f, lo, hi, mMax - 1e-5 * (mMax - mMin));
        corners.add(new Corner(top, null, "end", "highest return the mandate allows"));
        return new Frontier(corners, sols, Allocator.merton(f, 1.0), mMin, mMax);
    }

    private static double refine(AssetUniverse u, Factored f, double[] lo, double[] hi, Map<Integer, Double> setA,
                                 Map<Integer, Double> setB, double a) {
        int k = -1;
        for (int i = 0; i < u.size(); i++) {
            if (setA.containsKey(i) != setB.containsKey(i)) {
                k = i;
                break;
            }
        }
        if (k < 0) {
            return a;
        }
        double h = 1e-5;
        Solution s0 = closedFormFixed(u, f, lo, hi, setA, a - h);
        Solution s1 = closedFormFixed(u, f, lo, hi, setA, a);
        double v0;
        double v1;
        if (setB.containsKey(k)) { // k becomes bound: its weight reaches the bound
            v0 = s0.weight(k) - setB.get(k);
            v1 = s1.weight(k) - setB.get(k);
        } else { // k is released: its bound's multiplier reaches zero
            String name = (setA.get(k) == lo[k] ? "lower:" : "upper:") + u.assets().get(k);
            v0 = s0.multiplier(name).orElseThrow().variancePerUnit();
            v1 = s1.multiplier(name).orElseThrow().variancePerUnit();
        }
        if (v1 == v0) {
            return a;
        }
        double t = a - v1 * h / (v1 - v0);
        return Math.abs(t - a) < 1e-3 ? t : a;
    }

    /**
     * At a corner the asset about to bind already sits at its bound: flag that bound as binding (multiplier 0),
     * as "holds with equality" requires.
     */
    private static Solution flagBinding(Solution s, Map<Integer, Double> set, double[] lo) {
        List<Multiplier> mult = new ArrayList<>();
        for (Multiplier m : s.multipliers()) {
            boolean now = m.binding();
            if (!now && (m.constraint().startsWith("lower:") || m.constraint().startsWith("upper:"))) {
                int i = s.assets().indexOf(m.constraint().substring(6));
                Double b = set.get(i);
                now = b != null && (m.constraint().startsWith("lower:") == (b == lo[i]));
            }
            mult.add(now == m.binding() ? m : new Multiplier(m.constraint(), m.variancePerUnit(),
                    m.volatilityPerUnit(), true));
        }
        return new Solution(s.method(), s.assets(), s.weights(), s.expectedReturn(), s.variance(), s.volatility(),
                mult, s.certificate(), s.notes());
    }

    static double maxReturn(AssetUniverse u, double[] lo, double[] hi) {
        int n = u.size();
        Integer[] idx = new Integer[n];
        for (int i = 0; i < n; i++) {
            idx[i] = i;
        }
        Arrays.sort(idx, (a, b) -> Double.compare(u.expectedReturn(b), u.expectedReturn(a)));
        double left = 1.0;
        double m = 0;
        for (int i = 0; i < n; i++) {
            left -= lo[i];
            m += lo[i] * u.expectedReturn(i);
        }
        for (int i : idx) {
            double add = Math.min(hi[i] - lo[i], left);
            m += add * u.expectedReturn(i);
            left -= add;
        }
        return m;
    }

    private static Map<Integer, Double> activeSet(Solution s, double[] lo, double[] hi) {
        Map<Integer, Double> set = new LinkedHashMap<>();
        for (Multiplier m : s.multipliers()) {
            if (m.binding() && (m.constraint().startsWith("lower:") || m.constraint().startsWith("upper:"))) {
                int i = s.assets().indexOf(m.constraint().substring(6));
                set.put(i, m.constraint().startsWith("lower:") ? lo[i] : hi[i]);
            }
        }
        return set;
    }

    /** Euler shares of volatility {@code w_i (Σw)_i / (w'Σw)} (test-side arithmetic, from the definition). */
    static RiskShares shares(String name, AssetUniverse u, double[] w) {
        int n = u.size();
        double[] sw = new double[n];
        double v = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                sw[i] += u.covariance(i, j) * w[j];
            }
            v += w[i] * sw[i];
        }
        double[] sh = new double[n];
        for (int i = 0; i < n; i++) {
            sh[i] = w[i] * sw[i] / v;
        }
        return new RiskShares(name, u.assets(), sh);
    }

    /** The point of weights {@code w}: (sqrt(w'Σw), μ'w). */
    static PortfolioPoint point(String name, AssetUniverse u, double[] w) {
        int n = u.size();
        double v = 0;
        double m = 0;
        for (int i = 0; i < n; i++) {
            m += u.expectedReturn(i) * w[i];
            for (int j = 0; j < n; j++) {
                v += w[i] * u.covariance(i, j) * w[j];
            }
        }
        return new PortfolioPoint(name, Math.sqrt(v), m);
    }

    /** An invented current portfolio of the sample fund. */
    static double[] sampleCurrent() {
        return new double[] {0.03, 0.20, 0.05, 0.12, 0.05, 0.03, 0.20, 0.17, 0.05, 0.04, 0.03, 0.03};
    }

    /** Bounded solve: ojAlgo finds which bounds bind; the closed form with those assets fixed gives the numbers. */
    static Solution solveBounded(AssetUniverse u, Factored f, double[] lo, double[] hi, double target) {
        int n = u.size();
        R064Store q = R064Store.FACTORY.make(n, n);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                q.set(i, j, 2 * u.covariance(i, j));
            }
        }
        double[] ones = new double[n];
        Arrays.fill(ones, 1.0);
        ConvexSolver.Builder b = ConvexSolver.newBuilder(n).quadratic(q).equality(1.0, ones);
        if (!Double.isNaN(target)) {
            b.equality(target, u.expectedReturns());
        }
        for (int i = 0; i < n; i++) {
            double[] e = new double[n];
            e[i] = 1;
            b.inequality(hi[i], e);
            double[] me = new double[n];
            me[i] = -1;
            b.inequality(-lo[i], me);
        }
        Optimisation.Result r = b.build().solve();
        if (!r.getState().isOptimal()) {
            throw new IllegalStateException("fixture QP not optimal at " + target + ": " + r.getState());
        }
        RuntimeException last = null;
        for (double tol : new double[] {1e-7, 1e-9, 1e-11}) {
            Map<Integer, Double> set = new LinkedHashMap<>();
            for (int i = 0; i < n; i++) {
                double w = r.doubleValue(i);
                if (Math.abs(w - lo[i]) < tol) {
                    set.put(i, lo[i]);
                } else if (Math.abs(w - hi[i]) < tol) {
                    set.put(i, hi[i]);
                }
            }
            try {
                return closedFormFixed(u, f, lo, hi, set, target);
            } catch (RuntimeException e) {
                last = e; // the ends of the frontier: too many assets looked bound; classify more tightly
            }
        }
        throw last;
    }

    private static Solution closedFormFixed(AssetUniverse u, Factored f, double[] lo, double[] hi,
                                            Map<Integer, Double> set, double target) {
        int n = u.size();
        double[] nlo = new double[n];
        double[] nhi = new double[n];
        Arrays.fill(nlo, Double.NEGATIVE_INFINITY);
        Arrays.fill(nhi, Double.POSITIVE_INFINITY);
        Mandate m = new Mandate(1.0, nlo, nhi, set, List.of(), List.of());
        Objective o = Double.isNaN(target) ? Objective.minimumVariance() : Objective.targetReturn(target);
        Solution s = Allocator.closedForm(f, m, o, AllocationRequest.of(u, m, o));
        // Rename the fixed rows as the bounds they stand for, so the chart sees a bounded solution's multipliers.
        List<Multiplier> mult = new ArrayList<>();
        for (Multiplier x : s.multipliers()) {
            if (x.constraint().startsWith("fixed:")) {
                int i = u.assets().indexOf(x.constraint().substring(6));
                String kind = set.get(i) == lo[i] ? "lower:" : "upper:";
                mult.add(new Multiplier(kind + u.assets().get(i), x.variancePerUnit(), x.volatilityPerUnit(), true));
            } else {
                mult.add(x);
            }
        }
        for (int i = 0; i < n; i++) {
            if (!set.containsKey(i)) {
                mult.add(new Multiplier("lower:" + u.assets().get(i), 0, 0, false));
                mult.add(new Multiplier("upper:" + u.assets().get(i), 0, 0, false));
            }
        }
        return new Solution(org.isorisk.engine.model.Method.CRITICAL_LINE, s.assets(), s.weights(),
                s.expectedReturn(), s.variance(), s.volatility(), mult, s.certificate(), s.notes());
    }
}
