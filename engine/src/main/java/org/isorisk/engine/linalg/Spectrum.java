package org.isorisk.engine.linalg;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;

/**
 * Extreme eigenvalues of a symmetric matrix, for condition numbers and positive-definiteness reports.
 *
 * @param smallest smallest eigenvalue
 * @param largest  largest eigenvalue
 * @param exact    true when computed by a full symmetric eigendecomposition, false for the iterative estimate
 */
public record Spectrum(double smallest, double largest, boolean exact) {

    /** Size up to which the full eigendecomposition is used; above it, power and inverse iteration. */
    public static final int EXACT_LIMIT = 400;

    /** 2-norm condition number {@code λmax/λmin} (infinite when λmin ≤ 0). */
    public double conditionNumber() {
        return smallest > 0 ? largest / smallest : Double.POSITIVE_INFINITY;
    }

    /** Extreme eigenvalues of symmetric {@code a} (not modified). */
    public static Spectrum of(double[][] a) {
        return of(a, null);
    }

    /**
     * Extreme eigenvalues of symmetric {@code a}; when {@code chol} (its Cholesky factor) is given and the
     * matrix is large, the smallest eigenvalue is found by inverse iteration with it.
     */
    public static Spectrum of(double[][] a, Cholesky chol) {
        int n = a.length;
        if (n <= EXACT_LIMIT || chol == null) {
            if (n > EXACT_LIMIT * 3 && chol == null) {
                double big = powerIteration(a, null);
                return new Spectrum(Double.NaN, big, false);
            }
            double[] ev = new EigenDecomposition(new Array2DRowRealMatrix(a, false)).getRealEigenvalues();
            double lo = Double.POSITIVE_INFINITY;
            double hi = Double.NEGATIVE_INFINITY;
            for (double v : ev) {
                lo = Math.min(lo, v);
                hi = Math.max(hi, v);
            }
            return new Spectrum(lo, hi, true);
        }
        double big = powerIteration(a, null);
        double invSmall = powerIteration(a, chol);
        return new Spectrum(1.0 / invSmall, big, false);
    }

    /** Largest eigenvalue of a (chol null) or of a⁻¹ (chol given), by power iteration from a fixed start. */
    private static double powerIteration(double[][] a, Cholesky chol) {
        int n = a.length;
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = 1.0 + 0.37 * Math.sin(1.0 + i); // fixed, not aligned with any structure in particular
        }
        normalise(x);
        double lambda = 0;
        for (int it = 0; it < 200; it++) {
            double[] y = chol == null ? multiply(a, x) : chol.solve(x);
            double next = dot(x, y);
            normalise(y);
            x = y;
            if (it > 5 && Math.abs(next - lambda) <= 1e-6 * Math.abs(next)) {
                return next;
            }
            lambda = next;
        }
        return lambda;
    }

    private static double[] multiply(double[][] a, double[] x) {
        int n = a.length;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double s = 0;
            double[] r = a[i];
            for (int j = 0; j < n; j++) {
                s += r[j] * x[j];
            }
            y[i] = s;
        }
        return y;
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    private static void normalise(double[] x) {
        double s = Math.sqrt(dot(x, x));
        for (int i = 0; i < x.length; i++) {
            x[i] /= s;
        }
    }
}
