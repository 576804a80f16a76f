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
        out.add(degenerate(5, true));
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
        // the scale of the multipliers: the largest of them, or of the objective's gradient 2Σw − 2q when they
        // all vanish (a tracking-error target met by the benchmark itself)
        double scale = 0;
        for (double v : theirs.values()) {
            scale = Math.max(scale, Math.abs(v));
        }
        double[] sw = Dense.multiplySymmetric(c.problem().sigma, pt.weights());
        for (int i = 0; i < n; i++) {
            scale = Math.max(scale, Math.abs(2 * sw[i]) + Math.abs(2 * c.problem().linear[i]));
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

    // ------------------------------------------------------------------ the envelope theorem

    @Test
    void everyMultiplierIsTheDerivativeOfTheOptimalObjectiveInItsLimit() {
        // Envelope theorem (e.g. Luenberger & Ye, "Linear and Nonlinear Programming", sensitivity section; from
        // memory): ∂V*/∂b of a convex QP is the constraint's multiplier in the convention of the certificate. Each
        // limit is moved by ±h and the problem re-solved (a fresh walk), V* compared by central differences.
        double h = 1e-6;
        int checked = 0;
        for (LinearCase c : linearCases().subList(0, 2)) {
            ParametricProblem p = c.problem();
            ParametricPath path = ParametricQp.walk(p, true, SolverSettings.defaults());
            double lo = path.lowest();
            double hi = path.highest();
            for (double f : new double[] {0.13, 0.52, 0.91}) {
                ParametricPath.Point pt = path.at(lo + f * (hi - lo));
                if (!pt.multipliersUnique()) {
                    continue;
                }
                double m = pt.target();
                String at = c.name() + " at " + m;
                double dm = (objectiveAt(p, m + h) - objectiveAt(p, m - h)) / (2 * h);
                assertClose(pt.targetPrice(), dm, at + ": target");
                checked++;
                for (int r = 0; r < p.rowCount(); r++) {
                    if (!pt.rowActive()[r]) {
                        assertEquals(0.0, pt.rowPrices()[r], 0.0, at + ": row " + r + " outside the working set");
                        continue;
                    }
                    double d = (objectiveAt(withRowLimit(p, r, h), m) - objectiveAt(withRowLimit(p, r, -h), m)) / (2 * h);
                    assertClose(pt.rowPrices()[r], d, at + ": row " + p.rows.get(r).name());
                    checked++;
                }
                for (int i = 0; i < p.n; i++) {
                    byte st = pt.state()[i];
                    if (st == ParametricQp.FREE) {
                        assertEquals(0.0, pt.boundPrices()[i], 0.0);
                        continue;
                    }
                    boolean lower = st == ParametricQp.LOWER;
                    double d = (objectiveAt(withBound(p, i, lower, h), m) - objectiveAt(withBound(p, i, lower, -h), m))
                            / (2 * h);
                    assertClose(pt.boundPrices()[i], d, at + ": " + (lower ? "lower" : "upper") + " bound " + i);
                    assertTrue(lower ? pt.boundPrices()[i] >= 0 : pt.boundPrices()[i] <= 0, at + ": sign at bound " + i);
                    checked++;
                }
            }
        }
        assertTrue(checked >= 40, "multipliers checked: " + checked);
    }

    private static void assertClose(double expected, double actual, String what) {
        assertEquals(expected, actual, 1e-7 * Math.max(1, Math.abs(expected)), what);
    }

    private static double objectiveAt(ParametricProblem p, double m) {
        return ParametricQp.walk(p, true, SolverSettings.defaults()).at(m).objective();
    }

    private static ParametricProblem withRowLimit(ParametricProblem p, int r, double h) {
        List<LinearConstraint> rows = new ArrayList<>(p.rows);
        LinearConstraint c = rows.get(r);
        rows.set(r, new LinearConstraint(c.name(), c.coefficients(), c.relation(), c.limit() + h));
        return new ParametricProblem(p.sigma, p.linear, p.mu, rows, p.lo, p.hi);
    }

    private static ParametricProblem withBound(ParametricProblem p, int i, boolean lower, double h) {
        double[] lo = p.lo.clone();
        double[] hi = p.hi.clone();
        if (lower) {
            lo[i] += h;
        } else {
            hi[i] += h;
        }
        return new ParametricProblem(p.sigma, p.linear, p.mu, p.rows, lo, hi);
    }

    // ------------------------------------------------------------------ the shape of the frontier

    @Test
    void betweenCornersWeightsAreAffineAndTheObjectiveIsQuadraticAndConvexInTheTarget() {
        // Follows from the KKT system being linear in m on a piece (Best 1996): the midpoint of a piece, solved on
        // its own, is the average of the corners' weights, and V*(m) has slope ∂V*/∂m (envelope theorem) that is
        // affine on the piece and never falls from one piece to the next (V* is convex in m).
        for (LinearCase c : linearCases()) {
            ParametricPath path = ParametricQp.walk(c.problem(), true, SolverSettings.defaults());
            List<ParametricPath.Corner> cs = path.corners();
            double lastSlope = Double.NEGATIVE_INFINITY;
            for (int j = 0; j + 1 < cs.size(); j++) {
                ParametricPath.Corner a = cs.get(j);
                ParametricPath.Corner b = cs.get(j + 1);
                ParametricPath.Piece pc = path.pieces().get(j);
                double dm = b.target() - a.target();
                String what = c.name() + " piece " + j;
                assertTrue(dm > 0, what + ": corners increase");
                ParametricPath.Point mid = path.at(0.5 * (a.target() + b.target()));
                assertTrue(mid.certificate().worst() <= 1e-9, what + ": " + mid.certificate());
                for (int i = 0; i < a.weights().length; i++) {
                    assertEquals(0.5 * (a.weights()[i] + b.weights()[i]), mid.weights()[i], 1e-12, what + " asset " + i);
                }
                double ta = pc.targetPriceAt(a.target());
                double tb = pc.targetPriceAt(b.target());
                // V*(b) − V*(a) is the integral of the affine slope; the midpoint sits below the chord by Δm·Δτ/8.
                assertEquals(b.objective() - a.objective(), 0.5 * (ta + tb) * dm, 1e-10 * Math.max(1, Math.abs(b.objective())),
                        what + ": objective against its slope");
                assertEquals(0.5 * (a.objective() + b.objective()) - dm * (tb - ta) / 8, mid.objective(), 1e-12, what
                        + ": midpoint of the quadratic");
                assertTrue(tb >= ta - 1e-9 * Math.max(1, Math.abs(ta)), what + ": slope rises along the piece");
                assertTrue(ta >= lastSlope - 1e-9 * Math.max(1, Math.abs(ta)), what + ": slope rises across the corner");
                lastSlope = tb;
            }
            assertEquals(0.0, cs.get(path.minimum()).targetPrice(), 1e-12, c.name() + ": no price at the minimum");
        }
    }

    // ------------------------------------------------------------------ degenerate mandates

    /**
     * A degenerate mandate over 32 invented assets in four groups of eight (illustrative numbers): every asset in
     * [0, 12 %] except the second group's, capped at 6.875 % so that the group's limit of 55 % equals the sum of
     * its members' bounds; the first three groups at most 55 %, the third at least 10 %, the fourth at most 96 %
     * (again the sum of its members' bounds); expected returns rounded to half a percent, so that many tie, also
     * at the top of the range.
     */
    static LinearCase degenerate(long seed, boolean linear) {
        int n = 32;
        AssetUniverse base = FactorModels.universe(n, seed);
        double[] mu = base.expectedReturns();
        for (int i = 0; i < n; i++) {
            mu[i] = Math.rint(mu[i] * 200) / 200;
        }
        AssetUniverse u = new AssetUniverse(base.assets(), mu, base.covariance());
        double[] lo = new double[n];
        double[] hi = new double[n];
        java.util.Arrays.fill(hi, 0.12);
        for (int i = 8; i < 16; i++) {
            hi[i] = 0.55 / 8;
        }
        List<org.isorisk.engine.model.Group> groups = new ArrayList<>();
        for (int g = 0; g < 4; g++) {
            List<Integer> members = new ArrayList<>();
            for (int i = 8 * g; i < 8 * g + 8; i++) {
                members.add(i);
            }
            groups.add(new org.isorisk.engine.model.Group("G" + (g + 1), members, g == 2 ? 0.10 : Double.NEGATIVE_INFINITY,
                    g == 3 ? 0.96 : 0.55));
        }
        Mandate m = new Mandate(1.0, lo, hi, Map.of(), groups, List.of());
        double[] q = null;
        if (linear) {
            double[] bench = new double[n];
            java.util.Arrays.fill(bench, 1.0 / n);
            q = Dense.multiplySymmetric(u.covariance(), bench);
        }
        return new LinearCase("degenerate_" + seed + (linear ? "_tracking" : ""), u, m, q);
    }

    @Test
    void degenerateMandatesAreWalkedToTheEndWithEveryCornerCertified() {
        // Invariants that follow from the KKT conditions (no outside reference): every corner certified by the
        // project's one certificate, the pieces joining the corners continuously, the ends of the range those of
        // the bounded simplex (checked inside the walk), and non-unique multipliers flagged where a group limit
        // binds together with all its members' bounds.
        int corners = 0;
        int notUnique = 0;
        int exchanges = 0;
        int zeroSteps = 0;
        for (long seed = 1; seed <= 16; seed++) {
            LinearCase c = degenerate(seed, seed % 2 == 0);
            ParametricPath path = ParametricQp.walk(c.problem(), true, SolverSettings.defaults());
            exchanges += path.counts().exchanges();
            zeroSteps += path.counts().zeroSteps();
            List<ParametricPath.Corner> cs = path.corners();
            for (int j = 0; j < cs.size(); j++) {
                ParametricPath.Corner k = cs.get(j);
                String what = c.name() + " corner " + j + " at " + k.target();
                assertTrue(k.certificate().passes() && k.certificate().worst() <= 1e-9, what + ": " + k.certificate());
                corners++;
                notUnique += k.multipliersUnique() ? 0 : 1;
                if (j > 0) {
                    double[] fromBelow = path.pieces().get(j - 1).weightsAt(k.target());
                    for (int i = 0; i < fromBelow.length; i++) {
                        assertEquals(k.weights()[i], fromBelow[i], 1e-10, what + ": piece below, asset " + i);
                    }
                }
                if (j + 1 < cs.size()) {
                    double[] fromAbove = path.pieces().get(j).weightsAt(k.target());
                    for (int i = 0; i < fromAbove.length; i++) {
                        assertEquals(k.weights()[i], fromAbove[i], 1e-10, what + ": piece above, asset " + i);
                    }
                }
            }
            assertTrue(!cs.get(0).multipliersUnique() && !cs.get(cs.size() - 1).multipliersUnique(),
                    c.name() + ": the ends' multipliers are one-sided, never unique");
        }
        // the degenerate cases are really met: dependent joins beyond the two ends of each walk (Best's exchange,
        // e.g. a group limit reached with its members' bounds), and multipliers flagged as not unique
        assertTrue(corners > 16 * 10 && notUnique > 16 * 2 && exchanges > 16 * 2, corners
                + " corners, " + notUnique + " not unique, " + exchanges + " exchanges, " + zeroSteps + " zero steps");
    }

    @Test
    void mirrorImageAssetsAnAssetAtItsBoundWithZeroPriceAndTiesAtTheTopAreWalkedExactly() {
        // Three hand-built degenerate cases of the critical line tests, now with a group limit and (for the first)
        // a linear term, against ojAlgo's active-set QP (support/OjAlgoReference, weights) at several targets.
        // (1) Assets A and B are exchangeable, so every event happens to both at once: zero-length steps.
        int n = 6;
        double[] mu = {0.07, 0.07, 0.05, 0.04, 0.03, 0.02};
        double[] vol = {0.20, 0.20, 0.15, 0.10, 0.07, 0.04};
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double rho = i == j ? 1 : (i < 2 && j < 2) ? 0.5 : 0.2;
                s[i][j] = rho * vol[i] * vol[j];
            }
        }
        AssetUniverse mirror = new AssetUniverse(List.of("A", "B", "C", "D", "E", "F"), mu, s);
        Mandate mm = withGroup(FactorModels.boxed(n, 0.0, 0.3), List.of(2, 3), 0.45);
        double[] qm = Dense.multiplySymmetric(s, new double[] {0.1, 0.1, 0.2, 0.2, 0.2, 0.2}); // tracking error
        ParametricPath pm = walk(mirror, mm, qm, true);
        assertTrue(pm.counts().zeroSteps() > 0, "two assets change at one corner: " + pm.counts());
        for (ParametricPath.Corner c : pm.corners()) {
            assertEquals(c.weights()[0], c.weights()[1], 1e-12, "symmetry kept at " + c.target());
            assertTrue(c.certificate().worst() <= 1e-9, c.certificate().toString());
        }
        againstOjAlgo(mirror, mm, qm, pm, "mirror");
        // (2) Σ(½, ½, 0) = 0.025·1 (worked out by hand): without a linear term the minimum-variance portfolio puts
        // exactly nothing in C, which sits at its lower bound with a zero multiplier.
        double[][] s3 = {{0.04, 0.01, 0.025}, {0.01, 0.04, 0.025}, {0.025, 0.025, 0.09}};
        AssetUniverse three = new AssetUniverse(List.of("A", "B", "C"), new double[] {0.05, 0.06, 0.09}, s3);
        Mandate m3 = FactorModels.boxed(3, 0.0, 1.0);
        ParametricPath p3 = walk(three, m3, null, true);
        ParametricPath.Corner min = p3.corners().get(p3.minimum());
        double[] half = {0.5, 0.5, 0.0};
        for (int i = 0; i < 3; i++) {
            assertEquals(half[i], min.weights()[i], 1e-12, "minimum variance, asset " + i);
        }
        assertEquals(0.025, min.variance(), 1e-12);
        assertEquals(0.0, min.boundPrices()[2], 1e-12, "C at its bound with a zero price");
        againstOjAlgo(three, m3, null, p3, "at bound");
        // (3) Three assets tie for the highest return: the top end is the least-risk mix of them (each at 30 %),
        // the rest going to the next best, and the walk ends there.
        AssetUniverse base = FactorModels.universe(12, 9);
        double[] mt = base.expectedReturns();
        double top = java.util.Arrays.stream(mt).max().orElseThrow() + 0.01;
        mt[2] = top;
        mt[7] = top;
        mt[10] = top;
        AssetUniverse tied = new AssetUniverse(base.assets(), mt, base.covariance());
        Mandate mt12 = withGroup(FactorModels.boxed(12, 0.0, 0.3), List.of(0, 1, 2, 3), 0.5);
        ParametricPath pt = walk(tied, mt12, null, true);
        ParametricPath.Corner end = pt.corners().get(pt.corners().size() - 1);
        for (int i : new int[] {2, 7, 10}) {
            assertEquals(0.3, end.weights()[i], 1e-12, "tied asset " + i + " full");
        }
        againstOjAlgo(tied, mt12, null, pt, "ties at the top");
    }

    private static Mandate withGroup(Mandate m, List<Integer> members, double max) {
        return new Mandate(m.budget(), m.lower(), m.upper(), Map.of(),
                List.of(new org.isorisk.engine.model.Group("G", members, Double.NEGATIVE_INFINITY, max)), List.of());
    }

    private static void againstOjAlgo(AssetUniverse u, Mandate m, double[] q, ParametricPath path, String what) {
        for (double f : new double[] {0.0, 0.05, 0.3, 0.6, 0.95, 1.0}) {
            double t = path.lowest() + f * (path.highest() - path.lowest());
            ParametricPath.Point pt = path.at(t);
            assertTrue(pt.certificate().worst() <= 1e-9, what + " at " + t + ": " + pt.certificate());
            double[] ref = org.isorisk.engine.support.OjAlgoReference.weights(u, m, t, q);
            org.junit.jupiter.api.Assertions.assertNotNull(ref, what + ": ojAlgo at " + t);
            for (int i = 0; i < ref.length; i++) {
                assertEquals(ref[i], pt.weights()[i], 1e-7, what + " at " + t + ", asset " + i);
            }
        }
    }

    // ------------------------------------------------------------------ semi-definite Σ and refusals

    /** Four risky assets and a riskless one (zero variance and covariances: Σ is only semi-definite). */
    private static AssetUniverse withRiskless(double risklessReturn) {
        double[] vol = {0.18, 0.12, 0.07, 0.22};
        double[][] s = new double[5][5];
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                s[i][j] = (i == j ? 1 : 0.3) * vol[i] * vol[j];
            }
        }
        return new AssetUniverse(List.of("Equity", "Credit", "Bonds", "Emerging", "Deposit"),
                new double[] {0.07, 0.05, 0.03, 0.09, risklessReturn}, s);
    }

    @Test
    void aSemiDefiniteCovarianceIsWalkedWhileTheFreeBlockStaysDefiniteAndRefusedClearlyWhenItDoesNot() {
        // The riskless deposit has the highest return (an invented promotional rate): it sits at its 10 % cap along
        // the whole efficient frontier, the free block never holds it, and the walk is exact (against ojAlgo, which
        // accepts a semi-definite Σ).
        Mandate capped = new Mandate(1.0, new double[5], new double[] {1, 1, 1, 1, 0.1}, Map.of(), List.of(),
                List.of());
        AssetUniverse high = withRiskless(0.095);
        ParametricPath path = walk(high, capped, null, false);
        for (ParametricPath.Corner c : path.corners()) {
            assertEquals(ParametricQp.UPPER, c.state()[4], "the deposit at its cap at " + c.target());
            assertTrue(c.certificate().worst() <= 1e-9, c.certificate().toString());
        }
        againstOjAlgo(high, capped, null, path, "semi-definite");
        // Below the minimum-variance return (the inefficient branch) the deposit leaves its cap: the free block (Σ
        // restricted to the assets free to move) would be singular, so the walk refuses, naming the asset.
        org.isorisk.engine.error.NoSolutionException e = org.junit.jupiter.api.Assertions.assertThrows(
                org.isorisk.engine.error.NoSolutionException.class, () -> walk(high, capped, null, true));
        assertEquals(org.isorisk.engine.error.NoSolutionException.Reason.NOT_CONVEX, e.reason());
        assertTrue(e.getMessage().startsWith("the reduced Hessian is singular: the covariance block of the assets "
                + "free to move becomes singular when asset number 5 joins them"), e.getMessage());
    }

    @Test
    void anIndefiniteCovarianceAnInfeasibleMandateAnUnboundedReturnAndEqualReturnsAreReportedAsSuch() {
        AssetUniverse u = FactorModels.universe(6, 3);
        double[][] bad = u.covariance();
        bad[0][1] = bad[1][0] = 2 * Math.sqrt(bad[0][0] * bad[1][1]); // a "correlation" of 2
        org.isorisk.engine.error.NoSolutionException e = org.junit.jupiter.api.Assertions.assertThrows(
                org.isorisk.engine.error.NoSolutionException.class,
                () -> ParametricQp.walk(new ParametricProblem(bad, null, u.expectedReturns(),
                        FactorModels.boxed(6, 0, 1).rows(u.assets()), new double[6], filled(6, 1.0)), false, null));
        assertEquals(org.isorisk.engine.error.NoSolutionException.Reason.NOT_CONVEX, e.reason());
        assertTrue(e.getMessage().startsWith("the covariance matrix is not positive semi-definite (smallest "
                + "eigenvalue -"), e.getMessage());
        // two assets must hold 90 % between them but may hold 30 % each
        double[] pair = new double[6];
        pair[0] = 1;
        pair[1] = 1;
        Mandate infeasible = new Mandate(1.0, new double[6], filled(6, 0.3), Map.of(), List.of(),
                List.of(new LinearConstraint("pair", pair, Relation.AT_LEAST, 0.9)));
        e = org.junit.jupiter.api.Assertions.assertThrows(org.isorisk.engine.error.NoSolutionException.class,
                () -> walk(u, infeasible, null, false));
        assertEquals(org.isorisk.engine.error.NoSolutionException.Reason.INFEASIBLE, e.reason());
        assertEquals("no portfolio meets these constraints together: pair (>= 90.00 %) together with the asset "
                + "bounds and fixed weights; fix: relax one of them", e.getMessage());
        // the budget alone: the minimum exists, but the target can rise without limit
        e = org.junit.jupiter.api.Assertions.assertThrows(org.isorisk.engine.error.NoSolutionException.class,
                () -> walk(u, Mandate.fullyInvested(6), null, false));
        assertEquals("the expected return can rise without limit under these constraints, so the frontier has no "
                + "upper end; fix: bound every asset (a min and a max) or add rows that limit the weights",
                e.getMessage());
        // equal expected returns: μ'w is the budget, so the frontier is one point whose target price is not unique
        AssetUniverse flat = new AssetUniverse(u.assets(), filled(6, 0.05), u.covariance());
        ParametricPath one = walk(flat, FactorModels.boxed(6, 0, 0.5), null, true);
        assertEquals(1, one.corners().size());
        assertEquals(0.05, one.corners().get(0).target(), 1e-15);
        assertTrue(!one.corners().get(0).multipliersUnique());
        assertTrue(one.corners().get(0).certificate().worst() <= 1e-9, one.corners().get(0).certificate().toString());
    }

    private static double[] filled(int n, double v) {
        double[] out = new double[n];
        java.util.Arrays.fill(out, v);
        return out;
    }
}
