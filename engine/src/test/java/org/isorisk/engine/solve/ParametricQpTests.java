package org.isorisk.engine.solve;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.TimeUnit;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.SingularValueDecomposition;
import org.isorisk.engine.ExternalTools;
import org.isorisk.engine.TestUniverses;
import org.isorisk.engine.linalg.Dense;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The parametric active-set method ({@link ParametricQp}) against the project's critical line method where both
 * apply (budget and bounds, no linear term).
 */
class ParametricQpTests {

    static ParametricPath walk(AssetUniverse u, Mandate m, double[] q, boolean inefficient) {
        return ParametricQp.walk(ParametricProblem.of(u, m, q), inefficient, SolverSettings.defaults());
    }

    static Set<Integer> free(byte[] state) {
        Set<Integer> out = new TreeSet<>();
        for (int i = 0; i < state.length; i++) {
            if (state[i] == ParametricQp.FREE) {
                out.add(i);
            }
        }
        return out;
    }

    private static Set<Integer> assets(List<ParametricPath.Change> changes) {
        Set<Integer> out = new TreeSet<>();
        for (ParametricPath.Change c : changes) {
            assertTrue(c.constraint().kind() == ParametricPath.Kind.LOWER
                    || c.constraint().kind() == ParametricPath.Kind.UPPER, c.toString());
            out.add(c.constraint().index());
        }
        return out;
    }

    private static Set<Integer> symmetricDifference(Set<Integer> a, Set<Integer> b) {
        Set<Integer> out = new TreeSet<>(a);
        out.addAll(b);
        Set<Integer> both = new HashSet<>(a);
        both.retainAll(b);
        out.removeAll(both);
        return out;
    }

    @Test
    void budgetAndBoundsGiveTheCriticalLinesCornersWeightsAndChanges() {
        // Reference: the project's critical line method (CriticalLine/MandateSweep; Markowitz 1956, Niedermayer &
        // Niedermayer 2010), an independent algorithm (a walk in the risk-aversion parameter over free sets) on the
        // same problems: every corner's target and weights, and the free set of every piece between corners.
        int checked = 0;
        for (int n : new int[] {10, 25, 50, 100, 200}) {
            List<Object[]> problems = List.of(
                    new Object[] {"market", FactorModels.universe(n, FactorModels.DEFAULT_SEED + n),
                        FactorModels.longOnlyCapped(n)},
                    new Object[] {"signed", FactorModels.signedUniverse(n, 7 + n), FactorModels.longOnlyCapped(n)},
                    new Object[] {"random", TestUniverses.random(n, 11 + n),
                        FactorModels.boxed(n, -0.02, Math.max(0.1, 2.0 / n))});
            for (Object[] pr : problems) {
                String what = pr[0] + " n=" + n;
                AssetUniverse u = (AssetUniverse) pr[1];
                Mandate m = (Mandate) pr[2];
                ParametricPath path = walk(u, m, null, true);
                MandateSweep cl = MandateSweep.of(u, m, SolverSettings.defaults());
                List<ParametricPath.Corner> mine = path.corners();
                List<ParametricPath.Piece> pieces = path.pieces();
                int k = path.minimum();
                compare(u, m, cl.efficientCorners(), mine.subList(k, mine.size()), pieces.subList(k, pieces.size()), true,
                        what + " efficient");
                compare(u, m, cl.inefficientCorners(), mine.subList(0, k + 1), pieces.subList(0, k), false,
                        what + " inefficient");
                checked += mine.size();
            }
        }
        assertTrue(checked > 500, "corners compared: " + checked);
    }

    /**
     * CL's corners (increasing target; several at one target at a kink) against ours on one branch; CL's free set
     * of a corner is that of the stretch towards the minimum-variance portfolio.
     */
    private static void compare(AssetUniverse u, Mandate m, List<Corner> cl, List<ParametricPath.Corner> mine,
                                List<ParametricPath.Piece> pieces, boolean efficient, String what) {
        List<List<Corner>> groups = new ArrayList<>();
        for (Corner c : cl) {
            if (!groups.isEmpty()) {
                List<Corner> g = groups.get(groups.size() - 1);
                if (Math.abs(g.get(0).expectedReturn() - c.expectedReturn()) <= 1e-12) {
                    g.add(c);
                    continue;
                }
            }
            groups.add(new ArrayList<>(List.of(c)));
        }
        assertEquals(groups.size(), mine.size(), what + ": number of corners");
        int n = u.size();
        for (int g = 0; g < groups.size(); g++) {
            ParametricPath.Corner c = mine.get(g);
            Corner ref = groups.get(g).get(0);
            assertEquals(ref.expectedReturn(), c.target(), 1e-12, what + ": target of corner " + g);
            for (int i = 0; i < n; i++) {
                assertEquals(ref.portfolio().weight(i), c.weights()[i], 1e-10, what + ": corner " + g + " asset " + i);
            }
            assertTrue(c.certificate().worst() <= 1e-9, what + ": certificate " + c.certificate());
        }
        List<Set<Integer>> freeSets = new ArrayList<>();
        for (int j = 0; j < pieces.size(); j++) {
            List<Corner> side = efficient ? groups.get(j + 1) : groups.get(j);
            Corner ref = efficient ? side.get(0) : side.get(side.size() - 1);
            Set<Integer> theirs = new TreeSet<>();
            for (String a : ref.free()) {
                theirs.add(u.indexOf(a).orElseThrow());
            }
            Set<Integer> ours = free(pieces.get(j).state());
            assertEquals(theirs, ours, what + ": free set of piece " + j);
            freeSets.add(ours);
        }
        int end = efficient ? groups.size() - 1 : 0;
        int minimum = efficient ? 0 : groups.size() - 1;
        for (int g = 0; g < groups.size(); g++) {
            Set<Integer> theirs = new TreeSet<>();
            for (Corner c : groups.get(g)) {
                if (c.asset() != null) {
                    for (String a : c.asset().split(", ")) {
                        theirs.add(u.indexOf(a).orElseThrow());
                    }
                }
            }
            Set<Integer> ours = assets(mine.get(g).changes());
            if (g == minimum) {
                assertEquals(Set.of(), ours, what + ": changes at the minimum");
            } else if (g == end) {
                // At the end of the range our changes are the assets free on the last piece that reach a bound
                // there. The critical line method names the events of its walk's first corner (it starts at this
                // end): at a degenerate end vertex that may be one of several such assets, or include assets that
                // change twice there; it must name at least one of ours.
                Set<Integer> endPiece = efficient ? freeSets.get(freeSets.size() - 1) : freeSets.get(0);
                Set<Integer> reached = new TreeSet<>();
                double[] w = mine.get(g).weights();
                for (int i : endPiece) {
                    if (Math.abs(w[i] - m.lower(i)) <= 1e-12 || Math.abs(w[i] - m.upper(i)) <= 1e-12) {
                        reached.add(i);
                    }
                }
                assertEquals(reached, ours, what + ": changes at the end");
                Set<Integer> common = new TreeSet<>(theirs);
                common.retainAll(ours);
                assertTrue(!common.isEmpty(), what + ": critical line's end changes " + theirs + " vs ours " + ours);
            } else {
                Set<Integer> expected = symmetricDifference(freeSets.get(g - 1), freeSets.get(g));
                assertEquals(expected, ours, what + ": changes at corner " + g);
                // The critical line method names every event of a merged corner, also an asset that enters and
                // leaves again there (no net change); the net changes must be among them.
                assertTrue(theirs.containsAll(expected), what + ": critical line changes at corner " + g + " "
                        + theirs + " vs " + expected);
            }
        }
    }

    // ------------------------------------------------------------------ groups, a general row and a linear term

    /** A problem with groups, a general row and a linear term in the objective. */
    record LinearCase(String name, AssetUniverse universe, Mandate mandate, double[] linear) {
        ParametricProblem problem() {
            return ParametricProblem.of(universe, mandate, linear);
        }
    }

    /**
     * Surplus variance {@code w'Σw − (2/F)w'c} against an invented liability proxy h (c = Σh, its covariances with
     * the assets) and funded ratios 1.25 and 0.9, and tracking error {@code (w−b)'Σ(w−b)} against an equal-weight
     * benchmark b (q = Σb), on generated problems with two groups and a general row (invented numbers).
     */
    static List<LinearCase> linearCases() {
        List<LinearCase> out = new ArrayList<>();
        int[] sizes = {15, 40, 60};
        for (int k = 0; k < sizes.length; k++) {
            int n = sizes[k];
            AssetUniverse u = GeneratedProblems.universe(n, 2000 + n);
            Mandate m = GeneratedProblems.withGroups(n);
            double[] q;
            String name;
            if (k == 1) {
                double[] bench = new double[n];
                java.util.Arrays.fill(bench, 1.0 / n);
                q = Dense.multiplySymmetric(u.covariance(), bench);
                name = "tracking_n" + n;
            } else {
                double funded = k == 0 ? 1.25 : 0.9;
                double[] h = new double[n];
                for (int i = 0; i < n; i++) {
                    h[i] = (i % 4 == 0 ? 2.0 : 0.5) / n;
                }
                q = Dense.multiplySymmetric(u.covariance(), h);
                for (int i = 0; i < n; i++) {
                    q[i] /= funded;
                }
                name = "surplus_n" + n;
            }
            out.add(new LinearCase(name, u, m, q));
        }
        return out;
    }

    /** The targets checked on a path: every corner, and 20 targets spread over the range between corners. */
    static List<Double> targets(ParametricPath path) {
        List<Double> out = new ArrayList<>();
        for (ParametricPath.Corner c : path.corners()) {
            out.add(c.target());
        }
        double lo = path.lowest();
        double hi = path.highest();
        for (int k = 0; k < 20; k++) {
            double m = lo + (hi - lo) * (k + 0.5) / 20;
            for (ParametricPath.Corner c : path.corners()) {
                if (Math.abs(c.target() - m) <= 1e-9 * (hi - lo)) {
                    m += 1e-6 * (hi - lo); // between corners, not on one
                }
            }
            out.add(m);
        }
        return out;
    }

    @Test
    void groupsAGeneralRowAndALinearTermAgreeWithQuadprogAndCvxoptAtCornersAndBetween(@TempDir Path temp)
            throws IOException, InterruptedException {
        // Outside references: R's quadprog (Goldfarb & Idnani 1983 dual active-set method, Debian r-cran-quadprog) at
        // every target including the exact corners and ends of the range, and CVXOPT's interior-point QP (Debian
        // python3-cvxopt, tolerances 1e-14) with each corner's target moved a hair into a neighbouring piece (an
        // interior-point method meets a corner's weakly binding constraint only in the limit); both through
        // engine/src/test/scripts. Weights to 1e-8; multipliers, mapped by the scripts to
        // ∂V*∂limit, to 1e-7 relative (as ExternalSolverCrossCheckTests: quadprog per multiplier with a floor of 1e-3
        // of the largest, CVXOPT relative to the largest), wherever ours are unique.
        boolean haveR = available("Rscript", "-e", "suppressPackageStartupMessages(library(quadprog))");
        boolean havePy = available("/usr/bin/python3", "-c", "import cvxopt");
        if ("true".equals(System.getenv("CI"))) {
            assertTrue(haveR, "CI must install r-base-core and r-cran-quadprog");
            assertTrue(havePy, "CI must install python3-cvxopt");
        }
        Assumptions.assumeTrue(haveR && havePy, "skipped: needs Rscript with quadprog (Debian r-cran-quadprog) and "
                + "/usr/bin/python3 with cvxopt (Debian python3-cvxopt)");
        String keep = System.getProperty("isorisk.crosscheck.dir");
        Path root = keep == null ? temp : Path.of(keep);
        Path qp = root.resolve("quadprog");
        Path cx = root.resolve("cvxopt");
        Map<String, Object[]> cases = new LinkedHashMap<>(); // name -> {case, point at the exact target, point for cvxopt}
        for (LinearCase c : linearCases()) {
            ParametricPath path = ParametricQp.walk(c.problem(), true, SolverSettings.defaults());
            double width = path.highest() - path.lowest();
            List<Double> ts = targets(path);
            for (int k = 0; k < ts.size(); k++) {
                double m = ts.get(k);
                double inside = m;
                if (k < path.corners().size()) {
                    // a corner is degenerate for an interior-point method (a constraint binds there with a zero
                    // multiplier): CVXOPT gets a target a hair inside the piece above (below, at the top end),
                    // 1e-4 of the range (at most a quarter of the piece); at 1e-6 a weight that has just left its
                    // bound sits ~1e-7 from it and CVXOPT's answer is ~2e-8 off (quadprog and CVXOPT at 1e-15
                    // agree with ours there to 1e-10)
                    boolean top = k == path.corners().size() - 1;
                    double gap = top ? m - path.corners().get(k - 1).target()
                            : path.corners().get(k + 1).target() - m;
                    inside = m + (top ? -1 : 1) * Math.min(1e-4 * width, 0.25 * gap);
                }
                ParametricPath.Point exact = path.at(m);
                ParametricPath.Point hair = path.at(inside);
                assertTrue(exact.certificate().worst() <= 1e-9, c.name() + " at " + m + ": " + exact.certificate());
                assertTrue(hair.certificate().worst() <= 1e-9, c.name() + " at " + inside + ": " + hair.certificate());
                String name = String.format(Locale.ROOT, "%s_%03d", c.name(), k);
                write(qp.resolve(name), c, m);
                if (m <= path.lowest() || m >= path.highest()) {
                    Files.writeString(qp.resolve(name).resolve("inward.txt"), m <= path.lowest() ? "1\n" : "-1\n");
                }
                write(cx.resolve(name), c, inside);
                cases.put(name, new Object[] {c, exact, hair});
            }
        }
        run(List.of("Rscript", ExternalTools.scripts().resolve("check_qp_against_quadprog.R").toString(),
                qp.toString()));
        run(List.of("/usr/bin/python3", ExternalTools.scripts().resolve("check_qp_against_cvxopt.py").toString(),
                cx.toString()));
        int multipliersCompared = 0;
        for (Map.Entry<String, Object[]> e : cases.entrySet()) {
            LinearCase c = (LinearCase) e.getValue()[0];
            multipliersCompared += compare(c, (ParametricPath.Point) e.getValue()[1], qp.resolve(e.getKey()),
                    "quadprog", e.getKey());
            multipliersCompared += compare(c, (ParametricPath.Point) e.getValue()[2], cx.resolve(e.getKey()),
                    "cvxopt", e.getKey());
        }
        assertTrue(cases.size() > 100 && multipliersCompared > 100 * 20, cases.size() + " points, "
                + multipliersCompared + " multipliers compared");
    }

    /** The rows the scripts read: the problem's rows, the target, then every finite bound as a row. */
    static List<LinearConstraint> scriptRows(LinearCase c, double m) {
        AssetUniverse u = c.universe();
        int n = u.size();
        ParametricProblem p = c.problem();
        List<LinearConstraint> rows = new ArrayList<>(p.rows);
        rows.add(new LinearConstraint("target_return", u.expectedReturns(), Relation.EQUAL, m));
        for (int i = 0; i < n; i++) {
            double[] e = new double[n];
            e[i] = 1;
            if (Double.isFinite(p.lo[i])) {
                rows.add(new LinearConstraint("lower:" + u.assets().get(i), e, Relation.AT_LEAST, p.lo[i]));
            }
            if (Double.isFinite(p.hi[i])) {
                rows.add(new LinearConstraint("upper:" + u.assets().get(i), e, Relation.AT_MOST, p.hi[i]));
            }
        }
        return rows;
    }

    /** Our multipliers by the scripts' names. */
    static Map<String, Double> byName(LinearCase c, ParametricPath.Point pt) {
        AssetUniverse u = c.universe();
        ParametricProblem p = c.problem();
        Map<String, Double> out = new LinkedHashMap<>();
        for (int r = 0; r < p.rowCount(); r++) {
            out.put(p.rows.get(r).name(), pt.rowPrices()[r]);
        }
        out.put("target_return", pt.targetPrice());
        double[] lp = pt.lowerPrices();
        double[] up = pt.upperPrices();
        for (int i = 0; i < u.size(); i++) {
            out.put("lower:" + u.assets().get(i), lp[i]);
            out.put("upper:" + u.assets().get(i), up[i]);
        }
        return out;
    }

    private static void write(Path dir, LinearCase c, double m) throws IOException {
        Files.createDirectories(dir);
        AssetUniverse u = c.universe();
        int n = u.size();
        try (Writer w = Files.newBufferedWriter(dir.resolve("sigma.csv"), StandardCharsets.UTF_8)) {
            double[][] s = c.problem().sigma;
            for (int i = 0; i < n; i++) {
                StringBuilder sb = new StringBuilder();
                for (int j = 0; j < n; j++) {
                    sb.append(j == 0 ? "" : ",").append(s[i][j]);
                }
                w.write(sb.append('\n').toString());
            }
        }
        try (Writer w = Files.newBufferedWriter(dir.resolve("linear.csv"), StandardCharsets.UTF_8)) {
            for (double v : c.linear()) {
                w.write(v + "\n");
            }
        }
        try (Writer w = Files.newBufferedWriter(dir.resolve("constraints.csv"), StandardCharsets.UTF_8)) {
            for (LinearConstraint r : scriptRows(c, m)) {
                StringBuilder sb = new StringBuilder(r.name()).append(',').append(r.relation().symbol()).append(',')
                        .append(r.limit());
                for (int i = 0; i < n; i++) {
                    sb.append(',').append(r.coefficient(i));
                }
                w.write(sb.append('\n').toString());
            }
        }
    }

    /** Weights always; multipliers where ours are unique. Returns the number of multipliers compared. */
    private static int compare(LinearCase c, ParametricPath.Point pt, Path dir, String solver, String name)
            throws IOException {
        if (solver.equals("quadprog")) {
            // quadprog may need the target moved into the range by a few units of double precision at an exact
            // end (see the script); nowhere else.
            String status = Files.readString(dir.resolve("quadprog_status.txt")).trim();
            boolean end = Files.exists(dir.resolve("inward.txt"));
            assertTrue(status.equals("exact") || end, name + ": quadprog " + status);
        }
        List<String> wl = Files.readAllLines(dir.resolve(solver + "_weights.csv"));
        int n = c.universe().size();
        assertEquals(n, wl.size(), name + " " + solver);
        for (int i = 0; i < n; i++) {
            assertEquals(Double.parseDouble(wl.get(i).trim()), pt.weights()[i], 1e-8, name + " " + solver
                    + " weight " + i);
        }
        // Uniqueness, independently: the gradients of the constraints binding at the point (Commons Math SVD). Our
        // flag may only say "not unique" where they are dependent, and must say "unique" where they are not.
        boolean dependent = bindingGradientsDependent(c, pt);
        if (!dependent) {
            assertTrue(pt.multipliersUnique(), name + ": binding gradients independent, multipliers must be unique");
        }
        if (!pt.multipliersUnique()) {
            assertTrue(dependent, name + ": multipliers flagged not unique with independent binding gradients");
            return 0;
        }
        Map<String, Double> theirs = new LinkedHashMap<>();
        for (String line : Files.readAllLines(dir.resolve(solver + "_multipliers.csv"))) {
            int comma = line.lastIndexOf(',');
            theirs.put(line.substring(0, comma), Double.parseDouble(line.substring(comma + 1).trim()));
        }
        Map<String, Double> ours = byName(c, pt);
        double scale = 0;
        for (double v : theirs.values()) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (Map.Entry<String, Double> e : theirs.entrySet()) {
            double tol = solver.equals("quadprog") ? 1e-7 * Math.max(Math.abs(e.getValue()), 1e-3 * scale)
                    : 1e-7 * scale;
            assertEquals(e.getValue(), ours.get(e.getKey()), tol, name + " " + solver + " multiplier of " + e.getKey());
        }
        return theirs.size();
    }

    static boolean bindingGradientsDependent(LinearCase c, ParametricPath.Point pt) {
        List<double[]> grads = new ArrayList<>();
        for (LinearConstraint r : scriptRows(c, pt.target())) {
            if (Math.abs(r.evaluate(pt.weights()) - r.limit()) <= 1e-10 * Math.max(1, Math.abs(r.limit()))) {
                grads.add(r.coefficients());
            }
        }
        double[][] g = grads.toArray(new double[0][]);
        return new SingularValueDecomposition(new Array2DRowRealMatrix(g, false)).getRank() < g.length;
    }

    static boolean available(String... cmd) {
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
        pb.environment().put("OPENBLAS_NUM_THREADS", "1");
        Process p = pb.start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        if (!p.waitFor(600, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("timed out: " + String.join(" ", cmd));
        }
        assertEquals(0, p.exitValue(), () -> String.join(" ", cmd) + " failed:\n" + out);
    }
}
