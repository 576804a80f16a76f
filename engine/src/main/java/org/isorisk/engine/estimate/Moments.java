package org.isorisk.engine.estimate;

import java.util.stream.IntStream;
import org.isorisk.engine.linalg.Dense;

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

    /**
     * {@code G = A'B / divisor} for columns {@code a[i][t]}, {@code b[j][t]}; symmetric when a == b. Entries are
     * computed in 2 × 2 blocks (four dot products sharing each load), block rows spread over the cores.
     */
    static double[][] cross(double[][] a, double[][] b, double divisor) {
        int n = a.length;
        double[][] g = new double[n][n];
        boolean symmetric = a == b;
        int blocks = (n + 1) / 2;
        IntStream.range(0, blocks).parallel().forEach(bi -> {
            int i = 2 * bi;
            int jStart = symmetric ? i : 0;
            for (int j = jStart; j < n; j += 2) {
                if (i + 1 < n && j + 1 < n) {
                    block(a[i], a[i + 1], b[j], b[j + 1], g, i, j, divisor);
                } else {
                    for (int ii = i; ii < Math.min(i + 2, n); ii++) {
                        for (int jj = j; jj < Math.min(j + 2, n); jj++) {
                            g[ii][jj] = Dense.dot(a[ii], b[jj]) / divisor;
                        }
                    }
                }
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

    private static void block(double[] x0, double[] x1, double[] y0, double[] y1, double[][] g, int i, int j,
                              double divisor) {
        int len = x0.length;
        double s00 = 0;
        double s01 = 0;
        double s10 = 0;
        double s11 = 0;
        double u00 = 0;
        double u01 = 0;
        double u10 = 0;
        double u11 = 0;
        int t = 0;
        for (; t + 1 < len; t += 2) {
            double a0 = x0[t];
            double a1 = x1[t];
            double b0 = y0[t];
            double b1 = y1[t];
            s00 += a0 * b0;
            s01 += a0 * b1;
            s10 += a1 * b0;
            s11 += a1 * b1;
            double c0 = x0[t + 1];
            double c1 = x1[t + 1];
            double d0 = y0[t + 1];
            double d1 = y1[t + 1];
            u00 += c0 * d0;
            u01 += c0 * d1;
            u10 += c1 * d0;
            u11 += c1 * d1;
        }
        if (t < len) {
            s00 += x0[t] * y0[t];
            s01 += x0[t] * y1[t];
            s10 += x1[t] * y0[t];
            s11 += x1[t] * y1[t];
        }
        g[i][j] = (s00 + u00) / divisor;
        g[i][j + 1] = (s01 + u01) / divisor;
        g[i + 1][j] = (s10 + u10) / divisor;
        g[i + 1][j + 1] = (s11 + u11) / divisor;
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
