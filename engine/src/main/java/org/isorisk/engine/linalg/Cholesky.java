package org.isorisk.engine.linalg;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;

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
 * daemon threads when the matrix is large.
 *
 * <p>Instances are immutable and safe to share between threads.
 */
public final class Cholesky {
    /**
     * Block size (columns per panel). 64 balances the panel solve (scalar-heavy, cost ∝ n²·block) against
     * the trailing update's reuse of each loaded row (∝ n³/block memory traffic); measured best among
     * 32–128 on a 2-core AVX-512 machine at n = 500–2000.
     */
    public static final int BLOCK = 64;

    /**
     * Column tile of the trailing update: the panel slice a row is updated against (BLOCK × TILE doubles,
     * 256 KiB) stays in a core's L2 cache while the rows stream past it.
     */
    static final int TILE = 512;

    /** Below this size the factorisation runs on the calling thread only; fork/join would cost more. */
    public static final int PARALLEL_MIN = 384;

    private static final AtomicInteger THREAD_NUMBER = new AtomicInteger();
    private static volatile ExecutorService pool;

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
        int n = a.length;
        double[][] l = new double[n][];
        for (int i = 0; i < n; i++) {
            if (a[i].length < i + 1) {
                throw new IllegalArgumentException("row " + i + " is shorter than the lower triangle needs");
            }
            l[i] = java.util.Arrays.copyOf(a[i], i + 1);
        }
        int t = n >= PARALLEL_MIN ? Math.max(1, threads) : 1;
        return factorInPlace(n, l, t) ? new Cholesky(n, l) : null;
    }

    private static boolean factorInPlace(int n, double[][] l, int threads) {
        double[][] panel = n > BLOCK ? new double[BLOCK][n] : null;
        for (int start = 0; start < n; start += BLOCK) {
            int k0 = start;
            int kb = Math.min(BLOCK, n - k0);
            if (!factorDiagonalBlock(l, k0, kb)) {
                return false;
            }
            int k1 = k0 + kb;
            if (k1 == n) {
                break;
            }
            // Transposed panel: panel[p][i] = A[i][k0+p] for i ≥ k1, then solved in place to L[i][k0+p].
            int[] cols = split(k1, n, threads, false);
            run(threads, part -> packAndSolvePanel(l, panel, k0, kb, cols[part], cols[part + 1]));
            int[] rows = split(k1, n, threads, true);
            run(threads, part -> updateTrailing(l, panel, k0, kb, k1, rows[part], rows[part + 1]));
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
            int p = 0;
            for (; p + 3 < j; p += 4) {
                double c0 = lj[k0 + p];
                double c1 = lj[k0 + p + 1];
                double c2 = lj[k0 + p + 2];
                double c3 = lj[k0 + p + 3];
                double[] q0 = panel[p];
                double[] q1 = panel[p + 1];
                double[] q2 = panel[p + 2];
                double[] q3 = panel[p + 3];
                for (int i = from; i < to; i++) {
                    pj[i] -= c0 * q0[i] + c1 * q1[i] + c2 * q2[i] + c3 * q3[i];
                }
            }
            for (; p < j; p++) {
                double c0 = lj[k0 + p];
                double[] q0 = panel[p];
                for (int i = from; i < to; i++) {
                    pj[i] -= c0 * q0[i];
                }
            }
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
                int end = Math.min(j1, i + 1);
                int p = 0;
                for (; p + 3 < kb; p += 4) {
                    double a0 = ri[k0 + p];
                    double a1 = ri[k0 + p + 1];
                    double a2 = ri[k0 + p + 2];
                    double a3 = ri[k0 + p + 3];
                    double[] q0 = panel[p];
                    double[] q1 = panel[p + 1];
                    double[] q2 = panel[p + 2];
                    double[] q3 = panel[p + 3];
                    for (int j = j0; j < end; j++) {
                        ri[j] -= a0 * q0[j] + a1 * q1[j] + a2 * q2[j] + a3 * q3[j];
                    }
                }
                for (; p < kb; p++) {
                    double a0 = ri[k0 + p];
                    double[] q0 = panel[p];
                    for (int j = j0; j < end; j++) {
                        ri[j] -= a0 * q0[j];
                    }
                }
            }
        }
    }

    /**
     * Splits {@code [from, to)} into {@code parts} ranges: equal lengths, or (triangular) equal areas of the
     * lower triangle, where row i costs ∝ (i − from + 1).
     */
    private static int[] split(int from, int to, int parts, boolean triangular) {
        int[] b = new int[parts + 1];
        int m = to - from;
        for (int p = 0; p <= parts; p++) {
            double f = (double) p / parts;
            int off = (int) Math.round(triangular ? m * Math.sqrt(f) : m * f);
            b[p] = from + Math.min(m, off);
        }
        b[parts] = to;
        return b;
    }

    private interface Part {
        void run(int part);
    }

    /** Runs parts 1..threads−1 on the pool and part 0 on the calling thread; returns when all are done. */
    private static void run(int threads, Part body) {
        if (threads == 1) {
            body.run(0);
            return;
        }
        ExecutorService ex = pool(threads);
        List<Future<?>> futures = new ArrayList<>(threads - 1);
        for (int p = 1; p < threads; p++) {
            int part = p;
            futures.add(ex.submit(() -> body.run(part)));
        }
        body.run(0);
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted during a parallel factorisation", e);
            } catch (ExecutionException e) {
                throw new IllegalStateException("a factorisation worker failed", e.getCause());
            }
        }
    }

    /** The shared pool: daemon threads, created on first use, idle ones retire after a minute. */
    private static ExecutorService pool(int threads) {
        ExecutorService p = pool;
        if (p == null) {
            synchronized (Cholesky.class) {
                p = pool;
                if (p == null) {
                    p = Executors.newCachedThreadPool(r -> {
                        Thread th = new Thread(r, "isorisk-linalg-" + THREAD_NUMBER.incrementAndGet());
                        th.setDaemon(true);
                        return th;
                    });
                    pool = p;
                }
            }
        }
        return p;
    }

    /** Matrix size. */
    public int size() {
        return n;
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
     * Solves {@code Σ X = B} for several right-hand sides at once, reading the factor once per group of four
     * instead of once per vector.
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
        for (int c = 0; c < x.length; c += 4) {
            int r = Math.min(4, x.length - c);
            if (r == 1) {
                forward(x[c]);
                backward(x[c]);
                continue;
            }
            double[] x0 = x[c];
            double[] x1 = x[c + 1];
            // Fewer than four distinct vectors: the spare slots work on scratch copies that are discarded.
            double[] x2 = r > 2 ? x[c + 2] : new double[n];
            double[] x3 = r > 3 ? x[c + 3] : new double[n];
            forward4(x0, x1, x2, x3);
            backward4(x0, x1, x2, x3);
        }
        return x;
    }

    /** Solves {@code L y = b} in place. */
    public void forward(double[] x) {
        checkLength(x);
        for (int i = 0; i < n; i++) {
            double[] ri = l[i];
            // Four partial sums: independent chains the processor can overlap.
            double s0 = 0;
            double s1 = 0;
            double s2 = 0;
            double s3 = 0;
            int k = 0;
            for (; k + 3 < i; k += 4) {
                s0 += ri[k] * x[k];
                s1 += ri[k + 1] * x[k + 1];
                s2 += ri[k + 2] * x[k + 2];
                s3 += ri[k + 3] * x[k + 3];
            }
            for (; k < i; k++) {
                s0 += ri[k] * x[k];
            }
            x[i] = (x[i] - ((s0 + s1) + (s2 + s3))) / ri[i];
        }
    }

    /** Forward substitution of four vectors in place, each row of L read once for all four. */
    private void forward4(double[] x0, double[] x1, double[] x2, double[] x3) {
        for (int i = 0; i < n; i++) {
            double[] ri = l[i];
            double s0 = 0;
            double s1 = 0;
            double s2 = 0;
            double s3 = 0;
            for (int k = 0; k < i; k++) {
                double v = ri[k];
                s0 += v * x0[k];
                s1 += v * x1[k];
                s2 += v * x2[k];
                s3 += v * x3[k];
            }
            double d = ri[i];
            x0[i] = (x0[i] - s0) / d;
            x1[i] = (x1[i] - s1) / d;
            x2[i] = (x2[i] - s2) / d;
            x3[i] = (x3[i] - s3) / d;
        }
    }

    /** Backward substitution of four vectors in place; a row of L is fetched once and then reused from cache. */
    private void backward4(double[] x0, double[] x1, double[] x2, double[] x3) {
        for (int i = n - 1; i >= 0; i--) {
            double[] ri = l[i];
            double d = ri[i];
            double v0 = x0[i] / d;
            double v1 = x1[i] / d;
            double v2 = x2[i] / d;
            double v3 = x3[i] / d;
            x0[i] = v0;
            x1[i] = v1;
            x2[i] = v2;
            x3[i] = v3;
            axpyPrefix(-v0, ri, x0, i);
            axpyPrefix(-v1, ri, x1, i);
            axpyPrefix(-v2, ri, x2, i);
            axpyPrefix(-v3, ri, x3, i);
        }
    }

    /** {@code y[0..len) += c · x[0..len)}. */
    private static void axpyPrefix(double c, double[] x, double[] y, int len) {
        for (int k = 0; k < len; k++) {
            y[k] += c * x[k];
        }
    }

    /** Solves {@code L' x = y} in place. */
    public void backward(double[] x) {
        checkLength(x);
        for (int i = n - 1; i >= 0; i--) {
            double[] ri = l[i];
            double xi = x[i] / ri[i];
            x[i] = xi;
            for (int k = 0; k < i; k++) {
                x[k] -= ri[k] * xi;
            }
        }
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
