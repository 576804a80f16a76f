package org.isorisk.engine.solve;

import org.isorisk.engine.model.Relation;

/**
 * The internal form of a mandate problem for the active-set QP: minimise {@code w'Σw} subject to general rows
 * {@code a_r'w (=|<=|>=) b_r} and per-asset bounds {@code lo ≤ w ≤ hi}. A fixed weight is a variable with
 * {@code lo = hi}: it is eliminated, never a dense row. Arrays are shared, not copied: the caller builds them and
 * does not modify them afterwards.
 */
final class QpProblem {
    final int n;
    final double[][] sigma;
    final double[] lo;
    final double[] hi;
    final double[][] a;
    final Relation[] rel;
    final double[] b;
    final String[] names;
    final double[] rowNorm;

    QpProblem(double[][] sigma, double[] lo, double[] hi, double[][] a, Relation[] rel, double[] b, String[] names) {
        this.n = lo.length;
        this.sigma = sigma;
        this.lo = lo;
        this.hi = hi;
        this.a = a;
        this.rel = rel;
        this.b = b;
        this.names = names;
        this.rowNorm = new double[a.length];
        for (int r = 0; r < a.length; r++) {
            double s = 0;
            for (double v : a[r]) {
                s += v * v;
            }
            rowNorm[r] = Math.sqrt(s);
        }
    }

    int rows() {
        return a.length;
    }

    /** {@code a_r'w}. */
    double rowValue(int r, double[] w) {
        double s = 0;
        double[] ar = a[r];
        for (int i = 0; i < n; i++) {
            s += ar[i] * w[i];
        }
        return s;
    }

    /** Largest violation of a row or bound by {@code w}, relative to {@code max(1, |limit|)}. */
    double violation(double[] w) {
        double v = 0;
        for (int r = 0; r < a.length; r++) {
            double d = rowValue(r, w) - b[r];
            double s = Math.max(1, Math.abs(b[r]));
            v = Math.max(v, switch (rel[r]) {
                case EQUAL -> Math.abs(d) / s;
                case AT_MOST -> Math.max(0, d) / s;
                case AT_LEAST -> Math.max(0, -d) / s;
            });
        }
        for (int i = 0; i < n; i++) {
            v = Math.max(v, Math.max(lo[i] - w[i], w[i] - hi[i]));
        }
        return v;
    }
}
