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
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
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
        if (!r.scenarios().isEmpty()) {
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
                baseReturn = dot(u.expectedReturns(), wb);
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
        return new ScenarioResult(sc, sh, s.maxTarget(), points);
    }

    /**
     * The sweep of one universe over the targets, in increasing order: one solver session (one factorisation,
     * the mandate checked once), each solve warm-started from the previous target's solution.
     */
    static Sweep sweep(AssetUniverse u, Mandate m, double[] targets, SolverSettings settings, StressProgress pr,
                       AtomicInteger done, int total, String label) {
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
            double marginal = s.multiplier("target_return").map(Multiplier::volatilityPerUnit).orElse(Double.NaN);
            List<String> binding = new ArrayList<>();
            for (Multiplier q : s.binding()) {
                if (!q.constraint().equals("budget") && !q.constraint().equals("target_return")) {
                    binding.add(q.constraint());
                }
            }
            return new TargetPoint(t, true, s, s.volatility(), marginal, binding, "");
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

    static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }
}
