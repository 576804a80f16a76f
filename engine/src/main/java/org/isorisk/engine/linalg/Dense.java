package org.isorisk.engine.linalg;

/** Dense kernels on symmetric matrices stored as row arrays. */
public final class Dense {
    private Dense() {
    }

    /** Size from which the product is split over two threads (below it, a fork costs more than it saves). */
    public static final int PARALLEL_MIN = 512;

    /**
     * {@code y = A x} for a symmetric {@code a}, computed as {@code Σ_j x_j · (row j of A)}: row-wise axpy loops
     * the JIT compiler vectorises (the dot-product form cannot be). For an asymmetric matrix this is {@code A'x}.
     * Large matrices are split by output range over the shared threads; each entry is summed in the same order
     * whatever the split, so the result does not depend on the thread count.
     *
     * @param a symmetric matrix (not modified)
     * @param x vector (not modified)
     */
    public static double[] multiplySymmetric(double[][] a, double[] x) {
        return multiplySymmetric(a, x, Math.min(2, Runtime.getRuntime().availableProcessors()));
    }

    /**
     * {@link #multiplySymmetric(double[][], double[])} with at most {@code threads} threads.
     *
     * @param a       symmetric matrix (not modified)
     * @param x       vector (not modified)
     * @param threads at most this many threads (1: the calling thread alone)
     */
    public static double[] multiplySymmetric(double[][] a, double[] x, int threads) {
        int n = x.length;
        double[] y = new double[n];
        int parts = n >= PARALLEL_MIN ? Math.max(1, threads) : 1;
        int[] cut = Workers.split(0, n, parts, false);
        Workers.run(parts, part -> {
            int from = cut[part];
            int to = cut[part + 1];
            for (int j = 0; j < n; j++) {
                double xj = x[j];
                double[] r = a[j];
                for (int i = from; i < to; i++) {
                    y[i] += xj * r[i];
                }
            }
        });
        return y;
    }

    /**
     * {@code A x_c} for several vectors, each row of the symmetric {@code a} read once for all of them.
     *
     * @param a  symmetric matrix (not modified)
     * @param xs vectors (not modified)
     */
    public static double[][] multiplySymmetric(double[][] a, double[][] xs) {
        int n = a.length;
        double[][] ys = new double[xs.length][n];
        int parts = n >= PARALLEL_MIN ? Math.min(2, Runtime.getRuntime().availableProcessors()) : 1;
        int[] cut = Workers.split(0, n, parts, false);
        Workers.run(parts, part -> {
            int from = cut[part];
            int to = cut[part + 1];
            for (int j = 0; j < n; j++) {
                double[] r = a[j];
                for (int c = 0; c < xs.length; c++) {
                    double xj = xs[c][j];
                    double[] y = ys[c];
                    for (int i = from; i < to; i++) {
                        y[i] += xj * r[i];
                    }
                }
            }
        });
        return ys;
    }

    /**
     * {@code Σ_{k<len} a[k]·b[k]} with four partial sums, {@code (s0 + s1) + (s2 + s3)} (independent chains the
     * processor overlaps); the one blocked dot product of the engine, so every caller sums in the same order.
     */
    public static double dot(double[] a, double[] b, int len) {
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        double s3 = 0;
        int k = 0;
        for (; k + 3 < len; k += 4) {
            s0 += a[k] * b[k];
            s1 += a[k + 1] * b[k + 1];
            s2 += a[k + 2] * b[k + 2];
            s3 += a[k + 3] * b[k + 3];
        }
        for (; k < len; k++) {
            s0 += a[k] * b[k];
        }
        return (s0 + s1) + (s2 + s3);
    }

    /** {@link #dot(double[], double[], int)} over the whole of {@code a}. */
    public static double dot(double[] a, double[] b) {
        return dot(a, b, a.length);
    }

    /**
     * {@code Σ a[k]·b[k]} summed left to right, one term at a time: for figures reported as such (returns of
     * portfolios), where the plain order is the one a reader's own check reproduces.
     */
    public static double dotInOrder(double[] a, double[] b) {
        double s = 0;
        for (int k = 0; k < a.length; k++) {
            s += a[k] * b[k];
        }
        return s;
    }
}
