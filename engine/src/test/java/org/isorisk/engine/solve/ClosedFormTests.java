package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.QRDecomposition;
import org.apache.commons.math3.linear.RealVector;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Test;

/**
 * The closed-form engine against the outside world: Merton's (1972) formulas, an independent LU solve of the
 * full KKT system with Commons Math, the envelope theorem by finite differences, the Lagrange condition by
 * least squares, and the tangency portfolio's textbook formula. Every problem is generated here from a fixed
 * seed.
 */
class ClosedFormTests {

    private static final int[] SIZES = {2, 5, 12, 40};
    private static final double[] BUDGETS = {1.0, 0.6, 1.7};

    /** Merton's scalars computed independently: Σ⁻¹1 and Σ⁻¹μ by Commons Math's LU decomposition. */
    private record Scalars(double a, double b, double c, double d) {
        static Scalars of(AssetUniverse u) {
            int n = u.size();
            double[] ones = new double[n];
            Arrays.fill(ones, 1.0);
            double[] mu = u.expectedReturns();
            double[] x1 = luSolve(u.covariance(), ones);
            double[] xm = luSolve(u.covariance(), mu);
            double a = dot(ones, xm);
            double b = dot(mu, xm);
            double c = dot(ones, x1);
            return new Scalars(a, b, c, b * c - a * a);
        }
    }

    @Test
    void frontierVarianceAndMultipliersMatchMertonsFormulas() {
        for (int n : SIZES) {
            for (long seed = 1; seed <= 2; seed++) {
                AssetUniverse u = Problems.universe(n, seed);
                // Merton (1972), JFQA 7(4): A = 1'Σ⁻¹μ, B = μ'Σ⁻¹μ, C = 1'Σ⁻¹1, D = BC − A²; for budget 1 the
                // frontier variance is (Cm² − 2Am + B)/D and ∂V*/∂m = 2(Cm − A)/D. For a budget b the problem is
                // homogeneous: V* = (Cm² − 2Abm + Bb²)/D, ∂V*/∂m = 2(Cm − Ab)/D, ∂V*/∂b = 2(Bb − Am)/D.
                Scalars s = Scalars.of(u);
                for (double budget : BUDGETS) {
                    MertonScalars ms = Allocator.merton(u, budget);
                    assertClose(s.a(), ms.a(), Math.abs(s.a()), "A");
                    assertClose(s.b(), ms.b(), s.b(), "B");
                    assertClose(s.c(), ms.c(), s.c(), "C");
                    assertClose(s.d(), ms.d(), s.b() * s.c(), "D");
                    double mMin = s.a() * budget / s.c();
                    for (int k = -2; k <= 3; k++) {
                        double m = mMin + 0.02 * k * budget;
                        Solution sol = Allocator.solve(Problems.request(u, Problems.budget(n, budget),
                                Objective.targetReturn(m)));
                        String where = "n=" + n + " seed=" + seed + " b=" + budget + " m=" + m;
                        double v = (s.c() * m * m - 2 * s.a() * budget * m + s.b() * budget * budget) / s.d();
                        double scale = (s.c() * m * m + 2 * Math.abs(s.a() * budget * m) + s.b() * budget * budget)
                                / s.d();
                        assertClose(v, sol.variance(), scale, "variance " + where);
                        assertClose(v, ms.variance(m), scale, "record variance " + where);
                        double dm = 2 * (s.c() * m - s.a() * budget) / s.d();
                        double dmScale = 2 * (s.c() * Math.abs(m) + Math.abs(s.a() * budget)) / s.d();
                        assertClose(dm, price(sol, "target_return"), dmScale, "return multiplier " + where);
                        assertClose(dm, ms.returnMultiplier(m), dmScale, "record return multiplier " + where);
                        double db = 2 * (s.b() * budget - s.a() * m) / s.d();
                        double dbScale = 2 * (s.b() * Math.abs(budget) + Math.abs(s.a() * m)) / s.d();
                        assertClose(db, price(sol, "budget"), dbScale, "budget multiplier " + where);
                        assertClose(db, ms.budgetMultiplier(m), dbScale, "record budget multiplier " + where);
                        assertClose(m, sol.expectedReturn(), Math.abs(m) + budget, "return " + where);
                    }
                    // Global minimum variance (Merton 1972): return Ab/C, variance b²/C, ∂V*/∂b = 2b/C.
                    Solution gmv = Allocator.solve(Problems.request(u, Problems.budget(n, budget),
                            Objective.minimumVariance()));
                    assertClose(budget * budget / s.c(), gmv.variance(), budget * budget / s.c(), "GMV variance");
                    assertClose(mMin, gmv.expectedReturn(), Math.abs(mMin), "GMV return");
                    assertClose(2 * budget / s.c(), price(gmv, "budget"), 2 * budget / s.c(), "GMV budget price");
                    assertClose(mMin, ms.minimumVarianceReturn(), Math.abs(mMin), "record GMV return");
                    assertClose(budget * budget / s.c(), ms.minimumVariance(), budget * budget / s.c(), "record GMV");
                }
            }
        }
    }

    @Test
    void solutionMatchesAnIndependentLuSolveOfTheFullKktSystem() {
        for (int n : new int[] {3, 17, 64}) {
            AssetUniverse u = Problems.universe(n, 10 + n);
            for (Case c : cases(u)) {
                Solution sol = Allocator.solve(Problems.request(u, c.mandate(), c.objective()));
                List<LinearConstraint> rows = rowsOf(u, c);
                int k = rows.size();
                // Stationarity and feasibility of L = w'Σw − ν'(Aw − b) as one linear system (Commons Math LU):
                // [2Σ −A'; A 0] [w; ν] = [0; b].
                double[][] kkt = new double[n + k][n + k];
                double[][] sigma = u.covariance();
                double[] rhs = new double[n + k];
                for (int i = 0; i < n; i++) {
                    for (int j = 0; j < n; j++) {
                        kkt[i][j] = 2 * sigma[i][j];
                    }
                }
                for (int r = 0; r < k; r++) {
                    for (int i = 0; i < n; i++) {
                        kkt[i][n + r] = -rows.get(r).coefficient(i);
                        kkt[n + r][i] = rows.get(r).coefficient(i);
                    }
                    rhs[n + r] = rows.get(r).limit();
                }
                double[] x = luSolve(kkt, rhs);
                double wScale = maxAbs(Arrays.copyOf(x, n));
                for (int i = 0; i < n; i++) {
                    assertClose(x[i], sol.weight(i), wScale, c.name() + " weight " + i + " n=" + n);
                }
                double nuScale = maxAbs(Arrays.copyOfRange(x, n, n + k));
                for (int r = 0; r < k; r++) {
                    assertClose(x[n + r], price(sol, rows.get(r).name()), nuScale,
                            c.name() + " multiplier " + rows.get(r).name() + " n=" + n);
                }
            }
        }
    }

    @Test
    void everyMultiplierIsTheDerivativeOfTheOptimalVarianceInItsLimit() {
        int n = 12;
        AssetUniverse u = Problems.universe(n, 3);
        double budget = 0.9;
        double fixedWeight = 0.07;
        double groupTotal = 0.35;
        double target = 0.05;
        Solution base = solveWith(u, budget, fixedWeight, groupTotal, target);
        // Envelope theorem (e.g. Luenberger & Ye, "Linear and Nonlinear Programming", 3rd ed., 2008, §11.7):
        // ∂V*/∂b_k = ν_k. V* is exactly quadratic in each limit here, so the central difference has no
        // truncation error; what remains is rounding, about ε·V*/h.
        double h = 1e-4;
        double[] fd = {
                (solveWith(u, budget + h, fixedWeight, groupTotal, target).variance()
                        - solveWith(u, budget - h, fixedWeight, groupTotal, target).variance()) / (2 * h),
                (solveWith(u, budget, fixedWeight, groupTotal, target + h).variance()
                        - solveWith(u, budget, fixedWeight, groupTotal, target - h).variance()) / (2 * h),
                (solveWith(u, budget, fixedWeight + h, groupTotal, target).variance()
                        - solveWith(u, budget, fixedWeight - h, groupTotal, target).variance()) / (2 * h),
                (solveWith(u, budget, fixedWeight, groupTotal + h, target).variance()
                        - solveWith(u, budget, fixedWeight, groupTotal - h, target).variance()) / (2 * h)};
        String[] names = {"budget", "target_return", "fixed:Asset 3", "group:Core"};
        for (int i = 0; i < names.length; i++) {
            double nu = price(base, names[i]);
            assertTrue(Math.abs(fd[i] - nu) <= Tolerances.NUMERICAL * Math.max(Math.abs(nu), base.variance()),
                    names[i] + ": finite difference " + fd[i] + " vs multiplier " + nu);
        }
        // The volatility-unit price is the same derivative for σ* = sqrt(V*): (∂V*/∂b)/(2σ*). σ* is not
        // quadratic, so the central difference has a truncation error O(h²): a smaller step keeps it near 1e-7.
        double hv = 1e-5;
        double volUp = solveWith(u, budget, fixedWeight, groupTotal, target + hv).volatility();
        double volDown = solveWith(u, budget, fixedWeight, groupTotal, target - hv).volatility();
        double fdVol = (volUp - volDown) / (2 * hv);
        double vol = base.multiplier("target_return").orElseThrow().volatilityPerUnit();
        assertTrue(Math.abs(fdVol - vol) <= 1e-6 * Math.abs(vol), fdVol + " vs " + vol);
    }

    @Test
    void twiceSigmaWLiesInTheSpanOfTheConstraintGradients() {
        for (int n : new int[] {4, 25, 90}) {
            AssetUniverse u = Problems.universe(n, 40 + n);
            for (Case c : cases(u)) {
                Solution sol = Allocator.solve(Problems.request(u, c.mandate(), c.objective()));
                assertTrue(sol.certificate().stationarity() <= Tolerances.CLOSED_FORM,
                        c.name() + ": certificate stationarity " + sol.certificate().stationarity());
                assertTrue(sol.certificate().passes(), c.name() + " certificate " + sol.certificate());
                // Independently: least squares (Commons Math QR) of A'x ≈ 2Σw; the residual must vanish and
                // x must be the multipliers (Lagrange condition 2Σw = A'ν).
                List<LinearConstraint> rows = rowsOf(u, c);
                int k = rows.size();
                double[][] at = new double[n][k];
                for (int r = 0; r < k; r++) {
                    for (int i = 0; i < n; i++) {
                        at[i][r] = rows.get(r).coefficient(i);
                    }
                }
                double[] grad = new double[n];
                double[][] sigma = u.covariance();
                for (int i = 0; i < n; i++) {
                    double s = 0;
                    for (int j = 0; j < n; j++) {
                        s += sigma[i][j] * sol.weight(j);
                    }
                    grad[i] = 2 * s;
                }
                Array2DRowRealMatrix atm = new Array2DRowRealMatrix(at, false);
                RealVector x = new QRDecomposition(atm).getSolver().solve(new ArrayRealVector(grad, false));
                RealVector residual = atm.operate(x).subtract(new ArrayRealVector(grad, false));
                double rel = residual.getLInfNorm() / Math.max(maxAbs(grad), Double.MIN_NORMAL);
                assertTrue(rel <= Tolerances.CLOSED_FORM, c.name() + " n=" + n + ": least-squares residual " + rel);
                for (int r = 0; r < k; r++) {
                    assertClose(x.getEntry(r), price(sol, rows.get(r).name()), x.getLInfNorm(),
                            c.name() + " least-squares multiplier " + rows.get(r).name());
                }
            }
        }
    }

    @Test
    void tangencyPortfolioIsSigmaInverseExcessReturnsNormalisedToTheBudget() {
        for (int n : new int[] {3, 12, 40}) {
            AssetUniverse u = Problems.universe(n, 70 + n);
            Scalars s = Scalars.of(u);
            for (double budget : new double[] {1.0, 1.5}) {
                for (double rf : new double[] {s.a() / s.c() - 0.01, s.a() / s.c() - 0.03, 0.0}) {
                    if (!(rf < s.a() / s.c())) {
                        continue;
                    }
                    // Tangency (maximum Sharpe ratio) portfolio, e.g. Merton (1972) §III: w ∝ Σ⁻¹(μ − r_f 1),
                    // scaled to the budget.
                    double[] excess = u.expectedReturns();
                    for (int i = 0; i < n; i++) {
                        excess[i] -= rf;
                    }
                    double[] z = luSolve(u.covariance(), excess);
                    double total = 0;
                    for (double v : z) {
                        total += v;
                    }
                    Solution sol = Allocator.solve(Problems.request(u, Problems.budget(n, budget),
                            Objective.tangency(rf)));
                    double[] expected = new double[n];
                    for (int i = 0; i < n; i++) {
                        expected[i] = budget * z[i] / total;
                    }
                    double scale = maxAbs(expected);
                    for (int i = 0; i < n; i++) {
                        assertClose(expected[i], sol.weight(i), scale, "tangency n=" + n + " rf=" + rf + " i=" + i);
                    }
                }
            }
        }
    }

    @Test
    void tangencyIsRefusedWhenTheRiskFreeRateIsAtOrAboveTheMinimumVarianceReturn() {
        AssetUniverse u = Problems.universe(8, 5);
        Scalars s = Scalars.of(u);
        double gmvReturn = s.a() / s.c(); // Merton (1972): the minimum-variance portfolio returns A/C
        for (double rf : new double[] {gmvReturn + 0.005, gmvReturn + 0.05}) {
            NoSolutionException e = assertThrows(NoSolutionException.class, () -> Allocator.solve(
                    Problems.request(u, Problems.budget(8, 1.0), Objective.tangency(rf))));
            assertEquals("no tangency portfolio: the risk-free rate " + pct(rf) + " is at or above the "
                    + "minimum-variance portfolio's return " + pct(gmvReturn) + ", so no frontier portfolio earns a "
                    + "positive excess return per unit of risk on the efficient branch; fix: use a risk-free rate "
                    + "below " + pct(gmvReturn), e.getMessage());
            assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
            assertEquals(List.of("risk_free"), e.constraints());
        }
    }

    // ---- helpers ----

    private record Case(String name, Mandate mandate, Objective objective) {
    }

    /** Constraint sets: budget alone, budget + target, and budget + target + a fixed weight + a group total. */
    private static List<Case> cases(AssetUniverse u) {
        int n = u.size();
        double[] mu = u.expectedReturns();
        double mid = Arrays.stream(mu).average().orElseThrow();
        List<Case> cases = new ArrayList<>();
        cases.add(new Case("minimum variance", Problems.budget(n, 1.0), Objective.minimumVariance()));
        cases.add(new Case("target", Problems.budget(n, 0.8), Objective.targetReturn(mid)));
        if (n >= 4) {
            cases.add(new Case("target+fixed+group", Problems.withFixedAndGroup(n, 1.0, n - 1, 0.05, 0.4),
                    Objective.targetReturn(mid + 0.005)));
        }
        return cases;
    }

    /** The rows the problem has, in the solver's order: the mandate's rows, then the target. */
    private static List<LinearConstraint> rowsOf(AssetUniverse u, Case c) {
        List<LinearConstraint> rows = new ArrayList<>(c.mandate().rows(u.assets()));
        if (c.objective() instanceof Objective.TargetReturn t) {
            rows.add(new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, t.target()));
        }
        return rows;
    }

    private static Solution solveWith(AssetUniverse u, double budget, double fixedWeight, double groupTotal,
                                      double target) {
        int n = u.size();
        Mandate free = Mandate.budgetOnly(n, budget);
        List<Integer> core = List.of(0, 1, 3, 4, 5);
        Mandate m = new Mandate(budget, free.lower(), free.upper(), Map.of(2, fixedWeight),
                List.of(new Group("Core", core, groupTotal, groupTotal)), List.of());
        return Allocator.solve(Problems.request(u, m, Objective.targetReturn(target)));
    }

    static double price(Solution s, String constraint) {
        return s.multiplier(constraint).orElseThrow(() -> new AssertionError("no multiplier " + constraint))
                .variancePerUnit();
    }

    static double[] luSolve(double[][] a, double[] b) {
        return new LUDecomposition(new Array2DRowRealMatrix(a)).getSolver().solve(new ArrayRealVector(b))
                .toArray();
    }

    static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    static double maxAbs(double[] v) {
        double m = 0;
        for (double x : v) {
            m = Math.max(m, Math.abs(x));
        }
        return m;
    }

    /** |actual − expected| ≤ CLOSED_FORM · scale, scale being the size of the terms that make up the value. */
    static void assertClose(double expected, double actual, double scale, String what) {
        assertTrue(Math.abs(actual - expected) <= Tolerances.CLOSED_FORM * Math.max(scale, Double.MIN_NORMAL),
                what + ": expected " + expected + ", got " + actual + " (scale " + scale + ")");
    }

    /** Percent with two decimals, as the messages print it (common practice, no source). */
    static String pct(double decimal) {
        return String.format(Locale.ROOT, "%.2f %%", decimal * 100);
    }
}
