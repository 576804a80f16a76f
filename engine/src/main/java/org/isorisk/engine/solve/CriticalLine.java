package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.UpdatableCholesky;

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
 * <p>The free block {@code Σ_FF} is held as a Cholesky factor updated by one row/column per event
 * ({@link UpdatableCholesky}), never refactored: each corner costs {@code O(|F|² + n|F|)}.
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
    private final UpdatableCholesky chol;
    private final int[] free;
    private int nf;
    private double outSum;

    /** {@code S⁻¹1}, {@code S⁻¹r_F}, {@code S⁻¹c_F} in free-set order, kept current through every change. */
    private final double[] x1;
    private final double[] xr;
    private final double[] xg;
    private final double[] work;
    private int sinceRefresh;
    private boolean starting = true;

    /** Changes of the free set between full re-solves of the three systems (bounds the drift of the updates). */
    private static final int REFRESH = 32;

    private double[] alpha;
    private double[] beta;
    private double nu0;
    private double nu1;

    private CriticalLine(Problem p, double[] r, int maxIterations) {
        this.p = p;
        this.r = r;
        this.maxIterations = maxIterations;
        this.n = p.n;
        this.state = new byte[n];
        this.w = new double[n];
        this.c = new double[n];
        this.free = new int[n];
        this.chol = new UpdatableCholesky(n);
        this.x1 = new double[n];
        this.xr = new double[n];
        this.xg = new double[n];
        this.work = new double[n];
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
        CriticalLine cl = new CriticalLine(p, r, maxIterations);
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
            List<Point> facePath = walk(face, tieBreak, Double.NEGATIVE_INFINITY, maxIterations);
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
        // c and the factor.
        outSum = 0;
        for (int j = 0; j < n; j++) {
            if (state[j] != FREE) {
                outSum += w[j];
                addToC(j, w[j]);
            }
        }
        for (int i = 0; i < n; i++) {
            if (state[i] == FREE) {
                insert(i);
            }
        }
        starting = false;
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
        solveFree();
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
            apply(next);
            here.add(new Event(next.asset, next.kind));
            lastAsset = next.asset;
            solveFree();
            Point pt = snapshot(lambda, here);
            path.add(pt);
            if (returnOf(pt.weights()) < stopAt) {
                return path;
            }
        }
    }

    private double returnOf(double[] x) {
        double s = 0;
        for (int i = 0; i < n; i++) {
            s += r[i] * x[i];
        }
        return s;
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
        double[] sa = new double[n];
        double[] sb = new double[n];
        crossProducts(sa, sb);
        for (int i = 0; i < n; i++) {
            byte s = state[i];
            if (s != LOWER && s != UPPER) {
                continue;
            }
            double pi = 2 * (sa[i] + c[i]) - nu0;
            double qi = 2 * sb[i] - nu1 - r[i];
            double tiny = 1e-14 * (Math.abs(2 * sb[i]) + Math.abs(nu1) + Math.abs(r[i]));
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

    /**
     * For every out asset i: {@code sa_i = Σ_{j∈F} σ_ij α_j}, {@code sb_i = Σ_{j∈F} σ_ij β_j}. With few free
     * assets, as sums of the free assets' rows (Σ is symmetric; whole rows stream through memory); with few out
     * assets, as dot products along the out assets' rows. Either way Σ is read min(|F|, |out|) rows at a time.
     */
    private void crossProducts(double[] sa, double[] sb) {
        double[][] sigma = p.sigma;
        int out = 0;
        for (int i = 0; i < n; i++) {
            out += state[i] == LOWER || state[i] == UPPER ? 1 : 0;
        }
        if (nf <= out) {
            for (int k = 0; k < nf; k++) {
                double[] row = sigma[free[k]];
                double a = alpha[k];
                double b = beta[k];
                if (b == 0) {
                    for (int i = 0; i < n; i++) {
                        sa[i] += row[i] * a;
                    }
                } else {
                    for (int i = 0; i < n; i++) {
                        double v = row[i];
                        sa[i] += v * a;
                        sb[i] += v * b;
                    }
                }
            }
            return;
        }
        int m = nf;
        int[] f = free;
        double[] al = alpha;
        double[] be = beta;
        for (int i = 0; i < n; i++) {
            if (state[i] != LOWER && state[i] != UPPER) {
                continue;
            }
            double[] row = sigma[i];
            double x0 = 0;
            double x1 = 0;
            double y0 = 0;
            double y1 = 0;
            int k = 0;
            for (; k + 1 < m; k += 2) {
                double v0 = row[f[k]];
                double v1 = row[f[k + 1]];
                x0 += v0 * al[k];
                x1 += v1 * al[k + 1];
                y0 += v0 * be[k];
                y1 += v1 * be[k + 1];
            }
            for (; k < m; k++) {
                double v = row[f[k]];
                x0 += v * al[k];
                y0 += v * be[k];
            }
            sa[i] = x0 + x1;
            sb[i] = y0 + y1;
        }
    }

    private void moveFreeTo(double lambda) {
        for (int k = 0; k < nf; k++) {
            w[free[k]] = alpha[k] + (beta[k] == 0 ? 0 : lambda * beta[k]);
        }
    }

    private void apply(Candidate e) {
        int i = e.asset;
        switch (e.kind) {
            case LEAVES_AT_LOWER, LEAVES_AT_UPPER -> {
                int pos = -1;
                for (int k = 0; k < nf; k++) {
                    if (free[k] == i) {
                        pos = k;
                    }
                }
                boolean low = e.kind == Kind.LEAVES_AT_LOWER;
                double bound = low ? p.lo[i] : p.hi[i];
                // Column pos of S⁻¹ gives the smaller system's solutions (bordering in reverse), c gaining σ_·i w_i.
                double[] v = work;
                chol.unitSolution(pos, v);
                double vp = v[pos];
                double f1 = x1[pos] / vp;
                double fr = xr[pos] / vp;
                double fg = (xg[pos] + bound) / vp;
                for (int k = 0; k < nf; k++) {
                    x1[k] -= v[k] * f1;
                    xr[k] -= v[k] * fr;
                    xg[k] -= v[k] * fg;
                }
                shiftOut(x1, pos, nf);
                shiftOut(xr, pos, nf);
                shiftOut(xg, pos, nf);
                chol.remove(pos);
                System.arraycopy(free, pos + 1, free, pos, nf - pos - 1);
                nf--;
                state[i] = low ? LOWER : UPPER;
                w[i] = bound;
                outSum += w[i];
                addToC(i, w[i]);
                sinceRefresh++;
            }
            case ENTERS_FROM_LOWER, ENTERS_FROM_UPPER -> {
                outSum -= w[i];
                addToC(i, -w[i]);
                state[i] = FREE;
                insert(i);
            }
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

    private static void shiftOut(double[] a, int pos, int len) {
        System.arraycopy(a, pos + 1, a, pos, len - pos - 1);
    }

    /**
     * Adds asset i to the free set. Unless starting, the three solutions are bordered: with {@code z = S⁻¹s}
     * (s the new column) and the Schur complement {@code d − s'z}, each becomes {@code [x − z t; t]} with
     * {@code t = (b_i − s'x)/(d − s'z)}; c has already lost σ_·i w_i, so S⁻¹c_F first loses {@code w_i z}.
     */
    private void insert(int i) {
        double[] col = new double[nf];
        double[] row = p.sigma[i];
        for (int k = 0; k < nf; k++) {
            col[k] = row[free[k]];
        }
        double rel = chol.append(col, row[i], PIVOT_TOL);
        if (!(rel > PIVOT_TOL)) {
            throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(java.util.Locale.ROOT,
                    "the covariance block of the free assets is singular when asset number %d joins them (relative "
                            + "pivot %.3g): it is (nearly) a combination of the other free assets, so the "
                            + "minimum-variance mix is not unique; fix: remove one of the duplicated assets or "
                            + "repair the covariance matrix", i + 1, rel), List.of());
        }
        if (!starting) {
            int m = nf;
            double[] z = work;
            chol.borderSolution(z);
            double sz = 0;
            double s1 = 0;
            double sr = 0;
            double sg = 0;
            double wi = w[i];
            for (int k = 0; k < m; k++) {
                xg[k] -= wi * z[k];
                sz += col[k] * z[k];
                s1 += col[k] * x1[k];
                sr += col[k] * xr[k];
                sg += col[k] * xg[k];
            }
            double schur = row[i] - sz;
            double t1 = (1 - s1) / schur;
            double tr = (r[i] - sr) / schur;
            double tg = (c[i] - sg) / schur;
            for (int k = 0; k < m; k++) {
                x1[k] -= z[k] * t1;
                xr[k] -= z[k] * tr;
                xg[k] -= z[k] * tg;
            }
            x1[m] = t1;
            xr[m] = tr;
            xg[m] = tg;
            sinceRefresh++;
        }
        free[nf++] = i;
    }

    /** Solves the three systems afresh from the factor. */
    private void refresh() {
        for (int k = 0; k < nf; k++) {
            int i = free[k];
            x1[k] = 1;
            xr[k] = r[i];
            xg[k] = c[i];
        }
        chol.solveInPlace(x1, xr, xg);
        sinceRefresh = 0;
    }

    /** α, β, ν₀, ν₁ of the current free set. */
    private void solveFree() {
        if (sinceRefresh >= REFRESH) {
            refresh();
        }
        int m = nf;
        boolean flat = true;
        double r0 = r[free[0]];
        for (int k = 0; k < m; k++) {
            flat &= r[free[k]] == r0;
        }
        double cc = 0;
        double aa = 0;
        double gg = 0;
        for (int k = 0; k < m; k++) {
            cc += x1[k];
            aa += xr[k];
            gg += xg[k];
        }
        double bf = p.budget - outSum;
        nu0 = 2 * (bf + gg) / cc;
        nu1 = flat ? -r0 : -aa / cc;
        alpha = new double[m];
        beta = new double[m];
        for (int k = 0; k < m; k++) {
            alpha[k] = 0.5 * nu0 * x1[k] - xg[k];
            beta[k] = flat ? 0 : 0.5 * (xr[k] + nu1 * x1[k]);
        }
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
