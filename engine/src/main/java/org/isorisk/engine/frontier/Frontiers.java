package org.isorisk.engine.frontier;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Branch;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.RejectedTarget;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.Factored;

/** The one front door for frontiers: the exact mandate frontier and the unconstrained closed-form frontier. */
public final class Frontiers {
    private Frontiers() {
    }

    /**
     * The exact frontier under a budget + bounds (+ fixed weights) mandate by the critical line method: every
     * corner portfolio of the efficient branch (minimum-variance end to maximum-return end), each a certified
     * solution with its multipliers, and exact portfolios at the grid's targets (targets below the
     * minimum-variance return are solved on the inefficient branch and say so). Targets outside the achievable
     * range are listed in {@link Frontier#rejected()} with the reason.
     *
     * @param universe assets and assumptions (not modified)
     * @param mandate  budget, per-asset bounds and fixed weights
     * @param grid     which targets to sample; {@link Grid#points(int)} spaces them between the minimum-variance
     *                 and maximum-return ends
     * @param settings tolerances and limits; null for the defaults
     */
    public static Frontier mandate(AssetUniverse universe, Mandate mandate, Grid grid, SolverSettings settings) {
        return mandate(universe, mandate, grid, false, settings);
    }

    /**
     * The exact mandate frontier as {@link #mandate(AssetUniverse, Mandate, Grid, SolverSettings)}, optionally
     * with the corners of the inefficient branch too ({@link Frontier#inefficientCorners()}, from the lowest
     * return the mandate allows up to the minimum-variance portfolio).
     */
    public static Frontier mandate(AssetUniverse universe, Mandate mandate, Grid grid, boolean inefficientBranch,
                                   SolverSettings settings) {
        Grid g = grid == null ? Grid.none() : grid;
        return Allocator.mandateFrontier(universe, mandate, range -> g.targets(range[1], range[2]), inefficientBranch,
                settings);
    }

    /**
     * The frontier of a general mandate (groups, general linear constraints: where the critical line method does
     * not apply) sampled on the grid by the active-set QP of one {@link org.isorisk.engine.solve.SolverSession}:
     * the mandate and the convexity of Σ are checked once, the minimum-variance portfolio is solved first and each
     * target, in increasing order, is warm-started from the previous solution. There are no corner portfolios
     * ({@link Frontier#corners()} is empty). {@link Grid#points(int)} spaces targets between the minimum-variance
     * return and the highest return the mandate allows (the highest single-asset return times the budget when the
     * mandate does not bound it); a grid's target below the minimum-variance return is solved on the inefficient
     * branch and says so ({@link Branch}). Targets the mandate cannot reach, or that have no solution, are listed in
     * {@link Frontier#rejected()} with the reason.
     *
     * @param universe assets and assumptions (not modified)
     * @param mandate  the mandate (any; with bounds only, {@link #mandate} gives the exact corners instead)
     * @param grid     which targets to sample
     * @param settings tolerances and limits; null for the defaults
     * @throws NoSolutionException when the mandate admits no portfolio (with the constraints involved) or Σ is not
     *                             positive definite
     */
    public static Frontier sampled(AssetUniverse universe, Mandate mandate, Grid grid, SolverSettings settings) {
        SolverSettings s = settings == null ? SolverSettings.defaults() : settings;
        org.isorisk.engine.solve.SolverSession session = Allocator.session(universe, mandate, s);
        org.isorisk.engine.model.ReturnRange range = session.returnRange();
        Solution minVar = session.solve(Objective.minimumVariance());
        double low = minVar.expectedReturn();
        double high = range.max();
        if (!Double.isFinite(high)) {
            high = Double.NEGATIVE_INFINITY;
            for (double v : universe.expectedReturns()) {
                high = Math.max(high, v * mandate.budget());
            }
        }
        Grid g = grid == null ? Grid.none() : grid;
        double[] targets = g.targets(low, Math.max(low, high)).clone();
        java.util.Arrays.sort(targets);
        List<Solution> points = new ArrayList<>();
        List<RejectedTarget> rejected = new ArrayList<>();
        Solution warm = minVar;
        for (double t : targets) {
            try {
                Solution p = session.solve(Objective.targetReturn(t), warm);
                points.add(Branch.annotated(p)); // a target below the minimum-variance return says so
                warm = p;
            } catch (NoSolutionException e) {
                rejected.add(new RejectedTarget(t, e.getMessage()));
            }
        }
        MertonScalars ms;
        try {
            ms = Allocator.merton(Factored.of(universe, s), mandate.budget());
        } catch (NoSolutionException e) {
            ms = null; // no closed-form frontier to compare with (e.g. equal expected returns)
        }
        return new Frontier(List.of(), points, ms, low, range.max(), List.of(), range.min(), rejected);
    }

    /**
     * The unconstrained frontier (budget and return target only, short positions allowed) in closed form:
     * Merton's scalars and the portfolios at the grid's targets. {@link Grid#points(int)} spaces targets from the
     * global minimum-variance return to the highest expected return of a single asset. There are no corners.
     *
     * @param universe assets and assumptions (not modified)
     * @param budget   sum of weights (1 = fully invested)
     * @param grid     which targets to sample
     * @param settings tolerances; null for the defaults
     */
    public static Frontier unconstrained(AssetUniverse universe, double budget, Grid grid, SolverSettings settings) {
        SolverSettings s = settings == null ? SolverSettings.defaults() : settings;
        Factored f = Factored.of(universe, s);
        MertonScalars ms = Allocator.merton(f, budget);
        double low = ms.minimumVarianceReturn();
        double top = Double.NEGATIVE_INFINITY;
        for (double v : universe.expectedReturns()) {
            top = Math.max(top, v * budget);
        }
        Grid g = grid == null ? Grid.none() : grid;
        Mandate m = Mandate.budgetOnly(universe.size(), budget);
        List<Solution> points = new ArrayList<>();
        List<RejectedTarget> rejected = new ArrayList<>();
        double[] targets = g.targets(low, Math.max(low, top)).clone();
        java.util.Arrays.sort(targets);
        for (double t : targets) {
            try {
                points.add(Branch.annotated(Allocator.closedForm(f, m, Objective.targetReturn(t),
                        new org.isorisk.engine.model.AllocationRequest(universe, m, Objective.targetReturn(t),
                                org.isorisk.engine.model.Method.CLOSED_FORM, s))));
            } catch (NoSolutionException e) {
                rejected.add(new RejectedTarget(t, e.getMessage()));
            }
        }
        return new Frontier(List.of(), points, ms, low, Double.POSITIVE_INFINITY, List.of(), Double.NEGATIVE_INFINITY,
                rejected);
    }
}
