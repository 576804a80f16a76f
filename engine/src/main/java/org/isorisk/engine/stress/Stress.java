package org.isorisk.engine.stress;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import org.isorisk.engine.error.IsoriskException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Dense;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.RejectedTarget;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.SolverSession;

/**
 * The front door for stress tests: the base target sweep, then every scenario's sweep on a bounded pool of
 * worker threads (one task per scenario, targets in increasing order within a task so that each solve starts
 * near the previous one).
 */
public final class Stress {
    private Stress() {
    }

    /** Runs the sweep and the scenarios. */
    public static StressResult run(StressRequest r, StressProgress progress) {
        StressProgress pr = progress == null ? StressProgress.NONE : progress;
        double[] t = r.targets();
        int total = t.length * (1 + r.scenarios().size());
        AtomicInteger done = new AtomicInteger();
        List<String> notes = new ArrayList<>();
        // shocks first, on the caller's thread, so that bad input fails before any solve
        List<Shocked> shocked = new ArrayList<>();
        for (Scenario s : r.scenarios()) {
            Shocked sh = Shocks.apply(r.universe(), s, r.repair());
            shocked.add(sh);
            notes.addAll(sh.notes());
        }
        int threads = Math.max(1, Math.min(r.settings().threads(), Math.max(1, r.scenarios().size())));
        Sweep base = sweep(r.universe(), r.mandate(), t, r.settings(), pr, done, total, "base");
        List<ScenarioResult> results = new ArrayList<>();
        if (threads == 1) {
            // one thread asked for (e.g. a book of portfolios, already run in parallel): no pool of our own
            for (int k = 0; k < r.scenarios().size(); k++) {
                results.add(scenario(r.scenarios().get(k), shocked.get(k), base, r, pr, done, total));
            }
        } else if (!r.scenarios().isEmpty()) {
            ExecutorService pool = Executors.newFixedThreadPool(threads, run -> {
                Thread th = new Thread(run, "isorisk-stress");
                th.setDaemon(true);
                return th;
            });
            try {
                List<Future<ScenarioResult>> futures = new ArrayList<>();
                for (int k = 0; k < r.scenarios().size(); k++) {
                    Scenario sc = r.scenarios().get(k);
                    Shocked sh = shocked.get(k);
                    futures.add(pool.submit(() -> scenario(sc, sh, base, r, pr, done, total)));
                }
                for (Future<ScenarioResult> f : futures) {
                    results.add(f.get());
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IsoriskException("the stress run was interrupted", e);
            } catch (ExecutionException e) {
                if (e.getCause() instanceof IsoriskException ie) {
                    throw ie;
                }
                throw new IllegalStateException(e.getCause());
            } finally {
                pool.shutdownNow();
            }
        }
        return new StressResult(base, results, threads, notes);
    }

    static ScenarioResult scenario(Scenario sc, Shocked sh, Sweep base, StressRequest r, StressProgress pr,
                                   AtomicInteger done, int total) {
        Sweep s = sweep(sh.universe(), r.mandate(), r.targets(), r.settings(), pr, done, total, sc.name());
        AssetUniverse u = sh.universe();
        List<ScenarioPoint> points = new ArrayList<>();
        for (int k = 0; k < s.points().size(); k++) {
            TargetPoint p = s.points().get(k);
            TargetPoint b = base.points().get(k);
            double baseRisk = Double.NaN;
            double baseReturn = Double.NaN;
            if (b.feasible()) {
                double[] wb = b.solution().weights();
                baseRisk = Math.sqrt(Math.max(0, quad(u, wb)));
                baseReturn = Dense.dotInOrder(u.expectedReturns(), wb);
            }
            double change = Double.NaN;
            double turnover = Double.NaN;
            if (p.feasible() && b.feasible()) {
                change = p.volatility() - b.volatility();
                turnover = 0;
                for (int i = 0; i < u.size(); i++) {
                    turnover += Math.abs(p.solution().weight(i) - b.solution().weight(i));
                }
            }
            points.add(new ScenarioPoint(p.target(), p.feasible(), p.volatility(), change, baseRisk, baseReturn,
                    turnover, p.marginalRisk(), p.binding(), p.reason()));
        }
        return new ScenarioResult(sc, sh, s.maxTarget(), points, s);
    }

    /**
     * The sweep of one universe over the targets, in increasing order: one solver session (one factorisation,
     * the mandate checked once), each solve warm-started from the previous target's solution.
     */
    static Sweep sweep(AssetUniverse u, Mandate m, double[] targets, SolverSettings settings, StressProgress pr,
                       AtomicInteger done, int total, String label) {
        if (boundsOnly(m)) {
            return exact(u, m, targets, settings, pr, done, total, label);
        }
        double[] range = returnRange(u, m);
        List<TargetPoint> points = new ArrayList<>();
        SolverSession session = m.equalitiesOnly() ? null : Allocator.session(u, m, settings);
        Solution warm = null;
        for (double t : targets) {
            TargetPoint p = point(u, m, t, range, settings, session, warm);
            if (p.feasible()) {
                warm = p.solution();
            }
            points.add(p);
            pr.step(done.incrementAndGet(), total, String.format(Locale.ROOT, "%s, target %.2f %%", label, t * 100));
        }
        return new Sweep(points, range[0], range[1], changes(points));
    }

    /** True when only the budget, finite bounds and fixed weights apply: the critical line method is exact. */
    static boolean boundsOnly(Mandate m) {
        if (!m.hasBounds() || m.hasGeneralInequalities()) {
            return false;
        }
        for (var c : m.constraints()) {
            if (c.relation() == org.isorisk.engine.model.Relation.EQUAL) {
                return false;
            }
        }
        for (int i = 0; i < m.size(); i++) {
            if (!m.fixed().containsKey(i) && !(Double.isFinite(m.lower(i)) && Double.isFinite(m.upper(i)))) {
                return false;
            }
        }
        return true;
    }

    /**
     * The sweep from the exact mandate frontier (critical line method): every target's portfolio from the corner
     * portfolios around it, and the targets where the binding set changes exactly at the corners' returns.
     */
    static Sweep exact(AssetUniverse u, Mandate m, double[] targets, SolverSettings settings, StressProgress pr,
                       AtomicInteger done, int total, String label) {
        Frontier f;
        try {
            f = Allocator.mandateFrontier(u, m, range -> targets.clone(), false, settings);
        } catch (NoSolutionException e) {
            if (e.reason() != NoSolutionException.Reason.INFEASIBLE) {
                throw e;
            }
            List<TargetPoint> none = new ArrayList<>();
            for (double t : targets) {
                none.add(new TargetPoint(t, false, null, Double.NaN, Double.NaN, List.of(), e.getMessage()));
                pr.step(done.incrementAndGet(), total, label);
            }
            return new Sweep(none, Double.NaN, Double.NaN, List.of());
        }
        List<TargetPoint> points = new ArrayList<>();
        for (double t : targets) {
            Solution hit = null;
            for (Solution s : f.points()) {
                if (Math.abs(s.expectedReturn() - t) <= 1e-9 * Math.max(1, Math.abs(t))) {
                    hit = s;
                    break;
                }
            }
            if (hit == null) {
                String why = f.rejected().stream().filter(r -> r.target() == t).map(RejectedTarget::reason)
                        .findFirst().orElse(String.format(Locale.ROOT, "the target is outside the returns the mandate "
                                + "allows, %.4f %% to %.4f %%", f.lowestReturn() * 100, f.maxReturn() * 100));
                points.add(new TargetPoint(t, false, null, Double.NaN, Double.NaN, List.of(), why));
            } else {
                points.add(target(t, hit));
            }
            pr.step(done.incrementAndGet(), total, String.format(Locale.ROOT, "%s, target %.2f %%", label, t * 100));
        }
        List<BindingChange> changes = cornerChanges(f, m, u, targets);
        return new Sweep(points, f.lowestReturn(), f.maxReturn(), changes == null ? changes(points) : changes);
    }

    /**
     * Binding-set changes at the interior corners of the efficient branch within the grid, exactly: between two
     * corners the free set is constant, so at corner k the assets that leave the free set going up start binding
     * at a bound and those that enter stop binding. Null when the corners do not carry their free sets.
     */
    static List<BindingChange> cornerChanges(Frontier f, Mandate m, AssetUniverse u, double[] targets) {
        List<Corner> c = f.corners();
        List<BindingChange> out = new ArrayList<>();
        if (targets.length == 0) {
            return out;
        }
        double lo = targets[0];
        double hi = targets[targets.length - 1];
        for (int k = 1; k + 1 < c.size(); k++) {
            if (c.get(k).free().isEmpty() && c.get(k + 1).free().isEmpty()) {
                return null;
            }
            double r = c.get(k).expectedReturn();
            if (r < lo || r > hi) {
                continue;
            }
            List<String> below = c.get(k).free();
            List<String> above = c.get(k + 1).free();
            List<String> entered = new ArrayList<>();
            List<String> left = new ArrayList<>();
            for (String a : below) {
                if (!above.contains(a)) {
                    entered.add(boundName(a, c.get(k).portfolio(), m, u));
                }
            }
            for (String a : above) {
                if (!below.contains(a)) {
                    left.add(boundName(a, c.get(k).portfolio(), m, u));
                }
            }
            double from = Double.NaN;
            double to = Double.NaN;
            for (double t : targets) {
                if (t <= r) {
                    from = t;
                }
                if (t >= r && Double.isNaN(to)) {
                    to = t;
                }
            }
            out.add(new BindingChange(r, from, to, entered, left, true));
        }
        return out;
    }

    /** {@code lower:<asset>} or {@code upper:<asset>}, whichever bound the asset sits at in the corner portfolio. */
    private static String boundName(String asset, Solution corner, Mandate m, AssetUniverse u) {
        int i = u.indexOf(asset).orElseThrow();
        double w = corner.weight(i);
        return (Math.abs(w - m.lower(i)) <= Math.abs(w - m.upper(i)) ? "lower:" : "upper:") + asset;
    }

    static TargetPoint target(double t, Solution s) {
        double marginal = s.multiplier("target_return").map(Multiplier::volatilityPerUnit).orElse(Double.NaN);
        List<String> binding = new ArrayList<>();
        for (Multiplier q : s.binding()) {
            if (!q.constraint().equals("budget") && !q.constraint().equals("target_return")) {
                binding.add(q.constraint());
            }
        }
        return new TargetPoint(t, true, s, s.volatility(), marginal, binding, "");
    }

    static TargetPoint point(AssetUniverse u, Mandate m, double t, double[] range, SolverSettings settings,
                             SolverSession session, Solution warm) {
        double slack = 1e-12 * Math.max(1, Math.abs(t));
        if (Double.isNaN(range[0]) || Double.isNaN(range[1])) {
            return new TargetPoint(t, false, null, Double.NaN, Double.NaN, List.of(),
                    "no portfolio satisfies the mandate (bounds, groups and budget contradict each other)");
        }
        if (t > range[1] + slack || t < range[0] - slack) {
            return new TargetPoint(t, false, null, Double.NaN, Double.NaN, List.of(), String.format(Locale.ROOT,
                    "the target is outside the returns the mandate allows, %.4f %% to %.4f %%", range[0] * 100,
                    range[1] * 100));
        }
        try {
            Solution s = session == null
                    ? Allocator.solve(new AllocationRequest(u, m, Objective.targetReturn(t), null, settings))
                    : session.solve(Objective.targetReturn(t), warm);
            return target(t, s);
        } catch (NoSolutionException e) {
            if (e.reason() == NoSolutionException.Reason.INFEASIBLE) {
                return new TargetPoint(t, false, null, Double.NaN, Double.NaN, List.of(), e.getMessage());
            }
            throw e;
        }
    }

    /**
     * Lowest and highest expected return the mandate allows (the allocator's linear programmes over the mandate's
     * rows and bounds); ±∞ where the mandate is unbounded, NaN when it is infeasible.
     */
    public static double[] returnRange(AssetUniverse u, Mandate m) {
        if (!m.hasBounds()) {
            return new double[] {Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY};
        }
        try {
            ReturnRange r = Allocator.returnRange(u, m);
            return new double[] {r.min(), r.max()};
        } catch (NoSolutionException e) {
            return new double[] {Double.NaN, Double.NaN};
        }
    }

    /** Targets between consecutive feasible grid points where the binding set differs. */
    static List<BindingChange> changes(List<TargetPoint> points) {
        List<BindingChange> out = new ArrayList<>();
        TargetPoint prev = null;
        for (TargetPoint p : points) {
            if (!p.feasible()) {
                continue;
            }
            if (prev != null) {
                Set<String> a = new HashSet<>(prev.binding());
                Set<String> b = new HashSet<>(p.binding());
                if (!a.equals(b)) {
                    List<String> entered = p.binding().stream().filter(x -> !a.contains(x)).toList();
                    List<String> left = prev.binding().stream().filter(x -> !b.contains(x)).toList();
                    out.add(new BindingChange(Double.NaN, prev.target(), p.target(), entered, left, false));
                }
            }
            prev = p;
        }
        return out;
    }

    static double quad(AssetUniverse u, double[] w) {
        double v = 0;
        for (int i = 0; i < w.length; i++) {
            double s = 0;
            for (int j = 0; j < w.length; j++) {
                s += u.covariance(i, j) * w[j];
            }
            v += w[i] * s;
        }
        return v;
    }
}
