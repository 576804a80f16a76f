package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.ReturnRange;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The active-set QP against two independent solvers from Debian's packages, run through the scripts in
 * {@code src/test/scripts}: R's quadprog (Goldfarb &amp; Idnani 1983 dual method, {@code r-cran-quadprog}) and
 * CVXOPT's interior-point QP ({@code python3-cvxopt}, tolerances 1e-14 with refinement). Generated problems with n = 10 … 500
 * (dense factor-model Σ, long-only, upper bounds max(5 %, 3/n), two groups and a general constraint) at several
 * targets across the achievable range, plus the sample fund under the sample policy. Weights agree to 1e-8;
 * multipliers, after the scripts map the solvers' dual signs to ∂V*∂limit, to 1e-7 relative: for quadprog
 * relative to each multiplier (with a floor of 1e-3 of the solution's largest one), for the interior-point CVXOPT
 * relative to the solution's largest multiplier, since its duals of slack or weakly active constraints carry an
 * absolute error of the order of its stopping tolerance. Where the binding constraints are linearly dependent the
 * multipliers are not unique: there only the weights compare, and the solution must carry the note that says so.
 *
 * <p>Skipped, with a message, when Rscript with quadprog or /usr/bin/python3 with cvxopt is missing; under CI
 * (environment CI=true) a missing solver fails the test instead, since .ci/run installs them.
 */
class ExternalSolverCrossCheckTests {
    private static final Path SCRIPTS = Path.of("src", "test", "scripts");
    private static final double WEIGHT_TOL = 1e-8;
    private static final double MULTIPLIER_TOL = 1e-7;

    private record Case(String name, AssetUniverse universe, Mandate mandate, Solution ours, Double target) {
    }

    @Test
    void weightsAndMultipliersAgreeWithQuadprogAndCvxopt(@TempDir Path temp) throws Exception {
        // -Disorisk.crosscheck.dir=DIR keeps the problems and the solvers' answers for inspection
        String keep = System.getProperty("isorisk.crosscheck.dir");
        Path root = keep == null ? temp : Path.of(keep);
        boolean haveR = available("Rscript", "-e", "suppressPackageStartupMessages(library(quadprog))");
        boolean havePy = available("/usr/bin/python3", "-c", "import cvxopt");
        if ("true".equals(System.getenv("CI"))) {
            assertTrue(haveR, "CI must install r-base-core and r-cran-quadprog");
            assertTrue(havePy, "CI must install python3-cvxopt");
        }
        Assumptions.assumeTrue(haveR && havePy, "skipped: needs Rscript with quadprog (Debian r-cran-quadprog) and "
                + "/usr/bin/python3 with cvxopt (Debian python3-cvxopt)");
        List<Case> cases = new ArrayList<>();
        for (int n : new int[] {10, 30, 100, 250, 500}) {
            AssetUniverse u = GeneratedProblems.universe(n, 1000 + n);
            sweep("n" + n, u, GeneratedProblems.withGroups(n), n >= 500 ? 1 : n >= 250 ? 2 : 4, cases);
        }
        Mandate sample = PolicyReader.read(Path.of("..", "sample-data", "policy.yaml"), SampleFund.ASSETS).mandate();
        sweep("sample", SampleFund.universe(), sample, 6, cases);
        for (Case c : cases) {
            write(root.resolve(c.name()), c);
        }
        run(List.of("Rscript", SCRIPTS.resolve("check_qp_against_quadprog.R").toString(), root.toString()));
        run(List.of("/usr/bin/python3", SCRIPTS.resolve("check_qp_against_cvxopt.py").toString(), root.toString()));
        for (Case c : cases) {
            for (String solver : List.of("quadprog", "cvxopt")) {
                compare(c, root.resolve(c.name()), solver);
            }
        }
    }

    /** The minimum-variance point and {@code targets} targets spread over the range, solved warm in one session. */
    private static void sweep(String prefix, AssetUniverse u, Mandate m, int targets, List<Case> out) {
        SolverSession s = Allocator.session(u, m, null);
        ReturnRange rr = s.returnRange();
        Solution prev = s.solve(Objective.minimumVariance());
        out.add(new Case(prefix + "_minvar", u, m, prev, null));
        double lo = prev.expectedReturn();
        for (int k = 1; k <= targets; k++) {
            double t = lo + (rr.max() - lo) * k / (targets + 1.0);
            prev = s.solve(Objective.targetReturn(t), prev);
            out.add(new Case(String.format(Locale.ROOT, "%s_t%d", prefix, k), u, m, prev, t));
        }
    }

    /** The problem as rows: mandate rows, the target, then every finite bound. */
    private static List<LinearConstraint> rows(Case c) {
        AssetUniverse u = c.universe();
        int n = u.size();
        List<LinearConstraint> rows = new ArrayList<>(c.mandate().rows(u.assets()));
        if (c.target() != null) {
            rows.add(new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, c.target()));
        }
        for (int i = 0; i < n; i++) {
            if (c.mandate().fixed().containsKey(i)) {
                continue;
            }
            double[] e = new double[n];
            e[i] = 1;
            if (Double.isFinite(c.mandate().lower(i))) {
                rows.add(new LinearConstraint("lower:" + u.assets().get(i), e, Relation.AT_LEAST, c.mandate().lower(i)));
            }
            if (Double.isFinite(c.mandate().upper(i))) {
                rows.add(new LinearConstraint("upper:" + u.assets().get(i), e, Relation.AT_MOST, c.mandate().upper(i)));
            }
        }
        return rows;
    }

    private static void write(Path dir, Case c) throws IOException {
        Files.createDirectories(dir);
        AssetUniverse u = c.universe();
        int n = u.size();
        try (Writer w = Files.newBufferedWriter(dir.resolve("sigma.csv"), StandardCharsets.UTF_8)) {
            for (int i = 0; i < n; i++) {
                StringBuilder sb = new StringBuilder();
                for (int j = 0; j < n; j++) {
                    sb.append(j == 0 ? "" : ",").append(num(u.covariance(i, j)));
                }
                w.write(sb.append('\n').toString());
            }
        }
        try (Writer w = Files.newBufferedWriter(dir.resolve("constraints.csv"), StandardCharsets.UTF_8)) {
            for (LinearConstraint r : rows(c)) {
                if (r.name().contains(",")) {
                    throw new IllegalStateException("constraint names must not contain commas: " + r.name());
                }
                StringBuilder sb = new StringBuilder(r.name()).append(',').append(r.relation().symbol()).append(',')
                        .append(num(r.limit()));
                for (int i = 0; i < n; i++) {
                    sb.append(',').append(num(r.coefficient(i)));
                }
                w.write(sb.append('\n').toString());
            }
        }
    }

    private static void compare(Case c, Path dir, String solver) throws IOException {
        List<String> wl = Files.readAllLines(dir.resolve(solver + "_weights.csv"));
        Solution s = c.ours();
        int n = s.assets().size();
        assertEquals(n, wl.size(), c.name() + " " + solver);
        for (int i = 0; i < n; i++) {
            double theirs = Double.parseDouble(wl.get(i).trim());
            assertEquals(theirs, s.weight(i), WEIGHT_TOL, c.name() + " " + solver + " weight of " + s.assets().get(i));
        }
        // Multipliers are unique only when the constraints binding at the solution have independent gradients (the
        // constraint qualification); where they do not, any valid split is right and only the weights compare. The
        // rank is found independently here (Commons Math SVD) and our solution must say so in its notes.
        boolean degenerate = tightSetIsDependent(c);
        boolean noted = s.notes().stream().anyMatch(x -> x.startsWith(SolverSession.NOT_UNIQUE));
        assertEquals(degenerate, noted, c.name() + ": note on non-unique multipliers");
        if (degenerate) {
            return;
        }
        Map<String, Double> theirs = new LinkedHashMap<>();
        for (String line : Files.readAllLines(dir.resolve(solver + "_multipliers.csv"))) {
            int comma = line.lastIndexOf(',');
            theirs.put(line.substring(0, comma), Double.parseDouble(line.substring(comma + 1).trim()));
        }
        Map<String, Double> ours = new HashMap<>();
        for (Multiplier m : s.multipliers()) {
            ours.put(m.constraint(), m.variancePerUnit());
        }
        double scale = 0;
        for (double v : theirs.values()) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (Map.Entry<String, Double> e : theirs.entrySet()) {
            Double mine = ours.get(e.getKey());
            if (mine == null) {
                fail(c.name() + ": no multiplier for " + e.getKey());
            }
            // quadprog ends on an exact active set: relative to each multiplier (floor 1e-3 of the largest).
            // CVXOPT is an interior-point method whose duals carry an absolute error of about its tolerance times
            // the problem's scale: relative to the solution's largest multiplier (normwise).
            double tol = solver.equals("quadprog") ? MULTIPLIER_TOL * Math.max(Math.abs(e.getValue()), 1e-3 * scale)
                    : MULTIPLIER_TOL * scale;
            assertEquals(e.getValue(), mine, tol, c.name() + " " + solver + " multiplier of " + e.getKey());
        }
    }

    private static boolean tightSetIsDependent(Case c) {
        double[] w = c.ours().weights();
        List<double[]> grads = new ArrayList<>();
        for (LinearConstraint r : rows(c)) {
            if (Math.abs(r.evaluate(w) - r.limit()) <= 1e-10 * Math.max(1, Math.abs(r.limit()))) {
                grads.add(r.coefficients());
            }
        }
        if (grads.isEmpty()) {
            return false;
        }
        double[][] g = grads.toArray(new double[0][]);
        int rank = new org.apache.commons.math3.linear.SingularValueDecomposition(
                new org.apache.commons.math3.linear.Array2DRowRealMatrix(g, false)).getRank();
        return rank < g.length;
    }

    private static String num(double v) {
        return Double.toString(v);
    }

    private static boolean available(String... cmd) {
        try {
            Process p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
            p.getInputStream().readAllBytes();
            return p.waitFor(60, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    private static void run(List<String> cmd) throws IOException, InterruptedException {
        ProcessBuilder pb = new ProcessBuilder(cmd).redirectErrorStream(true);
        pb.environment().put("OPENBLAS_NUM_THREADS", "1"); // threaded BLAS reductions would make runs differ
        Process p = pb.start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        if (!p.waitFor(300, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            fail("timed out: " + String.join(" ", cmd));
        }
        assertEquals(0, p.exitValue(), () -> String.join(" ", cmd) + " failed:\n" + out);
    }
}
