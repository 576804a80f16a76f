package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Dense;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;

/**
 * A reusable numerical solver for one universe and one mandate: frontier sweeps and stress runs solve many
 * problems that share the mandate, so the session checks the mandate once, verifies once that Σ is positive
 * definite (the one {@code O(n³)} step), caches the achievable return range, and warm-starts each solve from a
 * previous solution's active set. Obtain one from {@link Allocator#session}. Not thread-safe.
 */
public final class SolverSession {
    /** Start of the note that says the multipliers are not unique (a degenerate solution). */
    public static final String NOT_UNIQUE = "Multipliers not unique:";

    private final AssetUniverse universe;
    private final Mandate mandate;
    private final SolverSettings settings;
    private final List<String> assets;
    private final double[][] sigma;
    private final int n;
    private final String[] lowerNames;
    private final String[] upperNames;
    private boolean mandateChecked;
    private boolean convexChecked;
    /** Cholesky factor of Σ from the convexity check, reused by solves that start with every asset free. */
    private Cholesky factor;
    private ReturnRange range;

    SolverSession(AssetUniverse universe, Mandate mandate, SolverSettings settings) {
        if (mandate.size() != universe.size()) {
            throw new IllegalArgumentException("mandate covers " + mandate.size() + " assets, universe has "
                    + universe.size());
        }
        this.universe = universe;
        this.mandate = mandate;
        this.settings = settings == null ? SolverSettings.defaults() : settings;
        this.assets = universe.assets();
        this.sigma = symmetric(universe.covariance());
        this.n = universe.size();
        this.lowerNames = new String[n];
        this.upperNames = new String[n];
        for (int i = 0; i < n; i++) {
            lowerNames[i] = "lower:" + assets.get(i);
            upperNames[i] = "upper:" + assets.get(i);
        }
    }

    public AssetUniverse universe() {
        return universe;
    }

    public Mandate mandate() {
        return mandate;
    }

    /** Solves from a cold start (a vertex of the feasible set found by the simplex method). */
    public Solution solve(Objective objective) {
        return solve(objective, null);
    }

    /**
     * Solves, warm-started from {@code warmStart} when given: its binding constraints become the first working
     * set, and its weights (or a blend of them with the end of the achievable return range, for a new return
     * target) the first feasible point.
     *
     * @param objective minimum variance, target return or tangency
     * @param warmStart a previous solution over the same assets, or null
     * @throws NoSolutionException INFEASIBLE with the constraints involved, NOT_CONVEX, or NOT_CONVERGED
     */
    public Solution solve(Objective objective, Solution warmStart) {
        if (objective instanceof Objective.Tangency t) {
            return tangency(t.riskFree(), warmStart);
        }
        checkMandate();
        Double target = objective instanceof Objective.TargetReturn t ? t.target() : null;
        if (target != null) {
            ReturnRange r = returnRange();
            if (!r.contains(target, 1e-12)) {
                throw Feasibility.targetOutside(target, r, assets);
            }
        }
        ensureConvex();
        QpProblem p = problem(target);
        ActiveSetQp.Result res = null;
        if (warmStart != null) {
            try {
                // first the previous solution's active set, continued from its own minimiser when feasible
                res = ActiveSetQp.solveFromMinimiser(p, previousActiveSet(p, warmStart), settings.maxIterations(),
                        settings.threads(), factor, 1);
                if (res == null) {
                    ActiveSetQp.Start start = warmStart(p, warmStart, target);
                    if (start != null) {
                        res = solveFrom(p, start);
                    }
                }
            } catch (NoSolutionException e) {
                if (e.reason() != NoSolutionException.Reason.CONSTRAINT_QUALIFICATION) {
                    throw e;
                }
                res = null;
            }
        }
        if (res == null) {
            res = coldSolve(p);
        }
        return toSolution(p, res, target, List.of());
    }

    /**
     * A solve without a previous solution: from the minimiser with every asset free (the closed form on the
     * equality rows), adding the bounds and rows it violates in blocks ({@link ActiveSetQp#solveFromMinimiser});
     * when that finds no feasible start, from a vertex of the feasible set.
     */
    private ActiveSetQp.Result coldSolve(QpProblem p) {
        ActiveSetQp.Result res = ActiveSetQp.solveFromMinimiser(p, allFree(p), settings.maxIterations(),
                settings.threads(), factor, GUESS_ROUNDS);
        return res != null ? res : solveFrom(p, coldStart(p));
    }

    /** Rounds of {@link ActiveSetQp#solveFromMinimiser} tried before the vertex start. */
    static final int GUESS_ROUNDS = 6;

    private ActiveSetQp.Result solveFrom(QpProblem p, ActiveSetQp.Start start) {
        return ActiveSetQp.solve(p, start, settings.maxIterations(), settings.threads(), factor);
    }

    /** Every variable free (those with equal bounds are fixed by the method), only the equality rows active. */
    private static ActiveSetQp.Start allFree(QpProblem p) {
        return new ActiveSetQp.Start(new double[p.n], new byte[p.n], new boolean[p.rows()]);
    }

    /**
     * The lowest and highest expected return the mandate allows, by two linear programs, with the portfolios at
     * the ends; cached.
     */
    public ReturnRange returnRange() {
        if (range != null) {
            return range;
        }
        checkMandate();
        QpProblem p = problem(null);
        double[] mu = universe.expectedReturns();
        double[] neg = new double[n];
        for (int i = 0; i < n; i++) {
            neg[i] = -mu[i];
        }
        BoundedSimplex.Result lo = BoundedSimplex.solve(p.a, p.rel, p.b, p.lo, p.hi, mu, settings.maxIterations());
        BoundedSimplex.Result hi = BoundedSimplex.solve(p.a, p.rel, p.b, p.lo, p.hi, neg, settings.maxIterations());
        if (lo.outcome() == BoundedSimplex.Outcome.INFEASIBLE || hi.outcome() == BoundedSimplex.Outcome.INFEASIBLE) {
            throw Feasibility.explainRows(p, settings.maxIterations());
        }
        double min = lo.outcome() == BoundedSimplex.Outcome.OPTIMAL ? Dense.dotInOrder(mu, lo.x()) : Double.NEGATIVE_INFINITY;
        double max = hi.outcome() == BoundedSimplex.Outcome.OPTIMAL ? Dense.dotInOrder(mu, hi.x()) : Double.POSITIVE_INFINITY;
        range = new ReturnRange(Math.min(min, max), Math.max(min, max),
                lo.outcome() == BoundedSimplex.Outcome.OPTIMAL ? lo.x() : null,
                hi.outcome() == BoundedSimplex.Outcome.OPTIMAL ? hi.x() : null);
        return range;
    }

    // ---- building the problem ---------------------------------------------------------------------------------

    private void checkMandate() {
        if (!mandateChecked) {
            Feasibility.checkMandate(mandate, assets);
            mandateChecked = true;
        }
    }

    private void ensureConvex() {
        if (convexChecked) {
            return;
        }
        factor = Cholesky.factor(sigma, settings.threads());
        if (factor == null) {
            throw Factored.notPositiveDefinite(universe, sigma, Spectrum.of(sigma));
        }
        convexChecked = true;
    }

    /** Rows: the mandate's rows without the fixed weights (they are bounds here), then the target if any. */
    private QpProblem problem(Double target) {
        List<LinearConstraint> rows = new ArrayList<>();
        for (LinearConstraint c : mandate.rows(assets)) {
            if (!c.name().startsWith("fixed:") || !isFixedRow(c)) {
                rows.add(c);
            }
        }
        if (target != null) {
            rows.add(new LinearConstraint("target_return", universe.expectedReturns(), Relation.EQUAL, target));
        }
        double[] lo = mandate.lower();
        double[] hi = mandate.upper();
        for (Map.Entry<Integer, Double> e : mandate.fixed().entrySet()) {
            lo[e.getKey()] = e.getValue();
            hi[e.getKey()] = e.getValue();
        }
        return fromRows(sigma, lo, hi, rows);
    }

    private boolean isFixedRow(LinearConstraint c) {
        String asset = c.name().substring("fixed:".length());
        Integer i = universe.indexOf(asset).orElse(null);
        return i != null && mandate.fixed().containsKey(i);
    }

    private static QpProblem fromRows(double[][] sigma, double[] lo, double[] hi, List<LinearConstraint> rows) {
        int m = rows.size();
        double[][] a = new double[m][];
        Relation[] rel = new Relation[m];
        double[] b = new double[m];
        String[] names = new String[m];
        for (int r = 0; r < m; r++) {
            LinearConstraint c = rows.get(r);
            a[r] = c.coefficients();
            rel[r] = c.relation();
            b[r] = c.limit();
            names[r] = c.name();
        }
        return new QpProblem(sigma, lo, hi, a, rel, b, names);
    }

    /** A vertex of the feasible set by phase 1 of the simplex method, with its tight constraints as working set. */
    private ActiveSetQp.Start coldStart(QpProblem p) {
        // The vertex that minimises Σ_i σ_ii w_i (each asset's own variance, a linear stand-in for w'Σw) starts the
        // active-set method among the low-risk assets, close to where the minimum-variance solution lives.
        double[] c = new double[n];
        for (int i = 0; i < n; i++) {
            c[i] = sigma[i][i];
        }
        BoundedSimplex.Result lp = BoundedSimplex.solve(p.a, p.rel, p.b, p.lo, p.hi, c, settings.maxIterations());
        if (lp.outcome() == BoundedSimplex.Outcome.UNBOUNDED || lp.outcome() == BoundedSimplex.Outcome.ITERATION_LIMIT) {
            // unbounded stand-in (assets without bounds): any vertex of phase 1 will do
            lp = BoundedSimplex.solve(p.a, p.rel, p.b, p.lo, p.hi, null, settings.maxIterations());
        }
        if (lp.outcome() != BoundedSimplex.Outcome.OPTIMAL) {
            throw Feasibility.explainRows(p, settings.maxIterations());
        }
        for (int r = 0; r < p.rows(); r++) {
            if (lp.redundant()[r] && p.rel[r] == Relation.EQUAL) {
                throw new NoSolutionException(NoSolutionException.Reason.CONSTRAINT_QUALIFICATION,
                        String.format(Locale.ROOT, "the constraint qualification fails: the equality '%s' repeats "
                                + "the other equalities and fixed weights, so its multiplier is not unique; fix: drop "
                                + "'%s' or the constraint it repeats", p.names[r], p.names[r]), List.of(p.names[r]));
            }
        }
        byte[] state = new byte[n];
        for (int i = 0; i < n; i++) {
            state[i] = switch (lp.states()[i]) {
                case AT_LOWER -> ActiveSetQp.LOWER;
                case AT_UPPER -> ActiveSetQp.UPPER;
                default -> ActiveSetQp.FREE;
            };
        }
        boolean[] rowActive = new boolean[p.rows()];
        for (int r = 0; r < p.rows(); r++) {
            rowActive[r] = lp.rowTight()[r] && !lp.redundant()[r];
        }
        return new ActiveSetQp.Start(lp.x(), state, rowActive);
    }

    /**
     * A start from a previous solution when its active set's own minimiser for this problem is not feasible: its
     * weights when they are still feasible; failing that, for a new return target, the blend of its weights with
     * the end of the achievable range that meets the target exactly. Null when none applies.
     */
    private ActiveSetQp.Start warmStart(QpProblem p, Solution prev, Double target) {
        double[] w0 = prev.weights();
        if (p.violation(w0) <= 1e-12) {
            return tightStart(p, w0, w0);
        }
        int targetRow = p.rows() - 1;
        if (target != null && violationExcept(p, w0, targetRow) <= 1e-12) {
            double r0 = Dense.dotInOrder(p.a[targetRow], w0);
            ReturnRange rr = returnRange();
            double[] end = target > r0 ? rr.maxPortfolio() : rr.minPortfolio();
            if (end == null) {
                return null;
            }
            double r1 = Dense.dotInOrder(p.a[targetRow], end);
            if (Math.abs(r1 - r0) <= 1e-15) {
                return null;
            }
            double theta = (target - r0) / (r1 - r0);
            if (!(theta >= 0 && theta <= 1)) {
                return null;
            }
            double[] x = new double[n];
            for (int i = 0; i < n; i++) {
                x[i] = w0[i] + theta * (end[i] - w0[i]);
            }
            return tightStart(p, x, theta == 1 ? end : w0, end);
        }
        return null;
    }

    /** The working set of a previous solution: its binding bounds and rows, and every equality. */
    private ActiveSetQp.Start previousActiveSet(QpProblem p, Solution prev) {
        if (!prev.assets().equals(assets)) {
            throw new IllegalArgumentException("the warm start solution is over other assets");
        }
        double[] w0 = prev.weights();
        Map<String, Boolean> binding = new HashMap<>();
        for (Multiplier mu : prev.multipliers()) {
            binding.put(mu.constraint(), mu.binding());
        }
        byte[] state = new byte[n];
        for (int i = 0; i < n; i++) {
            if (Boolean.TRUE.equals(binding.get(lowerNames[i])) && Double.isFinite(p.lo[i])) {
                state[i] = ActiveSetQp.LOWER;
            } else if (Boolean.TRUE.equals(binding.get(upperNames[i])) && Double.isFinite(p.hi[i])) {
                state[i] = ActiveSetQp.UPPER;
            }
        }
        boolean[] rows = new boolean[p.rows()];
        for (int r = 0; r < p.rows(); r++) {
            rows[r] = p.rel[r] == Relation.EQUAL || Boolean.TRUE.equals(binding.get(p.names[r]));
        }
        return new ActiveSetQp.Start(w0, state, rows);
    }

    /** A start at x whose working set holds the constraints tight at every one of {@code witnesses}. */
    private ActiveSetQp.Start tightStart(QpProblem p, double[] x, double[]... witnesses) {
        byte[] state = new byte[n];
        for (int i = 0; i < n; i++) {
            boolean atLo = Double.isFinite(p.lo[i]);
            boolean atHi = Double.isFinite(p.hi[i]);
            for (double[] v : witnesses) {
                atLo &= Math.abs(v[i] - p.lo[i]) <= 1e-13 * Math.max(1, Math.abs(p.lo[i]));
                atHi &= Math.abs(v[i] - p.hi[i]) <= 1e-13 * Math.max(1, Math.abs(p.hi[i]));
            }
            state[i] = atLo ? ActiveSetQp.LOWER : atHi ? ActiveSetQp.UPPER : ActiveSetQp.FREE;
        }
        boolean[] rows = new boolean[p.rows()];
        for (int r = 0; r < p.rows(); r++) {
            boolean tight = true;
            for (double[] v : witnesses) {
                tight &= Math.abs(p.rowValue(r, v) - p.b[r]) <= 1e-13 * Math.max(1, Math.abs(p.b[r]));
            }
            rows[r] = p.rel[r] == Relation.EQUAL || tight;
        }
        return new ActiveSetQp.Start(x, state, rows);
    }

    private static double violationExcept(QpProblem p, double[] w, int skip) {
        double v = 0;
        for (int r = 0; r < p.rows(); r++) {
            if (r == skip) {
                continue;
            }
            double d = p.rowValue(r, w) - p.b[r];
            double s = Math.max(1, Math.abs(p.b[r]));
            v = Math.max(v, switch (p.rel[r]) {
                case EQUAL -> Math.abs(d) / s;
                case AT_MOST -> Math.max(0, d) / s;
                case AT_LEAST -> Math.max(0, -d) / s;
            });
        }
        for (int i = 0; i < p.n; i++) {
            v = Math.max(v, Math.max(p.lo[i] - w[i], w[i] - p.hi[i]));
        }
        return v;
    }

    // ---- the solution ------------------------------------------------------------------------------------------

    /** Multipliers for every constraint in the one convention, and the certificate from {@link Kkt#certify}. */
    private Solution toSolution(QpProblem p, ActiveSetQp.Result res, Double target, List<String> extraNotes) {
        double[] w = res.w();
        double var = quadratic(w);
        double vol = Math.sqrt(Math.max(0, var));
        double ret = Dense.dotInOrder(universe.expectedReturns(), w);
        Map<String, Integer> rowIndex = new HashMap<>();
        for (int r = 0; r < p.rows(); r++) {
            rowIndex.put(p.names[r], r);
        }
        List<LinearConstraint> certRows = new ArrayList<>(mandate.rows(assets));
        if (target != null) {
            certRows.add(new LinearConstraint("target_return", universe.expectedReturns(), Relation.EQUAL, target));
        }
        double[] certPrices = new double[certRows.size()];
        List<Multiplier> mult = new ArrayList<>();
        for (int k = 0; k < certRows.size(); k++) {
            LinearConstraint c = certRows.get(k);
            Integer r = rowIndex.get(c.name());
            double price;
            boolean binding;
            if (r != null) {
                price = res.nu()[r];
                double slack = c.evaluate(w) - c.limit();
                binding = c.relation() == Relation.EQUAL || res.rowActive()[r]
                        || Math.abs(slack) <= 1e-12 * Math.max(1, Math.abs(c.limit()));
            } else {
                // a fixed weight: its shadow price is the eliminated variable's multiplier
                int i = universe.indexOf(c.name().substring("fixed:".length())).orElseThrow();
                price = res.lambda()[i];
                binding = true;
            }
            certPrices[k] = price;
            mult.add(new Multiplier(c.name(), price, perVol(price, vol), binding));
        }
        double[] lower = mandate.lower();
        double[] upper = mandate.upper();
        double[] lowerPrices = new double[n];
        double[] upperPrices = new double[n];
        for (int i = 0; i < n; i++) {
            boolean fixedByPolicy = mandate.fixed().containsKey(i);
            double lam = fixedByPolicy ? 0 : res.lambda()[i];
            byte s = res.state()[i];
            if (s == ActiveSetQp.LOWER) {
                lowerPrices[i] = lam;
            } else if (s == ActiveSetQp.UPPER) {
                upperPrices[i] = lam;
            } else if (s == ActiveSetQp.FIXED && !fixedByPolicy) {
                if (lam >= 0) {
                    lowerPrices[i] = lam;
                } else {
                    upperPrices[i] = lam;
                }
            }
        }
        for (int i = 0; i < n; i++) {
            byte s = res.state()[i];
            if (Double.isFinite(lower[i])) {
                boolean binding = s == ActiveSetQp.LOWER || (s == ActiveSetQp.FIXED && lower[i] == p.lo[i])
                        || Math.abs(w[i] - lower[i]) <= 1e-12 * Math.max(1, Math.abs(lower[i]));
                mult.add(new Multiplier(lowerNames[i], lowerPrices[i], perVol(lowerPrices[i], vol), binding));
            }
            if (Double.isFinite(upper[i])) {
                boolean binding = s == ActiveSetQp.UPPER || (s == ActiveSetQp.FIXED && upper[i] == p.hi[i])
                        || Math.abs(w[i] - upper[i]) <= 1e-12 * Math.max(1, Math.abs(upper[i]));
                mult.add(new Multiplier(upperNames[i], upperPrices[i], perVol(upperPrices[i], vol), binding));
            }
        }
        Certificate cert = Kkt.certify(sigma, w, certRows, certPrices, lower, upper, lowerPrices, upperPrices,
                res.condition(), settings.numericalTolerance(), true);
        List<String> notes = new ArrayList<>(extraNotes);
        notes.add(String.format(Locale.ROOT, "Solved by the active-set method for convex quadratic programs "
                + "(%d iterations; %d assets away from their bounds).", res.iterations(), res.freeCount()));
        notes.add("The covariance matrix is positive definite, so the problem is strictly convex: the "
                + "Karush-Kuhn-Tucker conditions are sufficient, and this minimum is global and unique.");
        if (res.dependent().length > 0) {
            List<String> names = new ArrayList<>();
            for (int d : res.dependent()) {
                names.add(d >= 0 ? p.names[d] : (Math.abs(w[-1 - d] - p.lo[-1 - d]) <= Math.abs(w[-1 - d] - p.hi[-1 - d])
                        ? lowerNames[-1 - d] : upperNames[-1 - d]));
            }
            notes.add(String.format(Locale.ROOT, "%s %s at this portfolio but %s a linear combination of the other "
                            + "binding constraints (the constraint qualification fails here), so the multipliers are "
                            + "not unique: the values shown are one valid set, with %s priced at zero. The weights "
                            + "are unique.", NOT_UNIQUE, String.join(", ", names) + (names.size() == 1 ? " binds" : " bind"),
                    names.size() == 1 ? "is" : "are", names.size() == 1 ? "it" : "them"));
        }
        if (!cert.passes()) {
            notes.add(String.format(Locale.ROOT, "WARNING: the certificate's largest residual %.3g exceeds the "
                    + "threshold %.1g; treat the result with care.", cert.worst(), cert.threshold()));
        }
        return new Solution(Method.NUMERICAL, assets, w, ret, var, vol, mult, cert, notes);
    }

    private static double perVol(double price, double vol) {
        return vol > 0 ? price / (2 * vol) : Double.NaN;
    }

    // ---- tangency -------------------------------------------------------------------------------------------------

    /**
     * The bounded tangency portfolio by homogenisation (Cornuejols &amp; Tütüncü, "Optimization Methods in Finance",
     * 2007, ch. 8; chapter from memory): with {@code y = κw}, {@code κ = 1'y/b > 0}, maximising the Sharpe ratio is minimising
     * {@code y'Σy} subject to {@code (μ − r_f 1)'y = 1} and every constraint scaled by κ. Then {@code w = y/κ}; its
     * multipliers and certificate are those of the minimum-variance problem at its own return, solved warm.
     */
    private Solution tangency(double rf, Solution warm) {
        checkMandate();
        double budget = mandate.budget();
        if (!(budget > 0)) {
            throw InputException.of("the tangency portfolio needs a positive budget").value(budget)
                    .fix("set budget to the invested total, e.g. 1.0").build();
        }
        double[] mu = universe.expectedReturns();
        int best = 0;
        for (int i = 1; i < n; i++) {
            if (mu[i] > mu[best]) {
                best = i;
            }
        }
        if (!(mu[best] > rf)) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "no tangency portfolio: no asset's expected return is above the risk-free rate %s (the highest is "
                            + "'%s' at %s), so no portfolio earns a positive excess return; fix: use a risk-free rate "
                            + "below %s", Explain.percent(rf), assets.get(best), Explain.percent(mu[best]),
                    Explain.percent(mu[best])), List.of("risk_free"));
        }
        ReturnRange rr = returnRange();
        if (!(rr.max() > rf * budget)) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "no tangency portfolio: the highest expected return the mandate allows, %s, is not above the "
                            + "risk-free rate %s on the budget of %s, so no allowed portfolio earns a positive excess "
                            + "return; fix: use a risk-free rate below %s", Explain.percent(rr.max()),
                    Explain.percent(rf), Explain.percent(budget), Explain.percent(rr.max() / budget)),
                    List.of("risk_free"));
        }
        ensureConvex();
        QpProblem h = homogenised(rf);
        ActiveSetQp.Result res = coldSolve(h);
        double[] y = res.w();
        double kappa = 0;
        for (double v : y) {
            kappa += v;
        }
        kappa /= budget;
        if (!(kappa > 1e-12)) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, "no tangency portfolio: the "
                    + "Sharpe ratio keeps rising towards a zero-investment position, so no fully invested portfolio "
                    + "attains it; fix: add bounds that limit short positions", List.of("risk_free"));
        }
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = y[i] / kappa;
        }
        double m = Dense.dotInOrder(mu, w);
        QpProblem p = problem(m);
        ActiveSetQp.Start start = tightStart(p, w, w);
        ActiveSetQp.Result fin = solveFrom(p, start);
        double vol = Math.sqrt(Math.max(0, quadratic(fin.w())));
        String note = String.format(Locale.ROOT, "Tangency portfolio for a risk-free rate of %s: the allowed portfolio "
                        + "with the highest Sharpe ratio (%.4f), found by the homogenised quadratic program and "
                        + "reported with the multipliers of the minimum-variance problem at its expected return.",
                Explain.percent(rf), (Dense.dotInOrder(mu, fin.w()) - rf * budget) / vol);
        return toSolution(p, fin, m, List.of(note));
    }

    /** The homogenised problem in y (κ eliminated through κ = 1'y / b). */
    private QpProblem homogenised(double rf) {
        double budget = mandate.budget();
        double[] mu = universe.expectedReturns();
        List<LinearConstraint> rows = new ArrayList<>();
        double[] excess = new double[n];
        for (int i = 0; i < n; i++) {
            excess[i] = mu[i] - rf;
        }
        rows.add(new LinearConstraint("excess_return", excess, Relation.EQUAL, 1.0));
        double[] ones = new double[n];
        java.util.Arrays.fill(ones, 1.0);
        rows.add(new LinearConstraint("positive_investment", ones, Relation.AT_LEAST, 0.0));
        for (LinearConstraint c : mandate.rows(assets)) {
            if (c.name().equals("budget")) {
                continue;
            }
            double f = c.limit() / budget;
            double[] a = c.coefficients();
            for (int i = 0; i < n; i++) {
                a[i] -= f;
            }
            rows.add(new LinearConstraint(c.name(), a, c.relation(), 0.0));
        }
        double[] lo = new double[n];
        double[] hi = new double[n];
        for (int i = 0; i < n; i++) {
            lo[i] = Double.NEGATIVE_INFINITY;
            hi[i] = Double.POSITIVE_INFINITY;
            if (mandate.fixed().containsKey(i)) {
                continue; // the fixed row above carries it
            }
            double l = mandate.lower(i);
            double u = mandate.upper(i);
            if (l == 0) {
                lo[i] = 0;
            } else if (Double.isFinite(l)) {
                double[] a = new double[n];
                for (int j = 0; j < n; j++) {
                    a[j] = -l / budget;
                }
                a[i] += 1;
                rows.add(new LinearConstraint("lower:" + assets.get(i), a, Relation.AT_LEAST, 0.0));
            }
            if (u == 0) {
                hi[i] = 0;
            } else if (Double.isFinite(u)) {
                double[] a = new double[n];
                for (int j = 0; j < n; j++) {
                    a[j] = -u / budget;
                }
                a[i] += 1;
                rows.add(new LinearConstraint("upper:" + assets.get(i), a, Relation.AT_MOST, 0.0));
            }
        }
        return fromRows(sigma, lo, hi, rows);
    }

    // ---- small helpers --------------------------------------------------------------------------------------------

    private double quadratic(double[] w) {
        double v = 0;
        for (int i = 0; i < n; i++) {
            if (w[i] == 0) {
                continue;
            }
            double s = 0;
            double[] r = sigma[i];
            for (int j = 0; j < n; j++) {
                s += r[j] * w[j];
            }
            v += w[i] * s;
        }
        return v;
    }

    /** Σ as read, made exactly symmetric (averaging the two triangles) so that row i is also column i. */
    private static double[][] symmetric(double[][] s) {
        int n = s.length;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < i; j++) {
                double v = 0.5 * (s[i][j] + s[j][i]);
                s[i][j] = v;
                s[j][i] = v;
            }
        }
        return s;
    }
}
