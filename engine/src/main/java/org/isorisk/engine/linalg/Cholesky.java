package org.isorisk.engine.linalg;

/**
 * Cholesky factor {@code Σ = L L'} of a symmetric positive definite matrix, with single and multiple
 * right-hand-side solves.
 *
 * <p>The factorisation is the right-looking blocked algorithm (block size {@link #BLOCK}): factor the
 * diagonal block, solve the panel below it against that block, then subtract the panel's outer product
 * from the trailing lower triangle. It performs the same operations as the textbook algorithm in a
 * different order, so it is backward stable in the same sense (Higham, "Accuracy and Stability of Numerical
 * Algorithms", 2nd ed., 2002, theorem 10.3: the computed factor is the exact factor of {@code Σ + ΔΣ} with
 * {@code |ΔΣ| ≤ γ_{n+1}|L||L'|}).
 *
 * <p>Layout, and why: L is stored by rows, each row its own array of length {@code i + 1} (lower triangle
 * only, half the memory of a square array). The trailing update walks each row as an axpy against a
 * transposed copy of the panel whose rows are indexed by the same column {@code j}; written that way the
 * HotSpot C2 compiler of Java 17 turns the inner loop into AVX/AVX-512 vector code. The same loop over one
 * flat row-major array (row offsets {@code i*n + j}) was measured about three times slower, because the
 * compiler cannot prove that differently offset accesses of one array do not overlap and keeps it scalar.
 * The trailing update and the panel solve are split by rows (balanced by work) over a small shared pool of
 * daemon threads when the matrix is large. Solves read only the rows of L: the backward pass as vectorised
 * axpy loops, the forward pass as dot products with independent partial sums. (Keeping the columns of L too,
 * for an axpy forward pass, was measured slower at n = 2000: twice the memory to stream per solve.)
 *
 * <p>Instances are immutable and safe to share between threads.
 */
public final class Cholesky {
    /**
     * Block size (columns per panel). It balances the panel work (∝ n²·block) against the trailing update's
     * memory traffic (∝ n³/block); on a 2-core AVX-512 machine 64 and 128 measured about equal at n = 2000,
     * and 48 or 256 slower.
     */
    public static final int BLOCK = 64;

    /**
     * Column tile of the trailing update: the panel slice a row is updated against (BLOCK × TILE doubles,
     * 256 KiB) stays in a core's L2 cache while the rows stream past it.
     */
    static final int TILE = 512;

    /** Below this size the factorisation runs on the calling thread only; fork/join would cost more. */
    public static final int PARALLEL_MIN = 384;

    private final int n;
    /** Row i holds L[i][0..i]. */
    private final double[][] l;

    private Cholesky(int n, double[][] l) {
        this.n = n;
        this.l = l;
    }

    /**
     * Factors {@code a} using as many threads as the machine has processors.
     *
     * @param a symmetric matrix (not modified; only the lower triangle is read)
     * @return the factor, or null when a pivot is not positive (the matrix is not positive definite)
     */
    public static Cholesky factor(double[][] a) {
        return factor(a, Runtime.getRuntime().availableProcessors());
    }

    /**
     * Factors {@code a} with at most {@code threads} threads (the calling one included).
     *
     * @param a       symmetric matrix (not modified; only the lower triangle is read)
     * @param threads worker threads for large matrices, at least 1
     * @return the factor, or null when a pivot is not positive or not finite (not positive definite)
     */
    public static Cholesky factor(double[][] a, int threads) {
        return factor(a, threads, BLOCK);
    }

    /** {@link #factor(double[][], int)} with another block size (for tests and tuning). */
    static Cholesky factor(double[][] a, int threads, int block) {
        int n = a.length;
        double[][] l = new double[n][];
        for (int i = 0; i < n; i++) {
            if (a[i].length < i + 1) {
                throw new IllegalArgumentException("row " + i + " is shorter than the lower triangle needs");
            }
            l[i] = java.util.Arrays.copyOf(a[i], i + 1);
        }
        int t = n >= PARALLEL_MIN ? Math.max(1, threads) : 1;
        return factorInPlace(n, l, t, Math.max(4, block)) ? new Cholesky(n, l) : null;
    }

    /**
     * Factors a lower triangle held by rows in place, with the same blocked algorithm as
     * {@link #factor(double[][], int)}: on entry row i holds {@code A[i][0..i]}, on return {@code L[i][0..i]}.
     * For callers that keep and update the factor themselves (the active-set QP's reduced Hessian), so that
     * the rows need not be copied twice.
     *
     * @param rows    row i of length at least {@code i + 1} (only entries 0..i are read and written)
     * @param threads worker threads for large matrices, at least 1
     * @return false when a pivot is not positive or not finite (not positive definite); the rows are then
     *         partly overwritten
     */
    public static boolean factorRowsInPlace(double[][] rows, int threads) {
        int n = rows.length;
        for (int i = 0; i < n; i++) {
            if (rows[i].length < i + 1) {
                throw new IllegalArgumentException("row " + i + " is shorter than the lower triangle needs");
            }
        }
        return factorInPlace(n, rows, n >= PARALLEL_MIN ? Math.max(1, threads) : 1, BLOCK);
    }

    /**
     * Wraps a lower triangular factor held by rows (row i holds {@code L[i][0..i]}; longer rows are trimmed to
     * that length, rows of exactly that length are shared, not copied: the caller must not modify them
     * afterwards). For a factor that was kept up to date by row additions and deletions rather than computed here.
     *
     * @throws IllegalArgumentException when a row is too short or a diagonal entry is not positive and finite
     */
    public static Cholesky ofRows(double[][] rows) {
        int n = rows.length;
        double[][] l = new double[n][];
        for (int i = 0; i < n; i++) {
            double[] r = rows[i];
            if (r.length < i + 1 || !(r[i] > 0) || !Double.isFinite(r[i])) {
                throw new IllegalArgumentException("row " + i + " is not a row of a Cholesky factor");
            }
            l[i] = r.length == i + 1 ? r : java.util.Arrays.copyOf(r, i + 1);
        }
        return new Cholesky(n, l);
    }

    private static boolean factorInPlace(int n, double[][] l, int threads, int block) {
        double[][] panel = n > block ? new double[block][n] : null;
        for (int start = 0; start < n; start += block) {
            int k0 = start;
            int kb = Math.min(block, n - k0);
            if (!factorDiagonalBlock(l, k0, kb)) {
                return false;
            }
            int k1 = k0 + kb;
            if (k1 == n) {
                break;
            }
            // Transposed panel: panel[p][i] = A[i][k0+p] for i ≥ k1, then solved in place to L[i][k0+p].
            int[] cols = Workers.split(k1, n, threads, false);
            Workers.run(threads, part -> packAndSolvePanel(l, panel, k0, kb, cols[part], cols[part + 1]));
            int[] rows = Workers.split(k1, n, threads, true);
            Workers.run(threads, part -> updateTrailing(l, panel, k0, kb, k1, rows[part], rows[part + 1]));
        }
        return true;
    }

    /** Unblocked left-looking factor of the diagonal block (rows and columns k0..k0+kb−1). */
    private static boolean factorDiagonalBlock(double[][] l, int k0, int kb) {
        for (int i = k0; i < k0 + kb; i++) {
            double[] ri = l[i];
            for (int j = k0; j <= i; j++) {
                double[] rj = l[j];
                double s = ri[j];
                for (int p = k0; p < j; p++) {
                    s -= ri[p] * rj[p];
                }
                if (j < i) {
                    ri[j] = s / rj[j];
                } else {
                    if (!(s > 0) || !Double.isFinite(s)) {
                        return false;
                    }
                    ri[i] = Math.sqrt(s);
                }
            }
        }
        return true;
    }

    /**
     * For rows {@code from..to−1} (all ≥ k0+kb): copies their block columns into the transposed panel, solves
     * {@code X L11' = A21} column-wise (forward substitution on panel rows, an axpy per step) and writes the
     * result back into the rows of L.
     */
    private static void packAndSolvePanel(double[][] l, double[][] panel, int k0, int kb, int from, int to) {
        // Transpose four rows at a time so that each panel row receives four adjacent entries per visit.
        int i4 = from;
        for (; i4 + 3 < to; i4 += 4) {
            double[] r0 = l[i4];
            double[] r1 = l[i4 + 1];
            double[] r2 = l[i4 + 2];
            double[] r3 = l[i4 + 3];
            for (int p = 0; p < kb; p++) {
                double[] q = panel[p];
                q[i4] = r0[k0 + p];
                q[i4 + 1] = r1[k0 + p];
                q[i4 + 2] = r2[k0 + p];
                q[i4 + 3] = r3[k0 + p];
            }
        }
        for (int i = i4; i < to; i++) {
            double[] ri = l[i];
            for (int p = 0; p < kb; p++) {
                panel[p][i] = ri[k0 + p];
            }
        }
        for (int j = 0; j < kb; j++) {
            double[] lj = l[k0 + j];
            double[] pj = panel[j];
            subtractCombination(pj, lj, k0, j, panel, from, to);
            double inv = 1.0 / lj[k0 + j];
            for (int i = from; i < to; i++) {
                pj[i] *= inv;
            }
        }
        i4 = from;
        for (; i4 + 3 < to; i4 += 4) {
            double[] r0 = l[i4];
            double[] r1 = l[i4 + 1];
            double[] r2 = l[i4 + 2];
            double[] r3 = l[i4 + 3];
            for (int p = 0; p < kb; p++) {
                double[] q = panel[p];
                r0[k0 + p] = q[i4];
                r1[k0 + p] = q[i4 + 1];
                r2[k0 + p] = q[i4 + 2];
                r3[k0 + p] = q[i4 + 3];
            }
        }
        for (int i = i4; i < to; i++) {
            double[] ri = l[i];
            for (int p = 0; p < kb; p++) {
                ri[k0 + p] = panel[p][i];
            }
        }
    }

    /**
     * Trailing update of rows {@code from..to−1}: {@code A[i][j] −= Σ_p L[i][k0+p] L[j][k0+p]} for
     * {@code k1 ≤ j ≤ i}, column tile by column tile, four panel columns per pass.
     */
    private static void updateTrailing(double[][] l, double[][] panel, int k0, int kb, int k1, int from, int to) {
        for (int j0 = k1; j0 < to; j0 += TILE) {
            int j1 = Math.min(j0 + TILE, to);
            for (int i = Math.max(from, j0); i < to; i++) {
                double[] ri = l[i];
                subtractCombination(ri, ri, k0, kb, panel, j0, Math.min(j1, i + 1));
            }
        }
    }

    /**
     * {@code target[i] −= Σ_{p<count} coef[k0+p]·panel[p][i]} for {@code lo ≤ i < hi}, four panel columns per
     * pass (each target entry loaded and stored once per four); the coefficients are read before the pass, so
     * {@code coef} may be {@code target} itself when its entries {@code k0..k0+count−1} lie outside [lo, hi).
     */
    private static void subtractCombination(double[] target, double[] coef, int k0, int count, double[][] panel,
                                            int lo, int hi) {
        int p = 0;
        for (; p + 3 < count; p += 4) {
            double c0 = coef[k0 + p];
            double c1 = coef[k0 + p + 1];
            double c2 = coef[k0 + p + 2];
            double c3 = coef[k0 + p + 3];
            double[] q0 = panel[p];
            double[] q1 = panel[p + 1];
            double[] q2 = panel[p + 2];
            double[] q3 = panel[p + 3];
            for (int i = lo; i < hi; i++) {
                target[i] -= c0 * q0[i] + c1 * q1[i] + c2 * q2[i] + c3 * q3[i];
            }
        }
        for (; p < count; p++) {
            double c0 = coef[k0 + p];
            double[] q0 = panel[p];
            for (int i = lo; i < hi; i++) {
                target[i] -= c0 * q0[i];
            }
        }
    }

    /** Matrix size. */
    public int size() {
        return n;
    }

    /** Row i of L, entries 0..i (shared with this factor: not to be modified). */
    double[] row(int i) {
        return l[i];
    }

    /** A copy of row i of L, entries 0..i. */
    public double[] copyOfRow(int i) {
        return l[i].clone();
    }

    /** Entry (i, j) of L (zero above the diagonal). */
    public double factorEntry(int i, int j) {
        return j > i ? 0 : l[i][j];
    }

    /** Solves {@code Σ x = b}; {@code b} is not modified. */
    public double[] solve(double[] b) {
        checkLength(b);
        double[] x = b.clone();
        forward(x);
        backward(x);
        return x;
    }

    /**
     * Solves {@code Σ X = B} for several right-hand sides at once: the forward pass reads each row of the factor
     * once for four vectors, the backward pass reuses each row from cache for all of them.
     *
     * @param rhs right-hand sides, each of length n (not modified)
     * @return the solutions, in the order of {@code rhs}
     */
    public double[][] solve(double[][] rhs) {
        double[][] x = new double[rhs.length][];
        for (int c = 0; c < rhs.length; c++) {
            checkLength(rhs[c]);
            x[c] = rhs[c].clone();
        }
        double[] scratch = null;
        for (int c = 0; c < x.length; c += 4) {
            int r = Math.min(4, x.length - c);
            if (r == 1) {
                forward(x[c]);
                continue;
            }
            if (r < 4 && scratch == null) {
                scratch = new double[n];
            }
            // Fewer than four vectors left: the spare slots work on a scratch vector whose result is dropped.
            forward4(x[c], x[c + 1], r > 2 ? x[c + 2] : scratch, r > 3 ? x[c + 3] : scratch);
        }
        for (int i = n - 1; i >= 0; i--) {
            double[] row = l[i];
            double d = row[i];
            for (double[] xc : x) {
                double xi = xc[i] / d;
                xc[i] = xi;
                axpy(-xi, row, xc, 0, i);
            }
        }
        return x;
    }

    /**
     * Solves {@code L y = b} in place, row by row: a dot product per row with eight partial sums (independent
     * chains the processor overlaps), so that only the rows of L are needed and the factor stays half the size
     * of Σ; memory traffic, not arithmetic, bounds a solve.
     */
    public void forward(double[] x) {
        checkLength(x);
        for (int i = 0; i < n; i++) {
            double[] row = l[i];
            double s0 = 0;
            double s1 = 0;
            double s2 = 0;
            double s3 = 0;
            double s4 = 0;
            double s5 = 0;
            double s6 = 0;
            double s7 = 0;
            int k = 0;
            for (; k + 7 < i; k += 8) {
                s0 += row[k] * x[k];
                s1 += row[k + 1] * x[k + 1];
                s2 += row[k + 2] * x[k + 2];
                s3 += row[k + 3] * x[k + 3];
                s4 += row[k + 4] * x[k + 4];
                s5 += row[k + 5] * x[k + 5];
                s6 += row[k + 6] * x[k + 6];
                s7 += row[k + 7] * x[k + 7];
            }
            for (; k < i; k++) {
                s0 += row[k] * x[k];
            }
            x[i] = (x[i] - (((s0 + s1) + (s2 + s3)) + ((s4 + s5) + (s6 + s7)))) / row[i];
        }
    }

    /** Forward substitution of four vectors in place, each row of L read once for all four. */
    private void forward4(double[] x0, double[] x1, double[] x2, double[] x3) {
        for (int i = 0; i < n; i++) {
            double[] row = l[i];
            double s0 = 0;
            double s1 = 0;
            double s2 = 0;
            double s3 = 0;
            for (int k = 0; k < i; k++) {
                double v = row[k];
                s0 += v * x0[k];
                s1 += v * x1[k];
                s2 += v * x2[k];
                s3 += v * x3[k];
            }
            double d = row[i];
            x0[i] = (x0[i] - s0) / d;
            x1[i] = (x1[i] - s1) / d;
            x2[i] = (x2[i] - s2) / d;
            x3[i] = (x3[i] - s3) / d;
        }
    }

    /** Solves {@code L' x = y} in place, row by row of L (an axpy per row, vectorised). */
    public void backward(double[] x) {
        checkLength(x);
        for (int i = n - 1; i >= 0; i--) {
            double[] row = l[i];
            double xi = x[i] / row[i];
            x[i] = xi;
            axpy(-xi, row, x, 0, i);
        }
    }

    /** {@code y[from..to) += c · x[from..to)}. */
    private static void axpy(double c, double[] x, double[] y, int from, int to) {
        for (int k = from; k < to; k++) {
            y[k] += c * x[k];
        }
    }

    /** {@code L L' x}, the factored matrix applied to x ({@code x} not modified). */
    public double[] multiply(double[] x) {
        checkLength(x);
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            axpy(x[i], l[i], y, 0, i + 1); // y = L'x, row i of L contributing x_i·L[i][0..i]
        }
        double[] z = new double[n];
        for (int i = 0; i < n; i++) {
            z[i] = Dense.dot(l[i], y, i + 1);
        }
        return z;
    }

    /** {@code L L' x_c} for several vectors, each row of L read once for all of them (not modified). */
    public double[][] multiply(double[][] xs) {
        int c = xs.length;
        double[][] y = new double[c][n];
        for (double[] x : xs) {
            checkLength(x);
        }
        for (int i = 0; i < n; i++) {
            double[] row = l[i];
            for (int v = 0; v < c; v++) {
                axpy(xs[v][i], row, y[v], 0, i + 1);
            }
        }
        double[][] z = new double[c][n];
        for (int i = 0; i < n; i++) {
            double[] row = l[i];
            for (int v = 0; v < c; v++) {
                double[] yv = y[v];
                double s0 = 0;
                double s1 = 0;
                int k = 0;
                for (; k + 1 <= i; k += 2) {
                    s0 += row[k] * yv[k];
                    s1 += row[k + 1] * yv[k + 1];
                }
                for (; k <= i; k++) {
                    s0 += row[k] * yv[k];
                }
                z[v][i] = s0 + s1;
            }
        }
        return z;
    }

    /** Smallest diagonal entry of L (its square bounds the smallest eigenvalue from above). */
    public double minPivot() {
        double m = Double.POSITIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            m = Math.min(m, l[i][i]);
        }
        return m;
    }

    private void checkLength(double[] v) {
        if (v.length != n) {
            throw new IllegalArgumentException("vector of length " + v.length + " for a factor of size " + n);
        }
    }
}
