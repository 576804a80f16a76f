package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;

/**
 * The one front door for solving: picks the method (closed form when only equalities apply, the critical line
 * method when only the budget, per-asset bounds and fixed weights apply, the numerical QP otherwise), runs it, and returns a solution that says which method it used and carries its
 * certificate.
 */
public final class Allocator {
    private Allocator() {
    }

    /** Note added when no bounds apply. */
    public static final String SHORTS_NOTE = "Only the budget (and any target or fixed weights) apply: short positions "
            + "(negative weights) are allowed. Give a policy file to add bounds.";

    /**
     * Solves one allocation problem.
     *
     * @throws NoSolutionException when the problem has no meaningful solution (infeasible, constraint
     *                             qualification fails, Σ not positive definite)
     * @throws InputException      when the request cannot be solved as asked (e.g. closed form with bounds)
     */
    public static Solution solve(AllocationRequest r) {
        return solve(r, null);
    }

    /**
     * Solves one allocation problem, warm-starting the numerical method from a previous solution over the same
     * assets (a neighbouring target of a frontier sweep, or the base case of a stress run). The closed form
     * ignores the warm start.
     *
     * @param warmStart a previous solution, or null for a cold start
     */
    public static Solution solve(AllocationRequest r, Solution warmStart) {
        return solve(r, warmStart, null);
    }

    /**
     * Factors the universe's covariance once for many solves on the same assumptions (a book of portfolios):
     * what {@link #solveWith} takes. The same factorisation {@link #solve} makes for each request.
     *
     * @param settings the thread count of the factorisation; null for {@link SolverSettings#defaults()}
     * @throws NoSolutionException (NOT_CONVEX) when Σ is not positive definite, as {@link #solve} would
     */
    public static Factored prepare(AssetUniverse u, SolverSettings settings) {
        return Factored.of(u, settings == null ? SolverSettings.defaults() : settings);
    }

    /**
     * Solves one allocation problem on a universe factored beforehand by {@link #prepare}: bit for bit the
     * solution {@link #solve(AllocationRequest)} gives for the same request (the factor and its spectrum are the
     * ones that call would compute; solves with it start from an empty memory, as in a fresh call), without the
     * per-request factorisation and condition estimate. With {@code r.settings().threads() == 1} no other thread
     * is used.
     *
     * @param prepared {@code prepare(r.universe(), ...)}; shared by any number of threads (not modified)
     * @throws IllegalArgumentException when {@code prepared} was made for another universe object
     */
    public static Solution solveWith(Factored prepared, AllocationRequest r) {
        if (prepared.universe() != r.universe()) {
            throw new IllegalArgumentException("the prepared factor belongs to another universe");
        }
        return solve(r, null, prepared);
    }

    private static Solution solve(AllocationRequest r, Solution warmStart, Factored prepared) {
        Mandate m = r.mandate();
        Method method = r.method();
        if (method == Method.AUTO && !m.equalitiesOnly()) {
            // closed form when nothing binds (issue 3's method choice); else a bounded method below
            Solution interior = InteriorShortcut.tryClosedForm(r, prepared == null ? null : prepared.fresh());
            if (interior != null) {
                return interior;
            }
        }
        if (method == Method.AUTO) {
            if (m.equalitiesOnly()) {
                method = Method.CLOSED_FORM;
            } else if (MandateSweep.applies(m) && !(r.objective() instanceof Objective.Tangency)) {
                method = Method.CRITICAL_LINE;
            } else {
                method = Method.NUMERICAL;
            }
        }
        if (method == Method.CRITICAL_LINE) {
            return criticalLine(r, prepared);
        }
        if (method == Method.NUMERICAL) {
            return session(r.universe(), m, r.settings()).solve(r.objective(), warmStart);
        }
        if (method == Method.CLOSED_FORM) {
            if (!m.equalitiesOnly()) {
                throw InputException.of("the closed form applies only when every constraint is an equality, but the "
                                + "policy has bounds or inequality limits")
                        .fix("drop --method closed-form (auto picks a bounded method) or remove the bounds").build();
            }
            return closedForm(prepared != null ? prepared.fresh() : Factored.of(r.universe(), r.settings()), m,
                    r.objective(), r);
        }
        throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVERGED,
                "method " + method.label() + " is not available in this build", List.of());
    }

    /**
     * Critical line solve: the minimum-variance portfolio under budget, bounds and fixed weights, or the exact
     * frontier portfolio at a target return (interpolated between its two corner portfolios).
     */
    private static Solution criticalLine(AllocationRequest r, Factored prepared) {
        if (r.objective() instanceof Objective.Tangency) {
            throw InputException.of("the critical line method here solves minimum-variance and target-return "
                    + "problems, not the tangency portfolio").fix("drop --method critical-line for --risk-free").build();
        }
        MandateSweep sweep = null;
        if (prepared != null) {
            MandateSweep kept = prepared.sharedSweep(r.mandate(), r.settings(),
                    () -> MandateSweep.of(r.universe(), r.mandate(), r.settings(), prepared.fresh()));
            sweep = kept == null ? null : kept.forCall(prepared.fresh());
        }
        if (sweep == null) {
            sweep = MandateSweep.of(r.universe(), r.mandate(), r.settings(), prepared == null ? null : prepared.fresh());
        }
        if (r.objective() instanceof Objective.TargetReturn t) {
            return sweep.target(t.target());
        }
        return sweep.minimumVariance();
    }

    /**
     * The exact mandate frontier by the critical line method: corner portfolios of both branches, efficient and
     * inefficient (each a certified solution with its multipliers), and exact portfolios at {@code targets}; targets outside the
     * achievable range are listed in {@link Frontier#rejected()} with the reason.
     *
     * @param u        assets and assumptions
     * @param m        budget, bounds and fixed weights (no groups or general constraints)
     * @param targets  expected returns to sample, decimal (not modified; any order)
     * @param settings tolerances and limits
     * @throws NoSolutionException when the bounds admit no portfolio or Σ is not positive definite
     * @throws InputException      when the mandate has groups or general constraints, or an unbounded asset
     */
    public static Frontier mandateFrontier(AssetUniverse u, Mandate m, double[] targets, SolverSettings settings) {
        double[] copy = targets.clone();
        return mandateFrontier(u, m, range -> copy, true, settings);
    }

    /**
     * The exact mandate frontier with points at targets chosen once the achievable range is known.
     *
     * @param targetsForRange given {lowest return, minimum-variance return, highest return} (decimals), returns
     *                        the targets to sample
     * @param withInefficient also list the corners of the inefficient branch (below the minimum-variance return)
     */
    public static Frontier mandateFrontier(AssetUniverse u, Mandate m,
                                           java.util.function.Function<double[], double[]> targetsForRange,
                                           boolean withInefficient, SolverSettings settings) {
        MandateSweep sweep = MandateSweep.of(u, m, settings == null ? SolverSettings.defaults() : settings);
        return sweep.frontier(targetsForRange, withInefficient);
    }

    /** True when {@link Method#CRITICAL_LINE} can solve the mandate (what {@link Method#AUTO} checks). */
    public static boolean criticalLineApplies(Mandate m) {
        return !m.equalitiesOnly() && MandateSweep.applies(m);
    }

    /**
     * A reusable numerical solver for one universe and mandate (frontier sweeps, stress runs): it checks the
     * mandate and the convexity of Σ once and warm-starts each solve.
     *
     * @param settings null for {@link SolverSettings#defaults()}
     */
    public static SolverSession session(AssetUniverse u, Mandate m, SolverSettings settings) {
        return new SolverSession(u, m, settings);
    }

    /** The lowest and highest expected return the mandate allows (linear programming), with the end portfolios. */
    public static ReturnRange returnRange(AssetUniverse u, Mandate m) {
        return new SolverSession(u, m, null).returnRange();
    }

    /** Closed-form solve on an already factored universe (for sweeps sharing one factorisation). */
    public static Solution closedForm(Factored f, Mandate m, Objective objective, AllocationRequest r) {
        AssetUniverse u = f.universe();
        List<LinearConstraint> rows = new ArrayList<>(m.rows(u.assets()));
        List<String> notes = new ArrayList<>();
        notes.add(SHORTS_NOTE);
        if (objective instanceof Objective.TargetReturn t) {
            rows.add(new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, t.target()));
        } else if (objective instanceof Objective.Tangency t) {
            double target = tangencyReturn(f, m, rows, t.riskFree(), r);
            rows.add(new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, target));
            notes.add(String.format(Locale.ROOT, "Tangency portfolio for a risk-free rate of %s: the frontier point "
                    + "with the highest Sharpe ratio, found as the minimum-variance portfolio at its return.",
                    Explain.percent(t.riskFree())));
        }
        return ClosedForm.solve(f, rows, r.settings(), notes);
    }

    /**
     * Return of the tangency portfolio on the frontier of the equality rows: maximises the Sharpe ratio
     * {@code (m − r_f b)/σ*(m)} (b the budget, so that {@code r_f b} is what the budget earns risk-free) along the
     * closed-form frontier {@code V*(m) = αm² − 2βm + γ}; refuses when the risk-free rate is at or above the
     * minimum-variance portfolio's return per unit of budget (for the budget alone, Merton's A/C).
     */
    private static double tangencyReturn(Factored f, Mandate m, List<LinearConstraint> rows, double rf,
                                         AllocationRequest r) {
        // V*(t) is quadratic in the target t. Sample it at three targets to read its coefficients exactly.
        AssetUniverse u = f.universe();
        double[] mu = u.expectedReturns();
        double[] t = {-1, 0, 1};
        double[] v = new double[3];
        for (int i = 0; i < 3; i++) {
            List<LinearConstraint> withTarget = new ArrayList<>(rows);
            withTarget.add(new LinearConstraint("target_return", mu, Relation.EQUAL, t[i]));
            v[i] = ClosedForm.solve(f, withTarget, r.settings(), List.of()).variance();
        }
        double alpha = (v[2] + v[0] - 2 * v[1]) / 2;
        double beta = -(v[2] - v[0]) / 4;
        double gamma = v[1];
        double mMin = beta / alpha; // return of the minimum-variance portfolio under these equalities
        double budget = m.budget();
        double rfb = rf * budget;
        if (!(budget > 0)) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "no tangency portfolio: the budget is %s, and a maximum Sharpe ratio needs a positive budget; "
                            + "fix: give a positive budget", Explain.percent(budget)), List.of("budget", "risk_free"));
        }
        double perUnit = mMin / budget;
        if (!(rf < perUnit)) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "no tangency portfolio: the risk-free rate %s is at or above the minimum-variance portfolio's "
                            + "return %s, so no frontier portfolio earns a positive excess return per unit of risk on "
                            + "the efficient branch; fix: use a risk-free rate below %s",
                    Explain.percent(rf), Explain.percent(perUnit), Explain.percent(perUnit)), List.of("risk_free"));
        }
        // d/dm [(m − r_f b)/sqrt(V(m))] = 0  ⇔  V(m) = (m − r_f b) V'(m)/2  ⇔  m = (γ − β r_f b)/(β − α r_f b).
        return (gamma - beta * rfb) / (beta - alpha * rfb);
    }

    /** Merton's (1972) frontier scalars A, B, C, D for the universe (budget-only frontier). */
    public static MertonScalars merton(AssetUniverse u, double budget) {
        return ClosedForm.merton(Factored.of(u), budget);
    }

    /** Merton's scalars on an already factored universe. */
    public static MertonScalars merton(Factored f, double budget) {
        return ClosedForm.merton(f, budget);
    }
}
