package org.isorisk.engine.bench;

import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.GeneratedProblems;
import org.isorisk.engine.solve.SolverSession;

/**
 * Benchmark (not a test): the active-set QP against CVXOPT's interior-point QP on the same problems in the same run.
 * Dense factor-model Σ, long-only, upper bounds {@code max(5 %, 3/n)}, budget; one minimum-variance solve and a
 * 24-target sweep (warm-started here, one by one there), at n = 500 and n = 2000 by default.
 *
 * <p>Run after {@code mvn -pl engine test-compile}:
 * {@code java -cp engine/target/classes:engine/target/test-classes:$(cat cp.txt) org.isorisk.engine.bench.QpBenchmark
 * [n ...]}, with {@code cp.txt} from {@code mvn -pl engine dependency:build-classpath -Dmdep.outputFile=cp.txt}.
 * Needs {@code /usr/bin/python3} with {@code python3-cvxopt} (and {@code libopenblas0-pthread}) for the reference
 * times; without it only isorisk's times are printed. Times are in-process wall-clock medians after warm-up.
 */
public final class QpBenchmark {
    private QpBenchmark() {
    }

    private static final int TARGETS = 24;
    private static final java.lang.management.ThreadMXBean THREADS = ManagementFactory.getThreadMXBean();

    public static void main(String[] args) throws Exception {
        int[] sizes = args.length == 0 ? new int[] {500, 2000} : Arrays.stream(args).mapToInt(Integer::parseInt).toArray();
        boolean python = Files.isExecutable(Path.of("/usr/bin/python3"));
        System.out.printf(Locale.ROOT, "isorisk active-set QP benchmark; %d cores; Java %s%n",
                Runtime.getRuntime().availableProcessors(), System.getProperty("java.version"));
        for (int n : sizes) {
            run(n, python);
        }
    }

    private static void run(int n, boolean python) throws Exception {
        AssetUniverse u = GeneratedProblems.universe(n, 4242 + n);
        Mandate m = GeneratedProblems.longOnly(n);
        int reps = n <= 500 ? 15 : 5;

        // 1. one minimum-variance solve, cold start, in a session whose convexity check (one Cholesky of Σ) is done
        SolverSession session = Allocator.session(u, m, null);
        long c0 = System.nanoTime();
        Solution first = session.solve(Objective.minimumVariance());
        double firstMs = (System.nanoTime() - c0) / 1e6;
        long warmUntil = System.nanoTime() + 3_000_000_000L; // JIT warm-up: about 3 s of repeated solves
        while (System.nanoTime() < warmUntil) {
            session.solve(Objective.minimumVariance());
        }
        double[] solveMs = new double[reps];
        double[] solveCpuMs = new double[reps];
        Solution s = first;
        for (int r = 0; r < reps; r++) {
            long c = THREADS.getCurrentThreadCpuTime();
            long t0 = System.nanoTime();
            s = session.solve(Objective.minimumVariance());
            solveMs[r] = (System.nanoTime() - t0) / 1e6;
            solveCpuMs[r] = (THREADS.getCurrentThreadCpuTime() - c) / 1e6;
        }
        // 2. the same through the front door, each call re-checking Σ (a fresh session per call)
        double[] fullMs = new double[Math.max(3, reps / 3)];
        for (int r = 0; r < fullMs.length; r++) {
            long t0 = System.nanoTime();
            Allocator.solve(new AllocationRequest(u, m, Objective.minimumVariance(), Method.NUMERICAL, null));
            fullMs[r] = (System.nanoTime() - t0) / 1e6;
        }
        // 3. a 24-target sweep, warm-started from the previous target
        ReturnRange rr = session.returnRange();
        double lo = s.expectedReturn();
        double[] targets = new double[TARGETS];
        for (int k = 0; k < TARGETS; k++) {
            targets[k] = lo + (rr.max() - lo) * (k + 0.5) / TARGETS;
        }
        double sweepMs = Double.POSITIVE_INFINITY;
        double worstSweepCert = 0;
        for (int rep = 0; rep < 3; rep++) {
            long t0 = System.nanoTime();
            Solution prev = s;
            double worst = 0;
            for (double t : targets) {
                prev = session.solve(Objective.targetReturn(t), prev);
                worst = Math.max(worst, prev.certificate().worst());
            }
            sweepMs = Math.min(sweepMs, (System.nanoTime() - t0) / 1e6);
            worstSweepCert = worst;
        }
        long free = s.notes().stream().filter(x -> x.startsWith("Solved")).count();
        System.out.printf(Locale.ROOT, "%nn = %d (upper bound %.4f, %d assets away from their bounds; %s)%n", n,
                m.upper(0), s.multipliers().stream().filter(x -> x.constraint().startsWith("lower:") && !x.binding())
                        .count(), free > 0 ? s.notes().get(0) : "");
        System.out.printf(Locale.ROOT, "  isorisk min-variance solve (session, Σ checked once): median %.1f ms wall, "
                + "%.1f ms CPU (first call incl. check and JIT %.1f ms); certificate %.1e%n", median(solveMs),
                median(solveCpuMs), firstMs, s.certificate().worst());
        System.out.printf(Locale.ROOT, "  isorisk Allocator.solve incl. Σ positive-definiteness check: median %.1f ms%n",
                median(fullMs));
        System.out.printf(Locale.ROOT, "  isorisk %d-target warm sweep: %.1f ms total; worst certificate %.1e%n", TARGETS,
                sweepMs, worstSweepCert);
        System.out.printf(Locale.ROOT, "  peak heap so far: %.0f MB%n", peakHeapMb());
        if (python) {
            List<String> out = cvxopt(u, m, targets);
            for (String line : out) {
                System.out.println("  " + line);
            }
            double cvx = parse(out, "cvxopt_minvar_default_s");
            double cvxTight = parse(out, "cvxopt_minvar_tight_s");
            double cvxSweep = parse(out, "cvxopt_sweep_default_s");
            double cvxCpu = parseCpu(out, "cvxopt_minvar_default_s");
            System.out.printf(Locale.ROOT, "  ratio isorisk/CVXOPT, one solve: %.3f (default tolerances), %.3f (tight); "
                            + "incl. Σ check: %.3f; sweep: %.3f%n", median(solveMs) / 1e3 / cvx,
                    median(solveMs) / 1e3 / cvxTight, median(fullMs) / 1e3 / cvx, sweepMs / 1e3 / cvxSweep);
            System.out.printf(Locale.ROOT, "  CPU-time ratio, one solve (isorisk thread / CVXOPT process): %.3f%n",
                    median(solveCpuMs) / 1e3 / cvxCpu);
        }
    }

    private static double median(double[] v) {
        double[] c = v.clone();
        Arrays.sort(c);
        return c[c.length / 2];
    }

    private static double peakHeapMb() {
        double peak = 0;
        for (MemoryPoolMXBean p : ManagementFactory.getMemoryPoolMXBeans()) {
            if (p.getType() == MemoryType.HEAP) {
                peak += p.getPeakUsage().getUsed();
            }
        }
        return peak / 1e6;
    }

    private static double parse(List<String> lines, String key) {
        for (String l : lines) {
            if (l.startsWith(key + " ")) {
                return Double.parseDouble(l.substring(key.length() + 1).trim().split(" ")[0]);
            }
        }
        return Double.NaN;
    }

    private static double parseCpu(List<String> lines, String key) {
        for (String l : lines) {
            if (l.startsWith(key + " ")) {
                int at = l.indexOf("cpu ");
                return Double.parseDouble(l.substring(at + 4).trim().split(" ")[0]);
            }
        }
        return Double.NaN;
    }

    /** Writes Σ, μ and the targets as raw little-endian doubles and times CVXOPT on them in one Python process. */
    private static List<String> cvxopt(AssetUniverse u, Mandate m, double[] targets) throws IOException,
            InterruptedException {
        int n = u.size();
        Path dir = Files.createTempDirectory("isorisk-bench");
        try {
            ByteBuffer buf = ByteBuffer.allocate(8 * n * n).order(ByteOrder.LITTLE_ENDIAN);
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    buf.putDouble(u.covariance(i, j));
                }
            }
            Files.write(dir.resolve("sigma.bin"), buf.array());
            ByteBuffer mu = ByteBuffer.allocate(8 * n).order(ByteOrder.LITTLE_ENDIAN);
            for (int i = 0; i < n; i++) {
                mu.putDouble(u.expectedReturn(i));
            }
            Files.write(dir.resolve("mu.bin"), mu.array());
            ByteBuffer tb = ByteBuffer.allocate(8 * targets.length).order(ByteOrder.LITTLE_ENDIAN);
            for (double t : targets) {
                tb.putDouble(t);
            }
            Files.write(dir.resolve("targets.bin"), tb.array());
            Path script = dir.resolve("bench.py");
            Files.writeString(script, PY.replace("UPPER", Double.toString(m.upper(0))), StandardCharsets.UTF_8);
            Process p = new ProcessBuilder("/usr/bin/python3", script.toString(), dir.toString())
                    .redirectErrorStream(true).start();
            p.getOutputStream().close(); // no input
            String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            p.waitFor();
            return new ArrayList<>(Arrays.asList(out.strip().split("\n")));
        } finally {
            try (var files = Files.list(dir)) {
                for (Path f : files.toList()) {
                    Files.delete(f);
                }
            }
            Files.delete(dir);
        }
    }

    /** CVXOPT at its best: dense P = 2Σ, sparse bound rows, OpenBLAS; best of five, solve call only. */
    private static final String PY = """
            import sys, time
            import numpy as np
            from cvxopt import matrix, spmatrix, solvers
            d = sys.argv[1]
            mu = np.fromfile(d + '/mu.bin', dtype='<f8'); n = mu.size
            S = np.fromfile(d + '/sigma.bin', dtype='<f8').reshape(n, n)
            targets = np.fromfile(d + '/targets.bin', dtype='<f8')
            P = matrix(2.0 * S); q = matrix(0.0, (n, 1))
            G = spmatrix([-1.0] * n + [1.0] * n, list(range(2 * n)), list(range(n)) * 2)
            h = matrix([0.0] * n + [UPPER] * n)
            A1 = matrix(1.0, (1, n)); b1 = matrix(1.0)
            def timed(opts, A, b):
                solvers.options.clear(); solvers.options.update(opts); solvers.options['show_progress'] = False
                best = None
                for _ in range(5):
                    c = time.process_time(); t = time.perf_counter(); sol = solvers.qp(P, q, G, h, A, b)
                    e = time.perf_counter() - t; ce = time.process_time() - c
                    if best is None or e < best[0]:
                        best = (e, ce)
                return best, sol
            tight = {'abstol': 1e-13, 'reltol': 1e-13, 'feastol': 1e-13}
            t, sol = timed({}, A1, b1)
            print('cvxopt_minvar_default_s %.4f status %s iterations %d cpu %.4f' % (t[0], sol['status'], sol['iterations'], t[1]))
            t, sol = timed(tight, A1, b1)
            print('cvxopt_minvar_tight_s %.4f status %s iterations %d cpu %.4f' % (t[0], sol['status'], sol['iterations'], t[1]))
            solvers.options.clear(); solvers.options['show_progress'] = False
            A2 = matrix(np.vstack([np.ones(n), mu])); start = time.perf_counter()
            for m in targets:
                solvers.qp(P, q, G, h, A2, matrix([1.0, float(m)]))
            print('cvxopt_sweep_default_s %.4f (%d targets, one by one)' % (time.perf_counter() - start, len(targets)))
            """;
}
