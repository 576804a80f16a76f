package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Dense;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.linalg.UpdatableCholesky;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.SolverSettings;

/**
 * A parametric active-set method along the return target (after Best, M. J. (1996), "An Algorithm for the
 * Solution of the Parametric Quadratic Programming Problem"): for {@code min w'Σw − 2q'w} subject to linear rows,
 * the target {@code μ'w = m} and bounds, the optimal weights and multipliers are piecewise affine in m, and the
 * method walks from one piece to the next exactly, finding each corner by ratio tests on the affine pieces
 * (never by a tolerance search).
 *
 * <h2>The pieces</h2>
 * A working set W holds every equality row, the target, some inequality rows (set R) and the bounds some assets
 * sit at (the free assets F are the others). On W the KKT system, in the convention ∂V*∂limit,
 * <pre>
 *   2Σ_FF w_F − A_F' s = 2q_F − 2Σ_FB w_B,      A_F w_F = b_W − A_B w_B
 * </pre>
 * is linear in m (only the target's limit moves), so {@code w(m)} and the row multipliers {@code s(m)} are affine
 * along a piece, and so are the bound multipliers {@code λ_i = 2(Σw)_i − 2q_i − Σ_r s_r a_ri} of the assets at a
 * bound. It is solved by the range-space method: {@code Σ_FF = LL'} is an {@link UpdatableCholesky} factor that
 * grows by a row when an asset is freed and shrinks by Givens rotations when one is fixed (never refactored), and
 * the active rows enter through {@code Y = L⁻¹A_F'} (updated by the same rotations), whose Householder QR gives
 * {@code s} from {@code (Y'Y)s = 2(b_W − A_Bw_B) − Y'L⁻¹r}. Bounds are never rows. Each corner costs
 * {@code O(n²)}: one product with Σ for the bound multipliers, forward and backward solves with L, and
 * {@code O(|F|·|R|²)} for the QR.
 *
 * <h2>The events</h2>
 * The piece ends at the smallest step at which a free weight reaches a bound or an inactive row its limit (the
 * constraint joins W), or an inequality multiplier reaches zero (it leaves W). A joining constraint whose
 * gradient lies in the span of W's is exchanged (Best's dependent case): writing its gradient as
 * {@code Σ φ_j a_j} over W, the member j of W with the right sign of φ_j and the least {@code |s_j|/|φ_j|}
 * leaves, so that every multiplier keeps its sign at the corner; when no member qualifies the target cannot move
 * further, and that corner is the end of the range.
 *
 * <h2>The start</h2>
 * A vertex of the feasible set from the bounded simplex ({@link BoundedSimplex}) with its tight constraints as W
 * is the optimum of the same problem with the linear term {@code q₀ = Σw₀ − ½Σ_W s₀_j a_j} (any multipliers
 * {@code s₀} of the right signs; nonzero ones avoid a degenerate start). The same method then walks the linear
 * term from q₀ to q (a second parameter, Best's linear-term case), which ends at the minimum of the objective
 * over every target: the minimum-variance portfolio for plain variance. There the target row joins W (by the
 * same exchange when μ is in the span of W's gradients: a kink of the frontier), and the walk goes up to the
 * highest target the mandate allows and, when asked, down along the inefficient branch to the lowest. The ends
 * are checked against the bounded simplex's range of μ'w.
 *
 * <h2>Degeneracy and anti-cycling</h2>
 * Several events at one target are taken one at a time, with zero-length steps between them: among events
 * within {@link #SAME_POINT} of the smallest step the least index wins (bounds by asset index, then rows by row
 * index: Bland's rule, Bland 1977), and so do ties of the exchange's ratio test. A working set met twice at one
 * target stops the walk (NOT_CONVERGED) rather than cycle. Steps shorter than {@link #SAME_POINT} belong to one
 * corner. Multipliers are flagged as not unique where a constraint outside W binds with a gradient in W's span
 * and some positive multiple of it could take over part of W's multipliers (tested one constraint at a time).
 *
 * <h2>Convexity</h2>
 * Σ must be positive semi-definite (checked once: a Cholesky factorisation, else the smallest eigenvalue).
 * With a singular Σ the walk goes on while the free block Σ_FF stays positive definite and stops with a clear
 * NOT_CONVEX refusal naming the asset whose freeing makes it singular (the minimiser on that working set would
 * not be unique).
 */
final class ParametricQp {
    static final byte FREE = 0;
    static final byte LOWER = 1;
    static final byte UPPER = 2;
    static final byte FIXED = 3;

    /**
     * Relative pivot ({@code d²/σ_ii}) at or below which an asset cannot join the free block: Σ_FF would be
     * singular to working precision (the critical line method's threshold).
     */
    static final double PIVOT_TOL = 1e-14;
    /**
     * A component of a piece's direction at or below this share of the largest is round-off: a constraint that
     * only such a component moves neither blocks nor is released (it would be dependent on W).
     */
    static final double DIRECTION_TINY = 1e-11;
    /**
     * A joining constraint whose gradient, on the free assets and in the metric of L, keeps at most this share of
     * its norm outside the span of W's rows, lies in that span (exact dependence gives ~1e-16).
     */
    static final double DEPENDENT = 1e-9;
    /** Coefficients φ at or below this share of the largest do not count in an exchange (round-off). */
    static final double PHI_TINY = 1e-9;
    /**
     * Steps at or below this, relative to {@code max(1, |m|)}, stay at the same corner; events within it of the
     * smallest step count as ties. Far above the rounding of a ratio test, far below any distance between
     * distinct corners of a frontier in decimals.
     */
    static final double SAME_POINT = 1e-12;
    /** A constraint outside W with slack at or below this (relative to max(1, |limit|)) binds. */
    static final double TIGHT = 1e-10;
    /** Multiplier transfers above this share of the largest multiplier make the multipliers not unique. */
    static final double UNIQUE = 1e-9;
    /** A Σ whose smallest eigenvalue is at least −PSD_TOLERANCE times its largest counts as semi-definite. */
    static final double PSD_TOLERANCE = 1e-12;
    /** Changes of the working set between fresh forward solves of Y (bounds the drift of the updates). */
    static final int REFRESH = 32;

    private static final int BLOCK_LOWER = 0;
    private static final int BLOCK_UPPER = 1;
    private static final int BLOCK_ROW = 2;
    private static final int RELEASE_BOUND = 3;
    private static final int RELEASE_ROW = 4;

    private final ParametricProblem p;
    private final SolverSettings settings;
    private final int n;
    /** Rows of the problem; the target is row {@link #target}. */
    private final int rows;
    private final int target;
    private final double[][] a;
    private final Relation[] rel;
    /** Limits; {@code b[target]} is the current target. */
    private final double[] b;
    private final double[] rowNorm;
    private final double[][] sigma;
    private final double[] lo;
    private final double[] hi;
    /** The current linear term (moves in the start's homotopy) and its start and derivative there. */
    private final double[] q;
    private double[] q0;
    private double[] dq;
    /** In the walk along m: the target's row and the sign of its move (+1 up, −1 down); −1 in the homotopy. */
    private int dirRow = -1;
    private double dirSign;
    /** The walk's parameter: θ in the homotopy, the distance from the start target in the walk. */
    private double t;
    private double start;

    private final byte[] state;
    private final boolean[] active;
    private final int[] free;
    private final int[] pos;
    private int nf;
    private UpdatableCholesky chol;
    private final int[] act;
    private int na;
    private final double[][] y;
    private int sinceRefresh;
    private Qr qr;

    private final double[] x;
    private final double[] dx;
    private final double[] s;
    private final double[] ds;
    private final double[] lam;
    private final double[] dlam;
    private double[] g;

    private final double[] cos;
    private final double[] sin;
    private final double[] oldRow;
    private final double[] zeroA;
    private final double[] zeroB;
    private final double[] za;
    private final double[] zb;
    private int iterations;
    private int startChanges;
    private int exchanges;
    private int zeroSteps;

    private ParametricQp(ParametricProblem p, SolverSettings settings) {
        this.p = p;
        this.settings = settings;
        this.n = p.n;
        this.rows = p.rowCount();
        this.target = rows;
        this.a = new double[rows + 1][];
        this.rel = new Relation[rows + 1];
        this.b = new double[rows + 1];
        this.rowNorm = new double[rows + 1];
        for (int r = 0; r < rows; r++) {
            a[r] = p.a[r];
            rel[r] = p.rel[r];
            b[r] = p.b[r];
        }
        a[target] = p.mu;
        rel[target] = Relation.EQUAL;
        for (int r = 0; r <= rows; r++) {
            rowNorm[r] = Math.sqrt(Dense.dot(a[r], a[r]));
        }
        this.sigma = p.sigma;
        this.lo = p.lo;
        this.hi = p.hi;
        this.q = p.linear.clone();
        this.state = new byte[n];
        this.active = new boolean[rows + 1];
        this.free = new int[n];
        this.pos = new int[n];
        this.act = new int[rows + 1];
        this.y = new double[rows + 1][];
        this.x = new double[n];
        this.dx = new double[n];
        this.s = new double[rows + 1];
        this.ds = new double[rows + 1];
        this.lam = new double[n];
        this.dlam = new double[n];
        this.cos = new double[n];
        this.sin = new double[n];
        this.oldRow = new double[n];
        this.zeroA = new double[n];
        this.zeroB = new double[n];
        this.za = new double[n];
        this.zb = new double[n];
    }

    /**
     * Walks the whole frontier of a problem: up from the minimum of the objective to the highest target, and,
     * when {@code inefficient}, down to the lowest.
     *
     * @param p           the problem (not modified)
     * @param inefficient also walk the inefficient branch (targets below the minimum's)
     * @param settings    iteration cap, certificate threshold
     * @throws NoSolutionException INFEASIBLE when no portfolio meets the constraints; CONSTRAINT_QUALIFICATION
     *                             for a repeated equality; NOT_CONVEX when Σ is not positive semi-definite, a
     *                             free block is singular, or the target is unbounded; NOT_CONVERGED when the
     *                             iteration cap is hit or the walk would cycle
     */
    static ParametricPath walk(ParametricProblem p, boolean inefficient, SolverSettings settings) {
        SolverSettings st = settings == null ? SolverSettings.defaults() : settings;
        checkConvex(p, st);
        ParametricQp w = new ParametricQp(p, st);
        w.startAtVertex();
        w.homotopy();
        byte[] minState = w.state.clone();
        boolean[] minActive = w.active.clone();
        double mStar = Dense.dot(p.mu, w.x);
        List<Raw> up = w.walkTarget(+1, mStar);
        List<Raw> down = List.of();
        if (inefficient) {
            w.restore(minState, minActive);
            down = w.walkTarget(-1, mStar);
        }
        w.checkEnds(up, down, inefficient);
        return w.assemble(up, down, minState, minActive);
    }

    // ------------------------------------------------------------------ convexity

    private static void checkConvex(ParametricProblem p, SolverSettings st) {
        if (Cholesky.factor(p.sigma, st.threads()) != null) {
            return;
        }
        Spectrum sp = Spectrum.of(p.sigma, null);
        if (!(sp.smallest() >= -PSD_TOLERANCE * Math.abs(sp.largest()))) {
            throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(Locale.ROOT,
                    "the covariance matrix is not positive semi-definite (smallest eigenvalue %.6g, largest %.6g), "
                            + "so the problem is not convex and a stationary point need not be a minimum; fix: "
                            + "repair the matrix to the nearest valid one (isorisk check --repair)", sp.smallest(),
                    sp.largest()), List.of());
        }
    }

    // ------------------------------------------------------------------ the start: a vertex, then q₀ → q

    private void startAtVertex() {
        double[] c = new double[n];
        for (int i = 0; i < n; i++) {
            c[i] = sigma[i][i];
        }
        int maxIt = settings.maxIterations();
        BoundedSimplex.Result lp = BoundedSimplex.solve(p.a, p.rel, p.b, lo, hi, c, maxIt);
        if (lp.outcome() == BoundedSimplex.Outcome.UNBOUNDED || lp.outcome() == BoundedSimplex.Outcome.ITERATION_LIMIT) {
            lp = BoundedSimplex.solve(p.a, p.rel, p.b, lo, hi, null, maxIt);
        }
        if (lp.outcome() != BoundedSimplex.Outcome.OPTIMAL) {
            throw Feasibility.explainRows(qpProblem(), maxIt);
        }
        for (int r = 0; r < rows; r++) {
            if (lp.redundant()[r] && rel[r] == Relation.EQUAL) {
                throw repeatedEquality(r);
            }
        }
        double[] x0 = lp.x();
        for (int i = 0; i < n; i++) {
            if (lo[i] == hi[i]) {
                state[i] = FIXED;
                x[i] = lo[i];
            } else if (lp.states()[i] == BoundedSimplex.State.AT_LOWER && Double.isFinite(lo[i])) {
                state[i] = LOWER;
                x[i] = lo[i];
            } else if (lp.states()[i] == BoundedSimplex.State.AT_UPPER && Double.isFinite(hi[i])) {
                state[i] = UPPER;
                x[i] = hi[i];
            } else {
                state[i] = FREE;
                x[i] = x0[i];
            }
        }
        chol = new UpdatableCholesky(n);
        nf = 0;
        na = 0;
        Arrays.fill(pos, -1);
        for (int i = 0; i < n; i++) {
            if (state[i] == FREE) {
                state[i] = LOWER; // freeVar expects a variable outside the free set
                freeVar(i);
            }
        }
        for (int r = 0; r < rows; r++) {
            if (rel[r] == Relation.EQUAL) {
                qr = Qr.of(y, na, nf);
                if (dependence(new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, r)) != null) {
                    throw repeatedEquality(r);
                }
                addRow(r);
            }
        }
        for (int r = 0; r < rows; r++) {
            if (rel[r] != Relation.EQUAL && lp.rowTight()[r] && !lp.redundant()[r]) {
                qr = Qr.of(y, na, nf);
                if (dependence(new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, r)) == null) {
                    addRow(r);
                }
            }
        }
        // q₀ makes the vertex optimal with multipliers of the right signs on every inequality of W.
        double[] sx = Dense.multiplySymmetric(sigma, x, settings.threads());
        double kappa = 0;
        double big = 0;
        for (int i = 0; i < n; i++) {
            kappa = Math.max(kappa, Math.abs(2 * sx[i] - 2 * p.linear[i]));
            big = Math.max(big, Math.abs(2 * sx[i]));
        }
        kappa = Math.max(kappa, Math.max(1e-12 * big, Double.MIN_NORMAL));
        q0 = sx;
        for (int j = 0; j < na; j++) {
            int r = act[j];
            if (rel[r] == Relation.EQUAL) {
                continue;
            }
            double s0 = sign(r) * kappa;
            for (int i = 0; i < n; i++) {
                q0[i] -= 0.5 * s0 * a[r][i];
            }
        }
        for (int i = 0; i < n; i++) {
            if (state[i] == LOWER || state[i] == UPPER) {
                q0[i] -= 0.5 * (state[i] == LOWER ? kappa : -kappa);
            }
        }
    }

    /** The problem as the active-set QP's rows and bounds, for the infeasibility diagnosis. */
    private QpProblem qpProblem() {
        String[] names = new String[rows];
        for (int r = 0; r < rows; r++) {
            names[r] = p.rows.get(r).name();
        }
        return new QpProblem(sigma, lo, hi, p.a, p.rel, p.b, names);
    }

    private NoSolutionException repeatedEquality(int r) {
        String name = p.rows.get(r).name();
        return new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION, String.format(Locale.ROOT,
                "the constraint qualification fails: the equality '%s' repeats the other equalities and fixed "
                        + "weights, so its multiplier is not unique; fix: drop '%s' or the constraint it repeats",
                name, name), List.of(name));
    }

    /** Walks the linear term from q₀ to q: the end is the minimum of the objective without a target. */
    private void homotopy() {
        dq = new double[n];
        for (int i = 0; i < n; i++) {
            dq[i] = p.linear[i] - q0[i];
            q[i] = q0[i];
        }
        dirRow = -1;
        t = 0;
        solvePoint();
        Set<String> seen = new HashSet<>();
        while (true) {
            count();
            Event ev = nextEvent(1 - t, 1);
            if (ev == null) {
                advance(1 - t);
                break;
            }
            if (ev.step > SAME_POINT) {
                seen.clear();
            } else {
                zeroSteps++;
            }
            advance(ev.step);
            if (!apply(ev)) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, "the parametric active-set "
                        + "method met a dependent constraint without a way out while moving the linear term (round-off "
                        + "at a degenerate vertex); fix: report this problem", List.of());
            }
            if (!seen.add(signature())) {
                throw cycling();
            }
            solvePoint();
        }
        System.arraycopy(p.linear, 0, q, 0, n);
        dq = null;
        t = 0;
        solvePoint();
        startChanges = iterations;
    }

    /** Rebuilds the factor and Y for a saved working set (the second walk starts from the minimum again). */
    private void restore(byte[] st, boolean[] act0) {
        chol = new UpdatableCholesky(n);
        nf = 0;
        na = 0;
        Arrays.fill(pos, -1);
        Arrays.fill(active, false);
        for (int i = 0; i < n; i++) {
            state[i] = st[i] == FREE ? LOWER : st[i];
            if (st[i] == LOWER) {
                x[i] = lo[i];
            } else if (st[i] == UPPER) {
                x[i] = hi[i];
            } else if (st[i] == FIXED) {
                x[i] = lo[i];
            }
        }
        for (int i = 0; i < n; i++) {
            if (st[i] == FREE) {
                freeVar(i);
            }
        }
        for (int r = 0; r <= rows; r++) {
            if (act0[r]) {
                addRow(r);
            }
        }
        dirRow = -1;
        dq = null;
        t = 0;
        solvePoint();
    }

    // ------------------------------------------------------------------ the walk along the target

    /** What the walk records at a corner (before the certificate). */
    private record Raw(double m, double[] x, double[] g, double[] s, double[] lam, double[] dx, double[] ds,
                       double[] dlam, byte[] state, boolean[] active, List<ParametricPath.Change> changes,
                       boolean unique, boolean pieceUnique, double condition) {
    }

    /** The working set when a corner begins, to read its changes at the end. */
    private record Before(byte[] state, boolean[] active) {
    }

    /**
     * Walks the target from {@code mStar} in direction {@code d} (+1 up, −1 down) to the end of the range.
     *
     * @return the corners in walk order, the first at {@code mStar}
     */
    private List<Raw> walkTarget(int d, double mStar) {
        start = mStar;
        t = 0;
        b[target] = mStar;
        dirRow = target;
        dirSign = d;
        dq = null;
        List<Raw> out = new ArrayList<>();
        Before before = new Before(state.clone(), active.clone());
        // The target joins W: it pushes like a '>=' row going up, a '<=' row going down.
        ParametricPath.ConstraintRef tr = new ParametricPath.ConstraintRef(ParametricPath.Kind.TARGET, 0);
        if (!block(tr, d)) {
            solvePoint();
            out.add(raw(before, d, Double.NaN, false));
            return out;
        }
        solvePoint();
        Set<String> seen = new HashSet<>();
        seen.add(signature());
        while (true) {
            count();
            Event ev = nextEvent(Double.POSITIVE_INFINITY, Math.max(1, Math.abs(b[target])));
            if (ev == null) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(Locale.ROOT,
                        "the expected return can %s without limit under these constraints, so the frontier has no "
                                + "%s end; fix: bound every asset (a min and a max) or add rows that limit the weights",
                        d > 0 ? "rise" : "fall", d > 0 ? "upper" : "lower"), List.of());
            }
            if (ev.step > SAME_POINT * Math.max(1, Math.abs(b[target]))) {
                out.add(raw(before, d, ev.step, true));
                advance(ev.step);
                before = new Before(state.clone(), active.clone());
                seen.clear();
            } else {
                zeroSteps++;
                advance(ev.step);
            }
            if (!apply(ev)) {
                if (out.isEmpty()) {
                    solvePoint();
                    out.add(raw(before, d, Double.NaN, false));
                } else {
                    out.add(end(out.get(out.size() - 1), d));
                }
                return out;
            }
            if (!seen.add(signature())) {
                throw cycling();
            }
            solvePoint();
        }
    }

    /**
     * The current corner: point, direction, changes since {@code before}, uniqueness (false when {@code
     * uniqueAllowed} is, as at an end of the range).
     */
    private Raw raw(Before before, int d, double stepAhead, boolean uniqueAllowed) {
        List<ParametricPath.Change> changes = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            boolean was = before.state[i] == LOWER || before.state[i] == UPPER;
            boolean is = state[i] == LOWER || state[i] == UPPER;
            if (was && (!is || before.state[i] != state[i])) {
                changes.add(new ParametricPath.Change(boundRef(i, before.state[i]), d < 0));
            }
            if (is && (!was || before.state[i] != state[i])) {
                changes.add(new ParametricPath.Change(boundRef(i, state[i]), d > 0));
            }
        }
        for (int r = 0; r < rows; r++) {
            if (before.active[r] != active[r]) {
                changes.add(new ParametricPath.Change(new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, r),
                        d > 0 == active[r]));
            }
        }
        boolean unique = uniqueAllowed && unique(0);
        boolean pieceUnique = Double.isNaN(stepAhead) || unique(0.5 * stepAhead);
        return new Raw(b[target], x.clone(), g.clone(), s.clone(), lam.clone(), dx.clone(), ds.clone(), dlam.clone(),
                state.clone(), active.clone(), changes, unique, pieceUnique, chol.conditionEstimate());
    }

    /**
     * The end of the range, reached on the piece that starts at corner {@code last}: its point and multipliers
     * there are that piece's (the one-sided values from inside the range), whatever zero-length changes the walk
     * tried at the end; the changes are the constraints outside that piece's working set that reach their limits
     * there. Multipliers at an end are
     * never unique (any larger target price, offset by the binding constraints, also satisfies the conditions).
     */
    private Raw end(Raw last, int d) {
        double h = (b[target] - last.m) * d;
        double[] xe = new double[n];
        double[] le = new double[n];
        for (int i = 0; i < n; i++) {
            xe[i] = last.x[i] + h * last.dx[i];
            le[i] = last.lam[i] + h * last.dlam[i];
            if (last.state[i] != FREE) {
                xe[i] = last.state[i] == UPPER ? hi[i] : lo[i];
            }
        }
        double[] se = new double[rows + 1];
        for (int r = 0; r <= rows; r++) {
            se[r] = last.s[r] + h * last.ds[r];
        }
        double[] ge = Dense.multiplySymmetric(sigma, xe, settings.threads());
        List<ParametricPath.Change> changes = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            if (last.state[i] != FREE) {
                continue;
            }
            if (Double.isFinite(lo[i]) && Math.abs(xe[i] - lo[i]) <= TIGHT * Math.max(1, Math.abs(lo[i]))) {
                changes.add(new ParametricPath.Change(new ParametricPath.ConstraintRef(ParametricPath.Kind.LOWER, i),
                        d > 0));
            } else if (Double.isFinite(hi[i]) && Math.abs(xe[i] - hi[i]) <= TIGHT * Math.max(1, Math.abs(hi[i]))) {
                changes.add(new ParametricPath.Change(new ParametricPath.ConstraintRef(ParametricPath.Kind.UPPER, i),
                        d > 0));
            }
        }
        for (int r = 0; r < rows; r++) {
            if (!last.active[r] && rel[r] != Relation.EQUAL
                    && Math.abs(Dense.dot(a[r], xe) - b[r]) <= TIGHT * Math.max(1, Math.abs(b[r]))) {
                changes.add(new ParametricPath.Change(new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, r),
                        d > 0));
            }
        }
        return new Raw(b[target], xe, ge, se, le, last.dx, last.ds, last.dlam, last.state, last.active, changes, false,
                true, last.condition);
    }

    private static ParametricPath.ConstraintRef boundRef(int i, byte st) {
        return new ParametricPath.ConstraintRef(st == LOWER ? ParametricPath.Kind.LOWER : ParametricPath.Kind.UPPER, i);
    }

    private void count() {
        if (++iterations > settings.maxIterations()) {
            throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, String.format(Locale.ROOT,
                    "the parametric active-set method passed %d working-set changes without finishing the frontier; "
                            + "fix: raise the iteration limit or check the covariance matrix for near-duplicate assets",
                    settings.maxIterations()), List.of());
        }
    }

    private static NoSolutionException cycling() {
        return new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, "the parametric active-set method "
                + "met the same working set twice at one degenerate corner (it would cycle); fix: report this problem",
                List.of());
    }

    private String signature() {
        StringBuilder sb = new StringBuilder(n + rows + 1);
        for (byte v : state) {
            sb.append((char) ('0' + v));
        }
        for (boolean v : active) {
            sb.append(v ? '1' : '0');
        }
        return sb.toString();
    }

    // ------------------------------------------------------------------ events

    private record Event(int kind, int index, double step) {
        int bland(int n) {
            return kind == BLOCK_ROW || kind == RELEASE_ROW ? n + index : index;
        }
    }

    /**
     * The next event within {@code limit}: the smallest step at which a free weight reaches a bound, an inactive
     * inequality row its limit, or an inequality multiplier zero; among steps within {@link #SAME_POINT}·scale of
     * the smallest, the least index. Null when none comes before {@code limit}.
     */
    private Event nextEvent(double limit, double scale) {
        double dxMax = 0;
        double dx2 = 0;
        for (int k = 0; k < nf; k++) {
            double v = dx[free[k]];
            dxMax = Math.max(dxMax, Math.abs(v));
            dx2 += v * v;
        }
        dx2 = Math.sqrt(dx2);
        double dual = 0;
        for (int j = 0; j < na; j++) {
            dual = Math.max(dual, Math.abs(ds[act[j]]) * rowNorm[act[j]]);
        }
        for (int i = 0; i < n; i++) {
            if (state[i] != FREE) {
                dual = Math.max(dual, Math.abs(dlam[i]));
            }
        }
        double tinyX = DIRECTION_TINY * dxMax;
        double tinyS = DIRECTION_TINY * dual;
        List<Event> found = new ArrayList<>();
        double best = Double.POSITIVE_INFINITY;
        for (int k = 0; k < nf; k++) {
            int i = free[k];
            double d = dx[i];
            if (d < -tinyX && d < 0 && Double.isFinite(lo[i])) {
                best = add(found, best, new Event(BLOCK_LOWER, i, Math.max(0, (x[i] - lo[i]) / -d)));
            } else if (d > tinyX && d > 0 && Double.isFinite(hi[i])) {
                best = add(found, best, new Event(BLOCK_UPPER, i, Math.max(0, (hi[i] - x[i]) / d)));
            }
        }
        for (int r = 0; r < rows; r++) {
            if (active[r] || rel[r] == Relation.EQUAL) {
                continue;
            }
            double v = Dense.dot(a[r], x);
            double dv = 0;
            for (int k = 0; k < nf; k++) {
                dv += a[r][free[k]] * dx[free[k]];
            }
            double tiny = DIRECTION_TINY * rowNorm[r] * dx2;
            if (rel[r] == Relation.AT_MOST && dv > tiny && dv > 0) {
                best = add(found, best, new Event(BLOCK_ROW, r, Math.max(0, (b[r] - v) / dv)));
            } else if (rel[r] == Relation.AT_LEAST && dv < -tiny && dv < 0) {
                best = add(found, best, new Event(BLOCK_ROW, r, Math.max(0, (v - b[r]) / -dv)));
            }
        }
        for (int j = 0; j < na; j++) {
            int r = act[j];
            if (rel[r] == Relation.EQUAL) {
                continue;
            }
            double tiny = tinyS / Math.max(rowNorm[r], Double.MIN_NORMAL);
            if (rel[r] == Relation.AT_MOST && ds[r] > tiny && ds[r] > 0) {
                best = add(found, best, new Event(RELEASE_ROW, r, Math.max(0, -s[r] / ds[r])));
            } else if (rel[r] == Relation.AT_LEAST && ds[r] < -tiny && ds[r] < 0) {
                best = add(found, best, new Event(RELEASE_ROW, r, Math.max(0, s[r] / -ds[r])));
            }
        }
        for (int i = 0; i < n; i++) {
            if (state[i] == LOWER && dlam[i] < -tinyS && dlam[i] < 0) {
                best = add(found, best, new Event(RELEASE_BOUND, i, Math.max(0, lam[i] / -dlam[i])));
            } else if (state[i] == UPPER && dlam[i] > tinyS && dlam[i] > 0) {
                best = add(found, best, new Event(RELEASE_BOUND, i, Math.max(0, -lam[i] / dlam[i])));
            }
        }
        if (!(best < limit)) {
            return null;
        }
        double tie = best + SAME_POINT * scale;
        Event pick = null;
        for (Event e : found) {
            if (e.step <= tie && (pick == null || e.bland(n) < pick.bland(n))) {
                pick = e;
            }
        }
        return new Event(pick.kind, pick.index, best);
    }

    private static double add(List<Event> found, double best, Event e) {
        found.add(e);
        return Math.min(best, e.step);
    }

    /** Moves the point, multipliers and parameter by {@code h} along the current piece. */
    private void advance(double h) {
        if (h == 0) {
            return;
        }
        t += h;
        for (int k = 0; k < nf; k++) {
            int i = free[k];
            x[i] += h * dx[i];
        }
        for (int j = 0; j < na; j++) {
            int r = act[j];
            s[r] += h * ds[r];
        }
        for (int i = 0; i < n; i++) {
            if (state[i] != FREE) {
                lam[i] += h * dlam[i];
            }
        }
        if (dirRow >= 0) {
            b[target] = start + dirSign * t;
        } else if (dq != null) {
            for (int i = 0; i < n; i++) {
                q[i] = q0[i] + t * dq[i];
            }
        }
    }

    /**
     * Makes the event's change of the working set.
     *
     * @return false when a joining constraint is dependent and no member of W can make room: the end of the range
     */
    private boolean apply(Event ev) {
        switch (ev.kind) {
            case BLOCK_LOWER:
                return block(new ParametricPath.ConstraintRef(ParametricPath.Kind.LOWER, ev.index), +1);
            case BLOCK_UPPER:
                return block(new ParametricPath.ConstraintRef(ParametricPath.Kind.UPPER, ev.index), -1);
            case BLOCK_ROW:
                return block(new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, ev.index), sign(ev.index));
            case RELEASE_BOUND:
                freeVar(ev.index);
                return true;
            case RELEASE_ROW:
                removeRow(ev.index);
                return true;
            default:
                throw new IllegalStateException("event " + ev.kind);
        }
    }

    /** Sign of an inequality row's multiplier: −1 for {@code <=}, +1 for {@code >=}. */
    private int sign(int r) {
        return rel[r] == Relation.AT_MOST ? -1 : +1;
    }

    /**
     * Constraint l joins W with multiplier sign {@code eps}; when its gradient is dependent, the member of W
     * chosen by Best's ratio test leaves first.
     *
     * @return false when it is dependent and nothing can leave (l's multiplier could grow without bound)
     */
    private boolean block(ParametricPath.ConstraintRef l, int eps) {
        double[][] phi = dependence(l);
        if (phi != null) {
            exchanges++;
            ParametricPath.ConstraintRef k = leaving(phi, eps);
            if (k == null) {
                return false;
            }
            if (k.kind() == ParametricPath.Kind.ROW) {
                removeRow(k.index());
            } else {
                freeVar(k.index());
            }
        }
        switch (l.kind()) {
            case LOWER -> fixVar(l.index(), LOWER);
            case UPPER -> fixVar(l.index(), UPPER);
            case ROW -> addRow(l.index());
            case TARGET -> addRow(target);
            default -> throw new IllegalStateException();
        }
        return true;
    }

    /**
     * Whether constraint l's gradient lies in the span of W's, and if so its coefficients φ over W:
     * {@code a_l = Σ_r φ_r a_r + Σ_{i at a bound} φ_i e_i}.
     *
     * @return {@code {φ per row (target included), φ per asset}}, or null when l is independent of W
     */
    private double[][] dependence(ParametricPath.ConstraintRef l) {
        double[] v = new double[Math.max(1, nf)];
        double[] grad = null;
        if (l.kind() == ParametricPath.Kind.LOWER || l.kind() == ParametricPath.Kind.UPPER) {
            v[pos[l.index()]] = 1;
        } else {
            grad = a[l.kind() == ParametricPath.Kind.TARGET ? target : l.index()];
            for (int k = 0; k < nf; k++) {
                v[k] = grad[free[k]];
            }
        }
        chol.forwardInPlace(v, zeroA, zeroB);
        double norm = 0;
        for (int k = 0; k < nf; k++) {
            norm += v[k] * v[k];
        }
        norm = Math.sqrt(norm);
        if (qr.residualNorm(v) > DEPENDENT * norm) {
            return null;
        }
        double[] theta = qr.leastSquares(v);
        double[] phiRow = new double[rows + 1];
        double[] phiVar = new double[n];
        for (int j = 0; j < na; j++) {
            phiRow[act[j]] = theta[j];
        }
        for (int i = 0; i < n; i++) {
            if (state[i] == FREE) {
                continue;
            }
            double v0 = grad == null ? 0 : grad[i];
            for (int j = 0; j < na; j++) {
                v0 -= theta[j] * a[act[j]][i];
            }
            phiVar[i] = v0;
        }
        return new double[][] {phiRow, phiVar};
    }

    /**
     * Best's ratio test for a dependent joining constraint with multiplier sign {@code eps}: the inequality of W
     * whose multiplier first reaches zero as l's grows, {@code min |s_j|/|φ_j|} over the members with
     * {@code eps_j·eps·φ_j > 0}; ties by least index. Null when no member qualifies.
     */
    private ParametricPath.ConstraintRef leaving(double[][] phi, int eps) {
        double big = 0;
        for (double v : phi[0]) {
            big = Math.max(big, Math.abs(v));
        }
        for (double v : phi[1]) {
            big = Math.max(big, Math.abs(v));
        }
        double tiny = PHI_TINY * big;
        double best = Double.POSITIVE_INFINITY;
        List<double[]> cand = new ArrayList<>(); // {ratio, bland index}
        for (int j = 0; j < na; j++) {
            int r = act[j];
            if (rel[r] == Relation.EQUAL) {
                continue;
            }
            int ej = sign(r);
            double f = phi[0][r];
            if (ej * eps * f > tiny) {
                double ratio = Math.max(0, ej * s[r]) / Math.abs(f);
                cand.add(new double[] {ratio, n + r});
                best = Math.min(best, ratio);
            }
        }
        for (int i = 0; i < n; i++) {
            if (state[i] != LOWER && state[i] != UPPER) {
                continue;
            }
            int ej = state[i] == LOWER ? +1 : -1;
            double f = phi[1][i];
            if (ej * eps * f > tiny) {
                double ratio = Math.max(0, ej * lam[i]) / Math.abs(f);
                cand.add(new double[] {ratio, i});
                best = Math.min(best, ratio);
            }
        }
        if (cand.isEmpty()) {
            return null;
        }
        double tie = best + SAME_POINT * Math.max(best, Double.MIN_NORMAL);
        int pick = Integer.MAX_VALUE;
        for (double[] c : cand) {
            if (c[0] <= tie) {
                pick = Math.min(pick, (int) c[1]);
            }
        }
        return pick >= n ? new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, pick - n)
                : new ParametricPath.ConstraintRef(state[pick] == LOWER ? ParametricPath.Kind.LOWER
                : ParametricPath.Kind.UPPER, pick);
    }

    // ------------------------------------------------------------------ the working set's factors

    /** Frees asset i (at a bound): the factor grows by its row, Y by the matching entry of each column. */
    private void freeVar(int i) {
        int m = nf;
        double[] col = oldRow;
        double[] si = sigma[i];
        for (int k = 0; k < m; k++) {
            col[k] = si[free[k]];
        }
        double relPivot = chol.append(col, si[i], PIVOT_TOL);
        if (!(relPivot > PIVOT_TOL)) {
            throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(Locale.ROOT,
                    "the reduced Hessian is singular: the covariance block of the assets free to move becomes "
                            + "singular when asset number %d joins them (relative pivot %.3g), so the minimiser on "
                            + "this working set is not unique; fix: remove the asset (or its duplicate) or repair "
                            + "the covariance matrix to a positive definite one", i + 1, relPivot), List.of());
        }
        double d = chol.factorEntry(m, m);
        for (int k = 0; k < m; k++) {
            col[k] = chol.factorEntry(m, k);
        }
        for (int j = 0; j < na; j++) {
            double[] yj = y[j];
            double v = a[act[j]][i];
            for (int k = 0; k < m; k++) {
                v -= col[k] * yj[k];
            }
            yj[m] = v / d;
        }
        free[m] = i;
        pos[i] = m;
        nf++;
        state[i] = FREE;
        lam[i] = 0;
        dlam[i] = 0;
        sinceRefresh++;
    }

    /** Fixes free asset i at a bound: the factor loses its row by Givens rotations, which turn Y as well. */
    private void fixVar(int i, byte st) {
        int at = pos[i];
        chol.remove(at, cos, sin, oldRow);
        int m = nf - 1;
        for (int j = 0; j < na; j++) {
            UpdatableCholesky.rotate(y[j], at, m, cos, sin);
        }
        for (int k = at; k < m; k++) {
            free[k] = free[k + 1];
            pos[free[k]] = k;
        }
        pos[i] = -1;
        nf = m;
        state[i] = st;
        x[i] = st == LOWER ? lo[i] : hi[i];
        dx[i] = 0;
        lam[i] = 0;
        sinceRefresh++;
    }

    /** Row r joins W: its column of Y is {@code L⁻¹a_{r,F}}. */
    private void addRow(int r) {
        double[] v = y[na] == null ? new double[n] : y[na];
        for (int k = 0; k < nf; k++) {
            v[k] = a[r][free[k]];
        }
        chol.forwardInPlace(v, zeroA, zeroB);
        y[na] = v;
        act[na] = r;
        na++;
        active[r] = true;
    }

    private void removeRow(int r) {
        int j = 0;
        while (act[j] != r) {
            j++;
        }
        double[] keep = y[j];
        for (int k = j; k < na - 1; k++) {
            act[k] = act[k + 1];
            y[k] = y[k + 1];
        }
        na--;
        y[na] = keep;
        active[r] = false;
        s[r] = 0;
        ds[r] = 0;
    }

    /** Every column of Y afresh from the factor. */
    private void refreshY() {
        for (int j = 0; j < na; j++) {
            double[] v = y[j];
            int r = act[j];
            for (int k = 0; k < nf; k++) {
                v[k] = a[r][free[k]];
            }
            chol.forwardInPlace(v, zeroA, zeroB);
        }
        sinceRefresh = 0;
    }

    // ------------------------------------------------------------------ the point on the working set

    /**
     * The point, multipliers and their derivatives on the current working set at the current parameter, solved
     * afresh from the KKT system (not carried from the previous corner).
     */
    private void solvePoint() {
        if (sinceRefresh >= REFRESH) {
            refreshY();
        }
        int m = nf;
        for (int k = 0; k < m; k++) {
            int i = free[k];
            za[k] = q[i];
            zb[k] = dq == null ? 0 : 2 * dq[i];
        }
        for (int j = 0; j < n; j++) {
            if (state[j] == FREE || x[j] == 0) {
                continue;
            }
            double[] row = sigma[j];
            double xj = x[j];
            for (int k = 0; k < m; k++) {
                za[k] -= row[free[k]] * xj;
            }
        }
        for (int k = 0; k < m; k++) {
            za[k] *= 2;
        }
        chol.forwardInPlace(za, zb, zeroA);
        qr = Qr.of(y, na, m);
        double[] c = new double[na];
        double[] dc = new double[na];
        for (int j = 0; j < na; j++) {
            int r = act[j];
            double rhs = b[r];
            double[] ar = a[r];
            for (int i = 0; i < n; i++) {
                if (state[i] != FREE && x[i] != 0) {
                    rhs -= ar[i] * x[i];
                }
            }
            double[] yj = y[j];
            c[j] = 2 * rhs - Dense.dot(yj, za, m);
            dc[j] = (r == dirRow ? 2 * dirSign : 0) - Dense.dot(yj, zb, m);
        }
        double[] sv = qr.normalSolve(c);
        double[] dsv = qr.normalSolve(dc);
        double[] xa = new double[Math.max(1, m)];
        double[] xb = new double[Math.max(1, m)];
        for (int k = 0; k < m; k++) {
            xa[k] = za[k];
            xb[k] = zb[k];
        }
        for (int j = 0; j < na; j++) {
            double[] yj = y[j];
            double u = sv[j];
            double du = dsv[j];
            for (int k = 0; k < m; k++) {
                xa[k] += yj[k] * u;
                xb[k] += yj[k] * du;
            }
        }
        for (int k = 0; k < m; k++) {
            xa[k] *= 0.5;
            xb[k] *= 0.5;
        }
        chol.backwardInPlace(xa, xb);
        for (int i = 0; i < n; i++) {
            if (state[i] == FREE) {
                continue;
            }
            x[i] = state[i] == UPPER ? hi[i] : lo[i];
            dx[i] = 0;
        }
        for (int k = 0; k < m; k++) {
            x[free[k]] = xa[k];
            dx[free[k]] = xb[k];
        }
        Arrays.fill(s, 0);
        Arrays.fill(ds, 0);
        for (int j = 0; j < na; j++) {
            s[act[j]] = sv[j];
            ds[act[j]] = dsv[j];
        }
        double[][] prod = Dense.multiplySymmetric(sigma, new double[][] {x, dx});
        g = prod[0];
        double[] gd = prod[1];
        for (int i = 0; i < n; i++) {
            if (state[i] == FREE) {
                lam[i] = 0;
                dlam[i] = 0;
                continue;
            }
            double v = 2 * g[i] - 2 * q[i];
            double dv = 2 * gd[i] - (dq == null ? 0 : 2 * dq[i]);
            for (int j = 0; j < na; j++) {
                double aji = a[act[j]][i];
                v -= sv[j] * aji;
                dv -= dsv[j] * aji;
            }
            lam[i] = v;
            dlam[i] = dv;
        }
    }

    // ------------------------------------------------------------------ uniqueness of the multipliers

    /**
     * Whether the multipliers at the point {@code h} along the current piece are unique: false when a constraint
     * outside W binds there (and, for {@code h > 0}, all along the piece) with a gradient in W's span and some
     * positive multiple of it could take over part of W's multipliers without a sign going wrong (Best's ratio
     * test gives a positive bound, or none).
     */
    private boolean unique(double h) {
        double scale = 0;
        for (int j = 0; j < na; j++) {
            int r = act[j];
            scale = Math.max(scale, Math.abs(s[r] + h * ds[r]) * rowNorm[r]);
        }
        for (int i = 0; i < n; i++) {
            if (state[i] != FREE) {
                scale = Math.max(scale, Math.abs(lam[i] + h * dlam[i]));
            }
        }
        double dxMax = 0;
        double dx2 = 0;
        for (int k = 0; k < nf; k++) {
            double v = dx[free[k]];
            dxMax = Math.max(dxMax, Math.abs(v));
            dx2 += v * v;
        }
        dx2 = Math.sqrt(dx2);
        List<Object[]> tight = new ArrayList<>(); // {ref, eps}
        for (int k = 0; k < nf; k++) {
            int i = free[k];
            double xi = x[i] + h * dx[i];
            boolean still = h == 0 || Math.abs(dx[i]) <= DIRECTION_TINY * dxMax;
            if (still && Double.isFinite(lo[i]) && Math.abs(xi - lo[i]) <= TIGHT * Math.max(1, Math.abs(lo[i]))) {
                tight.add(new Object[] {new ParametricPath.ConstraintRef(ParametricPath.Kind.LOWER, i), +1});
            } else if (still && Double.isFinite(hi[i]) && Math.abs(hi[i] - xi) <= TIGHT * Math.max(1, Math.abs(hi[i]))) {
                tight.add(new Object[] {new ParametricPath.ConstraintRef(ParametricPath.Kind.UPPER, i), -1});
            }
        }
        for (int r = 0; r < rows; r++) {
            if (active[r] || rel[r] == Relation.EQUAL) {
                continue;
            }
            double v = Dense.dot(a[r], x);
            double dv = 0;
            for (int k = 0; k < nf; k++) {
                dv += a[r][free[k]] * dx[free[k]];
            }
            boolean still = h == 0 || Math.abs(dv) <= DIRECTION_TINY * rowNorm[r] * dx2;
            if (still && Math.abs(v + h * dv - b[r]) <= TIGHT * Math.max(1, Math.abs(b[r]))) {
                tight.add(new Object[] {new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, r), sign(r)});
            }
        }
        if (tight.isEmpty()) {
            return true;
        }
        for (Object[] tc : tight) {
            double[][] phi = dependence((ParametricPath.ConstraintRef) tc[0]);
            if (phi == null) {
                continue;
            }
            int eps = (Integer) tc[1];
            double big = 0;
            for (double v : phi[0]) {
                big = Math.max(big, Math.abs(v));
            }
            for (double v : phi[1]) {
                big = Math.max(big, Math.abs(v));
            }
            double tiny = PHI_TINY * big;
            double bound = Double.POSITIVE_INFINITY;
            for (int j = 0; j < na; j++) {
                int r = act[j];
                if (rel[r] == Relation.EQUAL) {
                    continue;
                }
                double f = phi[0][r];
                if (sign(r) * eps * f > tiny) {
                    bound = Math.min(bound, Math.max(0, sign(r) * (s[r] + h * ds[r])) / Math.abs(f));
                }
            }
            for (int i = 0; i < n; i++) {
                if (state[i] != LOWER && state[i] != UPPER) {
                    continue;
                }
                int ej = state[i] == LOWER ? +1 : -1;
                double f = phi[1][i];
                if (ej * eps * f > tiny) {
                    bound = Math.min(bound, Math.max(0, ej * (lam[i] + h * dlam[i])) / Math.abs(f));
                }
            }
            if (bound > UNIQUE * Math.max(scale, Double.MIN_NORMAL)) {
                return false;
            }
        }
        return true;
    }

    // ------------------------------------------------------------------ ends and assembly

    /** The walk's ends against the bounded simplex's range of μ'w (two linear programmes). */
    private void checkEnds(List<Raw> up, List<Raw> down, boolean inefficient) {
        double[] neg = new double[n];
        for (int i = 0; i < n; i++) {
            neg[i] = -p.mu[i];
        }
        check(up.get(up.size() - 1).m, neg, "highest");
        if (inefficient) {
            check(down.get(down.size() - 1).m, p.mu, "lowest");
        }
    }

    private void check(double end, double[] c, String which) {
        BoundedSimplex.Result lp = BoundedSimplex.solve(p.a, p.rel, p.b, lo, hi, c, settings.maxIterations());
        if (lp.outcome() != BoundedSimplex.Outcome.OPTIMAL) {
            return; // the walk found an end; an LP that does not is no evidence against it
        }
        double ref = Dense.dot(p.mu, lp.x());
        if (Math.abs(ref - end) > 1e-9 * Math.max(1, Math.abs(ref))) {
            throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, String.format(Locale.ROOT,
                    "the parametric active-set method ended its walk at a target of %.12g, but the %s expected "
                            + "return the constraints allow is %.12g; fix: report this problem", end, which, ref),
                    List.of());
        }
    }

    private ParametricPath assemble(List<Raw> up, List<Raw> down, byte[] minState, boolean[] minActive) {
        List<LinearConstraint> certRows = new ArrayList<>(p.rows);
        certRows.add(new LinearConstraint("target_return", p.mu, Relation.EQUAL, 0));
        List<ParametricPath.Corner> corners = new ArrayList<>();
        List<ParametricPath.Piece> pieces = new ArrayList<>();
        for (int j = down.size() - 1; j >= 1; j--) {
            Raw r = down.get(j);
            corners.add(corner(r, r.changes, r.unique, certRows));
            pieces.add(piece(down.get(j - 1), r.m, down.get(j - 1).m, -1));
        }
        Raw top = up.get(0);
        List<ParametricPath.Change> atMin;
        boolean unique = top.unique;
        if (!down.isEmpty()) {
            Raw below = down.get(0);
            atMin = diff(below.state, below.active, top.state, top.active);
            unique &= below.unique;
        } else {
            atMin = diff(minState, minActive, top.state, top.active);
        }
        int minimum = corners.size();
        corners.add(corner(top, atMin, unique, certRows));
        for (int j = 1; j < up.size(); j++) {
            Raw r = up.get(j);
            pieces.add(piece(up.get(j - 1), up.get(j - 1).m, r.m, +1));
            corners.add(corner(r, r.changes, r.unique, certRows));
        }
        return new ParametricPath(p, corners, pieces, minimum, settings.numericalTolerance(),
                new ParametricPath.Counts(startChanges, iterations - startChanges, exchanges, zeroSteps));
    }

    /** Changes between the working sets below and above a target (the target row itself not counted). */
    private List<ParametricPath.Change> diff(byte[] belowState, boolean[] belowActive, byte[] aboveState,
                                             boolean[] aboveActive) {
        List<ParametricPath.Change> out = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            boolean was = belowState[i] == LOWER || belowState[i] == UPPER;
            boolean is = aboveState[i] == LOWER || aboveState[i] == UPPER;
            if (was && (!is || belowState[i] != aboveState[i])) {
                out.add(new ParametricPath.Change(boundRef(i, belowState[i]), false));
            }
            if (is && (!was || belowState[i] != aboveState[i])) {
                out.add(new ParametricPath.Change(boundRef(i, aboveState[i]), true));
            }
        }
        for (int r = 0; r < rows; r++) {
            if (belowActive[r] != aboveActive[r]) {
                out.add(new ParametricPath.Change(new ParametricPath.ConstraintRef(ParametricPath.Kind.ROW, r),
                        aboveActive[r]));
            }
        }
        return out;
    }

    private ParametricPath.Corner corner(Raw r, List<ParametricPath.Change> changes, boolean unique,
                                         List<LinearConstraint> certRows) {
        double[] rowPrices = Arrays.copyOf(r.s, rows);
        Certificate cert = certify(r.x, r.g, r.m, r.s, r.lam, r.state, r.condition, certRows);
        double variance = Dense.dot(r.x, r.g);
        return new ParametricPath.Corner(r.m, r.x, p.objective(r.x, r.g), variance, r.state,
                Arrays.copyOf(r.active, rows), rowPrices, r.s[target], r.lam, changes, unique, cert);
    }

    /** The piece the walk left corner {@code anchor} by, from {@code from} to {@code to} (per unit of m). */
    private ParametricPath.Piece piece(Raw anchor, double from, double to, int d) {
        double[] dw = scaled(anchor.dx, d);
        double[] dsr = scaled(Arrays.copyOf(anchor.ds, rows), d);
        double[] dl = scaled(anchor.dlam, d);
        return new ParametricPath.Piece(from, to, anchor.m, anchor.state, Arrays.copyOf(anchor.active, rows),
                anchor.x, dw, Arrays.copyOf(anchor.s, rows), dsr, anchor.s[target], d * anchor.ds[target], anchor.lam,
                dl, anchor.pieceUnique, anchor.condition);
    }

    private static double[] scaled(double[] v, int d) {
        double[] out = v.clone();
        if (d < 0) {
            for (int i = 0; i < out.length; i++) {
                out[i] = -out[i];
            }
        }
        return out;
    }

    private Certificate certify(double[] w, double[] sw, double m, double[] sAll, double[] bound, byte[] st,
                                double condition, List<LinearConstraint> certRows) {
        double[] limits = new double[rows + 1];
        System.arraycopy(p.b, 0, limits, 0, rows);
        limits[rows] = m;
        return Kkt.certifyProduct(sw, p.linear, w, certRows, limits, Arrays.copyOf(sAll, rows + 1), lo, hi,
                split(st, bound, true), split(st, bound, false), condition, settings.numericalTolerance(), true);
    }

    /** Bound prices split into lower and upper ones: a fixed weight's price goes to the side its sign fits. */
    static double[] split(byte[] st, double[] prices, boolean lower) {
        double[] out = new double[st.length];
        for (int i = 0; i < st.length; i++) {
            boolean low = st[i] == LOWER || (st[i] == FIXED && prices[i] >= 0);
            boolean high = st[i] == UPPER || (st[i] == FIXED && prices[i] < 0);
            if (lower ? low : high) {
                out[i] = prices[i];
            }
        }
        return out;
    }

    /** The frontier point at m on a piece, certified afresh against Σ. */
    static ParametricPath.Point point(ParametricPath path, ParametricPath.Piece pc, double m) {
        ParametricProblem pr = path.problem();
        int rows = pr.rowCount();
        double[] w = pc.weightsAt(m);
        double[] rp = pc.rowPricesAt(m);
        double tp = pc.targetPriceAt(m);
        double[] bp = pc.boundPricesAt(m);
        double[] sw = Dense.multiplySymmetric(pr.sigma, w);
        List<LinearConstraint> certRows = new ArrayList<>(pr.rows);
        certRows.add(new LinearConstraint("target_return", pr.mu, Relation.EQUAL, m));
        double[] all = Arrays.copyOf(rp, rows + 1);
        all[rows] = tp;
        Certificate cert = Kkt.certifyProduct(sw, pr.linear, w, certRows, null, all, pr.lo, pr.hi,
                split(pc.state(), bp, true), split(pc.state(), bp, false), pc.condition(), path.threshold(), true);
        return new ParametricPath.Point(m, w, pr.objective(w, sw), Dense.dot(w, sw), pc.state(), pc.rowActive(), rp,
                tp, bp, pc.multipliersUnique(), cert);
    }

    // ------------------------------------------------------------------ a small Householder QR

    /**
     * Householder QR of the m × k matrix whose columns are the first m entries of {@code cols[0..k)} (k ≤ m,
     * independent columns), for the range-space solves {@code (Y'Y)s = c} and for least squares against Y.
     */
    static final class Qr {
        private final int m;
        private final int k;
        private final double[][] v;
        private final double[] beta;
        private final double[][] r;

        private Qr(int m, int k) {
            this.m = m;
            this.k = k;
            this.v = new double[k][];
            this.beta = new double[k];
            this.r = new double[k][k];
        }

        static Qr of(double[][] cols, int k, int m) {
            if (k > m) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED, String.format(Locale.ROOT,
                        "internal: %d active rows on %d free assets are dependent", k, m), List.of());
            }
            Qr qr = new Qr(m, k);
            double[][] w = new double[k][];
            for (int j = 0; j < k; j++) {
                w[j] = Arrays.copyOf(cols[j], m);
            }
            for (int j = 0; j < k; j++) {
                double[] aj = w[j];
                double nrm = 0;
                for (int t = j; t < m; t++) {
                    nrm += aj[t] * aj[t];
                }
                nrm = Math.sqrt(nrm);
                double[] vj = new double[m];
                qr.v[j] = vj;
                if (nrm == 0) {
                    for (int c = j; c < k; c++) {
                        qr.r[j][c] = w[c][j];
                    }
                    continue;
                }
                double alpha = aj[j] > 0 ? -nrm : nrm;
                for (int t = j; t < m; t++) {
                    vj[t] = aj[t];
                }
                vj[j] -= alpha;
                double vv = 0;
                for (int t = j; t < m; t++) {
                    vv += vj[t] * vj[t];
                }
                double bj = vv == 0 ? 0 : 2 / vv;
                qr.beta[j] = bj;
                for (int c = j; c < k; c++) {
                    double[] ac = w[c];
                    double dot = 0;
                    for (int t = j; t < m; t++) {
                        dot += vj[t] * ac[t];
                    }
                    dot *= bj;
                    for (int t = j; t < m; t++) {
                        ac[t] -= dot * vj[t];
                    }
                    qr.r[j][c] = ac[j];
                }
            }
            return qr;
        }

        private double[] qt(double[] x) {
            double[] t = Arrays.copyOf(x, m);
            for (int j = 0; j < k; j++) {
                double[] vj = v[j];
                double dot = 0;
                for (int i = j; i < m; i++) {
                    dot += vj[i] * t[i];
                }
                dot *= beta[j];
                if (dot != 0) {
                    for (int i = j; i < m; i++) {
                        t[i] -= dot * vj[i];
                    }
                }
            }
            return t;
        }

        /** Norm of the part of x (first m entries) outside the columns' span. */
        double residualNorm(double[] x) {
            double[] t = qt(x);
            double ss = 0;
            for (int i = k; i < m; i++) {
                ss += t[i] * t[i];
            }
            return Math.sqrt(ss);
        }

        /** Least-squares coefficients of x on the columns. */
        double[] leastSquares(double[] x) {
            double[] t = qt(x);
            double[] h = new double[k];
            for (int j = k - 1; j >= 0; j--) {
                double v0 = t[j];
                for (int c = j + 1; c < k; c++) {
                    v0 -= r[j][c] * h[c];
                }
                h[j] = v0 / pivot(j);
            }
            return h;
        }

        /** Solves {@code (Y'Y)h = c} as {@code R'R h = c}. */
        double[] normalSolve(double[] c) {
            double[] h = c.clone();
            for (int j = 0; j < k; j++) {
                double v0 = h[j];
                for (int u = 0; u < j; u++) {
                    v0 -= r[u][j] * h[u];
                }
                h[j] = v0 / pivot(j);
            }
            for (int j = k - 1; j >= 0; j--) {
                double v0 = h[j];
                for (int u = j + 1; u < k; u++) {
                    v0 -= r[j][u] * h[u];
                }
                h[j] = v0 / pivot(j);
            }
            return h;
        }

        private double pivot(int j) {
            double d = r[j][j];
            if (d == 0) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED,
                        "internal: the working set's rows became dependent", List.of());
            }
            return d;
        }
    }
}
