package org.isorisk.engine.linalg;

import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;

/**
 * Extreme eigenvalues of a symmetric matrix, for condition numbers and positive-definiteness reports.
 *
 * <p>Up to {@link #EXACT_LIMIT} assets the full symmetric eigendecomposition (Commons Math) is used and the
 * values are exact to rounding. Above it the Lanczos method (full reorthogonalisation, a fixed pseudo-random
 * start) estimates the largest eigenvalue from products with Σ, and the smallest as the reciprocal of the
 * largest eigenvalue of Σ⁻¹, from solves with the Cholesky factor: a few dozen O(n²) steps instead of the
 * decomposition's O(n³). From {@link #SINGLE_PRECISION_MIN} assets each step streams megabytes of factor
 * from memory, which is what it costs; there the Lanczos run uses a single-precision copy of the factor
 * (half the bytes, twice the numbers per vector instruction), and its {@code 4} leading Ritz vectors are
 * then checked and refined in double precision against the true Σ (or Σ⁻¹ through the double factor) by
 * Rayleigh–Ritz on their span. The same stopping rule below is applied to that refined value; if it fails,
 * the double-precision run is done from the start, so the accuracy stated below holds on both paths.
 *
 * <p>Accuracy of the iterative estimate ({@code exact == false}). A Ritz value θ of the Lanczos tridiagonal
 * T_m, with unit eigenvector s, has residual {@code r = β_m |s_m|} (Parlett, "The Symmetric Eigenvalue
 * Problem", 1998, §13.1); an eigenvalue lies within r of θ, and within r²/gap when gap separates θ from the
 * rest of the spectrum (ibid., ch. 4 and 11; the gap to the next Ritz value stands in for the true gap, as
 * is usual). Iteration stops when {@code min(r, r²/gap) ≤ RELATIVE_ACCURACY·|θ|}: λmin and λmax are then each
 * to a relative {@link #RELATIVE_ACCURACY} (1e-4), the condition number to about 2e-4, four significant
 * digits, which is what a conditioning report needs. A caller may ask for another accuracy
 * ({@link #of(double[][], Cholesky, double)}): the certificate of a solve asks for {@link #CONDITION_ACCURACY}
 * (1e-2 by the error estimate, the condition number to a few per cent), which at 2000 assets takes about a
 * third of the steps. At that accuracy the gap-based estimate can understate the error when the bottom of the
 * spectrum is clustered: measured errors reach 2.6 % on random test matrices (0.3 % on the benchmark's factor
 * models). Either way the values lie inside the spectrum, so the condition number is never overstated. The estimate is conservative: on factor-model
 * covariances of 2000 assets the actual error at that point is near 1e-6. Ritz values lie inside the
 * spectrum, so the estimated largest eigenvalue never exceeds the true one and the estimated smallest never
 * falls below it. If {@link #MAX_STEPS} is reached first, the best values so far are returned, with the same
 * inside-the-spectrum property. Without a factor (a matrix that is not positive definite) the smallest
 * eigenvalue is the smallest Ritz value of Σ itself, which converges more slowly but reports the negative
 * eigenvalue's sign and size.
 *
 * @param smallest smallest eigenvalue
 * @param largest  largest eigenvalue
 * @param exact    true when computed by a full symmetric eigendecomposition, false for the Lanczos estimate
 */
public record Spectrum(double smallest, double largest, boolean exact) {

    /**
     * Size up to which the full eigendecomposition is used; above it, the Lanczos estimate. The decomposition
     * costs about 1 ms at 64 assets but seconds at 400, where Lanczos takes a few milliseconds.
     */
    public static final int EXACT_LIMIT = 64;

    /** Relative error estimate at which an iterative extreme eigenvalue counts as converged. */
    public static final double RELATIVE_ACCURACY = 1e-4;

    /**
     * Relative accuracy asked of the estimate behind the condition number in a solution's certificate (each
     * extreme eigenvalue to 1e-2 by the stopping rule; see the class comment for what was measured): its order
     * of magnitude is what tells whether the residuals are believable, and a solve's cost should not be spent
     * on its third digit.
     */
    public static final double CONDITION_ACCURACY = 1e-2;

    /** Most Lanczos steps taken for one estimate. */
    public static final int MAX_STEPS = 300;

    /** Seed of the start vector, fixed so that the estimate is reproducible. */
    private static final long SEED = 20_240_601L;

    /** 2-norm condition number {@code λmax/λmin} (infinite when λmin ≤ 0). */
    public double conditionNumber() {
        return smallest > 0 ? largest / smallest : Double.POSITIVE_INFINITY;
    }

    /** Extreme eigenvalues of symmetric {@code a} (not modified). */
    public static Spectrum of(double[][] a) {
        return of(a, null);
    }

    /**
     * Extreme eigenvalues of symmetric {@code a} (not modified); when the matrix is large the Lanczos estimate
     * is used, with {@code chol} (its Cholesky factor) for the smallest eigenvalue. Without a factor a large
     * matrix is factored here; if that fails the smallest eigenvalue is estimated from Σ directly.
     */
    public static Spectrum of(double[][] a, Cholesky chol) {
        return of(a, chol, RELATIVE_ACCURACY);
    }

    /**
     * {@link #of(double[][], Cholesky)} with the iterative estimate stopped at relative accuracy {@code accuracy}
     * (in the sense of the class comment) instead of {@link #RELATIVE_ACCURACY}; the exact decomposition is used
     * up to {@link #EXACT_LIMIT} assets as before.
     *
     * @param accuracy relative error estimate at which each extreme eigenvalue counts as converged, in (0, 0.1]
     */
    public static Spectrum of(double[][] a, Cholesky chol, double accuracy) {
        if (a.length <= EXACT_LIMIT) {
            return exact(a);
        }
        return iterative(a, chol != null ? chol : Cholesky.factor(a), accuracy);
    }

    /**
     * Extreme eigenvalues of {@code L L'} from its Cholesky factor alone (no matrix at hand, e.g. a reduced
     * Hessian whose factor was updated row by row): exact up to {@link #EXACT_LIMIT}, the Lanczos estimate of
     * the class comment above, with products {@code L(L'x)} in place of products with the matrix.
     *
     * @param chol     the factor
     * @param accuracy relative accuracy of the iterative estimate, in (0, 0.1]
     */
    public static Spectrum ofFactor(Cholesky chol, double accuracy) {
        int n = chol.size();
        if (n <= EXACT_LIMIT) {
            double[][] a = new double[n][];
            for (int i = 0; i < n; i++) {
                double[] e = new double[n];
                e[i] = 1;
                a[i] = chol.multiply(e);
            }
            return exact(a);
        }
        return iterative(n, chol, chol::multiply, chol::multiply, accuracy);
    }

    /** The full symmetric eigendecomposition, whatever the size. */
    public static Spectrum exact(double[][] a) {
        double[] ev = new EigenDecomposition(new Array2DRowRealMatrix(a, false)).getRealEigenvalues();
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double v : ev) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        return new Spectrum(lo, hi, true);
    }

    /**
     * The Lanczos estimate, whatever the size.
     *
     * @param a    symmetric matrix (not modified)
     * @param chol its Cholesky factor, or null when it has none (not positive definite)
     */
    public static Spectrum iterative(double[][] a, Cholesky chol) {
        return iterative(a, chol, RELATIVE_ACCURACY);
    }

    /**
     * The Lanczos estimate, whatever the size, to relative accuracy {@code acc}.
     *
     * @param a    symmetric matrix (not modified)
     * @param chol its Cholesky factor, or null when it has none (not positive definite)
     * @param acc  relative error estimate at which each extreme eigenvalue counts as converged, in (0, 0.1]
     */
    public static Spectrum iterative(double[][] a, Cholesky chol, double acc) {
        if (!(acc > 0 && acc <= 0.1)) {
            throw new IllegalArgumentException("accuracy must be in (0, 0.1], was " + acc);
        }
        int n = a.length;
        if (chol == null) {
            Run both = lanczos(n, x -> Dense.multiplySymmetric(a, x), true, acc);
            return new Spectrum(both.lo, both.hi, false);
        }
        return iterative(n, chol, x -> Dense.multiplySymmetric(a, x), v -> Dense.multiplySymmetric(a, v), acc);
    }

    /** The Lanczos estimate with the factor and a product with the matrix (one vector, several vectors). */
    private static Spectrum iterative(int n, Cholesky chol, Operator product, BlockOperator products, double acc) {
        if (!(acc > 0 && acc <= 0.1)) {
            throw new IllegalArgumentException("accuracy must be in (0, 0.1], was " + acc);
        }
        if (n < SINGLE_PRECISION_MIN) {
            double smallest = 1.0 / lanczos(n, chol::solve, false, acc).hi;
            return new Spectrum(smallest, lanczos(n, product, false, acc).hi, false);
        }
        float[][] lf = new float[n][];
        for (int i = 0; i < n; i++) {
            double[] row = chol.row(i);
            float[] r = new float[i + 1];
            for (int k = 0; k <= i; k++) {
                r[k] = (float) row[k];
            }
            lf[i] = r;
        }
        // Columns of the single-precision factor, column j holding L[j..n)[j] (packed: half the bytes of a square
        // copy to stream per solve), transposed tile by tile for locality.
        float[][] cf = new float[n][];
        for (int j = 0; j < n; j++) {
            cf[j] = new float[n - j];
        }
        for (int i0 = 0; i0 < n; i0 += 64) {
            for (int j0 = 0; j0 <= i0; j0 += 64) {
                for (int i = i0; i < Math.min(n, i0 + 64); i++) {
                    float[] r = lf[i];
                    for (int j = j0; j < Math.min(j0 + 64, i + 1); j++) {
                        cf[j][i - j] = r[j];
                    }
                }
            }
        }
        double inverse = refinedLargest(n, x -> solveSingle(lf, cf, x), chol::solve, chol::solve, acc);
        double largest = refinedLargest(n, x -> multiplySingle(lf, x), products, product, acc);
        return new Spectrum(1.0 / inverse, largest, false);
    }

    /** Size from which each estimate is first found with a single-precision copy of the factor. */
    public static final int SINGLE_PRECISION_MIN = 1024;

    /** Ritz vectors carried from the single-precision run into the double-precision check. */
    private static final int REFINE = 4;

    /** A symmetric operator applied to several vectors at once. */
    private interface BlockOperator {
        double[][] apply(double[][] v);
    }

    /**
     * Largest eigenvalue of a symmetric operator. For large matrices one application streams the whole matrix
     * or factor from memory, and that, not arithmetic, sets its cost; so the Lanczos run first uses the
     * single-precision factor ({@code rough}: a quarter of the bytes), and its leading Ritz vectors are then
     * checked and refined in double precision: Rayleigh–Ritz of the true operator ({@code exact}, applied to
     * all of them in one pass) on their span, with the stopping rule of the class comment. Should that check
     * fail, the double-precision run ({@code exactOne}) is done from the start, so the stated accuracy holds
     * either way.
     */
    private static double refinedLargest(int n, Operator rough, BlockOperator exact, Operator exactOne,
                                         double acc) {
        Run run = lanczos(n, rough, false, acc);
        double[][] y = run.topRitzVectors(Math.min(REFINE, run.m));
        double[][] z = exact.apply(y);
        int k = y.length;
        double[][] h = new double[k][k];
        for (int i = 0; i < k; i++) {
            for (int j = 0; j <= i; j++) {
                double v = 0.5 * (Dense.dot(y[i], z[j]) + Dense.dot(y[j], z[i]));
                h[i][j] = v;
                h[j][i] = v;
            }
        }
        EigenDecomposition e = new EigenDecomposition(new Array2DRowRealMatrix(h, false));
        double[] theta = e.getRealEigenvalues();
        int top = 0;
        for (int i = 1; i < k; i++) {
            if (theta[i] > theta[top]) {
                top = i;
            }
        }
        double next = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < k; i++) {
            if (i != top) {
                next = Math.max(next, theta[i]);
            }
        }
        double[] s = e.getEigenvector(top).toArray();
        double[] res = new double[n];
        for (int j = 0; j < k; j++) {
            double c = s[j];
            double[] zj = z[j];
            double[] yj = y[j];
            for (int i = 0; i < n; i++) {
                res[i] += c * (zj[i] - theta[top] * yj[i]);
            }
        }
        double r = Math.sqrt(Dense.dot(res, res));
        // The gap: to the next Ritz value of the refined subspace or, if it has only one vector, of the rough run.
        double gap = k > 1 ? theta[top] - next : run.hi - run.second();
        double err = gap > 0 ? Math.min(r, r * r / gap) : r;
        if (err <= acc * Math.abs(theta[top])) {
            return theta[top];
        }
        return lanczos(n, exactOne, false, acc).hi;
    }

    /** {@code L(L'x)} ≈ Σx through the single-precision factor. */
    private static double[] multiplySingle(float[][] lf, double[] b) {
        int n = b.length;
        float[] x = new float[n];
        for (int i = 0; i < n; i++) {
            x[i] = (float) b[i];
        }
        float[] y = new float[n];
        for (int i = 0; i < n; i++) {
            float[] row = lf[i];
            float xi = x[i];
            for (int k = 0; k <= i; k++) {
                y[k] += xi * row[k];
            }
        }
        double[] out = new double[n];
        for (int i = 0; i < n; i++) {
            float[] row = lf[i];
            float s0 = 0;
            float s1 = 0;
            float s2 = 0;
            float s3 = 0;
            int k = 0;
            for (; k + 3 <= i; k += 4) {
                s0 += row[k] * y[k];
                s1 += row[k + 1] * y[k + 1];
                s2 += row[k + 2] * y[k + 2];
                s3 += row[k + 3] * y[k + 3];
            }
            for (; k <= i; k++) {
                s0 += row[k] * y[k];
            }
            out[i] = (s0 + s1) + (s2 + s3);
        }
        return out;
    }

    /**
     * Σ⁻¹x through the single-precision factor: forward along its packed columns ({@code cf[i][k − i] = L[k][i]}),
     * backward along its rows (axpy).
     */
    private static double[] solveSingle(float[][] lf, float[][] cf, double[] b) {
        int n = b.length;
        float[] x = new float[n];
        for (int i = 0; i < n; i++) {
            x[i] = (float) b[i];
        }
        for (int i = 0; i < n; i++) {
            float[] col = cf[i];
            float xi = x[i] / col[0];
            x[i] = xi;
            for (int k = i + 1; k < n; k++) {
                x[k] -= xi * col[k - i];
            }
        }
        for (int i = n - 1; i >= 0; i--) {
            float[] row = lf[i];
            float xi = x[i] / row[i];
            x[i] = xi;
            for (int k = 0; k < i; k++) {
                x[k] -= xi * row[k];
            }
        }
        double[] out = new double[n];
        for (int i = 0; i < n; i++) {
            out[i] = x[i];
        }
        return out;
    }

    private interface Operator {
        double[] apply(double[] x);
    }

    /** A finished Lanczos run: its basis, tridiagonal and extreme Ritz values. */
    private static final class Run {
        final double[][] q;
        final double[] alpha;
        final double[] beta;
        final int m;
        final double lo;
        final double hi;

        Run(double[][] q, double[] alpha, double[] beta, int m, double lo, double hi) {
            this.q = q;
            this.alpha = alpha;
            this.beta = beta;
            this.m = m;
            this.lo = lo;
            this.hi = hi;
        }

        /** The second largest Ritz value (the largest again when there is only one). */
        double second() {
            return m > 1 ? kthLargest(alpha, beta, m, 1) : hi;
        }

        /**
         * Orthonormal vectors spanning the Ritz vectors of the k largest Ritz values ({@code Q s} for each
         * eigenvector s of T, orthonormalised again, since nearly equal Ritz values give nearly parallel s).
         */
        double[][] topRitzVectors(int k) {
            int n = q[0].length;
            java.util.List<double[]> out = new java.util.ArrayList<>();
            for (int j = 0; j < k; j++) {
                double[] s = tridiagonalEigenvector(alpha, beta, m, kthLargest(alpha, beta, m, j));
                double[] y = new double[n];
                for (int p = 0; p < m; p++) {
                    axpy(s[p], q[p], y);
                }
                for (int pass = 0; pass < 2; pass++) {
                    for (double[] u : out) {
                        axpy(-Dense.dot(u, y), u, y);
                    }
                }
                double norm = Math.sqrt(Dense.dot(y, y));
                if (norm > 1e-8) {
                    scale(y, 1.0 / norm);
                    out.add(y);
                }
            }
            return out.toArray(new double[0][]);
        }
    }

    /**
     * Lanczos with full reorthogonalisation; stops once the largest Ritz value (and, when {@code both}, the
     * smallest) has converged in the sense of the class comment.
     */
    private static Run lanczos(int n, Operator op, boolean both, double acc) {
        int steps = Math.min(n, MAX_STEPS);
        double[][] q = new double[steps][];
        double[] alpha = new double[steps];
        double[] beta = new double[steps];
        SplittableRandom rnd = new SplittableRandom(SEED);
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            v[i] = rnd.nextDouble() - 0.5;
        }
        scale(v, 1.0 / Math.sqrt(Dense.dot(v, v)));
        double lo = Double.NaN;
        double hi = Double.NaN;
        int m = 0;
        for (int k = 0; k < steps; k++) {
            q[k] = v;
            double[] w = op.apply(v);
            alpha[k] = Dense.dot(v, w);
            axpy(-alpha[k], v, w);
            if (k > 0) {
                axpy(-beta[k - 1], q[k - 1], w);
            }
            // One full reorthogonalisation pass against every earlier vector keeps Q orthonormal to working
            // accuracy, so that no spurious copies of converged Ritz values appear.
            for (int j = 0; j <= k; j++) {
                axpy(-Dense.dot(q[j], w), q[j], w);
            }
            double b = Math.sqrt(Dense.dot(w, w));
            beta[k] = b;
            m = k + 1;
            hi = kthLargest(alpha, beta, m, 0);
            boolean done = converged(alpha, beta, m, hi, 1, Math.max(Math.abs(hi), Double.MIN_NORMAL), acc);
            double scale = Math.abs(hi);
            if (both || done || !(b > 1e-13 * scale) || m == steps) {
                lo = kthLargest(alpha, beta, m, m - 1);
                scale = Math.max(Math.max(Math.abs(hi), Math.abs(lo)), Double.MIN_NORMAL);
            }
            if (both && done) {
                done = converged(alpha, beta, m, lo, -1, scale, acc);
            }
            // b ≈ 0: the Krylov subspace is invariant and its Ritz values are eigenvalues.
            if (done || !(b > 1e-13 * scale) || m == steps) {
                break;
            }
            v = w;
            scale(v, 1.0 / b);
        }
        return new Run(q, alpha, beta, m, lo, hi);
    }

    /**
     * Whether Ritz value θ (the largest when {@code end} is 1, the smallest when −1) of the m×m tridiagonal
     * (alpha, beta) has error estimate {@code min(r, r²/gap) ≤ acc · scale}, with
     * {@code r = β_m |s_m|} from its eigenvector s (inverse iteration on T − θI) and gap the distance to the
     * next Ritz value (computed only when r alone does not settle it).
     */
    private static boolean converged(double[] alpha, double[] beta, int m, double theta, int end, double scale,
                                     double acc) {
        double[] s = tridiagonalEigenvector(alpha, beta, m, theta);
        double r = beta[m - 1] * Math.abs(s[m - 1]);
        double limit = acc * scale;
        if (r <= limit) {
            return true;
        }
        if (m < 2) {
            return false;
        }
        double next = kthLargest(alpha, beta, m, end > 0 ? 1 : m - 2);
        double gap = Math.abs(theta - next);
        return gap > 0 && r * r / gap <= limit;
    }

    /** Unit eigenvector of the tridiagonal (d, e) for eigenvalue θ: two steps of inverse iteration. */
    private static double[] tridiagonalEigenvector(double[] d, double[] e, int m, double theta) {
        double norm = 0;
        for (int i = 0; i < m; i++) {
            norm = Math.max(norm, Math.abs(d[i]) + (i > 0 ? Math.abs(e[i - 1]) : 0) + (i < m - 1 ? Math.abs(e[i]) : 0));
        }
        double tiny = 1e-15 * Math.max(norm, Double.MIN_NORMAL);
        // LU of T − θI without pivoting, tiny pivots nudged (the usual device of inverse iteration).
        double[] piv = new double[m];
        double[] mult = new double[m];
        for (int i = 0; i < m; i++) {
            double p = d[i] - theta - (i > 0 ? mult[i - 1] * e[i - 1] : 0);
            if (Math.abs(p) < tiny) {
                p = p < 0 ? -tiny : tiny;
            }
            piv[i] = p;
            if (i < m - 1) {
                mult[i] = e[i] / p;
            }
        }
        double[] x = new double[m];
        java.util.Arrays.fill(x, 1.0);
        for (int it = 0; it < 2; it++) {
            for (int i = 1; i < m; i++) {
                x[i] -= mult[i - 1] * x[i - 1];
            }
            x[m - 1] /= piv[m - 1];
            for (int i = m - 2; i >= 0; i--) {
                x[i] = (x[i] - e[i] * x[i + 1]) / piv[i];
            }
            double s = 0;
            for (int i = 0; i < m; i++) {
                s = Math.max(s, Math.abs(x[i]));
            }
            for (int i = 0; i < m; i++) {
                x[i] /= s;
            }
        }
        double nn = 0;
        for (int i = 0; i < m; i++) {
            nn += x[i] * x[i];
        }
        double inv = 1.0 / Math.sqrt(nn);
        for (int i = 0; i < m; i++) {
            x[i] *= inv;
        }
        return x;
    }

    /** The (k+1)-th largest eigenvalue of the symmetric tridiagonal (d, e), by Sturm-count bisection. */
    private static double kthLargest(double[] d, double[] e, int m, int k) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < m; i++) {
            double r = (i > 0 ? Math.abs(e[i - 1]) : 0) + (i < m - 1 ? Math.abs(e[i]) : 0);
            lo = Math.min(lo, d[i] - r);
            hi = Math.max(hi, d[i] + r);
        }
        int below = m - 1 - k; // the wanted eigenvalue has exactly this many below it
        for (int it = 0; it < 200; it++) {
            double mid = 0.5 * (lo + hi);
            if (mid <= lo || mid >= hi || hi - lo <= 1e-15 * Math.max(Math.abs(lo), Math.abs(hi))) {
                break;
            }
            if (countBelow(d, e, m, mid) > below) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    /** Number of eigenvalues of the tridiagonal (d, e) below x: negative pivots of the LDL' of T − xI. */
    private static int countBelow(double[] d, double[] e, int m, double x) {
        int count = 0;
        double piv = 1;
        for (int i = 0; i < m; i++) {
            piv = d[i] - x - (i > 0 ? e[i - 1] * e[i - 1] / piv : 0);
            if (piv == 0) {
                piv = -Double.MIN_NORMAL;
            }
            if (piv < 0) {
                count++;
            }
        }
        return count;
    }

    private static void axpy(double c, double[] x, double[] y) {
        for (int i = 0; i < x.length; i++) {
            y[i] += c * x[i];
        }
    }

    private static void scale(double[] x, double c) {
        for (int i = 0; i < x.length; i++) {
            x[i] *= c;
        }
    }
}
