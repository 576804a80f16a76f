package org.isorisk.engine.linalg;

/**
 * Cholesky factor {@code Σ = L L'} of a symmetric positive definite matrix, with solves.
 * The factor is stored row-major in a flat array (lower triangle used).
 */
public final class Cholesky {
    private final int n;
    private final double[] l;

    private Cholesky(int n, double[] l) {
        this.n = n;
        this.l = l;
    }

    /**
     * Factors {@code a} (not modified; only the lower triangle is read).
     *
     * @return the factor, or null when a pivot is not positive (the matrix is not positive definite)
     */
    public static Cholesky factor(double[][] a) {
        int n = a.length;
        double[] l = new double[n * n];
        for (int i = 0; i < n; i++) {
            System.arraycopy(a[i], 0, l, i * n, i + 1);
        }
        return factorInPlace(n, l) ? new Cholesky(n, l) : null;
    }

    /** Row-oriented left-looking factorisation: row i of L from rows 0..i-1. */
    private static boolean factorInPlace(int n, double[] l) {
        for (int i = 0; i < n; i++) {
            int ri = i * n;
            for (int j = 0; j <= i; j++) {
                int rj = j * n;
                // four partial sums break the add-latency chain of the dot product (same result to round-off)
                double s0 = 0;
                double s1 = 0;
                double s2 = 0;
                double s3 = 0;
                int k = 0;
                for (; k + 3 < j; k += 4) {
                    s0 += l[ri + k] * l[rj + k];
                    s1 += l[ri + k + 1] * l[rj + k + 1];
                    s2 += l[ri + k + 2] * l[rj + k + 2];
                    s3 += l[ri + k + 3] * l[rj + k + 3];
                }
                for (; k < j; k++) {
                    s0 += l[ri + k] * l[rj + k];
                }
                double s = l[ri + j] - ((s0 + s1) + (s2 + s3));
                if (j < i) {
                    l[ri + j] = s / l[rj + j];
                } else {
                    if (!(s > 0) || !Double.isFinite(s)) {
                        return false;
                    }
                    l[ri + i] = Math.sqrt(s);
                }
            }
            for (int j = i + 1; j < n; j++) {
                l[ri + j] = 0;
            }
        }
        return true;
    }

    /** Matrix size. */
    public int size() {
        return n;
    }

    /** Entry (i, j) of L (zero above the diagonal). */
    public double factorEntry(int i, int j) {
        return j > i ? 0 : l[i * n + j];
    }

    /** Solves {@code Σ x = b}; {@code b} is not modified. */
    public double[] solve(double[] b) {
        double[] x = b.clone();
        forward(x);
        backward(x);
        return x;
    }

    /** Solves {@code L y = b} in place. */
    public void forward(double[] x) {
        for (int i = 0; i < n; i++) {
            int ri = i * n;
            double s = x[i];
            for (int k = 0; k < i; k++) {
                s -= l[ri + k] * x[k];
            }
            x[i] = s / l[ri + i];
        }
    }

    /** Solves {@code L' x = y} in place. */
    public void backward(double[] x) {
        for (int i = n - 1; i >= 0; i--) {
            x[i] /= l[i * n + i];
            double xi = x[i];
            int ri = i * n;
            for (int k = 0; k < i; k++) {
                x[k] -= l[ri + k] * xi;
            }
        }
    }

    /** Smallest diagonal entry of L (its square bounds the smallest eigenvalue from above). */
    public double minPivot() {
        double m = Double.POSITIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            m = Math.min(m, l[i * n + i]);
        }
        return m;
    }
}
