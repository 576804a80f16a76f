package org.isorisk.engine.bench;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.TestUniverses;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.Scope;
import org.isorisk.engine.stress.Shock;
import org.isorisk.engine.stress.Stress;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;

/**
 * Speed benchmark (not a test): one rebalance of n assets with bounds and a turnover limit, and a
 * 40-target × 5-scenario stress run. Run with
 * {@code java -cp engine/target/classes:engine/target/test-classes:<dependencies> org.isorisk.engine.bench.RebalanceStressBenchmark [n] [threads] [both|rebalance|stress|stress-qp]}.
 * Prints wall-clock times measured inside the process (after a warm-up run), excluding JVM start-up.
 */
public final class RebalanceStressBenchmark {
    private RebalanceStressBenchmark() {
    }

    /** CPU time of this JVM process, in nanoseconds (robust when other jobs share the cores). */
    static long cpu() {
        return ((com.sun.management.OperatingSystemMXBean) java.lang.management.ManagementFactory
                .getOperatingSystemMXBean()).getProcessCpuTime();
    }

    public static void main(String[] args) {
        int n = args.length > 0 ? Integer.parseInt(args[0]) : 500;
        int threads = args.length > 1 ? Integer.parseInt(args[1]) : 2;
        String only = args.length > 2 ? args[2] : "both";
        AssetUniverse u = TestUniverses.random(n, 42);
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(hi, 5.0 / n);
        Mandate m = Mandate.fullyInvested(n).withBounds(lo, hi);
        double[] w0 = new double[n];
        Arrays.fill(w0, 1.0 / n);
        SolverSettings settings = SolverSettings.defaults().withThreads(threads);
        System.out.printf(Locale.ROOT, "n = %d, bounds 0 <= w <= %.4f, %d thread(s), %d processors%n", n, 5.0 / n,
                threads, Runtime.getRuntime().availableProcessors());
        if (!only.startsWith("stress")) {
            double target = 0;
            for (int i = 0; i < n; i++) {
                target += u.expectedReturn(i) * w0[i];
            }
            RebalanceRequest r = new RebalanceRequest(u, m, Holdings.ofWeights(u.assets(), w0, 1e9),
                    TradingLimits.none(n).withMaxTurnover(0.2), new RebalanceObjective.TargetReturn(target + 0.005),
                    settings);
            java.lang.management.ThreadMXBean mx = java.lang.management.ManagementFactory.getThreadMXBean();
            double bestWall = Double.POSITIVE_INFINITY;
            double bestCpu = Double.POSITIVE_INFINITY;
            RebalanceResult res = null;
            for (int k = 0; k < 6; k++) { // the first runs warm up the JIT; the best of the rest is reported
                long c0 = mx.getCurrentThreadCpuTime();
                long t0 = System.nanoTime();
                res = Rebalancer.rebalance(r);
                long t1 = System.nanoTime();
                long c1 = mx.getCurrentThreadCpuTime();
                if (k >= 2) {
                    bestWall = Math.min(bestWall, (t1 - t0) / 1e9);
                    bestCpu = Math.min(bestCpu, (c1 - c0) / 1e9);
                }
            }
            System.out.printf(Locale.ROOT, "rebalance: best of 4 after warm-up: %.3f s wall, %.3f s CPU of the calling "
                            + "thread (turnover %.4f, volatility %.6f, certificate %s)%n", bestWall, bestCpu,
                    res.turnover(), res.proposedVolatility(),
                    res.proposal().certificate().passes() ? "passes" : "FAILS " + res.proposal().certificate());
        }
        if (only.equals("stress-qp")) {
            // the same stress run with a group limit that never binds, so that every target goes through the
            // active-set QP (warm-started) instead of the exact critical-line frontier
            java.util.List<Integer> allIdx = java.util.stream.IntStream.range(0, n).boxed().toList();
            m = new Mandate(1.0, lo, hi, java.util.Map.of(), List.of(new org.isorisk.engine.model.Group("All",
                    allIdx, Double.NEGATIVE_INFINITY, 2.0)), List.of());
        }
        if (!only.equals("rebalance")) {
            double[] range = Stress.returnRange(u, m);
            double[] targets = new double[40];
            double a = range[0] + 0.1 * (range[1] - range[0]);
            double b = range[1] - 0.05 * (range[1] - range[0]);
            for (int k = 0; k < 40; k++) {
                targets[k] = a + (b - a) * k / 39;
            }
            List<Integer> half = new ArrayList<>();
            for (int i = 0; i < n / 2; i++) {
                half.add(i);
            }
            Scope all = Scope.all(n);
            Scope g = new Scope(Scope.Kind.GROUP, "first half", half);
            List<Scenario> sc = List.of(
                    new Scenario("vol x1.5", "", List.of(new Shock.VolatilityMultiplier(all, 1.5))),
                    new Scenario("crisis", "", List.of(new Shock.CorrelationShift(all, 0.5))),
                    new Scenario("returns -1%", "", List.of(new Shock.ReturnShift(g, -0.01))),
                    new Scenario("half vol x2", "", List.of(new Shock.VolatilityMultiplier(g, 2.0))),
                    new Scenario("mixed", "", List.of(new Shock.VolatilityMultiplier(all, 1.2),
                            new Shock.CorrelationShift(all, 0.3))));
            StressRequest sr = new StressRequest(u, m, targets, sc, null, settings);
            long c0 = cpu();
            long t0 = System.nanoTime();
            StressResult res = Stress.run(sr, null);
            long t1 = System.nanoTime();
            long c1 = cpu();
            long feasible = res.scenarios().stream().flatMap(s -> s.points().stream()).filter(p -> p.feasible()).count();
            System.out.printf(Locale.ROOT, "stress: 40 targets x 5 scenarios (+ base): %.3f s wall, %.3f s CPU (process), %d of 200 feasible, %d thread(s)%n", (t1 - t0) / 1e9, (c1 - c0) / 1e9, feasible,
                    res.threads());
        }
    }
}
