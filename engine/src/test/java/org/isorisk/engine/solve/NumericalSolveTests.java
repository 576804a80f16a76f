package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

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
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Test;
import org.ojalgo.optimisation.Expression;
import org.ojalgo.optimisation.ExpressionsBasedModel;
import org.ojalgo.optimisation.Optimisation;
import org.ojalgo.optimisation.Variable;

class NumericalSolveTests {

    private static Solution solve(AssetUniverse u, Mandate m, Objective o) {
        return Allocator.solve(new AllocationRequest(u, m, o, Method.NUMERICAL, null));
    }

    private static void assertCertified(Solution s) {
        assertTrue(s.certificate().worst() <= 1e-9, () -> "certificate " + s.certificate());
        assertTrue(s.certificate().passes());
    }

    /** Independent reference: ojAlgo's convex QP (active set at these sizes), objective w'Σw. */
    private static double[] ojalgo(AssetUniverse u, Mandate m, Double target) {
        int n = u.size();
        ExpressionsBasedModel model = new ExpressionsBasedModel();
        Variable[] v = new Variable[n];
        for (int i = 0; i < n; i++) {
            v[i] = model.addVariable("w" + i);
            if (Double.isFinite(m.lower(i))) {
                v[i].lower(m.lower(i));
            }
            if (Double.isFinite(m.upper(i))) {
                v[i].upper(m.upper(i));
            }
        }
        for (LinearConstraint c : m.rows(u.assets())) {
            Expression e = model.addExpression(c.name());
            for (int i = 0; i < n; i++) {
                if (c.coefficient(i) != 0) {
                    e.set(v[i], c.coefficient(i));
                }
            }
            switch (c.relation()) {
                case EQUAL -> e.level(c.limit());
                case AT_MOST -> e.upper(c.limit());
                case AT_LEAST -> e.lower(c.limit());
            }
        }
        if (target != null) {
            Expression e = model.addExpression("target");
            for (int i = 0; i < n; i++) {
                e.set(v[i], u.expectedReturn(i));
            }
            e.level(target);
        }
        Expression risk = model.addExpression("risk").weight(1);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                risk.set(v[i], v[j], u.covariance(i, j));
            }
        }
        model.options.convex().algorithm(org.ojalgo.optimisation.convex.ConvexSolver.Algorithm.ACTIVE_SET);
        Optimisation.Result r = model.minimise();
        assertTrue(r.getState().isOptimal(), "ojAlgo state " + r.getState());
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = r.doubleValue(i);
        }
        return w;
    }

    @Test
    void minimumVarianceUnderGroupsAgreesWithOjAlgoAndIsCertified() {
        for (int n : new int[] {8, 20, 40}) {
            AssetUniverse u = GeneratedProblems.universe(n, 7 + n);
            Mandate m = GeneratedProblems.withGroups(n);
            Solution s = solve(u, m, Objective.minimumVariance());
            assertCertified(s);
            assertEquals(Method.NUMERICAL, s.method());
            double[] ref = ojalgo(u, m, null); // ojAlgo 57.1.0, convex active-set solver
            for (int i = 0; i < n; i++) {
                assertEquals(ref[i], s.weight(i), 1e-6, "weight " + i + " at n=" + n);
            }
        }
    }

    @Test
    void aLargeProblemWhoseUnboundedMinimiserBreaksManyBoundsAgreesWithOjAlgo() {
        // n = 120 takes the blocked first factor; the budget-only minimiser of this universe holds many negative
        // weights (checked below), so the start from it must add violated bounds in blocks and then let the primal
        // method release the ones it fixed wrongly; groups and the general row join when violated.
        int n = 120;
        AssetUniverse u = GeneratedProblems.universe(n, 2026);
        Mandate m = GeneratedProblems.withGroups(n);
        double[] none = new double[n];
        double[] lowNone = new double[n];
        java.util.Arrays.fill(none, Double.POSITIVE_INFINITY);
        java.util.Arrays.fill(lowNone, Double.NEGATIVE_INFINITY);
        double[] unbounded = Allocator.solve(new AllocationRequest(u, new Mandate(1.0, lowNone, none, Map.of(),
                List.of(), List.of()), Objective.minimumVariance(), Method.CLOSED_FORM, null)).weights();
        int negative = 0;
        for (double w : unbounded) {
            negative += w < 0 ? 1 : 0;
        }
        assertTrue(negative >= 10, "the test needs a minimiser that breaks many bounds, has " + negative);
        ReturnRange rr = Allocator.returnRange(u, m);
        Solution mv = solve(u, m, Objective.minimumVariance());
        assertCertified(mv);
        double[] ref = ojalgo(u, m, null); // ojAlgo 57.1.0, convex active-set solver
        for (int i = 0; i < n; i++) {
            assertEquals(ref[i], mv.weight(i), 1e-6, "minimum variance weight " + i);
        }
        for (double f : new double[] {0.3, 0.8}) {
            double target = mv.expectedReturn() + f * (rr.max() - mv.expectedReturn());
            Solution s = solve(u, m, Objective.targetReturn(target));
            assertCertified(s);
            double[] r = ojalgo(u, m, target); // ojAlgo 57.1.0, convex active-set solver
            for (int i = 0; i < n; i++) {
                assertEquals(r[i], s.weight(i), 1e-6, "weight " + i + " at target " + target);
            }
        }
    }

    @Test
    void targetReturnSolutionsAgreeWithOjAlgoAcrossTheRange() {
        int n = 25;
        AssetUniverse u = GeneratedProblems.universe(n, 99);
        Mandate m = GeneratedProblems.withGroups(n);
        ReturnRange rr = Allocator.returnRange(u, m);
        for (double f : new double[] {0.1, 0.4, 0.7, 0.95}) {
            double target = rr.min() + f * (rr.max() - rr.min());
            Solution s = solve(u, m, Objective.targetReturn(target));
            assertCertified(s);
            assertEquals(target, s.expectedReturn(), Tolerances.TIGHT);
            double[] ref = ojalgo(u, m, target);
            for (int i = 0; i < n; i++) {
                assertEquals(ref[i], s.weight(i), 1e-6, "weight " + i + " at target " + target);
            }
        }
    }

    @Test
    void returnRangeAgreesWithOjAlgoLinearProgramming() {
        int n = 30;
        AssetUniverse u = GeneratedProblems.universe(n, 5);
        Mandate m = GeneratedProblems.withGroups(n);
        ReturnRange rr = Allocator.returnRange(u, m);
        for (boolean max : new boolean[] {true, false}) {
            ExpressionsBasedModel model = new ExpressionsBasedModel();
            Variable[] v = new Variable[n];
            for (int i = 0; i < n; i++) {
                v[i] = model.addVariable("w" + i).lower(m.lower(i)).upper(m.upper(i)).weight(u.expectedReturn(i));
            }
            for (LinearConstraint c : m.rows(u.assets())) {
                Expression e = model.addExpression(c.name());
                for (int i = 0; i < n; i++) {
                    e.set(v[i], c.coefficient(i));
                }
                switch (c.relation()) {
                    case EQUAL -> e.level(c.limit());
                    case AT_MOST -> e.upper(c.limit());
                    case AT_LEAST -> e.lower(c.limit());
                }
            }
            Optimisation.Result r = max ? model.maximise() : model.minimise(); // ojAlgo's LP solver
            assertTrue(r.getState().isOptimal());
            assertEquals(r.getValue(), max ? rr.max() : rr.min(), Tolerances.GENERAL);
        }
        double[] top = rr.maxPortfolio();
        assertEquals(rr.max(), dot(top, u.expectedReturns()), Tolerances.TIGHT);
    }

    @Test
    void everyMultiplierIsTheDerivativeOfTheOptimalVarianceByFiniteDifferences() {
        // Envelope theorem: ∂V*/∂limit, checked by central differences of re-solved problems.
        int n = 12;
        AssetUniverse u = GeneratedProblems.universe(n, 3);
        Mandate m = GeneratedProblems.withGroups(n);
        ReturnRange rr = Allocator.returnRange(u, m);
        double target = rr.min() + 0.6 * (rr.max() - rr.min());
        Solution s = solve(u, m, Objective.targetReturn(target));
        assertCertified(s);
        double h = 1e-6;
        int checked = 0;
        for (Multiplier mu : s.multipliers()) {
            if (!mu.binding() || Math.abs(mu.variancePerUnit()) < 1e-8) {
                continue;
            }
            double up = perturbed(u, m, target, mu.constraint(), h).variance();
            double dn = perturbed(u, m, target, mu.constraint(), -h).variance();
            double fd = (up - dn) / (2 * h);
            assertEquals(fd, mu.variancePerUnit(), 1e-6 * Math.max(1, Math.abs(fd)), mu.constraint());
            checked++;
        }
        assertTrue(checked >= 4, "binding multipliers checked: " + checked);
        // signs: upper limits and <= rows are ≤ 0, lower limits and >= rows ≥ 0
        for (Multiplier mu : s.multipliers()) {
            String c = mu.constraint();
            if (c.startsWith("upper:") || c.endsWith(":max") || c.equals("middle_tilt")) {
                assertTrue(mu.variancePerUnit() <= 0, c);
            }
            if (c.startsWith("lower:") || c.endsWith(":min")) {
                assertTrue(mu.variancePerUnit() >= 0, c);
            }
            if (!mu.binding()) {
                assertEquals(0.0, mu.variancePerUnit(), 0.0, c);
            }
        }
    }

    private static Solution perturbed(AssetUniverse u, Mandate m, double target, String name, double h) {
        int n = u.size();
        double[] lo = m.lower();
        double[] hi = m.upper();
        List<Group> groups = new java.util.ArrayList<>(m.groups());
        List<LinearConstraint> cons = new java.util.ArrayList<>(m.constraints());
        double budget = m.budget();
        double t = target;
        if (name.equals("budget")) {
            budget += h;
        } else if (name.equals("target_return")) {
            t += h;
        } else if (name.startsWith("lower:")) {
            lo[u.indexOf(name.substring(6)).orElseThrow()] += h;
        } else if (name.startsWith("upper:")) {
            hi[u.indexOf(name.substring(6)).orElseThrow()] += h;
        } else if (name.startsWith("group:")) {
            for (int k = 0; k < groups.size(); k++) {
                Group g = groups.get(k);
                if (name.equals(g.minName())) {
                    groups.set(k, new Group(g.name(), g.members(), g.min() + h, g.max()));
                } else if (name.equals(g.maxName())) {
                    groups.set(k, new Group(g.name(), g.members(), g.min(), g.max() + h));
                }
            }
        } else {
            for (int k = 0; k < cons.size(); k++) {
                LinearConstraint c = cons.get(k);
                if (c.name().equals(name)) {
                    cons.set(k, new LinearConstraint(c.name(), c.coefficients(), c.relation(), c.limit() + h));
                }
            }
        }
        return solve(u, new Mandate(budget, lo, hi, m.fixed(), groups, cons), Objective.targetReturn(t));
    }

    @Test
    void withNothingBindingTheNumericalSolutionIsTheClosedForm() {
        int n = 15;
        AssetUniverse u = GeneratedProblems.universe(n, 11);
        Mandate free = Mandate.fullyInvested(n);
        double[] lo = new double[n];
        double[] hi = new double[n];
        java.util.Arrays.fill(lo, -10);
        java.util.Arrays.fill(hi, 10);
        Group wide = new Group("Wide", List.of(0, 1, 2), -5, 5);
        Mandate loose = new Mandate(1.0, lo, hi, Map.of(), List.of(wide), List.of());
        double target = 0.06;
        Solution cf = Allocator.solve(AllocationRequest.of(u, free, Objective.targetReturn(target)));
        Solution qp = solve(u, loose, Objective.targetReturn(target));
        assertCertified(qp);
        for (int i = 0; i < n; i++) {
            assertEquals(cf.weight(i), qp.weight(i), Tolerances.CLOSED_FORM);
        }
        assertEquals(cf.multiplier("target_return").orElseThrow().variancePerUnit(),
                qp.multiplier("target_return").orElseThrow().variancePerUnit(), Tolerances.CLOSED_FORM);
        assertEquals(cf.multiplier("budget").orElseThrow().variancePerUnit(),
                qp.multiplier("budget").orElseThrow().variancePerUnit(), Tolerances.CLOSED_FORM);
        assertTrue(qp.multiplier("group:Wide:max").orElseThrow().variancePerUnit() == 0.0
                && !qp.multiplier("group:Wide:max").orElseThrow().binding());
    }

    @Test
    void aWarmStartedSweepReproducesColdSolves() {
        int n = 60;
        AssetUniverse u = GeneratedProblems.universe(n, 21);
        Mandate m = GeneratedProblems.withGroups(n);
        SolverSession session = Allocator.session(u, m, null);
        ReturnRange rr = session.returnRange();
        Solution prev = session.solve(Objective.minimumVariance());
        for (int k = 0; k <= 10; k++) {
            double target = prev.expectedReturn() + k * (rr.max() - prev.expectedReturn()) / 10.5;
            Solution warm = session.solve(Objective.targetReturn(target), prev);
            Solution cold = Allocator.session(u, m, null).solve(Objective.targetReturn(target));
            assertCertified(warm);
            for (int i = 0; i < n; i++) {
                assertEquals(cold.weight(i), warm.weight(i), Tolerances.GENERAL);
            }
            prev = warm;
        }
    }

    @Test
    void aStressedCovarianceSolvesWarmFromTheBaseCase() {
        // A stress run: a common shock added to every covariance (Σ + 0.004·11', still positive definite), the same
        // mandate and target; warm equals cold.
        int n = 40;
        AssetUniverse u = GeneratedProblems.universe(n, 37);
        Mandate m = GeneratedProblems.withGroups(n);
        double target = Allocator.returnRange(u, m).min() + 0.02;
        Solution base = solve(u, m, Objective.targetReturn(target));
        double[][] s = u.covariance();
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                s[i][j] += 0.004;
            }
        }
        AssetUniverse stressed = u.withAssumptions(u.expectedReturns(), s);
        Solution warm = Allocator.solve(new AllocationRequest(stressed, m, Objective.targetReturn(target),
                Method.NUMERICAL, null), base);
        Solution cold = solve(stressed, m, Objective.targetReturn(target));
        assertCertified(warm);
        for (int i = 0; i < n; i++) {
            assertEquals(cold.weight(i), warm.weight(i), Tolerances.GENERAL);
        }
        assertTrue(warm.variance() > base.variance());
    }

    @Test
    void fixedWeightsAreHeldAndPricedAsEqualities() {
        int n = 10;
        AssetUniverse u = GeneratedProblems.universe(n, 13);
        Mandate base = GeneratedProblems.withGroups(n);
        Mandate m = new Mandate(1.0, base.lower(), base.upper(), Map.of(2, 0.04), base.groups(), base.constraints());
        Solution s = solve(u, m, Objective.minimumVariance());
        assertCertified(s);
        assertEquals(0.04, s.weight(2), 0.0);
        Multiplier fixed = s.multiplier("fixed:" + u.assets().get(2)).orElseThrow();
        assertTrue(fixed.binding());
        double h = 1e-6;
        Mandate up = new Mandate(1.0, base.lower(), base.upper(), Map.of(2, 0.04 + h), base.groups(), base.constraints());
        Mandate dn = new Mandate(1.0, base.lower(), base.upper(), Map.of(2, 0.04 - h), base.groups(), base.constraints());
        double fd = (solve(u, up, Objective.minimumVariance()).variance()
                - solve(u, dn, Objective.minimumVariance()).variance()) / (2 * h);
        assertEquals(fd, fixed.variancePerUnit(), 1e-7);
    }

    @Test
    void boundedTangencyMaximisesTheSharpeRatioOverTheMandate() {
        int n = 20;
        AssetUniverse u = GeneratedProblems.universe(n, 17);
        Mandate m = GeneratedProblems.withGroups(n);
        double rf = 0.02;
        Solution t = solve(u, m, Objective.tangency(rf));
        assertCertified(t);
        double sharpe = (t.expectedReturn() - rf) / t.volatility();
        ReturnRange rr = Allocator.returnRange(u, m);
        SolverSession session = Allocator.session(u, m, null);
        for (int k = 1; k < 40; k++) {
            double target = rr.min() + k * (rr.max() - rr.min()) / 40;
            Solution s = session.solve(Objective.targetReturn(target));
            assertTrue((s.expectedReturn() - rf) / s.volatility() <= sharpe + 1e-12, "target " + target);
        }
    }

    @Test
    void unboundedTangencyMatchesTheClosedForm() {
        // w ∝ Σ⁻¹(μ − r_f 1) (Merton 1972) when no bound binds.
        int n = 8;
        AssetUniverse u = GeneratedProblems.universe(n, 23);
        double rf = 0.01;
        double[] lo = new double[n];
        double[] hi = new double[n];
        java.util.Arrays.fill(lo, -50);
        java.util.Arrays.fill(hi, 50);
        Mandate loose = new Mandate(1.0, lo, hi, Map.of(), List.of(), List.of());
        Solution qp = solve(u, loose, Objective.tangency(rf));
        double[] ex = new double[n];
        for (int i = 0; i < n; i++) {
            ex[i] = u.expectedReturn(i) - rf;
        }
        double[] z = Factored.of(u).solve(ex);
        double sum = 0;
        for (double v : z) {
            sum += v;
        }
        for (int i = 0; i < n; i++) {
            assertEquals(z[i] / sum, qp.weight(i), Tolerances.GENERAL);
        }
    }

    @Test
    void tangencyIsRefusedWhenNoAssetBeatsTheRiskFreeRate() {
        int n = 6;
        AssetUniverse u = GeneratedProblems.universe(n, 29);
        double top = java.util.Arrays.stream(u.expectedReturns()).max().orElseThrow();
        int at = 0;
        for (int i = 0; i < n; i++) {
            if (u.expectedReturn(i) == top) {
                at = i;
            }
        }
        double rf = 0.2;
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> solve(u, GeneratedProblems.longOnly(n), Objective.tangency(rf)));
        assertEquals(String.format(java.util.Locale.ROOT, "no tangency portfolio: no asset's expected return is above "
                + "the risk-free rate 20.00 %% (the highest is '%s' at %s), so no portfolio earns a positive excess "
                + "return; fix: use a risk-free rate below %s", u.assets().get(at),
                org.isorisk.engine.explain.Explain.percent(top), org.isorisk.engine.explain.Explain.percent(top)),
                e.getMessage());
    }

    static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

}
