package org.isorisk.engine.support;

import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.ojalgo.matrix.store.R064Store;
import org.ojalgo.optimisation.Optimisation;
import org.ojalgo.optimisation.convex.ConvexSolver;

/**
 * An independent solution of {@code min w'Σw − 2q'w} (q = 0 unless given) subject to the budget, an optional
 * return target, per-asset bounds, and the mandate's group limits and general rows by ojAlgo's active-set convex QP
 * (general-purpose library). Per the project's library notes only
 * {@code isOptimal()} results are trusted, the active-set algorithm is forced (ojAlgo switches to ADMM above
 * about 300 variables otherwise), and only weights are compared: ojAlgo's duals are scaled and reordered.
 */
public final class OjAlgoReference {
    private OjAlgoReference() {
    }

    /**
     * Weights of the minimum-variance portfolio.
     *
     * @param target expected return to meet exactly, or NaN for none
     * @return the weights, or null when ojAlgo does not report an optimal solution
     */
    public static double[] weights(AssetUniverse u, Mandate m, double target) {
        return weights(u, m, target, null);
    }

    /**
     * Weights of the portfolio minimising {@code w'Σw − 2q'w}.
     *
     * @param linear q, or null for none
     */
    public static double[] weights(AssetUniverse u, Mandate m, double target, double[] linear) {
        int n = u.size();
        double[][] q = u.covariance();
        for (double[] row : q) {
            for (int j = 0; j < n; j++) {
                row[j] *= 2; // ojAlgo minimises ½x'Qx − c'x; Q = 2Σ makes it w'Σw
            }
        }
        // An asset pinned by equal bounds goes in as an equality row: two opposing inequalities on the same
        // variable are degenerate for an active-set method, and ojAlgo then reports a non-optimal point as optimal.
        int pinned = 0;
        for (int i = 0; i < n; i++) {
            pinned += m.lower(i) == m.upper(i) ? 1 : 0;
        }
        int eq = (Double.isNaN(target) ? 1 : 2) + pinned;
        double[][] ae = new double[eq][n];
        double[] be = new double[eq];
        java.util.Arrays.fill(ae[0], 1.0);
        be[0] = m.budget();
        int e = 1;
        if (!Double.isNaN(target)) {
            ae[1] = u.expectedReturns();
            be[1] = target;
            e = 2;
        }
        int rows = 0;
        for (int i = 0; i < n; i++) {
            if (m.lower(i) == m.upper(i)) {
                ae[e][i] = 1;
                be[e++] = m.lower(i);
                continue;
            }
            rows += (Double.isFinite(m.upper(i)) ? 1 : 0) + (Double.isFinite(m.lower(i)) ? 1 : 0);
        }
        // groups and general rows; fixed weights are read from equal bounds only, as before
        java.util.List<org.isorisk.engine.model.LinearConstraint> general = new java.util.ArrayList<>();
        for (org.isorisk.engine.model.LinearConstraint c : m.rows(u.assets())) {
            if (!c.name().equals("budget") && !c.name().startsWith("fixed:")) {
                general.add(c);
            }
        }
        for (org.isorisk.engine.model.LinearConstraint c : general) {
            rows += c.relation() == org.isorisk.engine.model.Relation.EQUAL ? 2 : 1;
        }
        double[][] ai = new double[rows][n];
        double[] bi = new double[rows];
        int r = 0;
        for (org.isorisk.engine.model.LinearConstraint c : general) {
            double sign = c.relation() == org.isorisk.engine.model.Relation.AT_LEAST ? -1 : 1;
            for (int j = 0; j < n; j++) {
                ai[r][j] = sign * c.coefficient(j);
            }
            bi[r++] = sign * c.limit();
            if (c.relation() == org.isorisk.engine.model.Relation.EQUAL) {
                for (int j = 0; j < n; j++) {
                    ai[r][j] = -c.coefficient(j);
                }
                bi[r++] = -c.limit();
            }
        }
        for (int i = 0; i < n; i++) {
            if (m.lower(i) == m.upper(i)) {
                continue;
            }
            if (Double.isFinite(m.upper(i))) {
                ai[r][i] = 1;
                bi[r++] = m.upper(i);
            }
            if (Double.isFinite(m.lower(i))) {
                ai[r][i] = -1;
                bi[r++] = -m.lower(i);
            }
        }
        ConvexSolver.Builder b = ConvexSolver.newBuilder()
                .objective(R064Store.FACTORY.rows(q), linearTerm(n, linear))
                .equalities(R064Store.FACTORY.rows(ae), R064Store.FACTORY.column(be))
                .inequalities(R064Store.FACTORY.rows(ai), R064Store.FACTORY.column(bi));
        Optimisation.Options opt = new Optimisation.Options();
        opt.convex().algorithm(ConvexSolver.Algorithm.ACTIVE_SET);
        Optimisation.Result res = b.build(opt).solve();
        if (!res.getState().isOptimal()) {
            return null;
        }
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = res.doubleValue(i);
        }
        return w;
    }

    /** ojAlgo's c in ½x'Qx − c'x: 2q. */
    private static R064Store linearTerm(int n, double[] linear) {
        R064Store c = R064Store.FACTORY.make(n, 1);
        if (linear != null) {
            for (int i = 0; i < n; i++) {
                c.set(i, 0, 2 * linear[i]);
            }
        }
        return c;
    }
}
