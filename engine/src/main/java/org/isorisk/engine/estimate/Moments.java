package org.isorisk.engine.estimate;

import java.util.stream.IntStream;

/**
 * Means and cross-products of return columns. Columns are stored one array per asset ({@code x[j][t]}) so
 * that every cross-product is a contiguous dot product; the N(N+1)/2 products are spread over the cores.
 */
final class Moments {
    private Moments() {
    }

    /** Column means of complete data {@code x[j][t]}. */
    static double[] means(double[][] x) {
        int n = x.length;
        double[] m = new double[n];
        for (int j = 0; j < n; j++) {
            m[j] = mean(x[j]);
        }
        return m;
    }

    static double mean(double[] a) {
        // Two passes: the correction term removes most of the rounding of the first (Higham, Accuracy and
        // Stability of Numerical Algorithms, 2nd ed., §1.9: corrected two-pass algorithm).
        double s = 0;
        for (double v : a) {
            s += v;
        }
        double m = s / a.length;
        double c = 0;
        for (double v : a) {
            c += v - m;
        }
        return m + c / a.length;
    }

    /** Columns minus their means (new arrays). */
    static double[][] centred(double[][] x, double[] means) {
        double[][] c = new double[x.length][];
        for (int j = 0; j < x.length; j++) {
            double[] col = x[j];
            double mj = means[j];
            double[] out = new double[col.length];
            for (int t = 0; t < col.length; t++) {
                out[t] = col[t] - mj;
            }
            c[j] = out;
        }
        return c;
    }

    /** {@code G = A'B / divisor} for columns {@code a[i][t]}, {@code b[j][t]}; symmetric when a == b. */
    static double[][] cross(double[][] a, double[][] b, double divisor) {
        int n = a.length;
        double[][] g = new double[n][n];
        boolean symmetric = a == b;
        IntStream.range(0, n).parallel().forEach(i -> {
            double[] ai = a[i];
            double[] gi = g[i];
            for (int j = symmetric ? i : 0; j < n; j++) {
                gi[j] = dot(ai, b[j]) / divisor;
            }
        });
        if (symmetric) {
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < i; j++) {
                    g[i][j] = g[j][i];
                }
            }
        }
        return g;
    }

    /** Dot product with four partial sums (shorter dependency chains; the JIT keeps them in registers). */
    static double dot(double[] x, double[] y) {
        int len = x.length;
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        double s3 = 0;
        int t = 0;
        for (; t + 3 < len; t += 4) {
            s0 += x[t] * y[t];
            s1 += x[t + 1] * y[t + 1];
            s2 += x[t + 2] * y[t + 2];
            s3 += x[t + 3] * y[t + 3];
        }
        for (; t < len; t++) {
            s0 += x[t] * y[t];
        }
        return (s0 + s1) + (s2 + s3);
    }

    /** Elementwise power of every column (new arrays). */
    static double[][] power(double[][] x, int p) {
        double[][] out = new double[x.length][];
        for (int j = 0; j < x.length; j++) {
            double[] col = x[j];
            double[] o = new double[col.length];
            for (int t = 0; t < col.length; t++) {
                double v = col[t];
                o[t] = p == 2 ? v * v : p == 3 ? v * v * v : Math.pow(v, p);
            }
            out[j] = o;
        }
        return out;
    }

    /**
     * Pairwise-complete covariance of columns with missing values (NaN): entry (i, j) uses the rows where both
     * are present, centred on the means over those rows, divided by {@code n_ij − 1} (as R's
     * {@code cov(use = "pairwise.complete.obs")} does). Entries with fewer than two common rows are NaN.
     *
     * @param counts filled with the number of common rows per pair
     */
    static double[][] pairwiseCovariance(double[][] x, int[][] counts) {
        int n = x.length;
        int len = n == 0 ? 0 : x[0].length;
        double[][] c = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = i; j < n; j++) {
                double[] a = x[i];
                double[] b = x[j];
                int k = 0;
                double sa = 0;
                double sb = 0;
                for (int t = 0; t < len; t++) {
                    if (!Double.isNaN(a[t]) && !Double.isNaN(b[t])) {
                        k++;
                        sa += a[t];
                        sb += b[t];
                    }
                }
                double v = Double.NaN;
                if (k >= 2) {
                    double ma = sa / k;
                    double mb = sb / k;
                    double s = 0;
                    for (int t = 0; t < len; t++) {
                        if (!Double.isNaN(a[t]) && !Double.isNaN(b[t])) {
                            s += (a[t] - ma) * (b[t] - mb);
                        }
                    }
                    v = s / (k - 1);
                }
                c[i][j] = v;
                c[j][i] = v;
                counts[i][j] = k;
                counts[j][i] = k;
            }
        }
        return c;
    }
}
