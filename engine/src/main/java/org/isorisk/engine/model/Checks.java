package org.isorisk.engine.model;

import org.isorisk.engine.error.InputException;

/** Preconditions for value constructors; each returns its argument so it can be used inline. */
public final class Checks {
    private Checks() {
    }

    /** Returns {@code v} when finite, else fails naming {@code what}. */
    public static double finite(double v, String what) {
        if (!Double.isFinite(v)) {
            throw InputException.of(what + " must be a finite number").value(v).build();
        }
        return v;
    }

    /** Returns a copy of {@code a} after checking its length and that every entry is finite. */
    public static double[] finiteCopy(double[] a, int length, String what) {
        if (a == null || a.length != length) {
            throw InputException.of(what + " must have " + length + " entries, one per asset")
                    .value(a == null ? "none" : a.length + " entries").build();
        }
        for (double v : a) {
            finite(v, what);
        }
        return a.clone();
    }

    /** Deep copy of a square matrix of side {@code n}, checking shape and finiteness. */
    public static double[][] squareCopy(double[][] m, int n, String what) {
        if (m == null || m.length != n) {
            throw InputException.of(what + " must be " + n + " by " + n).build();
        }
        double[][] c = new double[n][];
        for (int i = 0; i < n; i++) {
            if (m[i] == null || m[i].length != n) {
                throw InputException.of(what + " must be " + n + " by " + n + " (row " + (i + 1) + " differs)").build();
            }
            c[i] = m[i].clone();
            for (double v : c[i]) {
                finite(v, what);
            }
        }
        return c;
    }

    static double[][] deepCopy(double[][] m) {
        double[][] c = new double[m.length][];
        for (int i = 0; i < m.length; i++) {
            c[i] = m[i].clone();
        }
        return c;
    }
}
