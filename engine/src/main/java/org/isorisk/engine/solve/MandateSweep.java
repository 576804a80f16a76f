package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.linalg.Dense;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.CompactMultipliers;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.RejectedTarget;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;

/**
 * The mandate frontier of a budget + bounds (+ fixed weights) mandate by the critical line method: checks that
 * the bounds admit a portfolio, runs {@link CriticalLine} on the efficient branch (and, when asked for, on the
 * inefficient branch), and turns its corners into certified {@link Solution}s. A target between two corners is
 * solved exactly: weights, λ and the budget multiplier are affine in the target on a stretch, the bound
 * multipliers are recovered from the KKT rows of the assets out at a bound, {@code γ_i = 2(Σw)_i − ν − λμ_i},
 * and the certificate comes from {@link Kkt#certify}.
 */
final class MandateSweep {

    /** Note on every critical-line solution. */
    static final String CONVEX_NOTE = "The covariance matrix is positive definite, so the problem is strictly convex: "
            + "the Karush-Kuhn-Tucker conditions are sufficient, and this minimum is global and unique.";

    private final AssetUniverse u;
    private final double[][] sigma;
    private final java.util.concurrent.CompletableFuture<Factored> factoring;
    private Factored factored;
    private final Mandate mandate;
    private final SolverSettings settings;
    private final CriticalLine.Problem problem;
    private final double[] mu;
    private final double[] negMu;
    private final boolean[] bookFixed;
    private final List<LinearConstraint> rows;
    /** {@link #rows} and the return-target row ({@code μ'w = limit}, the limit given per solution). */
    private final List<LinearConstraint> rowsWithTarget;
    /** The limits of {@link #rows}, then a slot for the return target. */
    private final double[] limits;
    /**
     * The multipliers' names, built once per sweep and shared by every solution's {@link CompactMultipliers}:
     * budget, the fixed weights, the return target (in the second table only), then each asset's finite lower
     * and upper bound.
     */
    private final CompactMultipliers.Names names;
    private final CompactMultipliers.Names namesWithTarget;
    /** Position of asset i's lower (upper) bound multiplier among the bound entries, or -1 without that bound. */
    private final int[] lowerAt;
    private final int[] upperAt;
    /** The mandate's bounds, read once (not modified). */
    private final double[] lowerBounds;
    private final double[] upperBounds;
    private final int n;
    private List<CriticalLine.Point> efficient;
    private boolean efficientComplete;
    private List<CriticalLine.Point> inefficient;
    /** Whole walks shared by the copies of a sweep made once for many solves ({@link #forCall}); null otherwise. */
    private final Walks walks;

    /**
     * The two whole walks of one problem (efficient and inefficient branch), computed on first need and shared by
     * every copy of a sweep: a copy's partial walk is read from them ({@link CriticalLine#prefix}), the same points
     * to the last bit, since the walk does not depend on where it stops. A whole walk that fails (an iteration limit,
     * a singular free block) is not kept: copies then walk themselves, and fail or stop exactly as before.
     */
    private static final class Walks {
        private final Object[] whole = new Object[2];

        synchronized List<CriticalLine.Point> whole(int branch, java.util.function.Supplier<List<CriticalLine.Point>> walk) {
            if (whole[branch] == null) {
                try {
                    whole[branch] = walk.get();
                } catch (RuntimeException e) {
                    whole[branch] = Boolean.FALSE;
                }
            }
            @SuppressWarnings("unchecked")
            List<CriticalLine.Point> w = whole[branch] instanceof List<?> l ? (List<CriticalLine.Point>) l : null;
            return w;
        }
    }

    private MandateSweep(AssetUniverse u, double[][] sigma, java.util.concurrent.CompletableFuture<Factored> factoring,
                         Mandate mandate, SolverSettings settings, CriticalLine.Problem problem, boolean[] bookFixed) {
        this.walks = null;
        this.u = u;
        this.sigma = sigma;
        this.factoring = factoring;
        this.mandate = mandate;
        this.settings = settings;
        this.problem = problem;
        this.n = u.size();
        this.mu = u.expectedReturns();
        this.negMu = new double[n];
        for (int i = 0; i < n; i++) {
            negMu[i] = -mu[i];
        }
        this.bookFixed = bookFixed;
        this.rows = List.copyOf(mandate.rows(u.assets()));
        List<LinearConstraint> withTarget = new ArrayList<>(rows);
        withTarget.add(new LinearConstraint("target_return", mu, Relation.EQUAL, 0));
        this.rowsWithTarget = List.copyOf(withTarget);
        this.limits = new double[rows.size() + 1];
        for (int k = 0; k < rows.size(); k++) {
            limits[k] = rows.get(k).limit();
        }
        List<String> head = new ArrayList<>();
        head.add("budget");
        for (Integer i : mandate.fixed().keySet()) {
            head.add("fixed:" + u.assets().get(i));
        }
        List<String> bounds = new ArrayList<>();
        this.lowerAt = new int[n];
        this.upperAt = new int[n];
        this.lowerBounds = mandate.lower();
        this.upperBounds = mandate.upper();
        double[] lower = lowerBounds;
        double[] upper = upperBounds;
        for (int i = 0; i < n; i++) {
            String a = u.assets().get(i);
            lowerAt[i] = Double.isFinite(lower[i]) ? bounds.size() : -1;
            if (lowerAt[i] >= 0) {
                bounds.add("lower:" + a);
            }
            upperAt[i] = Double.isFinite(upper[i]) ? bounds.size() : -1;
            if (upperAt[i] >= 0) {
                bounds.add("upper:" + a);
            }
        }
        List<String> all = new ArrayList<>(head);
        all.addAll(bounds);
        this.names = new CompactMultipliers.Names(all);
        all = new ArrayList<>(head);
        all.add("target_return");
        all.addAll(bounds);
        this.namesWithTarget = new CompactMultipliers.Names(all);
    }

    /** A copy for one solve: everything derived from the universe and mandate shared, the walks' state fresh. */
    private MandateSweep(MandateSweep t, Walks walks, Factored prepared) {
        this.walks = walks;
        this.u = t.u;
        this.sigma = t.sigma;
        this.factoring = java.util.concurrent.CompletableFuture.completedFuture(prepared);
        this.mandate = t.mandate;
        this.settings = t.settings;
        this.problem = t.problem;
        this.n = t.n;
        this.mu = t.mu;
        this.negMu = t.negMu;
        this.bookFixed = t.bookFixed;
        this.rows = t.rows;
        this.rowsWithTarget = t.rowsWithTarget;
        this.limits = t.limits;
        this.lowerAt = t.lowerAt;
        this.upperAt = t.upperAt;
        this.lowerBounds = t.lowerBounds;
        this.upperBounds = t.upperBounds;
        this.names = t.names;
        this.namesWithTarget = t.namesWithTarget;
    }

    /**
     * A sweep to keep for many solves on the same universe and mandate (a book whose portfolios share a policy):
     * {@link #forCall} copies of it give, for every target, the solution a fresh {@link #of} sweep gives, to the
     * last bit, with the mandate's checks, names and walks made once. Only the copies are used; thread-safe.
     */
    MandateSweep shared() {
        return new MandateSweep(this, new Walks(), null);
    }

    /** A copy of a {@link #shared()} sweep for one solve, proving convexity with {@code prepared}. */
    MandateSweep forCall(Factored prepared) {
        return new MandateSweep(this, walks, prepared);
    }

    /** Why the critical line method cannot take a mandate, or null when it can. */
    static String unsupported(Mandate m) {
        if (!m.groups().isEmpty()) {
            return "the mandate has group limits";
        }
        if (!m.constraints().isEmpty()) {
            return "the mandate has general linear constraints";
        }
        return null;
    }

    /**
     * True when the critical line method applies: no groups or general constraints, and every asset bounded on
     * both sides directly or through the other bounds and the budget.
     */
    static boolean applies(Mandate m) {
        if (unsupported(m) != null) {
            return false;
        }
        int n = m.size();
        boolean[] frozen = new boolean[n];
        double[] fv = new double[n];
        for (Map.Entry<Integer, Double> e : m.fixed().entrySet()) {
            frozen[e.getKey()] = true;
            fv[e.getKey()] = e.getValue();
        }
        return CriticalLine.effective(null, m.budget(), m.lower(), m.upper(), new boolean[n], new boolean[n], frozen,
                fv) != null;
    }

    /**
     * Prepares the sweep, diagnosing bounds that admit no portfolio.
     *
     * @throws InputException      when the mandate has groups, general constraints, or an asset unbounded on a
     *                             side that no other bound limits
     * @throws NoSolutionException (INFEASIBLE) when fixed weights lie outside their bounds, or the bounds cannot
     *                             meet the budget
     */
    static MandateSweep of(AssetUniverse universe, Mandate m, SolverSettings s) {
        return of(universe, m, s, null);
    }

    /**
     * As {@link #of(AssetUniverse, Mandate, SolverSettings)}, with the proof of positive definiteness taken from
     * a factorisation made once for many solves.
     *
     * @param prepared the universe factored ({@link Factored#fresh()}), or null to factor it here
     */
    static MandateSweep of(AssetUniverse universe, Mandate m, SolverSettings s, Factored prepared) {
        String why = unsupported(m);
        if (why != null) {
            throw InputException.of("the critical line method takes only the budget, per-asset bounds and fixed "
                    + "weights, but " + why).fix("drop --method critical-line (auto picks the numerical method)").build();
        }
        AssetUniverse u = universe;
        int n = u.size();
        List<String> names = u.assets();
        boolean[] frozen = new boolean[n];
        boolean[] bookFixed = new boolean[n];
        double[] fv = new double[n];
        for (Map.Entry<Integer, Double> e : m.fixed().entrySet()) {
            int i = e.getKey();
            double v = e.getValue();
            if (v < m.lower(i) || v > m.upper(i)) {
                boolean low = v < m.lower(i);
                throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                        "the fixed weight of %s, %s, is %s its %s bound %s; fix: move the fixed weight inside "
                                + "the bounds or change the bound", names.get(i), Explain.percent(v),
                        low ? "below" : "above", low ? "lower" : "upper",
                        Explain.percent(low ? m.lower(i) : m.upper(i))),
                        List.of("fixed:" + names.get(i), (low ? "lower:" : "upper:") + names.get(i)));
            }
            frozen[i] = true;
            bookFixed[i] = true;
            fv[i] = v;
        }
        int live = 0;
        for (int i = 0; i < n; i++) {
            if (!frozen[i] && m.lower(i) == m.upper(i)) {
                frozen[i] = true;
                fv[i] = m.lower(i);
            }
            live += frozen[i] ? 0 : 1;
        }
        checkSums(u, m, frozen, fv);
        if (live == 0) {
            throw new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION,
                    "every asset has a fixed weight, so the budget and the fixed weights repeat each other and no "
                            + "multiplier is unique; fix: leave at least one asset free to move", List.of("budget"));
        }
        double[][] sigma = u.covariance();
        // The walk reads row j of Σ as its column j; a matrix read from a file may differ from its transpose in
        // the last digits, so use the symmetric part (unchanged when Σ is already symmetric).
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < i; j++) {
                if (sigma[i][j] != sigma[j][i]) {
                    double v = 0.5 * (sigma[i][j] + sigma[j][i]);
                    sigma[i][j] = v;
                    sigma[j][i] = v;
                }
            }
        }
        CriticalLine.Problem p = CriticalLine.effective(sigma, m.budget(), m.lower(), m.upper(), new boolean[n],
                new boolean[n], frozen, fv);
        if (p == null) {
            int bad = -1;
            for (int i = 0; i < n && bad < 0; i++) {
                if (!frozen[i] && (Double.isInfinite(m.lower(i)) || Double.isInfinite(m.upper(i)))) {
                    bad = i;
                }
            }
            throw InputException.of("the critical line method needs every asset bounded on both sides (directly or "
                            + "through the other assets' bounds and the budget), but this asset has no "
                            + (Double.isInfinite(m.lower(bad)) ? "lower" : "upper") + " bound").asset(names.get(bad))
                    .fix("give every asset a min and a max (e.g. a default of min 0 and max 1), or use the numerical "
                            + "method").build();
        }
        // Positive definiteness (one Cholesky factorisation) is checked on another thread while the walk runs;
        // the walk itself only ever factors the free block.
        java.util.concurrent.CompletableFuture<Factored> factoring = prepared != null
                ? java.util.concurrent.CompletableFuture.completedFuture(prepared)
                : s.threads() > 1 ? java.util.concurrent.CompletableFuture.supplyAsync(() -> Factored.of(u, s))
                : java.util.concurrent.CompletableFuture.completedFuture(null);
        return new MandateSweep(u, sigma, factoring, m, s, p, bookFixed);
    }

    /** The universe with Σ factored; throws NOT_CONVEX when Σ is not positive definite. */
    Factored factored() {
        if (factored == null) {
            try {
                Factored done = factoring.join();
                factored = done != null ? done : Factored.of(u, settings);
            } catch (java.util.concurrent.CompletionException e) {
                if (e.getCause() instanceof RuntimeException re) {
                    throw re;
                }
                throw e;
            }
        }
        return factored;
    }

    /** Merton's scalars of the budget-only frontier, for comparison. */
    MertonScalars merton() {
        return ClosedForm.merton(factored(), mandate.budget());
    }

    private static void checkSums(AssetUniverse u, Mandate m, boolean[] frozen, double[] fv) {
        int n = u.size();
        double sumLo = 0;
        double sumHi = 0;
        for (int i = 0; i < n; i++) {
            sumLo += frozen[i] ? fv[i] : m.lower(i);
            sumHi += frozen[i] ? fv[i] : m.upper(i);
        }
        double b = m.budget();
        double tol = 1e-12 * Math.max(1, Math.abs(b));
        boolean anyFixed = !m.fixed().isEmpty();
        if (sumLo > b + tol) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "the lower bounds%s sum to %s, above the budget %s (%s); fix: lower the minimums by at least %s "
                            + "in total, or raise the budget", anyFixed ? " and fixed weights" : "",
                    Explain.percent(sumLo), Explain.percent(b), list(u, m, frozen, fv, true), Explain.percent(sumLo - b)),
                    names(u, m, frozen, true));
        }
        if (sumHi < b - tol) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "the upper bounds%s sum to %s, below the budget %s (%s); fix: raise the maximums by at least %s "
                            + "in total, or lower the budget", anyFixed ? " and fixed weights" : "",
                    Explain.percent(sumHi), Explain.percent(b), list(u, m, frozen, fv, false), Explain.percent(b - sumHi)),
                    names(u, m, frozen, false));
        }
    }

    private static String list(AssetUniverse u, Mandate m, boolean[] frozen, double[] fv, boolean lower) {
        List<String> parts = new ArrayList<>();
        for (int i = 0; i < u.size(); i++) {
            double v = frozen[i] ? fv[i] : lower ? m.lower(i) : m.upper(i);
            if (lower && v == 0 && !frozen[i]) {
                continue;
            }
            String what = m.fixed().containsKey(i) ? "fixed" : lower ? "min" : "max";
            parts.add(u.assets().get(i) + " " + what + " " + Explain.percent(v));
        }
        return parts.isEmpty() ? "every bound zero" : String.join(", ", parts);
    }

    private static List<String> names(AssetUniverse u, Mandate m, boolean[] frozen, boolean lower) {
        List<String> out = new ArrayList<>();
        out.add("budget");
        for (int i = 0; i < u.size(); i++) {
            String a = u.assets().get(i);
            if (m.fixed().containsKey(i)) {
                out.add("fixed:" + a);
            } else if (lower && m.lower(i) != 0) {
                out.add("lower:" + a);
            } else if (!lower) {
                out.add("upper:" + a);
            }
        }
        return out;
    }

    // ------------------------------------------------------------------ walks

    private List<CriticalLine.Point> efficient(double stopAt) {
        if (efficient == null || (!efficientComplete && stopAt < lastReturn(efficient, mu))) {
            List<CriticalLine.Point> raw = walk(mu, stopAt);
            efficientComplete = raw.get(raw.size() - 1).lambda() == 0;
            efficient = merge(raw);
        }
        return efficient;
    }

    private List<CriticalLine.Point> efficient() {
        return efficient(Double.NEGATIVE_INFINITY);
    }

    private List<CriticalLine.Point> inefficient() {
        if (inefficient == null) {
            inefficient = merge(walk(negMu, Double.NEGATIVE_INFINITY));
        }
        return inefficient;
    }

    /**
     * Runs the walk; when it meets a singular free block, Σ's own check speaks first, since its message names a
     * perfectly correlated pair when there is one.
     */
    private List<CriticalLine.Point> walk(double[] dir, double stopAt) {
        if (walks != null) {
            List<CriticalLine.Point> whole = walks.whole(dir == mu ? 0 : 1, () -> CriticalLine.walk(problem, dir,
                    Double.NEGATIVE_INFINITY, settings.maxIterations(), settings.threads()));
            if (whole != null) {
                return CriticalLine.prefix(whole, dir, stopAt);
            }
        }
        try {
            return CriticalLine.walk(problem, dir, stopAt, settings.maxIterations(), settings.threads());
        } catch (NoSolutionException e) {
            if (e.reason() == NoSolutionException.Reason.NOT_CONVEX) {
                factored();
            }
            throw e;
        }
    }

    private double lastReturn(List<CriticalLine.Point> pts, double[] dir) {
        return Dense.dotInOrder(dir, pts.get(pts.size() - 1).weights());
    }

    /**
     * Merges consecutive walk points that are the same corner: the λ = ∞ start with the first event (the walk
     * starts on a stretch where nothing moves), and several events at one λ. Points with the same weights but
     * different λ stay apart: between them the frontier has a kink, the return-target multiplier is not unique,
     * and each neighbouring stretch needs its own end value.
     */
    private List<CriticalLine.Point> merge(List<CriticalLine.Point> raw) {
        List<CriticalLine.Point> out = new ArrayList<>();
        double tol = 1e-12 * Math.max(1, Math.abs(mandate.budget()));
        for (CriticalLine.Point p : raw) {
            if (!out.isEmpty()) {
                CriticalLine.Point last = out.get(out.size() - 1);
                boolean sameLambda = Double.isInfinite(last.lambda())
                        || Math.abs(last.lambda() - p.lambda()) <= 1e-12 * Math.max(1, Math.abs(p.lambda()));
                if (sameLambda && (Double.isInfinite(last.lambda()) || maxDiff(last.weights(), p.weights()) <= tol)) {
                    List<CriticalLine.Event> ev = new ArrayList<>(last.events());
                    ev.addAll(p.events());
                    out.set(out.size() - 1, new CriticalLine.Point(p.lambda(), p.weights(), p.budgetPrice(), p.state(),
                            ev, p.condition()));
                    continue;
                }
            }
            out.add(p);
        }
        return out;
    }

    private static double maxDiff(double[] a, double[] b) {
        double d = 0;
        for (int i = 0; i < a.length; i++) {
            d = Math.max(d, Math.abs(a[i] - b[i]));
        }
        return d;
    }

    // ------------------------------------------------------------------ public operations

    /** Expected return of the minimum-variance portfolio under the mandate. */
    double minimumVarianceReturn() {
        List<CriticalLine.Point> e = efficient();
        return Dense.dotInOrder(mu, e.get(e.size() - 1).weights());
    }

    /** The minimum-variance portfolio under the mandate (the λ = 0 end), without a return-target row. */
    Solution minimumVariance() {
        List<CriticalLine.Point> e = efficient();
        CriticalLine.Point end = e.get(e.size() - 1);
        List<String> notes = new ArrayList<>();
        notes.add("Minimum-variance portfolio under the bounds, by the critical line method (the end of its walk, "
                + "where the return-target shadow price reaches zero).");
        return solution(end.weights(), 0, end.budgetPrice(), end.state(), mu, null, notes, end.condition());
    }

    /** The minimum-variance portfolio with expected return exactly {@code target} (decimal). */
    Solution target(double target) {
        double tol = 1e-12 * Math.max(1, Math.abs(target));
        List<CriticalLine.Point> top = efficient(target - tol);
        double mMax = Dense.dotInOrder(mu, top.get(0).weights());
        if (target > mMax + tol) {
            throw aboveMaximum(target, top.get(0));
        }
        double mLast = lastReturn(top, mu);
        if (target >= mLast - tol || !efficientComplete) {
            return onBranch(top, target, mu, 1, false);
        }
        List<CriticalLine.Point> low = lowEnd();
        double mMin = Dense.dotInOrder(mu, low.get(0).weights());
        if (target < mMin - tol) {
            throw belowMinimum(target, low.get(0));
        }
        return onBranch(inefficient(), -target, negMu, -1, true);
    }

    private List<CriticalLine.Point> lowEnd() {
        if (inefficient != null) {
            return inefficient;
        }
        return merge(walk(negMu, Double.POSITIVE_INFINITY));
    }

    /**
     * Solves on one branch. Points are in walk order, {@code dir'w} decreasing; {@code t} is the target in the
     * walk's units ({@code dir'w = t}); {@code sign} turns λ into the return-target multiplier.
     */
    private Solution onBranch(List<CriticalLine.Point> pts, double t, double[] dir, double sign, boolean ineff) {
        int k = pts.size();
        double[] rets = new double[k];
        for (int j = 0; j < k; j++) {
            rets[j] = Dense.dotInOrder(dir, pts.get(j).weights());
        }
        List<String> notes = new ArrayList<>();
        double tol = 1e-12 * Math.max(1, Math.abs(t));
        if (t >= rets[0] - tol) {
            // The end of the range; when several walk points share it (a kink), the smallest λ is reported.
            int last = 0;
            while (last + 1 < k && rets[last + 1] >= rets[0] - tol) {
                last++;
            }
            CriticalLine.Point p = pts.get(last);
            notes.add(String.format(Locale.ROOT, "The target is the %s return the mandate allows; the return-target "
                    + "shadow price shown is the one-sided derivative from inside the frontier (any %s value also "
                    + "satisfies the optimality conditions).", ineff ? "lowest" : "highest", ineff ? "smaller" : "larger"));
            if (ineff) {
                notes.add(inefficientNote());
            }
            return solution(p.weights(), p.lambda(), p.budgetPrice(), p.state(), dir, sign * t, notes, sign,
                    p.condition());
        }
        int j = 0;
        while (j + 1 < k - 1 && rets[j + 1] >= t) {
            j++;
        }
        CriticalLine.Point a = pts.get(j);
        CriticalLine.Point b = pts.get(j + 1);
        double span = rets[j] - rets[j + 1];
        double s = span > 0 ? (rets[j] - t) / span : 1;
        s = Math.max(0, Math.min(1, s));
        double[] x = new double[n];
        double[] wa = a.weights();
        double[] wb = b.weights();
        for (int i = 0; i < n; i++) {
            x[i] = (1 - s) * wa[i] + s * wb[i];
        }
        // Assets out at a bound stay exactly there along the stretch.
        byte[] st = a.state();
        for (int i = 0; i < n; i++) {
            if (st[i] == CriticalLine.LOWER) {
                x[i] = problem.lo[i];
            } else if (st[i] == CriticalLine.UPPER) {
                x[i] = problem.hi[i];
            } else if (st[i] == CriticalLine.FROZEN) {
                x[i] = problem.frozenValue[i];
            }
        }
        double lambda = (1 - s) * a.lambda() + s * b.lambda();
        double nu = (1 - s) * a.budgetPrice() + s * b.budgetPrice();
        double sign1 = sign;
        notes.add(String.format(Locale.ROOT, "Exact: interpolated between the corner portfolios at returns %s and %s "
                        + "(weights are affine in the target between corners).",
                Explain.percent(sign1 * rets[j + 1]), Explain.percent(sign1 * rets[j])));
        if (ineff) {
            notes.add(inefficientNote());
        }
        return solution(x, lambda, nu, st, dir, sign * t, notes, sign, a.condition());
    }

    private String inefficientNote() {
        return String.format(Locale.ROOT, "This portfolio is on the inefficient branch of the frontier: its return is "
                + "below that of the minimum-variance portfolio (%s), so another portfolio with the same volatility "
                + "earns more; the return-target shadow price is negative (raising the target lowers risk).",
                Explain.percent(minimumVarianceReturn()));
    }

    private NoSolutionException aboveMaximum(double target, CriticalLine.Point end) {
        double mMax = Dense.dotInOrder(mu, end.weights());
        double mMin = Dense.dotInOrder(mu, lowEnd().get(0).weights());
        return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                "target return %s is above the highest return the mandate allows, %s (%s); achievable returns run "
                        + "from %s to %s; fix: choose a target of at most %s or loosen the upper bounds",
                Explain.percent(target), Explain.percent(mMax), describe(end), Explain.percent(mMin),
                Explain.percent(mMax), Explain.percent(mMax)), endNames(end, true), new double[] {mMin, mMax},
                byName(end.weights()));
    }

    private NoSolutionException belowMinimum(double target, CriticalLine.Point end) {
        double mMin = Dense.dotInOrder(mu, end.weights());
        double mMax = Dense.dotInOrder(mu, efficient().get(0).weights());
        return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                "target return %s is below the lowest return the mandate allows, %s (%s); achievable returns run "
                        + "from %s to %s; fix: choose a target of at least %s or loosen the bounds",
                Explain.percent(target), Explain.percent(mMin), describe(end), Explain.percent(mMin),
                Explain.percent(mMax), Explain.percent(mMin)), endNames(end, false), new double[] {mMin, mMax},
                byName(end.weights()));
    }

    /** Weights by asset name, in universe order (the end portfolio an infeasible target reports). */
    private Map<String, Double> byName(double[] w) {
        Map<String, Double> out = new java.util.LinkedHashMap<>();
        for (int i = 0; i < n; i++) {
            out.put(u.assets().get(i), w[i]);
        }
        return out;
    }

    /**
     * The end portfolio in words: assets above their lower bound by decreasing weight (at most eight named),
     * then the rest.
     */
    private String describe(CriticalLine.Point end) {
        double[] x = end.weights();
        double tol = 1e-12 * Math.max(1, Math.abs(mandate.budget()));
        List<Integer> shown = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            if (problem.frozen[i] || Math.abs(x[i] - problem.lo[i]) > tol || problem.loImplied[i]) {
                shown.add(i);
            }
        }
        int rest = n - shown.size();
        // Rounded so that weights equal up to the last digits list in asset order.
        shown.sort(Comparator.<Integer>comparingDouble(i -> -Math.rint(x[i] * 1e10)).thenComparingInt(i -> i));
        List<String> parts = new ArrayList<>();
        int limit = 8;
        for (int q = 0; q < Math.min(limit, shown.size()); q++) {
            int i = shown.get(q);
            String a = u.assets().get(i);
            if (problem.frozen[i]) {
                parts.add(a + " fixed at " + Explain.percent(x[i]));
            } else if (Math.abs(x[i] - problem.hi[i]) <= tol && !problem.hiImplied[i]) {
                parts.add(a + " at its upper bound " + Explain.percent(x[i]));
            } else {
                parts.add(a + " " + Explain.percent(x[i]));
            }
        }
        if (shown.size() > limit) {
            parts.add((shown.size() - limit) + " more above their lower bounds");
        }
        if (rest > 0) {
            parts.add(shown.isEmpty() ? "every asset at its lower bound" : "every other asset at its lower bound");
        }
        return String.join(", ", parts);
    }

    private List<String> endNames(CriticalLine.Point end, boolean top) {
        List<String> out = new ArrayList<>();
        out.add("target_return");
        for (int i = 0; i < n; i++) {
            byte s = end.state()[i];
            if (s == CriticalLine.UPPER && !problem.hiImplied[i]) {
                out.add("upper:" + u.assets().get(i));
            } else if (s == CriticalLine.LOWER && !problem.loImplied[i]) {
                out.add("lower:" + u.assets().get(i));
            }
        }
        return out;
    }

    // ------------------------------------------------------------------ solutions

    private Solution solution(double[] x, double lambda, double nu, byte[] st, double[] dir, Double target,
                              List<String> notes, double condition) {
        return solution(x, lambda, nu, st, dir, target, notes, 1, condition);
    }

    /**
     * A certified solution at weights {@code x} on a stretch with asset states {@code st}: λ is the walk's
     * parameter (the return-target multiplier is {@code sign·λ}), ν the budget multiplier; bound and fixed
     * multipliers are recovered from the KKT rows of the assets out of the free set.
     *
     * @param target    the return target, or null for the minimum-variance objective (no target row)
     * @param condition condition estimate of the free block Σ_FF on the stretch (the reduced system solved)
     */
    private Solution solution(double[] x, double lambda, double nu, byte[] st, double[] dir, Double target,
                              List<String> notes, double sign, double condition) {
        return solution(x, lambda, nu, st, dir, target, notes, sign, condition, sparseProduct(sigma, x));
    }

    /** As above, with {@code sx = Σx} already computed afresh from x (for corners, in blocks). */
    private Solution solution(double[] x, double lambda, double nu, byte[] st, double[] dir, Double target,
                              List<String> notes, double sign, double condition, double[] sx) {
        factored();
        double var = 0;
        double ret = 0;
        for (int i = 0; i < n; i++) {
            var += x[i] * sx[i];
            ret += mu[i] * x[i];
        }
        double vol = Math.sqrt(Math.max(0, var));
        double[] gamma = new double[n];
        for (int i = 0; i < n; i++) {
            if (st[i] != CriticalLine.FREE) {
                gamma[i] = 2 * sx[i] - nu - lambda * dir[i];
            }
        }
        double tau = sign * lambda;
        boolean withTarget = target != null;
        CompactMultipliers.Names table = withTarget ? namesWithTarget : names;
        double[] prices = new double[table.size()];
        boolean[] binding = new boolean[table.size()];
        double[] rowPrices = new double[rows.size() + (withTarget ? 1 : 0)];
        double[] rowLimits = limits.clone();
        rowPrices[0] = nu;
        prices[0] = nu;
        binding[0] = true;
        int k = 1;
        for (Integer i : mandate.fixed().keySet()) {
            rowPrices[k] = gamma[i];
            prices[k] = gamma[i];
            binding[k] = true;
            k++;
        }
        if (withTarget) {
            rowLimits[k] = target;
            rowPrices[k] = tau;
            prices[k] = tau;
            binding[k] = true;
            k++;
        }
        int at = k;
        double[] lower = lowerBounds;
        double[] upper = upperBounds;
        double[] lp = new double[n];
        double[] up = new double[n];
        double atTol = 1e-12 * Math.max(1, Math.abs(mandate.budget()));
        for (int i = 0; i < n; i++) {
            boolean out = st[i] != CriticalLine.FREE && !bookFixed[i];
            if (out) {
                boolean lowSide = st[i] == CriticalLine.LOWER
                        || (st[i] == CriticalLine.FROZEN && gamma[i] >= 0);
                if (lowSide) {
                    lp[i] = gamma[i];
                } else {
                    up[i] = gamma[i];
                }
            }
            if (lowerAt[i] >= 0) {
                prices[at + lowerAt[i]] = lp[i];
                binding[at + lowerAt[i]] = Math.abs(x[i] - lower[i]) <= atTol;
            }
            if (upperAt[i] >= 0) {
                prices[at + upperAt[i]] = up[i];
                binding[at + upperAt[i]] = Math.abs(x[i] - upper[i]) <= atTol;
            }
        }
        Certificate cert = Kkt.certifyProduct(sx, x, withTarget ? rowsWithTarget : rows, rowLimits, rowPrices, lower,
                upper, lp, up, condition, settings.numericalTolerance(), true);
        List<String> all = new ArrayList<>(notes.size() + 1);
        all.addAll(notes);
        all.add(CONVEX_NOTE);
        return new Solution(Method.CRITICAL_LINE, u.assets(), x, ret, var, vol,
                new CompactMultipliers(table, prices, binding, vol), cert, all);
    }

    /**
     * Σx, computed afresh from x: as a sum of the rows of Σ for the non-zero entries of x when they are few
     * (long-only portfolios often hold few assets; Σ is symmetric, so row j is column j), else by the dense
     * vectorised product.
     */
    private static double[] sparseProduct(double[][] sigma, double[] x) {
        int n = x.length;
        int nnz = 0;
        for (double v : x) {
            nnz += v != 0 ? 1 : 0;
        }
        if (nnz > n / 4) {
            return org.isorisk.engine.linalg.Dense.multiplySymmetric(sigma, x, 1);
        }
        double[] y = new double[n];
        for (int j = 0; j < n; j++) {
            double xj = x[j];
            if (xj == 0) {
                continue;
            }
            double[] row = sigma[j];
            for (int i = 0; i < n; i++) {
                y[i] += row[i] * xj;
            }
        }
        return y;
    }

    // ------------------------------------------------------------------ corners and frontier

    /** The efficient corners, from the minimum-variance end to the maximum-return end. */
    List<Corner> efficientCorners() {
        List<CriticalLine.Point> pts = efficient();
        int k = pts.size();
        Corner[] out = new Corner[k];
        factored();
        double[][] sx = products(pts);
        forEach(k, j -> out[k - 1 - j] = corner(pts.get(j), j == 0, j == k - 1, mu, 1, false, sx[j]));
        return List.of(out);
    }

    /**
     * Runs {@code body} for 0..k-1, split over {@link SolverSettings#threads()} threads (corners are independent:
     * each one's solution, multipliers and certificate depend only on its walk point).
     */
    private void forEach(int k, java.util.function.IntConsumer body) {
        int threads = Math.min(settings.threads(), Math.max(1, k / 8));
        if (threads <= 1) {
            for (int j = 0; j < k; j++) {
                body.accept(j);
            }
            return;
        }
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(threads - 1, r -> {
            Thread t = new Thread(r, "isorisk-corners");
            t.setDaemon(true);
            return t;
        });
        try {
            java.util.concurrent.atomic.AtomicInteger next = new java.util.concurrent.atomic.AtomicInteger();
            Runnable work = () -> {
                for (int j = next.getAndIncrement(); j < k; j = next.getAndIncrement()) {
                    body.accept(j);
                }
            };
            List<java.util.concurrent.Future<?>> done = new ArrayList<>();
            for (int t = 1; t < threads; t++) {
                done.add(pool.submit(work));
            }
            work.run();
            for (java.util.concurrent.Future<?> f : done) {
                f.get();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while assembling corner portfolios", e);
        } catch (java.util.concurrent.ExecutionException e) {
            if (e.getCause() instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(e.getCause());
        } finally {
            pool.shutdownNow();
        }
    }

    /** The inefficient corners, from the minimum-return end up to (and including) the minimum-variance end. */
    List<Corner> inefficientCorners() {
        List<CriticalLine.Point> pts = inefficient();
        int k = pts.size();
        Corner[] out = new Corner[k];
        factored();
        double[][] sx = products(pts);
        forEach(k, j -> out[j] = corner(pts.get(j), j == 0, j == k - 1, negMu, -1, true, sx[j]));
        return List.of(out);
    }

    /** Corners whose Σw are computed together: each row of Σ is read once per block instead of once per corner. */
    private static final int PRODUCT_BLOCK = 32;

    /**
     * Entries of the block's Σw computed together: {@code PRODUCT_BLOCK · PRODUCT_TILE} doubles (128 kB) stay in
     * the processor's second-level cache while the rows of Σ stream past.
     */
    private static final int PRODUCT_TILE = 512;

    /**
     * {@code Σw} of every point, computed afresh from its weights, {@link #PRODUCT_BLOCK} points at a time: for
     * each row q of Σ (its column q, Σ being symmetric) the block's {@code y += w_q·row_q}, so a frontier with
     * thousands of corners streams Σ a few dozen times, not thousands; the entries are done
     * {@link #PRODUCT_TILE} at a time so that the block's partial sums stay in cache. Each entry
     * {@code y_i = Σ_q σ_qi w_q} is summed in increasing q, the same order as a plain product row by row.
     */
    private double[][] products(List<CriticalLine.Point> pts) {
        int k = pts.size();
        double[][] out = new double[k][];
        int blocks = (k + PRODUCT_BLOCK - 1) / PRODUCT_BLOCK;
        forEach(blocks, b -> {
            int j0 = b * PRODUCT_BLOCK;
            int j1 = Math.min(k, j0 + PRODUCT_BLOCK);
            int m = j1 - j0;
            double[][] ws = new double[m][];
            double[][] ys = new double[m][n];
            for (int j = 0; j < m; j++) {
                ws[j] = pts.get(j0 + j).weights();
            }
            for (int i0 = 0; i0 < n; i0 += PRODUCT_TILE) {
                int i1 = Math.min(n, i0 + PRODUCT_TILE);
                int q = 0;
                // Four rows at a time: one load and store of y per four products. The sum keeps its order,
                // ((y + r0·w0) + r1·w1) + ..., so the result is the same to the last bit.
                for (; q + 3 < n; q += 4) {
                    double[] r0 = sigma[q];
                    double[] r1 = sigma[q + 1];
                    double[] r2 = sigma[q + 2];
                    double[] r3 = sigma[q + 3];
                    for (int j = 0; j < m; j++) {
                        double[] wj = ws[j];
                        double w0 = wj[q];
                        double w1 = wj[q + 1];
                        double w2 = wj[q + 2];
                        double w3 = wj[q + 3];
                        double[] y = ys[j];
                        if (w0 != 0 && w1 != 0 && w2 != 0 && w3 != 0) {
                            for (int i = i0; i < i1; i++) {
                                y[i] = y[i] + r0[i] * w0 + r1[i] * w1 + r2[i] * w2 + r3[i] * w3;
                            }
                            continue;
                        }
                        axpy(y, r0, w0, i0, i1);
                        axpy(y, r1, w1, i0, i1);
                        axpy(y, r2, w2, i0, i1);
                        axpy(y, r3, w3, i0, i1);
                    }
                }
                for (; q < n; q++) {
                    double[] row = sigma[q];
                    for (int j = 0; j < m; j++) {
                        double wq = ws[j][q];
                        if (wq == 0) {
                            continue;
                        }
                        double[] y = ys[j];
                        for (int i = i0; i < i1; i++) {
                            y[i] += row[i] * wq;
                        }
                    }
                }
            }
            for (int j = 0; j < m; j++) {
                out[j0 + j] = ys[j];
            }
        });
        return out;
    }

    /** {@code y[i] += row[i]·a} for i in [i0, i1); nothing when a is zero (a held asset only). */
    private static void axpy(double[] y, double[] row, double a, int i0, int i1) {
        if (a == 0) {
            return;
        }
        for (int i = i0; i < i1; i++) {
            y[i] += row[i] * a;
        }
    }

    private Corner corner(CriticalLine.Point p, boolean first, boolean last, double[] dir, double sign, boolean ineff,
                          double[] sx) {
        double ret = Dense.dotInOrder(mu, p.weights());
        List<String> notes = new ArrayList<>();
        notes.add("Corner portfolio of the mandate frontier (critical line method).");
        Solution s = solution(p.weights(), p.lambda(), p.budgetPrice(), p.state(), dir, ret, notes, sign, p.condition(),
                sx);
        List<String> sentences = new ArrayList<>();
        String change;
        if (first) {
            change = ineff ? "min-return" : "max-return";
            sentences.add(String.format(Locale.ROOT, "%s return the mandate allows, %s: %s.",
                    ineff ? "Lowest" : "Highest", Explain.percent(ret), describe(p)));
        } else if (last && p.events().isEmpty()) {
            change = "min-variance";
        } else {
            change = p.events().size() == 1 ? verb(p.events().get(0).kind()) : "several";
        }
        for (CriticalLine.Event e : p.events()) {
            sentences.add(sentence(e, ret, ineff));
        }
        if (last) {
            change = first ? change : "min-variance";
            sentences.add(String.format(Locale.ROOT, "Minimum-variance portfolio under the bounds (return %s): the "
                    + "return target no longer binds, its shadow price is zero.", Explain.percent(ret)));
        }
        List<String> assetNames = new ArrayList<>();
        for (CriticalLine.Event e : p.events()) {
            assetNames.add(u.assets().get(e.asset()));
        }
        List<String> free = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            if (p.state()[i] == CriticalLine.FREE) {
                free.add(u.assets().get(i));
            }
        }
        return new Corner(s, assetNames.isEmpty() ? null : String.join(", ", assetNames), change,
                String.join(" ", sentences), free);
    }

    private static String verb(CriticalLine.Kind k) {
        return k == CriticalLine.Kind.ENTERS_FROM_LOWER || k == CriticalLine.Kind.ENTERS_FROM_UPPER ? "enters" : "leaves";
    }

    private String sentence(CriticalLine.Event e, double ret, boolean ineff) {
        String a = u.assets().get(e.asset());
        String where = (ineff ? "As the target rises above " : "As the target falls below ") + Explain.percent(ret);
        return switch (e.kind()) {
            case LEAVES_AT_LOWER -> String.format(Locale.ROOT, "%s, %s leaves the free set at its lower bound %s: its "
                    + "weight has shrunk to the bound.", where, a, Explain.percent(problem.lo[e.asset()]));
            case LEAVES_AT_UPPER -> String.format(Locale.ROOT, "%s, %s leaves the free set at its upper bound %s: its "
                    + "weight has grown to the bound.", where, a, Explain.percent(problem.hi[e.asset()]));
            case ENTERS_FROM_LOWER -> String.format(Locale.ROOT, "%s, %s enters the free set from its lower bound %s: "
                    + "the shadow price of that bound has reached zero, so holding more of it now lowers risk.",
                    where, a, Explain.percent(problem.lo[e.asset()]));
            case ENTERS_FROM_UPPER -> String.format(Locale.ROOT, "%s, %s enters the free set from its upper bound %s: "
                    + "the shadow price of that bound has reached zero, so holding less of it now lowers risk.",
                    where, a, Explain.percent(problem.hi[e.asset()]));
        };
    }

    /**
     * The mandate frontier (efficient corners, and the inefficient ones when asked) with exact points at the
     * targets chosen for its range {lowest, minimum-variance, highest return}; targets outside the achievable range are
     * reported in {@link Frontier#rejected()}, not dropped.
     */
    Frontier frontier(java.util.function.Function<double[], double[]> targetsForRange, boolean withInefficient) {
        List<Corner> eff = efficientCorners();
        List<Corner> ineff = withInefficient ? inefficientCorners() : List.of();
        double lowest = Dense.dotInOrder(mu, lowEnd().get(0).weights());
        double[] targets = targetsForRange.apply(new double[] {lowest, eff.get(0).portfolio().expectedReturn(),
            eff.get(eff.size() - 1).portfolio().expectedReturn()});
        List<Solution> points = new ArrayList<>();
        List<RejectedTarget> rejected = new ArrayList<>();
        double[] sorted = targets.clone();
        Arrays.sort(sorted);
        for (double t : sorted) {
            try {
                points.add(target(t));
            } catch (NoSolutionException e) {
                rejected.add(new RejectedTarget(t, e.getMessage()));
            }
        }
        double mv = eff.get(0).portfolio().expectedReturn();
        double top = eff.get(eff.size() - 1).portfolio().expectedReturn();
        return new Frontier(eff, points, merton(), mv, top, ineff, lowest, rejected);
    }
}
