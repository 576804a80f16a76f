package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.NoSolutionException;
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
        // Y = Σ⁻¹A' column by column.
        double[][] y = new double[k][];
        for (int r = 0; r < k; r++) {
            y[r] = f.solve(rows.get(r).coefficients());
        }
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
        double[][] sigma = f.sigma();
        double var = 0;
        for (int i = 0; i < n; i++) {
            double s = 0;
            for (int j = 0; j < n; j++) {
                s += sigma[i][j] * w[j];
            }
            var += w[i] * s;
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
        Certificate cert = Kkt.certify(sigma, w, rows, nu, null, null, null, null,
                f.spectrum().conditionNumber(), settings.closedFormTolerance(), true);
        List<String> allNotes = new ArrayList<>(notes);
        allNotes.add("The covariance matrix is positive definite, so the problem is strictly convex: the Lagrange "
                + "(first-order) condition is sufficient, and this minimum is global and unique.");
        return new Solution(Method.CLOSED_FORM, f.universe().assets(), w, ret, var, vol, mult, cert, allNotes);
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

    private static NoSolutionException dependent(int i, double[][] l, List<LinearConstraint> rows) {
        List<String> names = new ArrayList<>();
        String me = rows.get(i).name();
        List<String> earlier = new ArrayList<>();
        for (int p = 0; p < i; p++) {
            if (Math.abs(l[i][p]) > 1e-9 * Math.max(1, Math.abs(l[p][p]))) {
                earlier.add(rows.get(p).name());
            }
        }
        if (earlier.isEmpty()) {
            for (int p = 0; p < i; p++) {
                earlier.add(rows.get(p).name());
            }
        }
        names.addAll(earlier);
        names.add(me);
        String why;
        if (me.equals("target_return") && earlier.equals(List.of("budget"))) {
            why = "every asset has the same expected return, so the return target's gradient μ is parallel to the "
                    + "budget's gradient 1 and adds no direction of its own";
        } else if (earlier.isEmpty()) {
            why = "its coefficients are all zero";
        } else {
            why = "its gradient is a linear combination of the gradients of " + String.join(", ", earlier);
        }
        String msg = String.format(Locale.ROOT,
                "the constraint qualification fails: constraint '%s' %s; its multiplier is not unique%s; fix: drop "
                        + "'%s' or one of the constraints it repeats", me,
                earlier.isEmpty() ? "is empty" : "depends on " + String.join(", ", earlier) + ": " + why,
                me.equals("target_return") ? " and the target is either met by every portfolio or by none" : "",
                me);
        return new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, msg, names);
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
