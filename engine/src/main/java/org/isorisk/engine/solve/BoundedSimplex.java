package org.isorisk.engine.solve;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealVector;
import org.isorisk.engine.model.Relation;

/**
 * A small dense primal simplex method for bounded variables (Dantzig's bounded-variable simplex; see e.g.
 * Chvátal, "Linear Programming", 1983, chapter on bounded variables, from memory), two phases with one artificial variable per row:
 * minimise {@code c'x} subject to {@code a_r'x (=|<=|>=) b_r} and {@code lo ≤ x ≤ hi} (infinite bounds allowed).
 *
 * <p>It serves three purposes: a feasible starting vertex for the active-set QP, the range of expected returns a
 * mandate allows (the maximum and minimum of {@code μ'w}), and the feasibility tests of the infeasibility
 * diagnosis. Rows are few (budget, groups, general constraints) and columns many, so a dense tableau of
 * {@code m × (n + 2m)} costs {@code O(m n)} per pivot. Dantzig's rule picks the entering column; after a run of
 * degenerate pivots it switches to Bland's smallest-index rule, which cannot cycle (Bland 1977). The basic values
 * are recomputed from the final basis by an LU solve, so the returned point meets the rows to round-off.
 */
final class BoundedSimplex {
    private BoundedSimplex() {
    }

    enum Outcome { OPTIMAL, INFEASIBLE, UNBOUNDED, ITERATION_LIMIT }

    /** Where a column ends up. */
    enum State { BASIC, AT_LOWER, AT_UPPER, FREE_AT_ZERO }

    /**
     * The result.
     *
     * @param outcome     optimal, infeasible or unbounded
     * @param x           structural values (a vertex when optimal)
     * @param objective   {@code c'x}
     * @param states      state of each structural column
     * @param rowTight    per row: its logical (slack) column is nonbasic, so the row holds with equality
     * @param redundant   per row: an equality that depends on the others (its artificial stayed basic at zero)
     * @param infeasibility sum of artificial values at the end of phase 1 (0 when feasible)
     */
    record Result(Outcome outcome, double[] x, double objective, State[] states, boolean[] rowTight,
                  boolean[] redundant, double infeasibility) {
    }

    private static final double PIVOT_TOL = 1e-9;
    private static final int BLAND_AFTER = 30;

    /**
     * Solves the LP; no argument is modified.
     *
     * @param a   rows of coefficients (m × n)
     * @param rel relation of each row
     * @param b   right-hand sides
     * @param lo  lower bounds, {@code -Infinity} allowed
     * @param hi  upper bounds, {@code +Infinity} allowed
     * @param c   objective (null for a pure feasibility problem)
     */
    static Result solve(double[][] a, Relation[] rel, double[] b, double[] lo, double[] hi, double[] c,
                        int maxIterations) {
        return new Run(a, rel, b, lo, hi, c, maxIterations).run();
    }

    private static final class Run {
        final int m;
        final int n;
        final int cols;
        final double[][] a;
        final double[] b;
        final double[] lo;
        final double[] hi;
        final double[] sign;
        final double[][] t;
        final int[] basis;
        final double[] x;
        final State[] state;
        final double[] cost2;
        final int maxIterations;
        int iterations;
        double scaleB;

        Run(double[][] a, Relation[] rel, double[] b, double[] lo, double[] hi, double[] c, int maxIterations) {
            this.m = a.length;
            this.n = lo.length;
            this.cols = n + 2 * m;
            this.a = a;
            this.b = b;
            this.maxIterations = maxIterations;
            this.lo = new double[cols];
            this.hi = new double[cols];
            System.arraycopy(lo, 0, this.lo, 0, n);
            System.arraycopy(hi, 0, this.hi, 0, n);
            for (int r = 0; r < m; r++) {
                int z = n + r;
                switch (rel[r]) {
                    case EQUAL -> { this.lo[z] = 0; this.hi[z] = 0; }
                    case AT_MOST -> { this.lo[z] = 0; this.hi[z] = Double.POSITIVE_INFINITY; }
                    case AT_LEAST -> { this.lo[z] = Double.NEGATIVE_INFINITY; this.hi[z] = 0; }
                }
                this.lo[n + m + r] = 0;
                this.hi[n + m + r] = Double.POSITIVE_INFINITY;
            }
            x = new double[cols];
            state = new State[cols];
            for (int j = 0; j < n + m; j++) {
                if (Double.isFinite(this.lo[j])) {
                    x[j] = this.lo[j];
                    state[j] = State.AT_LOWER;
                } else if (Double.isFinite(this.hi[j])) {
                    x[j] = this.hi[j];
                    state[j] = State.AT_UPPER;
                } else {
                    x[j] = 0;
                    state[j] = State.FREE_AT_ZERO;
                }
            }
            sign = new double[m];
            t = new double[m][cols];
            basis = new int[m];
            scaleB = 1;
            for (int r = 0; r < m; r++) {
                double res = b[r];
                for (int j = 0; j < n; j++) {
                    res -= a[r][j] * x[j];
                }
                sign[r] = res >= 0 ? 1 : -1;
                for (int j = 0; j < n; j++) {
                    t[r][j] = sign[r] * a[r][j];
                }
                t[r][n + r] = sign[r];
                t[r][n + m + r] = 1;
                basis[r] = n + m + r;
                x[n + m + r] = Math.abs(res);
                state[n + m + r] = State.BASIC;
                scaleB = Math.max(scaleB, Math.abs(b[r]));
            }
            cost2 = new double[cols];
            if (c != null) {
                System.arraycopy(c, 0, cost2, 0, n);
            }
        }

        Result run() {
            double[] cost1 = new double[cols];
            for (int r = 0; r < m; r++) {
                cost1[n + m + r] = 1;
            }
            Outcome o1 = iterate(cost1);
            double infeas = 0;
            for (int r = 0; r < m; r++) {
                infeas += x[n + m + r];
            }
            boolean[] redundant = new boolean[m];
            if (o1 == Outcome.ITERATION_LIMIT) {
                return result(o1, redundant, infeas);
            }
            if (o1 != Outcome.OPTIMAL || infeas > 1e-9 * scaleB) {
                return result(Outcome.INFEASIBLE, redundant, infeas);
            }
            // Drive artificials out of the basis; a row where that is impossible repeats other rows.
            for (int r = 0; r < m; r++) {
                if (basis[r] < n + m) {
                    continue;
                }
                int best = -1;
                double big = PIVOT_TOL;
                for (int j = 0; j < n + m; j++) {
                    if (state[j] != State.BASIC && Math.abs(t[r][j]) > big) {
                        big = Math.abs(t[r][j]);
                        best = j;
                    }
                }
                if (best < 0) {
                    redundant[r] = true;
                } else {
                    int leaving = basis[r];
                    pivot(r, best);
                    x[leaving] = 0;
                    state[leaving] = State.AT_LOWER;
                }
            }
            for (int r = 0; r < m; r++) {
                hi[n + m + r] = 0; // artificials may no longer move
            }
            Outcome o2 = iterate(cost2);
            refine();
            return result(o2, redundant, 0);
        }

        private Result result(Outcome o, boolean[] redundant, double infeas) {
            double[] xs = new double[n];
            System.arraycopy(x, 0, xs, 0, n);
            double obj = 0;
            for (int j = 0; j < n; j++) {
                obj += cost2[j] * xs[j];
            }
            State[] st = new State[n];
            System.arraycopy(state, 0, st, 0, n);
            boolean[] tight = new boolean[m];
            for (int r = 0; r < m; r++) {
                tight[r] = state[n + r] != State.BASIC;
            }
            return new Result(o, xs, obj, st, tight, redundant, infeas);
        }

        /** Primal simplex iterations on the current basis for the objective {@code cost}. */
        private Outcome iterate(double[] cost) {
            double cscale = 0;
            for (double v : cost) {
                cscale = Math.max(cscale, Math.abs(v));
            }
            double dtol = 1e-11 * Math.max(1, cscale);
            double[] d = new double[cols];
            int degenerate = 0;
            while (true) {
                if (++iterations > maxIterations) {
                    return Outcome.ITERATION_LIMIT;
                }
                boolean bland = degenerate >= BLAND_AFTER;
                // reduced costs d = c − c_B' T, row by row (contiguous, vectorisable)
                System.arraycopy(cost, 0, d, 0, cols);
                for (int r = 0; r < m; r++) {
                    double cb = cost[basis[r]];
                    if (cb == 0) {
                        continue;
                    }
                    double[] tr = t[r];
                    for (int j = 0; j < cols; j++) {
                        d[j] -= cb * tr[j];
                    }
                }
                int enter = -1;
                double dir = 0;
                double best = 0;
                for (int j = 0; j < cols; j++) {
                    State s = state[j];
                    if (s == State.BASIC || lo[j] == hi[j]) {
                        continue;
                    }
                    double dj = d[j];
                    double dirj = 0;
                    if (dj < -dtol && (s == State.AT_LOWER || s == State.FREE_AT_ZERO)) {
                        dirj = 1;
                    } else if (dj > dtol && (s == State.AT_UPPER || s == State.FREE_AT_ZERO)) {
                        dirj = -1;
                    }
                    if (dirj == 0) {
                        continue;
                    }
                    if (bland) {
                        enter = j;
                        dir = dirj;
                        break;
                    }
                    if (Math.abs(dj) > best) {
                        best = Math.abs(dj);
                        enter = j;
                        dir = dirj;
                    }
                }
                if (enter < 0) {
                    return Outcome.OPTIMAL;
                }
                double step = hi[enter] - lo[enter];
                int leaveRow = -1;
                boolean leaveToUpper = false;
                double pivotSize = 0;
                for (int r = 0; r < m; r++) {
                    double tr = t[r][enter];
                    if (Math.abs(tr) <= PIVOT_TOL) {
                        continue;
                    }
                    double delta = -dir * tr;
                    int bv = basis[r];
                    double limit;
                    boolean toUpper;
                    if (delta < 0) {
                        if (!Double.isFinite(lo[bv])) {
                            continue;
                        }
                        limit = Math.max(0, x[bv] - lo[bv]) / -delta;
                        toUpper = false;
                    } else {
                        if (!Double.isFinite(hi[bv])) {
                            continue;
                        }
                        limit = Math.max(0, hi[bv] - x[bv]) / delta;
                        toUpper = true;
                    }
                    boolean take;
                    if (limit < step - (bland ? 0 : 1e-14)) {
                        take = true;
                    } else if (limit <= step + (bland ? 0 : 1e-14)) {
                        take = leaveRow < 0 || (bland ? bv < basis[leaveRow] : Math.abs(tr) > pivotSize);
                    } else {
                        take = false;
                    }
                    if (take) {
                        step = Math.min(step, limit);
                        leaveRow = r;
                        leaveToUpper = toUpper;
                        pivotSize = Math.abs(tr);
                    }
                }
                if (!Double.isFinite(step)) {
                    return Outcome.UNBOUNDED;
                }
                degenerate = step == 0 ? degenerate + 1 : 0;
                x[enter] += dir * step;
                for (int r = 0; r < m; r++) {
                    x[basis[r]] -= dir * t[r][enter] * step;
                }
                if (leaveRow < 0) {
                    // bound flip: the entering column runs to its other bound, the basis stays
                    state[enter] = dir > 0 ? State.AT_UPPER : State.AT_LOWER;
                    x[enter] = dir > 0 ? hi[enter] : lo[enter];
                    continue;
                }
                int leaving = basis[leaveRow];
                pivot(leaveRow, enter);
                x[leaving] = leaveToUpper ? hi[leaving] : lo[leaving];
                state[leaving] = leaveToUpper ? State.AT_UPPER : State.AT_LOWER;
            }
        }

        private void pivot(int r, int j) {
            double[] pr = t[r];
            double p = pr[j];
            for (int k = 0; k < cols; k++) {
                pr[k] /= p;
            }
            pr[j] = 1;
            for (int s = 0; s < m; s++) {
                if (s == r) {
                    continue;
                }
                double f = t[s][j];
                if (f == 0) {
                    continue;
                }
                double[] ps = t[s];
                for (int k = 0; k < cols; k++) {
                    ps[k] -= f * pr[k];
                }
                ps[j] = 0;
            }
            basis[r] = j;
            state[j] = State.BASIC;
        }

        /** Recomputes the basic values from the nonbasic ones: {@code B x_B = b − N x_N}. */
        private void refine() {
            if (m == 0) {
                return;
            }
            double[][] bm = new double[m][m];
            double[] rhs = b.clone();
            for (int r = 0; r < m; r++) {
                for (int j = 0; j < cols; j++) {
                    if (state[j] == State.BASIC || x[j] == 0) {
                        continue;
                    }
                    rhs[r] -= column(r, j) * x[j];
                }
                for (int q = 0; q < m; q++) {
                    bm[r][q] = column(r, basis[q]);
                }
            }
            LUDecomposition lu = new LUDecomposition(new Array2DRowRealMatrix(bm, false), 1e-14);
            if (!lu.getSolver().isNonSingular()) {
                return;
            }
            RealVector xb = lu.getSolver().solve(new ArrayRealVector(rhs, false));
            for (int q = 0; q < m; q++) {
                int j = basis[q];
                double v = xb.getEntry(q);
                // clip round-off against the basic variable's own bounds
                if (Double.isFinite(lo[j]) && v < lo[j]) {
                    v = Math.max(v, lo[j] - 1e-15 * Math.max(1, Math.abs(lo[j])));
                }
                if (Double.isFinite(hi[j]) && v > hi[j]) {
                    v = Math.min(v, hi[j] + 1e-15 * Math.max(1, Math.abs(hi[j])));
                }
                x[j] = v;
            }
        }

        /** Entry (r, j) of the original constraint matrix {@code [A | I | diag(sign)]}. */
        private double column(int r, int j) {
            if (j < n) {
                return a[r][j];
            }
            if (j < n + m) {
                return j - n == r ? 1 : 0;
            }
            return j - n - m == r ? sign[r] : 0;
        }
    }
}
