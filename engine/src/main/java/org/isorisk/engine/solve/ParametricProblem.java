package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;

/**
 * The problem {@link ParametricQp} walks: minimise {@code w'Σw − 2q'w} subject to linear rows
 * {@code a_r'w (=|<=|>=) b_r}, the return target {@code μ'w = m} and bounds {@code lo ≤ w ≤ hi}, for every
 * attainable target m. The linear term covers surplus variance ({@code q = c/F}, c the assets' covariances with
 * the liability, F the funded ratio) and tracking error ({@code q = Σb} for a benchmark b); it is zero for plain
 * variance. Constant terms of those objectives (the liability's or the benchmark's own variance) are left out.
 *
 * <p>A fixed weight is a variable with {@code lo = hi}, never a row. Arrays are shared, not copied: the caller
 * builds them and does not modify them afterwards (Σ is n × n and a frontier is walked on it many times).
 */
final class ParametricProblem {
    final int n;
    /** Σ, symmetric to the last bit (row i is column i). */
    final double[][] sigma;
    /** q of the objective {@code w'Σw − 2q'w}. */
    final double[] linear;
    /** The return-target gradient μ. */
    final double[] mu;
    /** The rows (equalities and inequalities) other than the target, in the caller's order. */
    final List<LinearConstraint> rows;
    final double[][] a;
    final Relation[] rel;
    final double[] b;
    final double[] lo;
    final double[] hi;

    /**
     * @param sigma  covariance, n × n, symmetric (shared, not modified)
     * @param linear q, or null for plain variance (copied)
     * @param mu     expected returns, the target's gradient (copied)
     * @param rows   linear rows other than the target and the bounds (e.g. budget, groups, general rows)
     * @param lo     lower bounds, {@code -Infinity} for none (copied)
     * @param hi     upper bounds, {@code +Infinity} for none (copied); {@code lo[i] == hi[i]} fixes a weight
     */
    ParametricProblem(double[][] sigma, double[] linear, double[] mu, List<LinearConstraint> rows, double[] lo,
                      double[] hi) {
        this.n = mu.length;
        if (n < 1 || sigma.length != n || lo.length != n || hi.length != n || (linear != null && linear.length != n)) {
            throw new IllegalArgumentException("the covariance, expected returns, linear term and bounds must all "
                    + "have one entry per asset (" + n + ")");
        }
        for (int i = 0; i < n; i++) {
            if (sigma[i].length != n) {
                throw new IllegalArgumentException("row " + (i + 1) + " of the covariance has " + sigma[i].length
                        + " entries, not " + n);
            }
            for (int j = 0; j < i; j++) {
                if (sigma[i][j] != sigma[j][i]) {
                    throw new IllegalArgumentException("the covariance is not symmetric at (" + (i + 1) + ", "
                            + (j + 1) + ")");
                }
            }
            if (!(lo[i] <= hi[i]) || lo[i] == Double.POSITIVE_INFINITY || hi[i] == Double.NEGATIVE_INFINITY
                    || !Double.isFinite(mu[i]) || (linear != null && !Double.isFinite(linear[i]))) {
                throw new IllegalArgumentException("asset number " + (i + 1) + " has bounds [" + lo[i] + ", "
                        + hi[i] + "], expected return " + mu[i] + " or a linear term that is not usable");
            }
        }
        this.sigma = sigma;
        this.linear = linear == null ? new double[n] : linear.clone();
        this.mu = mu.clone();
        this.rows = List.copyOf(rows);
        int m = this.rows.size();
        this.a = new double[m][];
        this.rel = new Relation[m];
        this.b = new double[m];
        for (int r = 0; r < m; r++) {
            LinearConstraint c = this.rows.get(r);
            if (c.size() != n) {
                throw new IllegalArgumentException("constraint '" + c.name() + "' has " + c.size()
                        + " coefficients, not " + n);
            }
            a[r] = c.coefficients();
            rel[r] = c.relation();
            b[r] = c.limit();
        }
        this.lo = lo.clone();
        this.hi = hi.clone();
    }

    /**
     * The problem of a mandate over a universe: the mandate's rows in {@link Mandate#rows} order without the
     * fixed-weight rows (budget, group limits, general rows), its bounds, and each fixed weight as
     * {@code lo = hi}. The price of a fixed weight is then its variable's bound price. Σ is the universe's,
     * made exactly symmetric.
     *
     * @param linear q, or null for plain variance (copied)
     * @throws org.isorisk.engine.error.NoSolutionException when the mandate contradicts itself in a way the
     *                                                      feasibility checks name directly
     */
    static ParametricProblem of(AssetUniverse u, Mandate m, double[] linear) {
        Feasibility.checkMandate(m, u.assets());
        int n = u.size();
        List<LinearConstraint> all = m.rows(u.assets());
        List<LinearConstraint> rows = new ArrayList<>();
        int fixedRows = m.fixed().size();
        for (int r = 0; r < all.size(); r++) {
            if (r < 1 || r > fixedRows) { // rows 1..fixedRows are the fixed weights, in the map's order
                rows.add(all.get(r));
            }
        }
        double[] lo = m.lower();
        double[] hi = m.upper();
        for (Map.Entry<Integer, Double> e : m.fixed().entrySet()) {
            lo[e.getKey()] = e.getValue();
            hi[e.getKey()] = e.getValue();
        }
        double[][] sigma = u.covariance();
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < i; j++) {
                double v = 0.5 * (sigma[i][j] + sigma[j][i]);
                sigma[i][j] = v;
                sigma[j][i] = v;
            }
        }
        return new ParametricProblem(sigma, linear, u.expectedReturns(), rows, lo, hi);
    }

    /** Number of rows (the target not counted). */
    int rowCount() {
        return a.length;
    }

    /** Objective {@code w'Σw − 2q'w} from a product {@code Σw} computed afresh. */
    double objective(double[] w, double[] sigmaW) {
        double v = 0;
        for (int i = 0; i < n; i++) {
            v += w[i] * (sigmaW[i] - 2 * linear[i]);
        }
        return v;
    }
}
