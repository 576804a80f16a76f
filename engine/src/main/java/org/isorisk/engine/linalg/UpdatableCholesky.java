package org.isorisk.engine.linalg;

/**
 * A Cholesky factor {@code S = L L'} of a symmetric positive definite matrix that grows and shrinks one
 * row/column at a time: appending a row/column costs one triangular solve ({@code O(m²)}), deleting one at any
 * position costs a sweep of Givens rotations ({@code O(m²)}), so a sequence of changes never refactors from
 * scratch ({@code O(m³)}); a deletion can hand over its rotations so that a caller carries its own half solves
 * along. Used for the free-set block of the covariance in the critical line method.
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
            double v = (column[j] - Dense.dot(lj, r, j)) / lj[j];
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
     * Borders the matrix with a new last row/column whose off-diagonal part of the factor is already known:
     * {@code l = L⁻¹s} for the new column s (as kept by a caller that maintains {@code L⁻¹} times other columns).
     * Only the pivot {@code sqrt(diagonal − l'l)} is computed here, in {@code O(m)}.
     *
     * @param l        {@code L⁻¹s}, first {@code size()} entries (not modified)
     * @param diagonal the new diagonal entry {@code S[new][new]}
     * @param relTol   as for {@link #append}
     * @return the squared pivot relative to the diagonal, or a value ≤ relTol when refused (nothing changes)
     */
    public double appendRow(double[] l, double diagonal, double relTol) {
        if (size == capacity) {
            throw new IllegalStateException("factor is full");
        }
        int m = size;
        double ss = Dense.dot(l, l, m);
        double d = diagonal - ss;
        double rel = diagonal > 0 ? d / diagonal : -1;
        if (!(rel > relTol)) {
            return rel;
        }
        double[] r = rows[size] == null ? new double[capacity] : rows[size];
        System.arraycopy(l, 0, r, 0, m);
        r[m] = Math.sqrt(d);
        rows[size] = r;
        size++;
        return rel;
    }

    /**
     * Deletes row/column {@code pos} as {@link #remove(int)}, recording the Givens rotations that restore the
     * triangle so that a caller can carry other quantities along ({@link #rotate}): with {@code L_del} the old
     * factor without row pos and Q the product of the rotations, {@code L_del Q = [L̃ 0]}; hence for any
     * {@code y = L⁻¹b} the new {@code L̃⁻¹b_del} is the first {@code size()} entries of {@code Q'y}.
     *
     * @param pos zero-based position, {@code 0 ≤ pos < size()}
     * @param cos receives the rotations' cosines at indices pos..size()−1 (after the call)
     * @param sin receives their sines at the same indices
     * @param oldRow receives the deleted row of the factor (entries 0..pos), zeros after it up to the old size
     */
    public void remove(int pos, double[] cos, double[] sin, double[] oldRow) {
        if (pos < 0 || pos >= size) {
            throw new IndexOutOfBoundsException(pos);
        }
        double[] gone = rows[pos];
        System.arraycopy(gone, 0, oldRow, 0, pos + 1);
        java.util.Arrays.fill(oldRow, pos + 1, size, 0.0);
        System.arraycopy(rows, pos + 1, rows, pos, size - pos - 1);
        rows[size - 1] = gone;
        int m = size - 1;
        // Row by row (each row read once): row i takes the rotations of the rows above it, then sets its own.
        for (int i = pos; i < m; i++) {
            double[] li = rows[i];
            for (int j = pos; j < i; j++) {
                double x = li[j];
                double y = li[j + 1];
                li[j] = cos[j] * x + sin[j] * y;
                li[j + 1] = -sin[j] * x + cos[j] * y;
            }
            double a = li[i];
            double b = li[i + 1];
            double r = Math.hypot(a, b);
            cos[i] = a / r;
            sin[i] = b / r;
            li[i] = r;
            li[i + 1] = 0;
        }
        size = m;
    }

    /**
     * Applies the rotations recorded by {@link #remove(int, double[], double[], double[])} at indices
     * {@code pos..end−1} to a vector indexed like the factor's columns: {@code v ← Q'v}. The first {@code end}
     * entries of the result are the new system's; entry {@code end} is left over.
     */
    public static void rotate(double[] v, int pos, int end, double[] cos, double[] sin) {
        for (int j = pos; j < end; j++) {
            double x = v[j];
            double y = v[j + 1];
            v[j] = cos[j] * x + sin[j] * y;
            v[j + 1] = -sin[j] * x + cos[j] * y;
        }
    }

    /** Solves {@code L y = b} in place (the forward half) for three right-hand sides at once. */
    public void forwardInPlace(double[] a, double[] b, double[] c) {
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
    }

    /**
     * Solves {@code L'x = y} in place (the backward half) for two right-hand sides at once, reading each row of
     * the factor once: four rows at a time, each entry of the right-hand sides is loaded and stored once per four
     * rows rather than once per row.
     */
    public void backwardInPlace(double[] a, double[] b) {
        int i = size - 1;
        for (; i >= 3; i -= 4) {
            double[] l3 = rows[i];
            double[] l2 = rows[i - 1];
            double[] l1 = rows[i - 2];
            double[] l0 = rows[i - 3];
            // The 4×4 triangle at the diagonal.
            double a3 = a[i] / l3[i];
            double b3 = b[i] / l3[i];
            double a2 = (a[i - 1] - l3[i - 1] * a3) / l2[i - 1];
            double b2 = (b[i - 1] - l3[i - 1] * b3) / l2[i - 1];
            double a1 = (a[i - 2] - l3[i - 2] * a3 - l2[i - 2] * a2) / l1[i - 2];
            double b1 = (b[i - 2] - l3[i - 2] * b3 - l2[i - 2] * b2) / l1[i - 2];
            double a0 = (a[i - 3] - l3[i - 3] * a3 - l2[i - 3] * a2 - l1[i - 3] * a1) / l0[i - 3];
            double b0 = (b[i - 3] - l3[i - 3] * b3 - l2[i - 3] * b2 - l1[i - 3] * b1) / l0[i - 3];
            a[i] = a3;
            b[i] = b3;
            a[i - 1] = a2;
            b[i - 1] = b2;
            a[i - 2] = a1;
            b[i - 2] = b1;
            a[i - 3] = a0;
            b[i - 3] = b0;
            int end = i - 3;
            for (int k = 0; k < end; k++) {
                double v3 = l3[k];
                double v2 = l2[k];
                double v1 = l1[k];
                double v0 = l0[k];
                a[k] -= (v3 * a3 + v2 * a2) + (v1 * a1 + v0 * a0);
                b[k] -= (v3 * b3 + v2 * b2) + (v1 * b1 + v0 * b0);
            }
        }
        for (; i >= 0; i--) {
            double[] li = rows[i];
            double xa = a[i] / li[i];
            double xb = b[i] / li[i];
            a[i] = xa;
            b[i] = xb;
            for (int k = 0; k < i; k++) {
                a[k] -= li[k] * xa;
                b[k] -= li[k] * xb;
            }
        }
    }

    /**
     * Deletes row/column {@code pos}; the rows after it move up by one.
     *
     * @param pos zero-based position, {@code 0 ≤ pos < size()}
     */
    public void remove(int pos) {
        remove(pos, new double[size], new double[size], new double[size]);
    }

    /** Solves {@code S x = b} in place for the first {@code size()} entries of {@code x}. */
    public void solveInPlace(double[] x) {
        int m = size;
        for (int i = 0; i < m; i++) {
            double[] li = rows[i];
            x[i] = (x[i] - Dense.dot(li, x, i)) / li[i];
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
