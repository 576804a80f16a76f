package org.isorisk.engine.linalg;

/**
 * A Cholesky factor {@code S = L L'} of a symmetric positive definite matrix that grows and shrinks one
 * row/column at a time: appending a row/column costs one triangular solve ({@code O(m²)}), deleting one at any
 * position costs a sweep of Givens rotations ({@code O(m²)}), so a sequence of changes never refactors from
 * scratch ({@code O(m³)}). Used for the free-set block of the covariance in the critical line method.
 * Rows are stored as separate arrays of a fixed capacity, so deletions move references, not numbers.
 */
public final class UpdatableCholesky {
    private final int capacity;
    private final double[][] rows;
    private int size;

    /**
     * An empty factor that can hold matrices up to {@code capacity} by {@code capacity}.
     *
     * @param capacity largest size the factor will reach
     */
    public UpdatableCholesky(int capacity) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be at least 1");
        }
        this.capacity = capacity;
        this.rows = new double[capacity][];
    }

    /** Current size m of the factored matrix. */
    public int size() {
        return size;
    }

    /**
     * Borders the matrix with a new last row/column.
     *
     * @param column   entries {@code S[j][new]} for the current rows j = 0..m-1 (not modified; length ≥ m)
     * @param diagonal the new diagonal entry {@code S[new][new]}
     * @param relTol   the new pivot² must exceed {@code relTol · diagonal}, otherwise the bordered matrix is
     *                 (numerically) singular and nothing changes
     * @return the squared pivot relative to the diagonal (in (0, 1]), or a value ≤ relTol when refused
     */
    public double append(double[] column, double diagonal, double relTol) {
        if (size == capacity) {
            throw new IllegalStateException("factor is full");
        }
        double[] r = rows[size] == null ? new double[capacity] : rows[size];
        int m = size;
        double ss = 0;
        for (int j = 0; j < m; j++) {
            double[] lj = rows[j];
            double v = (column[j] - dot(lj, r, j)) / lj[j];
            r[j] = v;
            ss += v * v;
        }
        double d = diagonal - ss;
        double rel = diagonal > 0 ? d / diagonal : -1;
        if (!(rel > relTol)) {
            rows[size] = r;
            return rel;
        }
        r[m] = Math.sqrt(d);
        rows[size] = r;
        size++;
        return rel;
    }

    /**
     * Deletes row/column {@code pos}; the rows after it move up by one.
     *
     * @param pos zero-based position, {@code 0 ≤ pos < size()}
     */
    public void remove(int pos) {
        if (pos < 0 || pos >= size) {
            throw new IndexOutOfBoundsException(pos);
        }
        double[] gone = rows[pos];
        System.arraycopy(rows, pos + 1, rows, pos, size - pos - 1);
        rows[size - 1] = gone;
        int m = size - 1;
        // Rows pos..m-1 now reach one column past their diagonal; rotate columns (j, j+1) to clear it.
        for (int j = pos; j < m; j++) {
            double[] lj = rows[j];
            double a = lj[j];
            double b = lj[j + 1];
            double r = Math.hypot(a, b);
            double c = a / r;
            double s = b / r;
            lj[j] = r;
            lj[j + 1] = 0;
            for (int i = j + 1; i < m; i++) {
                double[] li = rows[i];
                double x = li[j];
                double y = li[j + 1];
                li[j] = c * x + s * y;
                li[j + 1] = -s * x + c * y;
            }
        }
        size = m;
    }

    /**
     * After {@link #append}, the old matrix's solution of {@code S z = s} for the appended column s, by one
     * back-substitution: the new row of L is {@code L⁻¹s} already.
     *
     * @param z receives z in its first {@code size() − 1} entries
     */
    public void borderSolution(double[] z) {
        int m = size - 1;
        double[] last = rows[m];
        System.arraycopy(last, 0, z, 0, m);
        for (int i = m - 1; i >= 0; i--) {
            double[] li = rows[i];
            double zi = z[i] / li[i];
            z[i] = zi;
            for (int k = 0; k < i; k++) {
                z[k] -= li[k] * zi;
            }
        }
    }

    /**
     * Column {@code p} of {@code S⁻¹}: solves {@code S v = e_p} (the forward pass starts at row p).
     *
     * @param v receives the column in its first {@code size()} entries
     */
    public void unitSolution(int p, double[] v) {
        int m = size;
        java.util.Arrays.fill(v, 0, m, 0.0);
        v[p] = 1 / rows[p][p];
        for (int i = p + 1; i < m; i++) {
            double[] li = rows[i];
            double s = 0;
            for (int k = p; k < i; k++) {
                s -= li[k] * v[k];
            }
            v[i] = s / li[i];
        }
        for (int i = m - 1; i >= 0; i--) {
            double[] li = rows[i];
            double vi = v[i] / li[i];
            v[i] = vi;
            for (int k = 0; k < i; k++) {
                v[k] -= li[k] * vi;
            }
        }
    }

    /** Solves {@code S x = b} in place for the first {@code size()} entries of {@code x}. */
    public void solveInPlace(double[] x) {
        int m = size;
        for (int i = 0; i < m; i++) {
            double[] li = rows[i];
            x[i] = (x[i] - dot(li, x, i)) / li[i];
        }
        for (int i = m - 1; i >= 0; i--) {
            double[] li = rows[i];
            double xi = x[i] / li[i];
            x[i] = xi;
            for (int k = 0; k < i; k++) {
                x[k] -= li[k] * xi;
            }
        }
    }

    /**
     * Solves {@code S x = b} in place for three right-hand sides at once, reading the factor twice in all (not
     * twice per right-hand side); the three sums of each row are independent, so they also pipeline.
     */
    public void solveInPlace(double[] a, double[] b, double[] c) {
        int m = size;
        for (int i = 0; i < m; i++) {
            double[] li = rows[i];
            double sa = a[i];
            double sb = b[i];
            double sc = c[i];
            for (int k = 0; k < i; k++) {
                double l = li[k];
                sa -= l * a[k];
                sb -= l * b[k];
                sc -= l * c[k];
            }
            double d = li[i];
            a[i] = sa / d;
            b[i] = sb / d;
            c[i] = sc / d;
        }
        for (int i = m - 1; i >= 0; i--) {
            double[] li = rows[i];
            double d = li[i];
            double xa = a[i] / d;
            double xb = b[i] / d;
            double xc = c[i] / d;
            a[i] = xa;
            b[i] = xb;
            c[i] = xc;
            for (int k = 0; k < i; k++) {
                double l = li[k];
                a[k] -= l * xa;
                b[k] -= l * xb;
                c[k] -= l * xc;
            }
        }
    }

    /** {@code Σ_{k<len} u[k] v[k]} with four partial sums (independent chains pipeline better). */
    private static double dot(double[] u, double[] v, int len) {
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        double s3 = 0;
        int k = 0;
        for (; k + 3 < len; k += 4) {
            s0 += u[k] * v[k];
            s1 += u[k + 1] * v[k + 1];
            s2 += u[k + 2] * v[k + 2];
            s3 += u[k + 3] * v[k + 3];
        }
        for (; k < len; k++) {
            s0 += u[k] * v[k];
        }
        return (s0 + s1) + (s2 + s3);
    }

    /** Entry (i, j) of L, zero above the diagonal. */
    public double factorEntry(int i, int j) {
        if (i >= size || j >= size) {
            throw new IndexOutOfBoundsException(Math.max(i, j));
        }
        return j > i ? 0 : rows[i][j];
    }

    /**
     * A cheap lower bound of the 2-norm condition number of the factored matrix, {@code (max L_ii / min L_ii)²}.
     */
    public double conditionEstimate() {
        double lo = Double.POSITIVE_INFINITY;
        double hi = 0;
        for (int i = 0; i < size; i++) {
            double d = rows[i][i];
            lo = Math.min(lo, d);
            hi = Math.max(hi, d);
        }
        return size == 0 ? 1 : (hi / lo) * (hi / lo);
    }
}
