package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.UpdatableCholesky;
import org.isorisk.engine.linalg.Workers;

/**
 * Markowitz's critical line method (Markowitz 1956; the exposition of Niedermayer &amp; Niedermayer 2010) for
 * {@code min w'Σw − λ r'w} subject to {@code 1'w = b} and {@code lo ≤ w ≤ hi}, for every λ from +∞ down to 0.
 * Here {@code r} is the direction of the sweep: μ for the efficient branch (from the maximum-return end to the
 * minimum-variance portfolio), −μ for the inefficient branch (from the minimum-return end).
 *
 * <p>On a stretch of λ where the set F of free assets (strictly between their bounds) does not change, the
 * stationarity rows of F and the budget give {@code w_F(λ) = α + λβ} and a budget multiplier
 * {@code ν(λ) = ν₀ + λν₁}; an asset out at a bound has multiplier {@code γ_i(λ) = 2(Σw)_i − ν(λ) − λ r_i}, affine
 * in λ too, with {@code γ_i ≥ 0} at its lower and {@code ≤ 0} at its upper bound. Walking down λ, the next corner
 * is the largest λ at which a free weight reaches a bound (it leaves F) or an out multiplier reaches zero (it
 * enters F). λ is the return-target multiplier ∂V*∂m, so corners are the frontier's turning points.
 *
 * <p>The free block {@code Σ_FF = LL'} is held as a Cholesky factor updated by one row/column per event
 * ({@link UpdatableCholesky}), never refactored, together with {@code K = L⁻¹Σ_{F,O}} (O the assets out at a
 * bound) and the half solves {@code L⁻¹1}, {@code L⁻¹r_F}, {@code L⁻¹c_F}. An entering asset's column of K is its
 * new row of the factor; a leaving asset's new column of K is its deleted row of the factor carried through the
 * same Givens rotations. Each corner then costs one pass over K ({@code |F|·|O|}: the new row of K and every out
 * asset's multiplier together), one backward solve ({@code |F|²/2}) for the free weights, and {@code O(n)}
 * besides; a deletion adds the rotations ({@code O(|F|² + |F|·|O|)}).
 *
 * <p>Ties in {@code r} at the start are resolved exactly: the start is the minimum-variance portfolio on the set
 * of highest-return portfolios, found by a sweep of the tied assets alone (tie-broken by index), so that the
 * walk starts from a true optimum of the λ = ∞ limit. Several events at one λ are taken one at a time, leaving
 * events first, then lower asset index; the asset that changed last may not change back at the same λ.
 */
final class CriticalLine {

    static final byte FREE = 0;
    static final byte LOWER = 1;
    static final byte UPPER = 2;
    static final byte FROZEN = 3;

    /** Kinds of event, as seen walking down λ (towards the minimum-variance portfolio). */
    enum Kind {
        /** A free asset reaches its lower bound and leaves the free set. */
        LEAVES_AT_LOWER,
        /** A free asset reaches its upper bound and leaves the free set. */
        LEAVES_AT_UPPER,
        /** An asset at its lower bound sees its multiplier reach zero and enters the free set. */
        ENTERS_FROM_LOWER,
        /** An asset at its upper bound sees its multiplier reach zero and enters the free set. */
        ENTERS_FROM_UPPER
    }

    /** One change of the free set. */
    record Event(int asset, Kind kind) {
    }

    /**
     * A corner of the walk: λ, the weights there, the budget multiplier, and the state of every asset on the
     * stretch that follows (towards λ = 0). {@code events} are the changes made at this corner (empty at the
     * start and at the λ = 0 end). {@code condition} estimates the condition number of the free block Σ_FF.
     */
    record Point(double lambda, double[] weights, double budgetPrice, byte[] state, List<Event> events,
                 double condition) {
    }

    /** The problem: covariance, bounds (finite, effective), frozen assets, budget. */
    static final class Problem {
        final double[][] sigma;
        final int n;
        final double budget;
        final double[] lo;
        final double[] hi;
        /** True where the effective bound is tighter than the mandate's own (implied by the others' bounds). */
        final boolean[] loImplied;
        final boolean[] hiImplied;
        final boolean[] frozen;
        final double[] frozenValue;

        Problem(double[][] sigma, double budget, double[] lo, double[] hi, boolean[] loImplied, boolean[] hiImplied,
                boolean[] frozen, double[] frozenValue) {
            this.sigma = sigma;
            this.n = lo.length;
            this.budget = budget;
            this.lo = lo;
            this.hi = hi;
            this.loImplied = loImplied;
            this.hiImplied = hiImplied;
            this.frozen = frozen;
            this.frozenValue = frozenValue;
        }
    }

    /**
     * The problem with effective bounds: each non-frozen asset's bounds tightened by what the budget and the
     * other assets' bounds imply ({@code w_i ≤ b − Σ_{j≠i} lo_j}, {@code w_i ≥ b − Σ_{j≠i} hi_j}), which makes
     * every bound finite when one side of every asset is. Tightened bounds are flagged as implied.
     *
     * @return the problem, or null when some bound stays infinite
     */
    static Problem effective(double[][] sigma, double budget, double[] lo, double[] hi, boolean[] loImplied,
                             boolean[] hiImplied, boolean[] frozen, double[] frozenValue) {
        int n = lo.length;
        double sumLo = 0;
        double sumHi = 0;
        for (int i = 0; i < n; i++) {
            sumLo += frozen[i] ? frozenValue[i] : lo[i];
            sumHi += frozen[i] ? frozenValue[i] : hi[i];
        }
        double[] l = new double[n];
        double[] h = new double[n];
        boolean[] li = new boolean[n];
        boolean[] hi2 = new boolean[n];
        for (int i = 0; i < n; i++) {
            if (frozen[i]) {
                l[i] = frozenValue[i];
                h[i] = frozenValue[i];
                continue;
            }
            double impliedLo = Double.isFinite(sumHi) ? budget - (sumHi - hi[i]) : Double.NEGATIVE_INFINITY;
            double impliedHi = Double.isFinite(sumLo) ? budget - (sumLo - lo[i]) : Double.POSITIVE_INFINITY;
            if (Double.isInfinite(hi[i]) && Double.isInfinite(sumHi)) {
                // sumHi is infinite because of this asset alone when every other upper bound is finite.
                impliedLo = othersFinite(hi, frozen, frozenValue, i) ? budget - othersSum(hi, frozen, frozenValue, i)
                        : Double.NEGATIVE_INFINITY;
            }
            if (Double.isInfinite(lo[i]) && Double.isInfinite(sumLo)) {
                impliedHi = othersFinite(lo, frozen, frozenValue, i) ? budget - othersSum(lo, frozen, frozenValue, i)
                        : Double.POSITIVE_INFINITY;
            }
            l[i] = Math.max(lo[i], impliedLo);
            h[i] = Math.min(hi[i], impliedHi);
            li[i] = loImplied[i] || l[i] > lo[i];
            hi2[i] = hiImplied[i] || h[i] < hi[i];
            if (Double.isInfinite(l[i]) || Double.isInfinite(h[i])) {
                return null;
            }
        }
        return new Problem(sigma, budget, l, h, li, hi2, frozen, frozenValue);
    }

    private static boolean othersFinite(double[] b, boolean[] frozen, double[] fv, int skip) {
        for (int j = 0; j < b.length; j++) {
            if (j != skip && !frozen[j] && Double.isInfinite(b[j])) {
                return false;
            }
        }
        return true;
    }

    private static double othersSum(double[] b, boolean[] frozen, double[] fv, int skip) {
        double s = 0;
        for (int j = 0; j < b.length; j++) {
            if (j != skip) {
                s += frozen[j] ? fv[j] : b[j];
            }
        }
        return s;
    }

    /** Relative pivot below which adding an asset would make the free block singular. */
    private static final double PIVOT_TOL = 1e-14;

    private final Problem p;
    private final double[] r;
    private final int maxIterations;
    private final int n;
    private final byte[] state;
    private final double[] w;
    /** c_i = Σ_{j out or frozen} σ_ij w_j, kept current as assets move in and out. */
    private final double[] c;
    /** The free block's factor {@code Σ_FF = LL'}, rows in free-set order. */
    private final UpdatableCholesky chol;
    private final int[] free;
    private int nf;
    private double outSum;

    /**
     * {@code K = L⁻¹Σ_{F,O}}: row k for the factor's column k, column q for the out asset {@code outs[q]} (frozen
     * assets have no column: they never enter). Its column for an asset about to enter is that asset's new row of
     * the factor, and {@code K'L'v = Σ_{O,F}v} gives every out asset's multiplier from the free weights in
     * {@code O(|F|·|O|)}, the least any corner can cost.
     */
    private final double[][] k;
    private final int[] outs;
    /** Column of K of each out asset, −1 for free and frozen ones. */
    private final int[] colOf;
    private int no;

    /** Half solves {@code L⁻¹1}, {@code L⁻¹r_F}, {@code L⁻¹c_F}, kept current through every change. */
    private final double[] y1;
    private final double[] yr;
    private final double[] yg;
    /** {@code L'α} and {@code L'β}, then α and β themselves (free-set order). */
    private final double[] ya;
    private final double[] yb;
    private final double[] alpha;
    private final double[] beta;
    /** {@code Σ_{i,F}α} and {@code Σ_{i,F}β} for the out asset of each column of K. */
    private final double[] sa;
    private final double[] sb;
    /** Scratch: an entering asset's column of K, rotations of a deletion, the deleted row. */
    private final double[] ell;
    private final double[] accL;
    private final double[] cos;
    private final double[] sin;
    private final double[] oldRow;
    private int sinceRefresh;

    /** Changes of the free set between fresh forward solves of the three half solves (bounds their drift). */
    private static final int REFRESH = 32;

    private double nu0;
    private double nu1;

    /** Threads for the two halves of each corner's work (the pass over K and the backward solve). */
    private final int threads;

    /** Work (entries of K and of the factor read per corner) above which the two halves run on two threads. */
    private static final long PARALLEL_WORK = 150_000;

    private CriticalLine(Problem p, double[] r, int maxIterations, int threads) {
        this.threads = threads;
        this.p = p;
        this.r = r;
        this.maxIterations = maxIterations;
        this.n = p.n;
        this.state = new byte[n];
        this.w = new double[n];
        this.c = new double[n];
        this.free = new int[n];
        this.chol = new UpdatableCholesky(n);
        this.k = new double[n][];
        this.outs = new int[n];
        this.colOf = new int[n];
        this.y1 = new double[n];
        this.yr = new double[n];
        this.yg = new double[n];
        this.ya = new double[n];
        this.yb = new double[n];
        this.alpha = new double[n];
        this.beta = new double[n];
        this.sa = new double[n];
        this.sb = new double[n];
        this.ell = new double[n];
        this.accL = new double[n];
        this.cos = new double[n];
        this.sin = new double[n];
        this.oldRow = new double[n];
    }

    /**
     * Walks from λ = +∞ down to λ = 0 (or until the return {@code r'w} falls below {@code stopAt}).
     *
     * @param p             the problem (not modified)
     * @param r             the sweep direction (μ or −μ; not modified)
     * @param stopAt        stop after the first corner whose {@code r'w} is below this; −∞ for the whole walk
     * @param maxIterations cap on the number of events
     * @return the corners in walk order: the start (λ = +∞), then each event, then λ = 0 (unless stopped early)
     */
    static List<Point> walk(Problem p, double[] r, double stopAt, int maxIterations) {
        return walk(p, r, stopAt, maxIterations, 1);
    }

    /**
     * As {@link #walk(Problem, double[], double, int)}, with up to {@code threads} threads (two are used: each
     * corner's pass over K and its backward solve are independent).
     */
    static List<Point> walk(Problem p, double[] r, double stopAt, int maxIterations, int threads) {
        CriticalLine cl = new CriticalLine(p, r, maxIterations, threads);
        cl.start();
        return cl.run(stopAt);
    }

    // ------------------------------------------------------------------ start: the λ = +∞ end

    private void start() {
        int[] order = order(r);
        double[] w0 = new double[n];
        double rest = p.budget;
        for (int i = 0; i < n; i++) {
            if (p.frozen[i]) {
                w0[i] = p.frozenValue[i];
                state[i] = FROZEN;
            } else {
                w0[i] = p.lo[i];
                state[i] = LOWER;
            }
            rest -= w0[i];
        }
        int marginal = -1;
        double dust = 1e-15 * Math.max(1, Math.abs(p.budget)); // rounding left over by the sums above
        for (int k = 0; k < order.length; k++) {
            int i = order[k];
            double room = p.hi[i] - p.lo[i];
            double add = Math.min(room, Math.max(0, rest));
            w0[i] += add;
            rest -= add;
            if (rest <= dust || k == order.length - 1) {
                marginal = k;
                break;
            }
            state[i] = UPPER;
        }
        int mi = order[marginal];
        for (int k = 0; k < marginal; k++) {
            state[order[k]] = UPPER;
            w0[order[k]] = p.hi[order[k]];
        }
        // Assets tied with the marginal one in r: the λ = ∞ limit is the minimum-variance point of that face.
        List<Integer> tied = new ArrayList<>();
        for (int i : order) {
            if (r[i] == r[mi]) {
                tied.add(i);
            }
        }
        System.arraycopy(w0, 0, w, 0, n);
        if (tied.size() > 1) {
            boolean[] frozen = new boolean[n];
            double[] fv = w0.clone();
            Arrays.fill(frozen, true);
            for (int i : tied) {
                frozen[i] = false;
            }
            Problem face = effective(p.sigma, p.budget, p.lo, p.hi, p.loImplied, p.hiImplied, frozen, fv);
            double[] tieBreak = new double[n];
            for (int k = 0; k < tied.size(); k++) {
                tieBreak[tied.get(k)] = -k;
            }
            List<Point> facePath = walk(face, tieBreak, Double.NEGATIVE_INFINITY, maxIterations, threads);
            Point end = facePath.get(facePath.size() - 1);
            // The face's bounds are tighter (implied by its own small budget), so read each tied asset's state
            // from its weight against this problem's bounds.
            double near = 1e-12 * Math.max(1, Math.abs(p.budget));
            for (int i : tied) {
                double x = end.weights()[i];
                if (Math.abs(x - p.hi[i]) <= near && !p.hiImplied[i]) {
                    state[i] = UPPER;
                    w[i] = p.hi[i];
                } else if (Math.abs(x - p.lo[i]) <= near && !p.loImplied[i]) {
                    state[i] = LOWER;
                    w[i] = p.lo[i];
                } else {
                    state[i] = FREE;
                    w[i] = x;
                }
            }
            boolean anyFree = false;
            for (int i : tied) {
                anyFree |= state[i] == FREE;
            }
            if (!anyFree) {
                // Every tied asset sits at a bound of this problem: the marginal one carries the budget.
                state[mi] = FREE;
            }
        } else {
            state[mi] = FREE;
        }
        // An asset sitting at a bound implied only by the others' bounds must be the free one: such a bound
        // has no multiplier of its own (the others' bounds carry it).
        int implied = -1;
        for (int i = 0; i < n; i++) {
            if ((state[i] == LOWER && p.loImplied[i]) || (state[i] == UPPER && p.hiImplied[i])) {
                implied = i;
            }
        }
        if (implied >= 0) {
            for (int i = 0; i < n; i++) {
                if (state[i] == FREE) {
                    state[i] = p.hi[i] - w[i] <= w[i] - p.lo[i] ? UPPER : LOWER;
                    w[i] = state[i] == UPPER ? p.hi[i] : p.lo[i];
                }
            }
            state[implied] = FREE;
        }
        // c, the columns of K, and the factor (built by the same bordering as every later entry).
        outSum = 0;
        Arrays.fill(colOf, -1);
        for (int j = 0; j < n; j++) {
            if (state[j] != FREE) {
                outSum += w[j];
                addToC(j, w[j]);
            }
            if (state[j] != FROZEN) {
                colOf[j] = no;
                outs[no++] = j;
            }
        }
        for (int i = 0; i < n; i++) {
            if (state[i] == FREE) {
                insert(i);
                extend(i);
            }
        }
        refresh();
    }

    /** Non-frozen assets by decreasing r, ties by increasing index. */
    private int[] order(double[] dir) {
        Integer[] idx = new Integer[n];
        int k = 0;
        for (int i = 0; i < n; i++) {
            if (!p.frozen[i]) {
                idx[k++] = i;
            }
        }
        Integer[] live = Arrays.copyOf(idx, k);
        Arrays.sort(live, (a, b) -> {
            int cmp = Double.compare(dir[b], dir[a]);
            return cmp != 0 ? cmp : Integer.compare(a, b);
        });
        int[] out = new int[k];
        for (int i = 0; i < k; i++) {
            out[i] = live[i];
        }
        return out;
    }

    // ------------------------------------------------------------------ the walk

    private List<Point> run(double stopAt) {
        List<Point> path = new ArrayList<>();
        double lambda = Double.POSITIVE_INFINITY;
        project(-1);
        path.add(snapshot(lambda, List.of()));
        int lastAsset = -1;
        for (int it = 0; ; it++) {
            if (it > maxIterations) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED,
                        "the critical line method passed " + maxIterations + " corners without reaching the "
                                + "minimum-variance portfolio; fix: raise the iteration limit or check the "
                                + "covariance matrix for near-duplicate assets", List.of());
            }
            Candidate next = nextEvent(lambda, lastAsset);
            if (next == null || next.lambda <= 0) {
                path.add(snapshot(0, List.of()));
                return path;
            }
            lambda = next.lambda;
            List<Event> here = new ArrayList<>();
            // Weights at the corner from the stretch just walked, then the change.
            moveFreeTo(lambda);
            int entered = apply(next);
            here.add(new Event(next.asset, next.kind));
            lastAsset = next.asset;
            project(entered);
            Point pt = snapshot(lambda, here);
            path.add(pt);
            if (returnOf(pt.weights()) < stopAt) {
                return path;
            }
        }
    }

    private double returnOf(double[] x) {
        return returnOf(r, x);
    }

    /** {@code r'x} summed in index order: what {@link #walk} compares with its stopping return. */
    static double returnOf(double[] r, double[] x) {
        double s = 0;
        for (int i = 0; i < x.length; i++) {
            s += r[i] * x[i];
        }
        return s;
    }

    /**
     * The walk {@code walk(p, r, stopAt, ...)} would return, read from the whole walk {@code full} (stopAt = −∞)
     * of the same problem and direction: the walk is the same whatever its stopping return, and stops after the
     * first corner (not the start, not the λ = 0 end) whose return is below {@code stopAt}.
     */
    static List<Point> prefix(List<Point> full, double[] r, double stopAt) {
        for (int i = 1; i < full.size() - 1; i++) {
            if (returnOf(r, full.get(i).weights()) < stopAt) {
                return new ArrayList<>(full.subList(0, i + 1));
            }
        }
        return new ArrayList<>(full);
    }

    private record Candidate(double lambda, int asset, Kind kind) {
    }

    /**
     * The next event below {@code lambda}: the largest λ_e ≤ λ at which a free weight reaches a bound or an out
     * multiplier reaches zero. Equal λ_e: leaving before entering, then lower index.
     */
    private Candidate nextEvent(double lambda, int lastAsset) {
        Candidate best = null;
        double scale = Double.isInfinite(lambda) ? 1 : Math.max(1, Math.abs(lambda));
        double same = 1e-12 * scale;
        // Free assets reaching a bound.
        for (int k = 0; k < nf; k++) {
            int i = free[k];
            double b = beta[k];
            if (b == 0) {
                continue;
            }
            Kind kind;
            double le;
            if (b > 0) {
                if (p.loImplied[i]) {
                    continue;
                }
                kind = Kind.LEAVES_AT_LOWER;
                le = (p.lo[i] - alpha[k]) / b;
            } else {
                if (p.hiImplied[i]) {
                    continue;
                }
                kind = Kind.LEAVES_AT_UPPER;
                le = (p.hi[i] - alpha[k]) / b;
            }
            if (i == lastAsset && !(le < lambda - same)) {
                continue;
            }
            best = better(best, new Candidate(Math.min(le, lambda), i, kind), same);
        }
        // Out assets whose multiplier reaches zero.
        for (int q = 0; q < no; q++) {
            int i = outs[q];
            byte s = state[i];
            double pi = 2 * (sa[q] + c[i]) - nu0;
            double qi = 2 * sb[q] - nu1 - r[i];
            double tiny = 1e-14 * (Math.abs(2 * sb[q]) + Math.abs(nu1) + Math.abs(r[i]));
            if (!(Math.abs(qi) > tiny)) {
                continue;
            }
            double le;
            Kind kind;
            if (s == LOWER && qi > 0) {
                kind = Kind.ENTERS_FROM_LOWER;
            } else if (s == UPPER && qi < 0) {
                kind = Kind.ENTERS_FROM_UPPER;
            } else {
                continue;
            }
            le = -pi / qi;
            if (i == lastAsset && !(le < lambda - same)) {
                continue;
            }
            best = better(best, new Candidate(Math.min(le, lambda), i, kind), same);
        }
        return best;
    }

    private static Candidate better(Candidate a, Candidate b, double same) {
        if (a == null) {
            return b;
        }
        if (Math.abs(a.lambda - b.lambda) <= same || (Double.isInfinite(a.lambda) && a.lambda == b.lambda)) {
            boolean aLeaves = a.kind == Kind.LEAVES_AT_LOWER || a.kind == Kind.LEAVES_AT_UPPER;
            boolean bLeaves = b.kind == Kind.LEAVES_AT_LOWER || b.kind == Kind.LEAVES_AT_UPPER;
            if (aLeaves != bLeaves) {
                return aLeaves ? a : b;
            }
            return a.asset <= b.asset ? a : b;
        }
        return b.lambda > a.lambda ? b : a;
    }

    private void moveFreeTo(double lambda) {
        for (int q = 0; q < nf; q++) {
            w[free[q]] = alpha[q] + (beta[q] == 0 ? 0 : lambda * beta[q]);
        }
    }

    /** Makes the change; returns the asset that entered the free set, or −1 when one left it. */
    private int apply(Candidate e) {
        int i = e.asset;
        switch (e.kind) {
            case LEAVES_AT_LOWER, LEAVES_AT_UPPER -> {
                boolean low = e.kind == Kind.LEAVES_AT_LOWER;
                leave(i, low ? p.lo[i] : p.hi[i]);
                state[i] = low ? LOWER : UPPER;
                return -1;
            }
            case ENTERS_FROM_LOWER, ENTERS_FROM_UPPER -> {
                // c loses σ_·i w_i, so L⁻¹c_F loses w_i L⁻¹σ_Fi, which is the asset's column of K.
                double wi = w[i];
                outSum -= wi;
                addToC(i, -wi);
                int col = colOf[i];
                for (int q = 0; q < nf; q++) {
                    yg[q] -= wi * k[q][col];
                }
                state[i] = FREE;
                insert(i);
                return i;
            }
            default -> throw new IllegalStateException(e.kind.toString());
        }
    }

    private void addToC(int j, double v) {
        if (v == 0) {
            return;
        }
        double[] col = p.sigma[j]; // Σ is symmetric: row j is column j
        for (int i = 0; i < n; i++) {
            c[i] += col[i] * v;
        }
    }

    /**
     * Adds asset i (already counted out of c) to the free set: its column of K is its new row of the factor, so
     * bordering the factor and the three half solves costs {@code O(|F|)}; its column leaves K (the last column
     * takes its place). The new row of K is made by {@link #extend}.
     */
    private void insert(int i) {
        int m = nf;
        int col = colOf[i];
        for (int q = 0; q < m; q++) {
            ell[q] = k[q][col];
        }
        double diag = p.sigma[i][i];
        double rel = chol.appendRow(ell, diag, PIVOT_TOL);
        if (!(rel > PIVOT_TOL)) {
            throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(java.util.Locale.ROOT,
                    "the covariance block of the free assets is singular when asset number %d joins them (relative "
                            + "pivot %.3g): it is (nearly) a combination of the other free assets, so the "
                            + "minimum-variance mix is not unique; fix: remove one of the duplicated assets or "
                            + "repair the covariance matrix", i + 1, rel), List.of());
        }
        double d = chol.factorEntry(m, m);
        int last = no - 1;
        if (col != last) {
            for (int q = 0; q < m; q++) {
                double[] row = k[q];
                row[col] = row[last];
            }
            outs[col] = outs[last];
            colOf[outs[col]] = col;
        }
        colOf[i] = -1;
        no--;
        double s1 = 0;
        double sr = 0;
        double sg = 0;
        for (int q = 0; q < m; q++) {
            s1 += ell[q] * y1[q];
            sr += ell[q] * yr[q];
            sg += ell[q] * yg[q];
        }
        y1[m] = (1 - s1) / d;
        yr[m] = (r[i] - sr) / d;
        yg[m] = (c[i] - sg) / d;
        free[nf++] = i;
        sinceRefresh++;
    }

    /**
     * Asset {@code free[pos]} leaves the free set at weight {@code bound}: the factor loses its row (Givens
     * rotations Q), the half solves and K become {@code Q'y} and {@code Q'K} without their last entry/row, and the
     * asset gains a column of K, {@code L̃⁻¹σ_{F̃,i}}, which is the deleted row of the factor rotated the same way;
     * c gains σ_·i·bound, so {@code L̃⁻¹c_F̃} gains bound times that column.
     */
    private void leave(int i, double bound) {
        int pos = -1;
        for (int q = 0; q < nf; q++) {
            if (free[q] == i) {
                pos = q;
            }
        }
        chol.remove(pos, cos, sin, oldRow);
        int m = nf - 1;
        UpdatableCholesky.rotate(y1, pos, m, cos, sin);
        UpdatableCholesky.rotate(yr, pos, m, cos, sin);
        UpdatableCholesky.rotate(yg, pos, m, cos, sin);
        UpdatableCholesky.rotate(oldRow, pos, m, cos, sin);
        // Q'K, one pair of rows at a time; row m (the old last row) is dropped.
        for (int j = pos; j < m; j++) {
            double[] top = k[j];
            double[] next = k[j + 1];
            double cj = cos[j];
            double sj = sin[j];
            for (int q = 0; q < no; q++) {
                double x = top[q];
                double y = next[q];
                top[q] = cj * x + sj * y;
                next[q] = -sj * x + cj * y;
            }
        }
        for (int q = 0; q < m; q++) {
            k[q][no] = oldRow[q];
        }
        outs[no] = i;
        colOf[i] = no;
        no++;
        System.arraycopy(free, pos + 1, free, pos, nf - pos - 1);
        nf = m;
        w[i] = bound;
        outSum += bound;
        addToC(i, bound);
        for (int q = 0; q < m; q++) {
            yg[q] += bound * oldRow[q];
        }
        sinceRefresh++;
    }

    /**
     * One pass over K: every out asset's {@code Σ_{i,F}α = (K'L'α)_i} and {@code Σ_{i,F}β}, and, when an asset has
     * just entered ({@code entered ≥ 0}), K's new last row {@code (σ_{i,O} − ℓ'K)/d} in the same pass.
     */
    private void extend(int entered) {
        boolean grow = entered >= 0;
        int rows = grow ? nf - 1 : nf;
        int cols = no;
        Arrays.fill(accL, 0, cols, 0.0);
        Arrays.fill(sa, 0, cols, 0.0);
        Arrays.fill(sb, 0, cols, 0.0);
        int q = 0;
        for (; q + 3 < rows; q += 4) {
            accumulate(q, grow, cols);
        }
        for (; q < rows; q++) {
            accumulate(q, grow ? ell[q] : 0, cols);
        }
        if (grow) {
            int m = nf - 1;
            double[] row = k[m] == null ? (k[m] = new double[n]) : k[m];
            double d = chol.factorEntry(m, m);
            double[] s = p.sigma[entered];
            for (int j = 0; j < cols; j++) {
                row[j] = (s[outs[j]] - accL[j]) / d;
            }
            accumulate(m, 0, cols);
        }
    }

    /**
     * Rows q..q+3 of K into the three accumulators (ℓ'K, K'L'α, K'L'β): each accumulator entry is loaded and
     * stored once per four rows.
     */
    private void accumulate(int q, boolean grow, int cols) {
        double[] r0 = k[q];
        double[] r1 = k[q + 1];
        double[] r2 = k[q + 2];
        double[] r3 = k[q + 3];
        double l0 = grow ? ell[q] : 0;
        double l1 = grow ? ell[q + 1] : 0;
        double l2 = grow ? ell[q + 2] : 0;
        double l3 = grow ? ell[q + 3] : 0;
        double a0 = ya[q];
        double a1 = ya[q + 1];
        double a2 = ya[q + 2];
        double a3 = ya[q + 3];
        double b0 = yb[q];
        double b1 = yb[q + 1];
        double b2 = yb[q + 2];
        double b3 = yb[q + 3];
        double[] al = accL;
        double[] xa = sa;
        double[] xb = sb;
        for (int j = 0; j < cols; j++) {
            double v0 = r0[j];
            double v1 = r1[j];
            double v2 = r2[j];
            double v3 = r3[j];
            al[j] += (l0 * v0 + l1 * v1) + (l2 * v2 + l3 * v3);
            xa[j] += (a0 * v0 + a1 * v1) + (a2 * v2 + a3 * v3);
            xb[j] += (b0 * v0 + b1 * v1) + (b2 * v2 + b3 * v3);
        }
    }

    /** One row q of K into the three accumulators, with ℓ-coefficient {@code l}. */
    private void accumulate(int q, double l, int cols) {
        double[] row = k[q];
        double a = ya[q];
        double b = yb[q];
        for (int j = 0; j < cols; j++) {
            double v = row[j];
            accL[j] += l * v;
            sa[j] += a * v;
            sb[j] += b * v;
        }
    }

    /** The three half solves afresh from the factor. */
    private void refresh() {
        for (int q = 0; q < nf; q++) {
            int i = free[q];
            y1[q] = 1;
            yr[q] = r[i];
            yg[q] = c[i];
        }
        chol.forwardInPlace(y1, yr, yg);
        sinceRefresh = 0;
    }

    /**
     * ν₀, ν₁, α and β of the current free set, and every out asset's cross products (with K's new row first when
     * an asset has just entered): {@code 1'S⁻¹1 = y₁'y₁} and the like, {@code L'α = ½ν₀y₁ − y_g},
     * {@code L'β = ½(y_r + ν₁y₁)}, then one backward solve for α and β together.
     */
    private void project(int entered) {
        if (sinceRefresh >= REFRESH) {
            refresh();
        }
        int m = nf;
        boolean flat = true;
        double r0 = r[free[0]];
        for (int q = 0; q < m; q++) {
            flat &= r[free[q]] == r0;
        }
        double cc = 0;
        double aa = 0;
        double gg = 0;
        for (int q = 0; q < m; q++) {
            cc += y1[q] * y1[q];
            aa += y1[q] * yr[q];
            gg += y1[q] * yg[q];
        }
        double bf = p.budget - outSum;
        nu0 = 2 * (bf + gg) / cc;
        nu1 = flat ? -r0 : -aa / cc;
        for (int q = 0; q < m; q++) {
            ya[q] = 0.5 * nu0 * y1[q] - yg[q];
            yb[q] = flat ? 0 : 0.5 * (yr[q] + nu1 * y1[q]);
        }
        long work = (long) m * no + (long) m * m / 2;
        if (threads >= 2 && work > PARALLEL_WORK) {
            Workers.run(2, part -> {
                if (part == 0) {
                    extend(entered);
                } else {
                    freeWeights(m);
                }
            });
        } else {
            extend(entered);
            freeWeights(m);
        }
    }

    /** α and β from {@code L'α} and {@code L'β}, by one backward solve for both. */
    private void freeWeights(int m) {
        System.arraycopy(ya, 0, alpha, 0, m);
        System.arraycopy(yb, 0, beta, 0, m);
        chol.backwardInPlace(alpha, beta);
    }

    private Point snapshot(double lambda, List<Event> events) {
        double l = Double.isInfinite(lambda) ? 0 : lambda;
        double[] x = w.clone();
        for (int k = 0; k < nf; k++) {
            x[free[k]] = alpha[k] + (beta[k] == 0 ? 0 : l * beta[k]);
        }
        double nu = nu0 + (nu1 == 0 ? 0 : l * nu1);
        return new Point(lambda, x, nu, state.clone(), List.copyOf(events), chol.conditionEstimate());
    }
}
