package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;

/**
 * Minimum variance subject to linear equalities {@code Aw = b}, from the Lagrangian
 * {@code L = w'Σw − ν'(Aw − b)}: stationarity {@code 2Σw = A'ν} gives {@code ν = 2(AΣ⁻¹A')⁻¹b} and
 * {@code w = ½Σ⁻¹A'ν}; {@code ν_k = ∂V*∂b_k} by the envelope theorem.
 */
final class ClosedForm {
    private ClosedForm() {
    }

    /** Solves with the given equality rows (every row must be {@link Relation#EQUAL}). */
    static Solution solve(Factored f, List<LinearConstraint> rows, SolverSettings settings, List<String> notes) {
        int n = f.universe().size();
        int k = rows.size();
        for (LinearConstraint c : rows) {
            if (c.relation() != Relation.EQUAL) {
                throw new IllegalArgumentException("closed form takes equalities only: " + c.name());
            }
        }
        if (n == 1) {
            return singleAsset(f, rows, settings, notes);
        }
        // Y = Σ⁻¹A', all gradients solved together (and remembered across a sweep).
        List<double[]> gradients = new ArrayList<>(k);
        for (LinearConstraint c : rows) {
            gradients.add(c.coefficients());
        }
        double[][] y = f.solveRemembered(gradients);
        double[][] m = new double[k][k];
        for (int r = 0; r < k; r++) {
            for (int s = 0; s <= r; s++) {
                double v = rows.get(r).evaluate(y[s]);
                m[r][s] = v;
                m[s][r] = v;
            }
        }
        double[] b = new double[k];
        for (int r = 0; r < k; r++) {
            b[r] = rows.get(r).limit();
        }
        double[] nu = solveGram(m, b, rows, settings.rankTolerance());
        for (int r = 0; r < k; r++) {
            nu[r] *= 2;
        }
        double[] w = new double[n];
        for (int r = 0; r < k; r++) {
            double h = 0.5 * nu[r];
            for (int i = 0; i < n; i++) {
                w[i] += h * y[r][i];
            }
        }
        return assemble(f, w, rows, nu, settings, notes);
    }

    static Solution assemble(Factored f, double[] w, List<LinearConstraint> rows, double[] nu, SolverSettings settings,
                             List<String> notes) {
        int n = w.length;
        double[] sw = f.sigmaTimes(w);
        double var = 0;
        for (int i = 0; i < n; i++) {
            var += w[i] * sw[i];
        }
        double vol = Math.sqrt(Math.max(0, var));
        double ret = 0;
        for (int i = 0; i < n; i++) {
            ret += f.universe().expectedReturn(i) * w[i];
        }
        List<Multiplier> mult = new ArrayList<>();
        for (int r = 0; r < rows.size(); r++) {
            mult.add(new Multiplier(rows.get(r).name(), nu[r], vol > 0 ? nu[r] / (2 * vol) : Double.NaN, true));
        }
        Certificate cert = Kkt.certifyProduct(sw, w, rows, nu, null, null, null, null,
                f.spectrum().conditionNumber(), settings.closedFormTolerance(), true);
        List<String> allNotes = new ArrayList<>(notes);
        allNotes.add("The covariance matrix is positive definite, so the problem is strictly convex: the Lagrange "
                + "(first-order) condition is sufficient, and this minimum is global and unique.");
        return new Solution(Method.CLOSED_FORM, f.universe().assets(), w, ret, var, vol, mult, cert, allNotes);
    }

    /**
     * One asset: every equality row fixes its single weight. The rows must agree on that weight; then the
     * portfolio is the asset itself and only the first row's multiplier is determined.
     */
    private static Solution singleAsset(Factored f, List<LinearConstraint> rows, SolverSettings settings,
                                        List<String> notes) {
        String asset = f.universe().assets().get(0);
        LinearConstraint first = null;
        for (LinearConstraint c : rows) {
            if (c.coefficient(0) != 0) {
                first = c;
                break;
            }
        }
        if (first == null) {
            throw new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION,
                    "no constraint fixes the weight of the only asset '" + asset + "'; fix: give a budget", List.of());
        }
        double w = first.limit() / first.coefficient(0);
        for (LinearConstraint c : rows) {
            if (c == first) {
                continue;
            }
            double lhs = c.coefficient(0) * w;
            boolean met = Math.abs(lhs - c.limit()) <= settings.closedFormTolerance() * Math.max(1, Math.abs(c.limit()));
            if (!met && c.name().equals("target_return")) {
                throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                        "only one asset ('%s'): the only portfolio that meets '%s' holds %s of it and returns %s, "
                                + "so the return target %s cannot be met; fix: set the target to %s, drop it, or add "
                                + "assets", asset, first.name(), Explain.percent(w), Explain.percent(lhs),
                        Explain.percent(c.limit()),
                        Explain.percent(lhs)), List.of(first.name(), c.name()));
            }
            if (!met) {
                throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                        "only one asset ('%s'): constraint '%s' sets its weight to %s, which gives '%s' the value "
                                + "%s instead of its limit %s; fix: drop one of the two constraints or add assets",
                        asset, first.name(), Explain.percent(w), c.name(), Explain.percent(lhs),
                        Explain.percent(c.limit())), List.of(first.name(), c.name()));
            }
            throw new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, String.format(
                    Locale.ROOT, "the constraint qualification fails: only one asset ('%s'): constraint '%s' already "
                            + "fixes the portfolio (%s of it), so '%s' adds nothing and its multiplier is not unique; "
                            + "fix: drop '%s'", asset, first.name(), Explain.percent(w), c.name(), c.name()),
                    List.of(first.name(), c.name()));
        }
        double[] weights = {w};
        // Stationarity 2σ²w = ν·a: the first row's multiplier is the only one.
        double[] nu = new double[rows.size()];
        nu[rows.indexOf(first)] = 2 * f.universe().covariance(0, 0) * w / first.coefficient(0);
        return assemble(f, weights, rows, nu, settings, notes);
    }

    /**
     * Solves the k×k Gram system {@code M x = b} by Cholesky with a dependence check: a row whose pivot falls
     * below {@code tol} of its diagonal is (nearly) a combination of the rows before it, and the constraint
     * qualification fails; the error names it and the rows it depends on.
     */
    static double[] solveGram(double[][] m, double[] b, List<LinearConstraint> rows, double tol) {
        int k = b.length;
        double[][] l = new double[k][k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j <= i; j++) {
                double s = m[i][j];
                for (int p = 0; p < j; p++) {
                    s -= l[i][p] * l[j][p];
                }
                if (j < i) {
                    l[i][j] = s / l[j][j];
                } else {
                    if (!(s > tol * Math.abs(m[i][i])) || !(m[i][i] > 0)) {
                        throw dependent(i, l, rows);
                    }
                    l[i][i] = Math.sqrt(s);
                }
            }
        }
        double[] x = b.clone();
        for (int i = 0; i < k; i++) {
            double s = x[i];
            for (int p = 0; p < i; p++) {
                s -= l[i][p] * x[p];
            }
            x[i] = s / l[i][i];
        }
        for (int i = k - 1; i >= 0; i--) {
            double s = x[i];
            for (int p = i + 1; p < k; p++) {
                s -= l[p][i] * x[p];
            }
            x[i] = s / l[i][i];
        }
        return x;
    }

    /**
     * Row i's gradient is (to the rank tolerance) a combination {@code a_i = Σ_p c_p a_p} of the rows before it.
     * The coefficients follow from the partial Gram factor: {@code c = L₍<i₎'⁻¹ L[i][0..i)}. The message names
     * the rows with a non-negligible coefficient and says whether row i's limit agrees with theirs (then it is
     * redundant) or contradicts them (then no portfolio meets all of them).
     */
    private static NoSolutionException dependent(int i, double[][] l, List<LinearConstraint> rows) {
        if (!(rows.get(i).evaluate(rows.get(i).coefficients()) > 0)) {
            String me = rows.get(i).name();
            return new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION,
                    "the constraint qualification fails: constraint '" + me + "' has all coefficients zero, so it "
                            + "adds no direction of its own; fix: drop '" + me + "'", List.of(me));
        }
        double[] c = new double[i];
        for (int p = 0; p < i; p++) {
            c[p] = l[i][p];
        }
        for (int p = i - 1; p >= 0; p--) {
            double s = c[p];
            for (int q = p + 1; q < i; q++) {
                s -= l[q][p] * c[q];
            }
            c[p] = s / l[p][p];
        }
        double biggest = 0;
        for (double v : c) {
            biggest = Math.max(biggest, Math.abs(v));
        }
        List<String> earlier = new ArrayList<>();
        for (int p = 0; p < i; p++) {
            if (Math.abs(c[p]) > 1e-8 * biggest) {
                earlier.add(rows.get(p).name());
            } else {
                c[p] = 0;
            }
        }
        double implied = 0;
        double scale = Math.abs(rows.get(i).limit());
        for (int p = 0; p < i; p++) {
            implied += c[p] * rows.get(p).limit();
            scale = Math.max(scale, Math.abs(c[p] * rows.get(p).limit()));
        }
        boolean consistent = Math.abs(implied - rows.get(i).limit()) <= 1e-9 * Math.max(1, scale);
        double single = Double.NaN;
        for (int p = 0; p < i && earlier.size() == 1; p++) {
            if (c[p] != 0) {
                single = c[p];
            }
        }
        return dependentRows(rows, i, single, earlier, consistent);
    }

    /**
     * The message for a dependent row i; {@code single} is its multiple of the one earlier row it repeats
     * (NaN when it combines several).
     */
    private static NoSolutionException dependentRows(List<LinearConstraint> rows, int i, double single,
                                                     List<String> earlier, boolean consistent) {
        LinearConstraint row = rows.get(i);
        String me = row.name();
        List<String> names = new ArrayList<>(earlier);
        names.add(me);
        String others = quoteAll(earlier);
        String why;
        String consequence;
        if (me.equals("target_return") && earlier.equals(List.of("budget"))) {
            double common = row.coefficient(0);
            double budget = 0;
            for (LinearConstraint r : rows) {
                if (r.name().equals("budget")) {
                    budget = r.limit();
                }
            }
            double implied = common * budget;
            why = String.format(Locale.ROOT, "every asset has the same expected return (%s), so the return target's "
                    + "gradient μ is parallel to the budget's gradient 1 and adds no direction of its own",
                    Explain.percent(common));
            consequence = consistent
                    ? String.format(Locale.ROOT, "every portfolio within the budget returns %s, so the target %s is "
                            + "met by all of them and its multiplier is not unique", Explain.percent(implied),
                            Explain.percent(row.limit()))
                    : String.format(Locale.ROOT, "every portfolio within the budget returns %s, so the target %s is "
                            + "met by none of them", Explain.percent(implied), Explain.percent(row.limit()));
        } else {
            why = earlier.size() == 1
                    ? (Math.abs(single - 1) <= 1e-9 ? "it has the same coefficients as '" + earlier.get(0) + "' (it repeats it)"
                            : String.format(Locale.ROOT, "its coefficients are %s times those of '%s'", trim(single),
                            earlier.get(0)))
                    : "its gradient is a linear combination of the gradients of " + others;
            consequence = consistent
                    ? "the limits agree, so it adds nothing and the multipliers are not unique"
                    : "the limits contradict each other, so no portfolio meets all of them";
        }
        String msg = String.format(Locale.ROOT,
                "the constraint qualification fails: constraint '%s' depends on %s: %s; %s; fix: drop '%s' or one "
                        + "of the constraints it depends on", me, others, why, consequence, me);
        return new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, msg, names);
    }

    private static String quoteAll(List<String> names) {
        List<String> q = new ArrayList<>();
        for (String s : names) {
            q.add("'" + s + "'");
        }
        return String.join(", ", q);
    }

    /** A coefficient as short text: 1, -1, 0.5, ... */
    private static String trim(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        return String.format(Locale.ROOT, "%.6g", v);
    }

    /** Merton's (1972) A, B, C, D for the universe and budget. */
    static MertonScalars merton(Factored f, double budget) {
        int n = f.universe().size();
        double[] ones = new double[n];
        java.util.Arrays.fill(ones, 1.0);
        double[] mu = f.universe().expectedReturns();
        double[] si1 = f.solve(ones);
        double[] siMu = f.solve(mu);
        double a = 0;
        double b = 0;
        double c = 0;
        for (int i = 0; i < n; i++) {
            a += si1[i] * mu[i];
            b += siMu[i] * mu[i];
            c += si1[i];
        }
        return new MertonScalars(a, b, c, b * c - a * a, budget);
    }
}
