package org.isorisk.bench;

import java.io.PrintStream;
import java.lang.management.ManagementFactory;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
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
import org.isorisk.engine.synthetic.FactorModels;

/**
 * Rebalancing and stress through the public API on the signed factor-model problems
 * ({@link FactorModels#signedUniverse}), fully invested with every asset in {@code [0, 5/n]}: one
 * {@link Rebalancer#rebalance} from equal weights to a return {@link #RETURN_STEP} higher under a two-way turnover
 * limit of {@link #MAX_TURNOVER}, and one {@link Stress#run} of {@link #TARGETS} return targets × 5 scenarios
 * (plus the base sweep). Issue 6's targets: the rebalance under 0.5 s and the stress run under 10 s at n = 500.
 */
final class RebalanceStressCase implements BenchCase {
    static final List<Integer> SIZES = List.of(500);
    static final long SEED = 20_260_101L;
    static final int TARGETS = 40;
    /** Largest two-way turnover of the rebalance, decimal. */
    static final double MAX_TURNOVER = 0.2;
    /** The rebalance asks for today's expected return plus this much, decimal. */
    static final double RETURN_STEP = 0.005;
    /** Issue 6's budget for one rebalance at n = 500, seconds. */
    static final double TARGET_REBALANCE = 0.5;
    /** Issue 6's budget for the 40-target × 5-scenario stress run at n = 500, seconds. */
    static final double TARGET_STRESS = 10.0;

    @Override
    public String name() {
        return "rebalance-stress";
    }

    @Override
    public String description() {
        return "one rebalance under a " + Math.round(100 * MAX_TURNOVER) + " % turnover limit and a " + TARGETS
                + "-target x 5-scenario stress run, bounds 0 <= w <= 5/n, dense " + FactorModels.SIGNED_FACTORS
                + "-factor problems";
    }

    @Override
    public void run(Options options, PrintStream out) throws Exception {
        SolverSettings settings = SolverSettings.defaults().withThreads(options.threads());
        out.printf(Locale.ROOT, "java %s, %d thread(s), %d processor(s); medians after %d warm-up run(s) (stress: "
                        + "at most 1)%n", System.getProperty("java.version"), settings.threads(),
                Runtime.getRuntime().availableProcessors(), options.warmup());
        out.printf(Locale.ROOT, "%6s %9s %9s %9s %8s %11s %7s %9s %9s %9s %8s %7s%n", "n", "rebal ms", "cpu ms",
                "turnover", "vol", "certificate", "target", "stress s", "cpu s", "feasible", "peak MB", "target");
        for (int n : options.sizesOr(SIZES)) {
            row(n, options, settings, out);
        }
        out.println("rebal ms: Rebalancer.rebalance from equal weights to their expected return + "
                + RETURN_STEP + " with two-way turnover at most " + MAX_TURNOVER + "; cpu ms: this process's CPU "
                + "time for it (steadier than wall time on a shared machine); turnover, vol: the proposal's; "
                + "certificate: the proposal's KKT certificate; stress s: Stress.run over " + TARGETS + " targets "
                + "from 10 % to 95 % of the mandate's return range, for the base and 5 scenarios (volatility x1.5, "
                + "correlation shift 0.5, returns -1 % on the first half, first-half volatility x2, mixed); "
                + "feasible: target x scenario points solved, of " + TARGETS * 5 + "; peak MB: heap during the "
                + "runs (all pools, an upper bound); target: rebalance under " + TARGET_REBALANCE + " s with a "
                + "passing certificate, stress under " + TARGET_STRESS + " s, at n = 500 (issue 6).");
    }

    private static void row(int n, Options options, SolverSettings settings, PrintStream out) throws Exception {
        AssetUniverse u = FactorModels.signedUniverse(n, SEED + n);
        Mandate m = FactorModels.boxed(n, 0.0, 5.0 / n);
        double[] today = new double[n];
        Arrays.fill(today, 1.0 / n);
        double todayReturn = 0;
        for (int i = 0; i < n; i++) {
            todayReturn += u.expectedReturn(i) * today[i];
        }
        RebalanceRequest rebalance = new RebalanceRequest(u, m, Holdings.ofWeights(u.assets(), today, 1e9),
                TradingLimits.none(n).withMaxTurnover(MAX_TURNOVER),
                new RebalanceObjective.TargetReturn(todayReturn + RETURN_STEP), settings);
        RebalanceResult result = Rebalancer.rebalance(rebalance);
        List<Double> rebalanceCpu = new ArrayList<>();
        Timing.Result rebalanceTime = Timing.measure(options.warmup(), options.repsOr(5), () -> {
            long c = cpuNanos();
            double v = Rebalancer.rebalance(rebalance).proposedVolatility();
            rebalanceCpu.add((cpuNanos() - c) / 1e9);
            return v;
        });
        boolean passes = result.proposal().certificate().passes();

        StressRequest stress = new StressRequest(u, m, targets(Stress.returnRange(u, m)), scenarios(n), null,
                settings);
        List<Double> stressCpu = new ArrayList<>();
        StressResult[] last = new StressResult[1];
        Timing.Result stressTime = Timing.measure(Math.min(1, options.warmup()), options.repsOr(1), () -> {
            long c = cpuNanos();
            last[0] = Stress.run(stress, null);
            stressCpu.add((cpuNanos() - c) / 1e9);
            return last[0].threads();
        });
        long feasible = last[0].scenarios().stream().flatMap(s -> s.points().stream()).filter(p -> p.feasible())
                .count();

        boolean rebalanceMet = rebalanceTime.medianSeconds() < TARGET_REBALANCE && passes;
        boolean stressMet = stressTime.medianSeconds() < TARGET_STRESS;
        long peak = Math.max(rebalanceTime.peakHeapBytes(), stressTime.peakHeapBytes());
        out.printf(Locale.ROOT, "%6d %9.1f %9.1f %9.4f %8.4f %11s %7s %9.2f %9.2f %9s %8.0f %7s%n", n,
                1e3 * rebalanceTime.medianSeconds(), 1e3 * measuredMedian(rebalanceCpu, options.repsOr(5)),
                result.turnover(), result.proposedVolatility(), passes ? "passes" : "FAILS",
                n == 500 ? (rebalanceMet ? "met" : "MISSED") : "-", stressTime.medianSeconds(),
                measuredMedian(stressCpu, options.repsOr(1)), feasible + "/" + TARGETS * 5, peak / 1048576.0,
                n == 500 ? (stressMet ? "met" : "MISSED") : "-");
        if (!passes) {
            out.println("WARNING n=" + n + ": the rebalance's certificate fails: "
                    + result.proposal().certificate());
        }
    }

    /** {@link #TARGETS} evenly spaced returns from 10 % to 95 % of the way across {@code range} (low, high). */
    static double[] targets(double[] range) {
        double a = range[0] + 0.1 * (range[1] - range[0]);
        double b = range[1] - 0.05 * (range[1] - range[0]);
        double[] t = new double[TARGETS];
        for (int k = 0; k < TARGETS; k++) {
            t[k] = a + (b - a) * k / (TARGETS - 1);
        }
        return t;
    }

    /** Five invented scenarios: whole-universe and first-half shocks to volatility, correlation and returns. */
    static List<Scenario> scenarios(int n) {
        List<Integer> half = new ArrayList<>();
        for (int i = 0; i < n / 2; i++) {
            half.add(i);
        }
        Scope all = Scope.all(n);
        Scope firstHalf = new Scope(Scope.Kind.GROUP, "first half", half);
        return List.of(
                new Scenario("vol x1.5", "", List.of(new Shock.VolatilityMultiplier(all, 1.5))),
                new Scenario("crisis", "", List.of(new Shock.CorrelationShift(all, 0.5))),
                new Scenario("returns -1%", "", List.of(new Shock.ReturnShift(firstHalf, -0.01))),
                new Scenario("half vol x2", "", List.of(new Shock.VolatilityMultiplier(firstHalf, 2.0))),
                new Scenario("mixed", "", List.of(new Shock.VolatilityMultiplier(all, 1.2),
                        new Shock.CorrelationShift(all, 0.3))));
    }

    /** The median of the last {@code reps} entries (the measured runs; the first ones were the warm-up). */
    private static double measuredMedian(List<Double> seconds, int reps) {
        double[] t = new double[reps];
        for (int i = 0; i < reps; i++) {
            t[i] = seconds.get(seconds.size() - reps + i);
        }
        return Timing.median(t);
    }

    /** CPU time of this process so far, nanoseconds (all its threads). */
    private static long cpuNanos() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean())
                .getProcessCpuTime();
    }
}
