package org.isorisk.cli.usecase;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.function.BiConsumer;
import java.util.function.Consumer;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.Shocked;
import org.isorisk.engine.stress.Shocks;
import org.isorisk.engine.stress.Stress;
import org.isorisk.engine.stress.StressProgress;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.Sweep;
import org.isorisk.engine.stress.TargetPoint;
import org.isorisk.notebooks.pack.PackResults;

/**
 * The pack's stress runs, made so that one point the solver cannot solve does not stop the pack. The whole run
 * goes through {@link Stress#run} first. When it fails with a solver failure ({@link NoSolutionException}: the
 * engine reports a target out of reach as an infeasible point, not as a failure), it is repeated in parts: today's
 * assumptions alone, then each scenario beside them, each as a sweep over the targets that stops just before the
 * target where it fails, tries that target on its own, and goes on after it (the active-set method is warm-started
 * along a sweep, and a cold start at a degenerate point can fail where the sweep does not, so the sweep is kept
 * whole wherever it succeeds; the parts are found by halving, a few runs per failure). Every point that can be solved
 * is, with the engine's own comparisons against today's assumptions; a single target that still fails is kept in the
 * result as a point without a solution whose reason is the solver's message, and listed as
 * {@link PackResults.NotSolved}. Where today's point itself cannot be solved, a scenario's point at that target is
 * solved on the scenario's assumptions alone (its comparisons with today's are then unknown, NaN). Where the binding
 * constraints change is not reported for a run repeated in parts. Bad input (a shock the assumptions cannot take)
 * still fails the run: it is the user's to fix. Every number is the engine's.
 */
final class PackStress {
    private PackStress() {
    }

    /** Runs a stress request: {@link Stress#run} in the pack; a test may put a failing one in its place. */
    @FunctionalInterface
    interface Runner {
        StressResult run(StressRequest request, StressProgress progress);
    }

    /** The engine's stress run. */
    static final Runner ENGINE = Stress::run;

    /**
     * A stress run with the points that were not solved.
     *
     * @param result    every scenario at every target; a point not solved has no solution and the solver's message
     *                  as its reason
     * @param notSolved the points not solved: today's first, then the scenarios', each in target order
     */
    record Outcome(StressResult result, List<PackResults.NotSolved> notSolved) {
        Outcome {
            notSolved = List.copyOf(notSolved);
        }
    }

    /**
     * Runs {@code r}; never fails on a point the solver cannot solve.
     *
     * @param which    which of the pack's runs this is, for the report of unsolved points
     * @param runner   {@link #ENGINE}, or a stand-in in tests
     * @param progress counts the solves of the first, whole run
     */
    static Outcome run(StressRequest r, PackResults.StressRun which, Runner runner, StressProgress progress) {
        try {
            return new Outcome(runner.run(r, progress), List.of());
        } catch (NoSolutionException whole) {
            return pointByPoint(r, which, runner);
        }
    }

    private static Outcome pointByPoint(StressRequest r, PackResults.StressRun which, Runner runner) {
        double[] targets = r.targets();
        Set<String> notes = new LinkedHashSet<>();
        List<PackResults.NotSolved> failed = new ArrayList<>();
        // today's assumptions alone, over the targets, halving the grid only where a part fails
        Map<Double, TargetPoint> today = new HashMap<>();
        Map<Double, NoSolutionException> todayFailed = new HashMap<>();
        int[] threads = {1};
        split(runner, r, r.universe(), targets, List.of(), res -> {
            notes.addAll(res.notes());
            threads[0] = Math.max(threads[0], res.threads());
            for (TargetPoint p : res.base().points()) {
                today.put(p.target(), p);
            }
        }, todayFailed::put);
        List<TargetPoint> base = new ArrayList<>();
        for (double t : targets) {
            if (today.containsKey(t)) {
                base.add(today.get(t));
            } else {
                NoSolutionException e = todayFailed.get(t);
                base.add(unsolved(t, e.getMessage()));
                failed.add(new PackResults.NotSolved(which, Optional.empty(), t, status(e), e.getMessage()));
            }
        }
        double[] comparable = Arrays.stream(targets).filter(today::containsKey).toArray();
        double[] alone = Arrays.stream(targets).filter(t -> !today.containsKey(t)).toArray();
        List<ScenarioResult> results = new ArrayList<>();
        for (Scenario sc : r.scenarios()) {
            Map<Double, ScenarioPoint> points = new HashMap<>();
            Map<Double, TargetPoint> sweep = new HashMap<>();
            Map<Double, NoSolutionException> lost = new HashMap<>();
            Shocked[] shocked = {null};
            double[] max = {Double.NaN};
            // the scenario beside today's assumptions where today's point is known: the engine's comparisons
            split(runner, r, r.universe(), comparable, List.of(sc), res -> {
                notes.addAll(res.notes());
                ScenarioResult one = res.scenarios().get(0);
                shocked[0] = one.shocked();
                max[0] = one.maxTarget();
                for (int j = 0; j < one.points().size(); j++) {
                    points.put(one.points().get(j).target(), one.points().get(j));
                    sweep.put(one.sweep().points().get(j).target(), one.sweep().points().get(j));
                }
            }, lost::put);
            Shocked sh = shocked[0];
            if (sh == null) {
                sh = Shocks.apply(r.universe(), sc, r.repair());
                notes.addAll(sh.notes());
            }
            // where today's point is not known: the scenario's own point, on its assumptions alone
            split(runner, r, sh.universe(), alone, List.of(), res -> {
                for (TargetPoint p : res.base().points()) {
                    points.put(p.target(), new ScenarioPoint(p.target(), p.feasible(), p.volatility(), Double.NaN,
                            Double.NaN, Double.NaN, Double.NaN, p.marginalRisk(), p.binding(), p.reason()));
                    sweep.put(p.target(), p);
                }
            }, lost::put);
            List<ScenarioPoint> ps = new ArrayList<>();
            List<TargetPoint> sw = new ArrayList<>();
            for (double t : targets) {
                if (points.containsKey(t)) {
                    ps.add(points.get(t));
                    sw.add(sweep.get(t));
                } else {
                    NoSolutionException e = lost.get(t);
                    ps.add(new ScenarioPoint(t, false, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
                            Double.NaN, List.of(), e.getMessage()));
                    sw.add(unsolved(t, e.getMessage()));
                    failed.add(new PackResults.NotSolved(which, Optional.of(sc.name()), t, status(e), e.getMessage()));
                }
            }
            double[] own = Stress.returnRange(sh.universe(), r.mandate());
            double top = Double.isNaN(max[0]) ? own[1] : max[0];
            results.add(new ScenarioResult(sc, sh, top, ps, new Sweep(sw, own[0], top, List.of())));
        }
        notes.add(failed.isEmpty() ? "The stress run failed as a whole and was repeated in parts; every point was "
                + "then solved." : String.format(Locale.ROOT, "The stress run failed as a whole and was repeated in "
                + "parts; %d point%s could not be solved and %s reported with the solver's message.", failed.size(),
                failed.size() == 1 ? "" : "s", failed.size() == 1 ? "is" : "are"));
        double[] range = Stress.returnRange(r.universe(), r.mandate());
        return new Outcome(new StressResult(new Sweep(base, range[0], range[1], List.of()), results, threads[0],
                new ArrayList<>(notes)), failed);
    }

    /**
     * Runs {@code scenarios} on {@code universe} at {@code targets} (increasing), handing each run that succeeds to
     * {@code ok} and each target that cannot be solved to {@code fail}. A sweep warm-starts each solve from the one
     * before, so where a run fails, the longest run of its first targets that succeeds is found by halving (its
     * solves are exactly those of the failed run up to there), the next target is tried once more on its own, and
     * the run goes on after it.
     */
    private static void split(Runner runner, StressRequest r, AssetUniverse universe, double[] targets,
                              List<Scenario> scenarios, Consumer<StressResult> ok,
                              BiConsumer<Double, NoSolutionException> fail) {
        int from = 0;
        while (from < targets.length) {
            double[] rest = Arrays.copyOfRange(targets, from, targets.length);
            Try all = attempt(runner, request(r, universe, rest, scenarios));
            if (all.ok()) {
                ok.accept(all.result());
                return;
            }
            int good = 0; // the first 'good' targets of rest are solved by one run; the first good + 1 are not
            int bad = rest.length;
            StressResult prefix = null;
            NoSolutionException error = all.error();
            while (bad - good > 1) {
                int mid = (good + bad) >>> 1;
                Try t = attempt(runner, request(r, universe, Arrays.copyOf(rest, mid), scenarios));
                if (t.ok()) {
                    good = mid;
                    prefix = t.result();
                } else {
                    bad = mid;
                    error = t.error();
                }
            }
            if (prefix != null) {
                ok.accept(prefix);
            }
            Try alone = attempt(runner, request(r, universe, new double[] {rest[good]}, scenarios));
            if (alone.ok()) {
                ok.accept(alone.result());
            } else {
                fail.accept(rest[good], error);
            }
            from += good + 1;
        }
    }

    private static StressRequest request(StressRequest r, AssetUniverse universe, double[] targets,
                                         List<Scenario> scenarios) {
        return new StressRequest(universe, r.mandate(), targets, scenarios, r.repair(), r.settings());
    }

    private static TargetPoint unsolved(double t, String why) {
        return new TargetPoint(t, false, null, Double.NaN, Double.NaN, List.of(), why);
    }

    /** A run's result or the solver's failure. */
    private record Try(StressResult result, NoSolutionException error) {
        boolean ok() {
            return error == null;
        }
    }

    private static Try attempt(Runner runner, StressRequest r) {
        try {
            return new Try(runner.run(r, StressProgress.NONE), null);
        } catch (NoSolutionException e) {
            return new Try(null, e);
        }
    }

    /**
     * A constraint-qualification failure is reported as infeasible (the JSON contract's rule); any other solver
     * failure (did not converge, not convex) as not solved.
     */
    private static PackResults.PointStatus status(NoSolutionException e) {
        return e.reason() == NoSolutionException.Reason.CONSTRAINT_QUALIFICATION
                ? PackResults.PointStatus.INFEASIBLE : PackResults.PointStatus.NOT_SOLVED;
    }
}
