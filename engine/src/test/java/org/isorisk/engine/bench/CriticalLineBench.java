package org.isorisk.engine.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.synthetic.FactorModels;

/**
 * Benchmark of the critical line method (a main, not a test): dense factor-model problems from
 * {@link FactorModels} (fixed seed), fully invested, long-only, each asset at most {@code max(5 %, 3/n)}.
 * For each size it times, in-process after warm-up runs, the whole efficient corner-portfolio frontier (every
 * corner a certified solution with its multipliers), the same with the inefficient branch, one bounded
 * minimum-variance solve and one target solve, and reports the worst certificate residual and the peak heap.
 *
 * <p>Run: {@code mvn -q -o test-compile -pl engine} then
 * {@code java -Xmx2g -cp engine/target/classes:engine/target/test-classes:<commons-math3 jar>
 * org.isorisk.engine.bench.CriticalLineBench [n ...] [--repeat R]}; defaults: n = 500 2000, R = 3.
 */
public final class CriticalLineBench {
    private CriticalLineBench() {
    }

    public static void main(String[] args) {
        List<Integer> sizes = new ArrayList<>();
        int repeat = 3;
        for (int i = 0; i < args.length; i++) {
            if (args[i].equals("--repeat")) {
                repeat = Integer.parseInt(args[++i]);
            } else {
                sizes.add(Integer.parseInt(args[i]));
            }
        }
        if (sizes.isEmpty()) {
            sizes = List.of(500, 2000);
        }
        System.out.printf(Locale.ROOT, "critical line benchmark: java %s, %d processors, max heap %d MB%n",
                System.getProperty("java.version"), Runtime.getRuntime().availableProcessors(),
                Runtime.getRuntime().maxMemory() >> 20);
        for (int n : sizes) {
            run(n, repeat);
        }
    }

    private static void run(int n, int repeat) {
        AssetUniverse u = FactorModels.universe(n, FactorModels.DEFAULT_SEED);
        Mandate m = FactorModels.longOnlyCapped(n);
        SolverSettings s = SolverSettings.defaults();
        // Warm-up: let the JIT compile the hot loops before timing.
        for (int w = 0; w < 2; w++) {
            Frontiers.mandate(u, m, Grid.none(), s);
        }
        System.gc();
        resetPeaks();
        double[] eff = new double[repeat];
        double[] both = new double[repeat];
        double[] mv = new double[repeat];
        double[] one = new double[repeat];
        Frontier fr = null;
        Frontier fb = null;
        Solution mvs = null;
        for (int r = 0; r < repeat; r++) {
            long t0 = System.nanoTime();
            fr = Frontiers.mandate(u, m, Grid.none(), s);
            long t1 = System.nanoTime();
            fb = Frontiers.mandate(u, m, Grid.none(), true, s);
            long t2 = System.nanoTime();
            mvs = Allocator.solve(AllocationRequest.of(u, m, Objective.minimumVariance()));
            long t3 = System.nanoTime();
            double mid = 0.5 * (fr.minReturn() + fr.maxReturn());
            Allocator.solve(AllocationRequest.of(u, m, Objective.targetReturn(mid)));
            long t4 = System.nanoTime();
            eff[r] = (t1 - t0) / 1e9;
            both[r] = (t2 - t1) / 1e9;
            mv[r] = (t3 - t2) / 1e9;
            one[r] = (t4 - t3) / 1e9;
        }
        long peak = peakHeap();
        double worst = 0;
        int maxFree = 0;
        for (Corner c : fb.corners()) {
            worst = Math.max(worst, c.portfolio().certificate().worst());
            maxFree = Math.max(maxFree, c.free().size());
        }
        for (Corner c : fb.inefficientCorners()) {
            worst = Math.max(worst, c.portfolio().certificate().worst());
        }
        System.out.printf(Locale.ROOT, "n=%d: %d efficient corners (+%d inefficient), largest free set %d, "
                        + "returns %.4f..%.4f..%.4f%n", n, fr.corners().size(), fb.inefficientCorners().size(), maxFree,
                fr.lowestReturn(), fr.minReturn(), fr.maxReturn());
        System.out.printf(Locale.ROOT, "  efficient corner frontier: best %.3f s, median %.3f s%n", min(eff), median(eff));
        System.out.printf(Locale.ROOT, "  both branches:             best %.3f s, median %.3f s%n", min(both),
                median(both));
        System.out.printf(Locale.ROOT, "  one minimum-variance solve: best %.3f s (volatility %.4f, certificate %.1e)%n",
                min(mv), mvs.volatility(), mvs.certificate().worst());
        System.out.printf(Locale.ROOT, "  one target solve (mid-frontier): best %.3f s%n", min(one));
        System.out.printf(Locale.ROOT, "  worst certificate residual over all corners: %.2e%n", worst);
        System.out.printf(Locale.ROOT, "  peak heap (sum of heap pools' peaks, an upper bound): %d MB%n", peak >> 20);
    }

    private static void resetPeaks() {
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                p.resetPeakUsage();
            }
        }
    }

    private static long peakHeap() {
        long s = 0;
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                s += p.getPeakUsage().getUsed();
            }
        }
        return s;
    }

    private static double min(double[] a) {
        return Arrays.stream(a).min().orElse(Double.NaN);
    }

    private static double median(double[] a) {
        double[] b = a.clone();
        Arrays.sort(b);
        return b[b.length / 2];
    }
}
