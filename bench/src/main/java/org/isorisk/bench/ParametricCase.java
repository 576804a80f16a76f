package org.isorisk.bench;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.ParametricBenchAccess;
import org.isorisk.engine.synthetic.FactorModels;

/**
 * The exact group frontier by the parametric active-set method (engine.solve.ParametricQp, reached through
 * {@link ParametricBenchAccess}) on {@link FactorModels#grouped} mandates (long-only with maxima, two groups and a
 * general row) over both factor-model recipes: the whole efficient branch, every corner certified. Beside it, in
 * the same run and over as many targets as the exact frontier has corners: the existing sampled sweep
 * ({@link Frontiers#sampled}: one active-set QP per target, warm-started) and CVXOPT's interior-point QP solving
 * the targets one by one ({@code bench/cvxopt_group_reference.py}, default tolerances).
 */
final class ParametricCase implements BenchCase {
    static final List<Integer> SIZES = List.of(25, 60, 200, 500);
    static final long SEED = 20_260_101L;
    /** Certificate residual every corner must reach for the timing to count. */
    static final double CERTIFICATE = 1e-9;

    @Override
    public String name() {
        return "parametric";
    }

    @Override
    public String description() {
        return "exact group frontier by the parametric active-set method (every corner certified) against the "
                + "sampled active-set sweep and a CVXOPT loop over as many targets";
    }

    @Override
    public void run(Options options, PrintStream out) throws Exception {
        SolverSettings settings = SolverSettings.defaults().withThreads(options.threads());
        Path script = options.reference() ? NumpyReference.script("cvxopt_group_reference.py", "CVXOPT", out) : null;
        String python = script != null ? NumpyReference.python("CVXOPT", "python3-cvxopt", out) : null;
        out.printf(Locale.ROOT, "java %s, %d thread(s); medians after %d warm-up run(s)%n",
                System.getProperty("java.version"), settings.threads(), options.warmup());
        if (python != null) {
            out.println("reference: " + NumpyReference.overridesNote());
        }
        StringBuilder rows = new StringBuilder();
        List<String> notes = new ArrayList<>();
        String description = null;
        for (int n : options.sizesOr(SIZES)) {
            for (String model : List.of("bench", "market")) {
                AssetUniverse u = model.equals("bench") ? FactorModels.signedUniverse(n, SEED + n)
                        : FactorModels.universe(n, FactorModels.DEFAULT_SEED);
                Mandate m = FactorModels.grouped(n);
                int reps = options.repsOr(n >= 500 ? 3 : 7);
                ParametricBenchAccess.Walk once = ParametricBenchAccess.walk(u, m, null, false, settings,
                        new double[0]);
                int k = once.corners();
                double lo = once.targets()[0];
                double hi = once.targets()[k - 1];
                double[] inside = new double[k];
                for (int j = 0; j < k; j++) {
                    inside[j] = lo + (hi - lo) * (j + 0.5) / k;
                }
                ParametricBenchAccess.Walk check = ParametricBenchAccess.walk(u, m, null, false, settings, inside);
                if (once.worstCertificate() > CERTIFICATE) {
                    out.printf(Locale.ROOT, "WARNING n=%d %s: a corner's certificate residual is %.2e%n", n, model,
                            once.worstCertificate());
                }
                Timing.Result exact = Timing.measure(options.warmup(), reps,
                        () -> ParametricBenchAccess.walk(u, m, null, false, settings, new double[0]).corners());
                Frontier sampled = Frontiers.sampled(u, m, Grid.points(k), settings);
                double sampledDiff = largestDifference(sampled, check, u, m, settings);
                Timing.Result sweep = Timing.measure(options.warmup(), reps,
                        () -> Frontiers.sampled(u, m, Grid.points(k), settings).points().size());
                String ref = String.format(Locale.ROOT, "%10s %8s %8s %8s", "-", "-", "-", "-");
                if (python != null) {
                    JsonNode j = cvxopt(python, script, u, m, inside, check.weightsAt(), n >= 500 ? 1 : 3);
                    double cvx = j.path("sweep_s").asDouble();
                    ref = String.format(Locale.ROOT, "%10.1f %8.3f %8.1e %8.1e", 1e3 * cvx,
                            exact.medianSeconds() / cvx, j.path("weights_diff").asDouble(),
                            j.path("weights_diff_tight").asDouble());
                    notes.add(String.format(Locale.ROOT, "n=%d %s CVXOPT: %s, %d iterations over %d targets", n,
                            model, j.path("status").asText(), j.path("iterations").asInt(), j.path("targets").asInt()));
                    description = "cvxopt " + j.path("cvxopt").asText() + ", python " + j.path("python").asText() + " ("
                            + j.path("openblas").asText() + ")";
                }
                rows.append(String.format(Locale.ROOT, "%6d %-7s %8d %6d %7d %10.1f %10.1f %7.3f %8.1e %s %8.1e%n", n,
                        model, k, once.largestFree(), once.events(), 1e3 * exact.medianSeconds(),
                        1e3 * sweep.medianSeconds(), exact.medianSeconds() / sweep.medianSeconds(), sampledDiff, ref,
                        once.worstCertificate()));
            }
        }
        if (description != null) {
            out.println("reference: " + description);
        }
        out.printf(Locale.ROOT, "%6s %-7s %8s %6s %7s %10s %10s %7s %8s %10s %8s %8s %8s %8s%n", "n", "model",
                "corners", "free", "events", "exact ms", "sampled ms", "ratio", "|dw| smp", "cvx ms", "ratio",
                "|dw| cvx", "|dw| 1e-13", "worst");
        out.print(rows);
        for (String note : notes) {
            out.println(note);
        }
        out.println("model bench: FactorModels.signedUniverse, market: FactorModels.universe; mandate: "
                + "FactorModels.grouped (long-only, maxima max(5 %, 3/n), first third 20-45 %, last quarter at most "
                + "25 %, a weighted middle row at most 30 %). corners: corners of the exact efficient frontier (its "
                + "ends included); free: largest free set of a piece; events: working-set changes of the start and the "
                + "walk; exact ms: the whole efficient frontier (every corner's weights, multipliers and certificate); "
                + "sampled ms: Frontiers.sampled over as many targets as corners (one warm-started active-set QP "
                + "each, range and minimum-variance solve included); ratio: exact/sampled; |dw| smp: largest weight "
                + "difference of the sampled points from the exact frontier at the same targets; cvx ms: CVXOPT "
                + "solving as many targets (spread strictly inside the range) one by one at its default tolerances; "
                + "ratio: exact/CVXOPT; |dw| cvx: largest weight difference of CVXOPT's answers from the exact "
                + "frontier there; |dw| 1e-13: the same for five of those targets solved again at tolerances 1e-13 "
                + "(untimed: both solve the same problem); worst: largest certificate residual over the corners.");
    }

    /** Largest weight difference of the sampled points from the exact frontier at the same targets. */
    private static double largestDifference(Frontier sampled, ParametricBenchAccess.Walk exact, AssetUniverse u,
                                            Mandate m, SolverSettings settings) {
        double[] t = new double[sampled.points().size()];
        for (int j = 0; j < t.length; j++) {
            t[j] = sampled.points().get(j).expectedReturn();
        }
        double lo = exact.targets()[0];
        double hi = exact.targets()[exact.targets().length - 1];
        for (int j = 0; j < t.length; j++) {
            t[j] = Math.max(lo, Math.min(hi, t[j]));
        }
        ParametricBenchAccess.Walk at = ParametricBenchAccess.walk(u, m, null, false, settings, t);
        double worst = 0;
        for (int j = 0; j < t.length; j++) {
            Solution s = sampled.points().get(j);
            for (int i = 0; i < u.size(); i++) {
                worst = Math.max(worst, Math.abs(s.weight(i) - at.weightsAt()[j][i]));
            }
        }
        return worst;
    }

    /** CVXOPT over the targets, in a child process. */
    private static JsonNode cvxopt(String python, Path script, AssetUniverse u, Mandate m, double[] targets,
                                   double[][] ours, int reps) throws IOException, InterruptedException {
        int n = u.size();
        List<LinearConstraint> rows = m.rows(u.assets());
        double[][] a = new double[rows.size()][];
        double[] rel = new double[rows.size()];
        double[] lim = new double[rows.size()];
        for (int r = 0; r < rows.size(); r++) {
            LinearConstraint c = rows.get(r);
            a[r] = c.coefficients();
            rel[r] = c.relation() == Relation.EQUAL ? 0 : c.relation() == Relation.AT_MOST ? 1 : -1;
            lim[r] = c.limit();
        }
        Path dir = Files.createTempDirectory("isorisk-bench");
        try {
            NumpyReference.writeMatrix(dir.resolve("sigma.f8"), u.covariance());
            NumpyReference.writeVector(dir.resolve("mu.f8"), u.expectedReturns());
            NumpyReference.writeMatrix(dir.resolve("rows.f8"), a);
            NumpyReference.writeVector(dir.resolve("relations.f8"), rel);
            NumpyReference.writeVector(dir.resolve("limits.f8"), lim);
            NumpyReference.writeVector(dir.resolve("lower.f8"), m.lower());
            NumpyReference.writeVector(dir.resolve("upper.f8"), m.upper());
            NumpyReference.writeVector(dir.resolve("targets.f8"), targets);
            NumpyReference.writeMatrix(dir.resolve("weights.f8"), ours);
            List<String> args = new ArrayList<>();
            for (String f : List.of("sigma", "mu", "rows", "relations", "limits", "lower", "upper", "targets",
                    "weights")) {
                args.add("--" + f);
                args.add(dir.resolve(f + ".f8").toString());
            }
            args.addAll(List.of("--n", Integer.toString(n), "--k", Integer.toString(rows.size()), "--reps",
                    Integer.toString(reps), "--warmup", "0"));
            return NumpyReference.runJson(python, script, args);
        } finally {
            NumpyReference.deleteFlat(dir);
        }
    }
}
