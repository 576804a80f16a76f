package org.isorisk.engine.solve;

import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.Relation;

/**
 * Primal active-set method for convex quadratic programs (Nocedal &amp; Wright, "Numerical Optimization",
 * 2nd ed. 2006, Algorithm 16.3; numbering from memory), specialised to portfolio problems: minimise {@code w'Σw} subject to a few general
 * rows and many simple bounds.
 *
 * <ul>
 *   <li>Bounds are handled as bounds: a variable in the working set at a bound is eliminated, so the equality
 *   subproblem lives on the free set {@code F} only. Its Hessian {@code Σ_FF = L L'} is held as a Cholesky factor
 *   that is <em>updated</em> when a variable is freed (a new row of {@code L}, {@code O(k²)}) or fixed (the row
 *   is deleted and the factor re-triangularised by Givens rotations, {@code O(k²)}); it is never refactored.</li>
 *   <li>Active general rows enter through {@code Y = L⁻¹ A_F'} (range-space method, N&amp;W §16.2), updated with the
 *   same rotations; the small least-squares problem in {@code Y} is solved by Householder QR.</li>
 *   <li>The gradient {@code g = 2Σw} is updated by the step, {@code O(n k)} per iteration.</li>
 *   <li>Degeneracy: after a run of zero-length steps both the constraint to drop and the blocking constraint are
 *   chosen by the smallest index (Bland's rule), which prevents cycling.</li>
 *   <li>At the end the point and the multipliers are recomputed directly on the final working set (not taken
 *   from the iterations), in the convention {@code 2Σw = Σ ν_r a_r + λ}: {@code ν_r = ∂V*∂b_r}, {@code λ_i} the
 *   bound's shadow price.</li>
 * </ul>
 * A start (feasible point with a working set) comes from the simplex vertex or from a previous solution.
 */
final class ActiveSetQp {

    static final byte FREE = 0;
    static final byte LOWER = 1;
    static final byte UPPER = 2;
    static final byte FIXED = 3;

    private static final int BLAND_AFTER = 3;

    /**
     * Free-set size from which the first factor of {@code Σ_FF} is computed by the blocked Cholesky
     * factorisation ({@link Cholesky#factorRowsInPlace}) instead of one appended row at a time: the same
     * O(k³/3) operations, but vectorised, cache-blocked and on {@code threads} threads.
     */
    static final int BLOCKED_MIN = 48;

    /** Violation of a bound or row (relative to max(1, |limit|)) up to which a start point counts as feasible. */
    static final double FEASIBLE = 1e-12;


    /**
     * The outcome.
     *
     * @param w          weights
     * @param nu         per row: multiplier {@code ∂V*∂b_r} (0 for rows not in the final working set)
     * @param lambda     per variable: bound multiplier (0 for free variables)
     * @param state      per variable: FREE, LOWER, UPPER or FIXED in the final working set
     * @param rowActive  per row: in the final working set
     * @param iterations iterations taken
     * @param condition  estimated 2-norm condition number of the reduced Hessian {@code Σ_FF}
     * @param freeCount  size of the final free set
     * @param dependent  constraints that hold with equality at the solution but are linear combinations of the
     *                   working set (degenerate): index r for row r, {@code -1 - i} for a bound of variable i. When
     *                   not empty, the multipliers are not unique; the ones returned are those of the working set.
     */
    record Result(double[] w, double[] nu, double[] lambda, byte[] state, boolean[] rowActive, int iterations,
                  double condition, int freeCount, int[] dependent) {
    }

    /**
     * A start: a point feasible for the problem and a working set of constraints active at it.
     *
     * @param w         weights (copied)
     * @param state     per variable FREE/LOWER/UPPER/FIXED (copied); bounded variables are moved onto their bound
     * @param rowActive per row: in the working set (equalities are always added)
     */
    record Start(double[] w, byte[] state, boolean[] rowActive) {
    }

    private final QpProblem p;
    private final int n;
    private final int m;
    private final double[][] s;
    private final int maxIterations;
    private final int threads;
    private final Cholesky full;
    private final double[] w;
    private final double[] g;
    private final byte[] st;
    private final int[] free;
    private final int[] pos;
    private int k;
    private double[][] l;
    private final int[] act;
    private final boolean[] rowAct;
    private int ma;
    private double[][] y;
    private final double[] rowVal;
    private int iterations;

    private ActiveSetQp(QpProblem p, Start start, int maxIterations, int threads, Cholesky full) {
        this.p = p;
        this.n = p.n;
        this.m = p.rows();
        this.s = p.sigma;
        this.maxIterations = maxIterations;
        this.threads = Math.max(1, threads);
        this.full = full != null && full.size() == p.n ? full : null;
        this.w = start.w().clone();
        this.st = start.state().clone();
        this.free = new int[n];
        this.pos = new int[n];
        Arrays.fill(pos, -1);
        this.l = new double[Math.max(1, n)][];
        this.act = new int[m];
        this.rowAct = new boolean[m];
        this.y = new double[m][];
        this.g = new double[n];
        this.rowVal = new double[m];
    }

    /** Solves from the start given (the first factor on one thread). */
    static Result solve(QpProblem p, Start start, int maxIterations) {
        return solve(p, start, maxIterations, 1, null);
    }

    /**
     * Solves from the start given.
     *
     * @param threads threads for the first factor of {@code Σ_FF}
     * @param full    the Cholesky factor of the whole Σ, reused when every variable starts free; null when none
     */
    static Result solve(QpProblem p, Start start, int maxIterations, int threads, Cholesky full) {
        ActiveSetQp qp = new ActiveSetQp(p, start, maxIterations, threads, full);
        qp.initialise(start.rowActive());
        return qp.run();
    }

    /**
     * Solves starting at the minimiser of a guessed working set instead of at a vertex. The guess's minimiser
     * (every constraint in it held with equality, all others ignored) is computed; when it is feasible the
     * method continues from it, on the factor already built. When it is not, the bounds and inequality rows it
     * violates join the working set (the set only grows) and the minimiser is computed again, at most
     * {@code rounds} times. This is the first half of a primal-dual active-set step for bound constraints
     * (Hintermüller, Ito &amp; Kunisch, SIAM J. Optim. 13(3), 2002; from memory) without its release step:
     * releasing constraints whose multipliers have the wrong sign is left to the primal method, which keeps
     * its exactness and termination. When most assets are free at the optimum (the minimum-variance portfolio
     * of a dense factor model with loose caps) the first guess, everything free, is already optimal: one blocked
     * factorisation replaces hundreds of one-asset iterations.
     *
     * @param guess   working set to try first ({@code w} only supplies the values of variables at bounds)
     * @param threads threads for each factor of {@code Σ_FF}
     * @param full    the Cholesky factor of the whole Σ, reused when every variable is free; null when none
     * @param rounds  at most this many minimisers are tried
     * @return the solution, or null when no round gave a feasible point or a working set was inconsistent
     *         (dependent equalities, Σ_FF not positive definite): the caller then starts from a vertex, where
     *         those cases are diagnosed
     */
    static Result solveFromMinimiser(QpProblem p, Start guess, int maxIterations, int threads, Cholesky full,
                                     int rounds) {
        byte[] state = guess.state().clone();
        boolean[] rows = guess.rowActive().clone();
        for (int round = 0; round < rounds; round++) {
            ActiveSetQp qp = new ActiveSetQp(p, new Start(guess.w(), state, rows), maxIterations, threads, full);
            try {
                qp.initialise(rows);
            } catch (NoSolutionException e) {
                return null;
            }
            if (!qp.recover()) {
                return null;
            }
            if (p.violation(qp.w) <= FEASIBLE) {
                return qp.run();
            }
            boolean grew = false;
            for (int i = 0; i < p.n; i++) {
                state[i] = qp.st[i];
                if (qp.st[i] != FREE) {
                    continue;
                }
                if (qp.w[i] < p.lo[i] - FEASIBLE * Math.max(1, Math.abs(p.lo[i]))) {
                    state[i] = LOWER;
                    grew = true;
                } else if (qp.w[i] > p.hi[i] + FEASIBLE * Math.max(1, Math.abs(p.hi[i]))) {
                    state[i] = UPPER;
                    grew = true;
                }
            }
            for (int r = 0; r < p.rows(); r++) {
                rows[r] = qp.rowAct[r];
                if (p.rel[r] == Relation.EQUAL || qp.rowAct[r]) {
                    continue;
                }
                double d = qp.rowVal[r] - p.b[r];
                double tol = FEASIBLE * Math.max(1, Math.abs(p.b[r]));
                if ((p.rel[r] == Relation.AT_MOST && d > tol) || (p.rel[r] == Relation.AT_LEAST && d < -tol)) {
                    rows[r] = true;
                    grew = true;
                }
            }
            if (!grew) {
                return null;
            }
        }
        return null;
    }

    private void initialise(boolean[] wanted) {
        for (int i = 0; i < n; i++) {
            if (p.lo[i] == p.hi[i]) {
                st[i] = FIXED;
                w[i] = p.lo[i];
            } else if (st[i] == LOWER && Double.isFinite(p.lo[i])) {
                w[i] = p.lo[i];
            } else if (st[i] == UPPER && Double.isFinite(p.hi[i])) {
                w[i] = p.hi[i];
            } else {
                st[i] = FREE;
            }
        }
        int[] initial = new int[n];
        int count = 0;
        for (int i = 0; i < n; i++) {
            if (st[i] == FREE) {
                initial[count++] = i;
            }
        }
        addFreeAll(initial, count);
        // equalities first: they must all be in the working set
        for (int pass = 0; pass < 2; pass++) {
            for (int r = 0; r < m; r++) {
                boolean eq = p.rel[r] == Relation.EQUAL;
                if ((pass == 0) == eq && (eq || wanted[r])) {
                    if (!addRow(r) && eq) {
                        throw dependentEqualities(r);
                    }
                }
            }
        }
        recomputeGradient();
        for (int r = 0; r < m; r++) {
            rowVal[r] = p.rowValue(r, w);
        }
    }

    private NoSolutionException dependentEqualities(int r) {
        return new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, String.format(Locale.ROOT,
                "the constraint qualification fails: the equality '%s' repeats the other equalities and fixed "
                        + "weights on the assets left free, so its multiplier is not unique; fix: drop '%s' or the "
                        + "constraint it repeats", p.names[r], p.names[r]), List.of(p.names[r]));
    }

    private Result run() {
        int degenerate = 0;
        boolean atMinimiser = false;
        double[] q = new double[n];
        double[] pf = new double[n];
        double[] nu = new double[m];
        int refinements = 0;
        while (true) {
            if (++iterations > maxIterations) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, String.format(Locale.ROOT,
                        "the active-set method did not converge within %d iterations (free set %d, active rows %d); "
                                + "fix: raise the iteration limit or check the covariance matrix's conditioning",
                        maxIterations, k, ma), List.of());
            }
            boolean bland = degenerate >= BLAND_AFTER;
            for (int t = 0; t < k; t++) {
                q[t] = g[free[t]];
            }
            forward(q);
            Qr qr = Qr.of(y, ma, k);
            qr.leastSquares(q, nu);
            if (!atMinimiser) {
                // p_F = ½ L'⁻¹ (Y ν − q): the step to the minimiser on the working set
                double pmax = 0;
                for (int t = 0; t < k; t++) {
                    double v = -q[t];
                    for (int j = 0; j < ma; j++) {
                        v += y[j][t] * nu[j];
                    }
                    pf[t] = 0.5 * v;
                }
                backward(pf);
                double wmax = 1;
                for (int t = 0; t < k; t++) {
                    pmax = Math.max(pmax, Math.abs(pf[t]));
                    wmax = Math.max(wmax, Math.abs(w[free[t]]));
                }
                if (pmax > 1e-13 * wmax) {
                    double alpha = step(pf, pmax, bland);
                    degenerate = alpha == 0 ? degenerate + 1 : 0;
                    atMinimiser = alpha == 1;
                    continue;
                }
            }
            atMinimiser = true;
            // x is the minimiser on the working set: check the multipliers' signs
            int drop = mostViolated(nu, bland);
            if (drop < 0) {
                if (!recover()) {
                    throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED,
                            "the final working set of the active-set method is singular", List.of());
                }
                int again = mostViolated(finalNu(), false);
                if (again >= 0 && refinements++ < 3) {
                    atMinimiser = false;
                    continue;
                }
                return result();
            }
            if (drop < n) {
                st[drop] = FREE;
                addFree(drop);
            } else {
                removeRow(drop - n);
            }
            atMinimiser = false;
        }
    }

    private double[] lastNu;

    private double[] finalNu() {
        return lastNu;
    }

    /**
     * The most wrong-signed multiplier on the working set (index i &lt; n for a bound of variable i, n + slot for
     * an active inequality row), or −1 when all signs are right.
     */
    private int mostViolated(double[] nu, boolean bland) {
        double gscale = 0;
        for (int i = 0; i < n; i++) {
            gscale = Math.max(gscale, Math.abs(g[i]));
        }
        double tol = 1e-11 * Math.max(gscale, Double.MIN_NORMAL);
        int best = -1;
        double worst = tol;
        int bestIndex = Integer.MAX_VALUE;
        for (int i = 0; i < n; i++) {
            if (st[i] != LOWER && st[i] != UPPER) {
                continue;
            }
            double lam = g[i];
            for (int j = 0; j < ma; j++) {
                lam -= nu[j] * p.a[act[j]][i];
            }
            double v = st[i] == LOWER ? -lam : lam;
            if (v > tol && (bland ? i < bestIndex : v > worst)) {
                worst = v;
                best = i;
                bestIndex = i;
            }
        }
        for (int j = 0; j < ma; j++) {
            int r = act[j];
            if (p.rel[r] == Relation.EQUAL) {
                continue;
            }
            double v = (p.rel[r] == Relation.AT_LEAST ? -nu[j] : nu[j]) / Math.max(p.rowNorm[r], Double.MIN_NORMAL);
            if (v > tol && (bland ? n + r < bestIndex : v > worst)) {
                worst = v;
                best = n + j;
                bestIndex = n + r;
            }
        }
        return best;
    }

    /** Ratio test and step along {@code pf}; adds the blocking constraint. Returns the step length. */
    private double step(double[] pf, double pmax, boolean bland) {
        double alpha = 1;
        int block = -1;
        int blockIndex = Integer.MAX_VALUE;
        boolean blockUpper = false;
        // Components below this share of the step are round-off: a constraint blocking only through them would be
        // (numerically) dependent on the working set, so it is not allowed to block.
        double ignore = 1e-9 * pmax;
        for (int t = 0; t < k; t++) {
            int i = free[t];
            double pi = pf[t];
            double a;
            boolean up;
            if (pi < -ignore && Double.isFinite(p.lo[i])) {
                a = Math.max(0, w[i] - p.lo[i]) / -pi;
                up = false;
            } else if (pi > ignore && Double.isFinite(p.hi[i])) {
                a = Math.max(0, p.hi[i] - w[i]) / pi;
                up = true;
            } else {
                continue;
            }
            if (a < alpha || (bland && a == alpha && block >= 0 && i < blockIndex)) {
                alpha = a;
                block = t;
                blockIndex = i;
                blockUpper = up;
            }
        }
        double[] ap = new double[m];
        for (int r = 0; r < m; r++) {
            double v = 0;
            double[] ar = p.a[r];
            for (int t = 0; t < k; t++) {
                v += ar[free[t]] * pf[t];
            }
            ap[r] = v;
            if (rowAct[r] || p.rel[r] == Relation.EQUAL) {
                continue;
            }
            double tiny = 1e-9 * p.rowNorm[r] * pmax;
            double a;
            if (p.rel[r] == Relation.AT_MOST && v > tiny) {
                a = Math.max(0, p.b[r] - rowVal[r]) / v;
            } else if (p.rel[r] == Relation.AT_LEAST && v < -tiny) {
                a = Math.max(0, rowVal[r] - p.b[r]) / -v;
            } else {
                continue;
            }
            if (a < alpha || (bland && a == alpha && block >= 0 && n + r < blockIndex)) {
                alpha = a;
                block = k + r;
                blockIndex = n + r;
            }
        }
        if (alpha > 0) {
            for (int t = 0; t < k; t++) {
                int i = free[t];
                double d = alpha * pf[t];
                if (d == 0) {
                    continue;
                }
                w[i] += d;
                double[] si = s[i];
                double d2 = 2 * d;
                for (int j = 0; j < n; j++) {
                    g[j] += d2 * si[j];
                }
            }
            for (int r = 0; r < m; r++) {
                rowVal[r] += alpha * ap[r];
            }
        }
        if (block >= 0 && block < k) {
            int i = free[block];
            double target = blockUpper ? p.hi[i] : p.lo[i];
            moveTo(i, target);
            removeFree(block);
            st[i] = blockUpper ? UPPER : LOWER;
        } else if (block >= k) {
            int r = block - k;
            if (!addRow(r)) {
                // numerically dependent on the working set: treat the step as taken without it
                return alpha;
            }
        }
        return block >= 0 ? alpha : 1;
    }

    /** Moves variable i exactly onto {@code target}, updating the gradient and row values. */
    private void moveTo(int i, double target) {
        double d = target - w[i];
        w[i] = target;
        if (d != 0) {
            double[] si = s[i];
            for (int j = 0; j < n; j++) {
                g[j] += 2 * d * si[j];
            }
            for (int r = 0; r < m; r++) {
                rowVal[r] += d * p.a[r][i];
            }
        }
    }

    private void recomputeGradient() {
        Arrays.fill(g, 0);
        for (int i = 0; i < n; i++) {
            double wi = w[i];
            if (wi == 0) {
                continue;
            }
            double[] si = s[i];
            double d2 = 2 * wi;
            for (int j = 0; j < n; j++) {
                g[j] += d2 * si[j];
            }
        }
    }

    /**
     * Recomputes the free weights and all multipliers directly on the current working set (N&amp;W eq. 16.5 in
     * range-space form): {@code Y'Y h = b' + Y'z}, {@code w_F = L'⁻¹(Y h − z)}, {@code ν = 2h}, with
     * {@code z = L⁻¹ Σ_FB w_B} and {@code b'} the active limits less the fixed variables' part.
     */
    private boolean recover() {
        double[] z = new double[k];
        for (int i = 0; i < n; i++) {
            if (pos[i] >= 0 || w[i] == 0) {
                continue;
            }
            double wi = w[i];
            double[] si = s[i];
            for (int t = 0; t < k; t++) {
                z[t] += si[free[t]] * wi;
            }
        }
        forward(z);
        double[] c = new double[ma];
        for (int j = 0; j < ma; j++) {
            int r = act[j];
            double v = p.b[r];
            double[] ar = p.a[r];
            for (int i = 0; i < n; i++) {
                if (pos[i] < 0 && w[i] != 0) {
                    v -= ar[i] * w[i];
                }
            }
            double[] yj = y[j];
            for (int t = 0; t < k; t++) {
                v += yj[t] * z[t];
            }
            c[j] = v;
        }
        Qr qr = Qr.of(y, ma, k);
        double[] h = qr.normalSolve(c);
        if (h == null) {
            return false;
        }
        double[] wf = new double[k];
        for (int t = 0; t < k; t++) {
            double v = -z[t];
            for (int j = 0; j < ma; j++) {
                v += y[j][t] * h[j];
            }
            wf[t] = v;
        }
        backward(wf);
        for (int t = 0; t < k; t++) {
            w[free[t]] = wf[t];
        }
        recomputeGradient();
        for (int r = 0; r < m; r++) {
            rowVal[r] = p.rowValue(r, w);
        }
        lastNu = new double[m];
        for (int j = 0; j < ma; j++) {
            lastNu[j] = 2 * h[j];
        }
        return true;
    }

    private Result result() {
        double[] nuRows = new double[m];
        for (int j = 0; j < ma; j++) {
            nuRows[act[j]] = lastNu[j];
        }
        double[] lambda = new double[n];
        for (int i = 0; i < n; i++) {
            if (st[i] == FREE) {
                continue;
            }
            double lam = g[i];
            for (int j = 0; j < ma; j++) {
                lam -= lastNu[j] * p.a[act[j]][i];
            }
            lambda[i] = lam;
        }
        return new Result(w.clone(), nuRows, lambda, st.clone(), rowAct.clone(), iterations, condition(), k,
                dependentTight());
    }

    /** Constraints tight at w, outside the working set, whose free-set gradient lies in the working set's span. */
    private int[] dependentTight() {
        Qr qr = Qr.of(y, ma, k);
        List<Integer> out = new java.util.ArrayList<>();
        for (int r = 0; r < m; r++) {
            if (rowAct[r] || Math.abs(rowVal[r] - p.b[r]) > 1e-10 * Math.max(1, Math.abs(p.b[r]))) {
                continue;
            }
            double[] col = new double[Math.max(k, 1)];
            double norm = 0;
            for (int t = 0; t < k; t++) {
                col[t] = p.a[r][free[t]];
            }
            forward(col);
            for (int t = 0; t < k; t++) {
                norm += col[t] * col[t];
            }
            if (qr.residualNorm(col) <= 1e-9 * Math.sqrt(norm)) {
                out.add(r);
            }
        }
        for (int t = 0; t < k; t++) {
            int i = free[t];
            boolean atLo = Double.isFinite(p.lo[i]) && Math.abs(w[i] - p.lo[i]) <= 1e-10 * Math.max(1, Math.abs(p.lo[i]));
            boolean atHi = Double.isFinite(p.hi[i]) && Math.abs(w[i] - p.hi[i]) <= 1e-10 * Math.max(1, Math.abs(p.hi[i]));
            if (!atLo && !atHi) {
                continue;
            }
            double[] col = new double[k];
            col[t] = 1;
            forward(col);
            double norm = 0;
            for (double v : col) {
                norm += v * v;
            }
            if (qr.residualNorm(col) <= 1e-9 * Math.sqrt(norm)) {
                out.add(-1 - i);
            }
        }
        return out.stream().mapToInt(Integer::intValue).toArray();
    }

    // ---- factor updates ------------------------------------------------------------------------------------

    /**
     * Makes the first free set (no active rows yet): for a large set the factor of {@code Σ_FF} by the blocked
     * Cholesky factorisation, or copied from the factor of the whole Σ when every variable is free; row by row
     * otherwise. The pivots are checked as {@link #addFree} checks them.
     */
    private void addFreeAll(int[] idx, int count) {
        if (count < BLOCKED_MIN || ma > 0 || k > 0) {
            for (int t = 0; t < count; t++) {
                addFree(idx[t]);
            }
            return;
        }
        double[][] rows = new double[count][];
        if (full != null && count == n) {
            for (int t = 0; t < count; t++) {
                rows[t] = full.copyOfRow(t); // idx is 0..n−1 in order
            }
        } else {
            for (int t = 0; t < count; t++) {
                double[] si = s[idx[t]];
                double[] r = new double[t + 1];
                for (int u = 0; u <= t; u++) {
                    r[u] = si[idx[u]];
                }
                rows[t] = r;
            }
            if (!Cholesky.factorRowsInPlace(rows, threads)) {
                // not positive definite: the row-by-row method finds and names the failing pivot
                for (int t = 0; t < count; t++) {
                    addFree(idx[t]);
                }
                return;
            }
        }
        for (int t = 0; t < count; t++) {
            int i = idx[t];
            double d = rows[t][t];
            if (!(d * d > 1e-14 * Math.abs(s[i][i])) || !(s[i][i] > 0)) {
                throw notPositiveDefinite(d * d, i);
            }
            l[t] = rows[t];
            free[t] = i;
            pos[i] = t;
        }
        k = count;
    }

    private static NoSolutionException notPositiveDefinite(double pivot, int i) {
        return new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(Locale.ROOT,
                "the covariance matrix is not positive definite on the assets left free (pivot %.3g for asset "
                        + "number %d), so the minimum-variance portfolio is not unique; fix: remove one of a "
                        + "perfectly correlated pair, or repair the matrix (isorisk check --repair)", pivot, i + 1),
                List.of());
    }

    /** Appends variable i to the free set: a new last row of L and of Y. */
    private void addFree(int i) {
        double[] row = new double[k + 1];
        double[] si = s[i];
        double ss = 0;
        for (int t = 0; t < k; t++) {
            double v = si[free[t]];
            double[] lt = l[t];
            for (int u = 0; u < t; u++) {
                v -= lt[u] * row[u];
            }
            v /= lt[t];
            row[t] = v;
            ss += v * v;
        }
        double d2 = si[i] - ss;
        if (!(d2 > 1e-14 * Math.abs(si[i])) || !(si[i] > 0)) {
            throw notPositiveDefinite(d2, i);
        }
        double d = Math.sqrt(d2);
        row[k] = d;
        l[k] = row;
        free[k] = i;
        pos[i] = k;
        for (int j = 0; j < ma; j++) {
            double[] yj = ensure(j, k + 1);
            double v = p.a[act[j]][i];
            for (int t = 0; t < k; t++) {
                v -= row[t] * yj[t];
            }
            yj[k] = v / d;
        }
        k++;
    }

    private double[] ensure(int j, int size) {
        double[] yj = y[j];
        if (yj.length < size) {
            yj = Arrays.copyOf(yj, Math.max(size, Math.min(n, 2 * yj.length + 8)));
            y[j] = yj;
        }
        return yj;
    }

    /** Removes the free variable at position q: deletes row q of L and re-triangularises by Givens rotations. */
    private void removeFree(int q) {
        int i = free[q];
        pos[i] = -1;
        for (int t = q; t < k - 1; t++) {
            l[t] = l[t + 1];
            free[t] = free[t + 1];
            pos[free[t]] = t;
        }
        l[k - 1] = null;
        k--;
        for (int c = q; c < k; c++) {
            double a = l[c][c];
            double bb = l[c][c + 1];
            if (bb == 0) {
                continue;
            }
            double r = Math.hypot(a, bb);
            double cs = a / r;
            double sn = bb / r;
            for (int row = c; row < k; row++) {
                double[] lr = l[row];
                double x0 = lr[c];
                double x1 = lr[c + 1];
                lr[c] = cs * x0 + sn * x1;
                lr[c + 1] = -sn * x0 + cs * x1;
            }
            l[c][c + 1] = 0;
            for (int j = 0; j < ma; j++) {
                double[] yj = y[j];
                double y0 = yj[c];
                double y1 = yj[c + 1];
                yj[c] = cs * y0 + sn * y1;
                yj[c + 1] = -sn * y0 + cs * y1;
            }
        }
    }

    /** Adds row r to the working set when it is independent of the rows already there; false otherwise. */
    private boolean addRow(int r) {
        double[] col = new double[Math.max(k, 1)];
        double[] ar = p.a[r];
        double norm = 0;
        for (int t = 0; t < k; t++) {
            col[t] = ar[free[t]];
        }
        forward(col);
        for (int t = 0; t < k; t++) {
            norm += col[t] * col[t];
        }
        // independence: the part of the new column outside the span of the active ones
        double resid = Qr.of(y, ma, k).residualNorm(col);
        if (!(resid > 1e-10 * Math.sqrt(norm))) {
            return false;
        }
        act[ma] = r;
        y[ma] = col;
        ma++;
        rowAct[r] = true;
        return true;
    }

    private void removeRow(int j) {
        rowAct[act[j]] = false;
        for (int t = j; t < ma - 1; t++) {
            act[t] = act[t + 1];
            y[t] = y[t + 1];
        }
        ma--;
        y[ma] = null;
    }

    /** Solves {@code L x = b} in place on the first k entries. */
    private void forward(double[] x) {
        for (int t = 0; t < k; t++) {
            double[] lt = l[t];
            double v = x[t];
            for (int u = 0; u < t; u++) {
                v -= lt[u] * x[u];
            }
            x[t] = v / lt[t];
        }
    }

    /** Solves {@code L' x = b} in place on the first k entries. */
    private void backward(double[] x) {
        for (int t = k - 1; t >= 0; t--) {
            double[] lt = l[t];
            x[t] /= lt[t];
            double xt = x[t];
            for (int u = 0; u < t; u++) {
                x[u] -= lt[u] * xt;
            }
        }
    }

    /**
     * Condition number of {@code Σ_FF = L L'} from the factor as updated (exact up to 64 free assets, else the
     * Lanczos estimate of {@link Spectrum#ofFactor} to {@link Spectrum#CONDITION_ACCURACY}).
     */
    private double condition() {
        if (k == 0) {
            return 1;
        }
        return Spectrum.ofFactor(Cholesky.ofRows(Arrays.copyOf(l, k)), Spectrum.CONDITION_ACCURACY).conditionNumber();
    }

    /** Householder QR of the k × ma matrix whose columns are {@code cols[0..ma)}, for least squares. */
    private static final class Qr {
        final int rows;
        final int colsN;
        final double[][] v;
        final double[] beta;
        final double[][] r;

        private Qr(int rows, int colsN) {
            this.rows = rows;
            this.colsN = colsN;
            this.v = new double[colsN][];
            this.beta = new double[colsN];
            this.r = new double[colsN][colsN];
        }

        static Qr of(double[][] cols, int ma, int k) {
            Qr qr = new Qr(k, ma);
            double[][] a = new double[ma][];
            for (int j = 0; j < ma; j++) {
                a[j] = Arrays.copyOf(cols[j], k);
            }
            for (int j = 0; j < ma && j < k; j++) {
                double[] aj = a[j];
                double nrm = 0;
                for (int t = j; t < k; t++) {
                    nrm += aj[t] * aj[t];
                }
                nrm = Math.sqrt(nrm);
                double[] vj = new double[k];
                if (nrm == 0) {
                    qr.v[j] = vj;
                    qr.beta[j] = 0;
                    for (int c = j; c < ma; c++) {
                        qr.r[j][c] = a[c][j];
                    }
                    continue;
                }
                double alpha = aj[j] > 0 ? -nrm : nrm;
                for (int t = j; t < k; t++) {
                    vj[t] = aj[t];
                }
                vj[j] -= alpha;
                double vv = 0;
                for (int t = j; t < k; t++) {
                    vv += vj[t] * vj[t];
                }
                double bj = vv == 0 ? 0 : 2 / vv;
                qr.v[j] = vj;
                qr.beta[j] = bj;
                for (int c = j; c < ma; c++) {
                    double[] ac = a[c];
                    double dot = 0;
                    for (int t = j; t < k; t++) {
                        dot += vj[t] * ac[t];
                    }
                    dot *= bj;
                    for (int t = j; t < k; t++) {
                        ac[t] -= dot * vj[t];
                    }
                    qr.r[j][c] = ac[j];
                }
            }
            return qr;
        }

        private void applyQt(double[] x) {
            for (int j = 0; j < colsN && j < rows; j++) {
                double[] vj = v[j];
                double dot = 0;
                for (int t = j; t < rows; t++) {
                    dot += vj[t] * x[t];
                }
                dot *= beta[j];
                for (int t = j; t < rows; t++) {
                    x[t] -= dot * vj[t];
                }
            }
        }

        /** Least-squares coefficients of {@code q} (first k entries) on the columns, into {@code out[0..ma)}. */
        void leastSquares(double[] q, double[] out) {
            if (colsN == 0) {
                return;
            }
            double[] x = Arrays.copyOf(q, rows);
            applyQt(x);
            for (int j = Math.min(colsN, rows) - 1; j >= 0; j--) {
                double v0 = x[j];
                for (int c = j + 1; c < colsN; c++) {
                    v0 -= r[j][c] * out[c];
                }
                out[j] = r[j][j] == 0 ? 0 : v0 / r[j][j];
            }
        }

        /** Solves {@code (Y'Y) h = c} as {@code R'R h = c}; null when R is singular. */
        double[] normalSolve(double[] c) {
            int q = colsN;
            if (q > rows) {
                return null;
            }
            double[] h = c.clone();
            for (int j = 0; j < q; j++) {
                if (Math.abs(r[j][j]) == 0) {
                    return null;
                }
                double v0 = h[j];
                for (int u = 0; u < j; u++) {
                    v0 -= r[u][j] * h[u];
                }
                h[j] = v0 / r[j][j];
            }
            for (int j = q - 1; j >= 0; j--) {
                double v0 = h[j];
                for (int u = j + 1; u < q; u++) {
                    v0 -= r[j][u] * h[u];
                }
                h[j] = v0 / r[j][j];
            }
            return h;
        }

        /** Norm of the part of {@code x} (first k entries) orthogonal to the columns. */
        double residualNorm(double[] x) {
            double[] t = Arrays.copyOf(x, rows);
            applyQt(t);
            double s = 0;
            for (int i = Math.min(colsN, rows); i < rows; i++) {
                s += t[i] * t[i];
            }
            return Math.sqrt(s);
        }
    }
}
