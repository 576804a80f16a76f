package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;
import org.isorisk.engine.model.ReturnRange;

import static org.isorisk.engine.explain.Explain.percent;

/**
 * Infeasibility diagnosis: instead of "no solution", say which constraints contradict each other. Simple
 * contradictions are named by direct checks (a fixed weight outside its bounds, lower bounds above the budget,
 * upper bounds below it, a group limit its members' bounds cannot meet, two groups that cannot both hold); any
 * other contradiction is reduced by the deletion filter (Chinneck &amp; Dravnieks 1991, "Locating minimal infeasible
 * constraint sets in linear programs", ORSA J. Computing 3(2)) over the constraint rows, with the simplex method as
 * the feasibility test. A return target outside what the mandate allows is reported with the achievable range
 * (two linear programs) and the portfolio at its nearer end.
 */
final class Feasibility {
    private Feasibility() {
    }

    private static final double TOL = 1e-9;

    /** Direct checks on bounds, fixed weights and groups; throws the first contradiction found. */
    static void checkMandate(Mandate m, List<String> assets) {
        int n = m.size();
        double[] lo = new double[n];
        double[] hi = new double[n];
        for (int i = 0; i < n; i++) {
            lo[i] = m.lower(i);
            hi[i] = m.upper(i);
        }
        for (Map.Entry<Integer, Double> e : m.fixed().entrySet()) {
            int i = e.getKey();
            double f = e.getValue();
            String a = assets.get(i);
            if (f < lo[i] - TOL || f > hi[i] + TOL) {
                boolean below = f < lo[i] - TOL;
                throw infeasible(String.format(Locale.ROOT,
                        "the fixed weight of '%s' (%s) lies %s its %s bound %s; fix: change the fixed weight or "
                                + "the bounds of '%s'", a, percent(f), below ? "below" : "above",
                        below ? "lower" : "upper", percent(below ? lo[i] : hi[i]), a),
                        List.of("fixed:" + a, (below ? "lower:" : "upper:") + a));
            }
            lo[i] = f;
            hi[i] = f;
        }
        double budget = m.budget();
        double sumLo = sum(lo, all(n));
        double sumHi = sum(hi, all(n));
        if (sumLo > budget + TOL) {
            List<String> names = new ArrayList<>();
            names.add("budget");
            names.addAll(boundNames(m, assets, all(n), true));
            throw infeasible(String.format(Locale.ROOT,
                    "the lower bounds and fixed weights add up to %s, above the budget of %s; fix: lower some minimum "
                            + "or fixed weights so that they add up to at most %s", percent(sumLo), percent(budget),
                    percent(budget)), names);
        }
        if (sumHi < budget - TOL) {
            List<String> names = new ArrayList<>();
            names.add("budget");
            names.addAll(boundNames(m, assets, all(n), false));
            throw infeasible(String.format(Locale.ROOT,
                    "the upper bounds and fixed weights add up to %s, below the budget of %s; fix: raise some maximum "
                            + "weights so that they add up to at least %s", percent(sumHi), percent(budget),
                    percent(budget)), names);
        }
        for (Group g : m.groups()) {
            List<Integer> in = g.members();
            List<Integer> out = complement(n, in);
            double inLo = sum(lo, in);
            double inHi = sum(hi, in);
            double roomLeft = budget - sum(lo, out);
            double mustTake = budget - sum(hi, out);
            String minName = g.min() == g.max() ? "group:" + g.name() : g.minName();
            String maxName = g.min() == g.max() ? "group:" + g.name() : g.maxName();
            if (g.min() > inHi + TOL) {
                List<String> names = new ArrayList<>(List.of(minName));
                names.addAll(boundNames(m, assets, in, false));
                throw infeasible(String.format(Locale.ROOT,
                        "group '%s' must hold at least %s, but the upper bounds of its members add up to only %s; "
                                + "fix: lower the group minimum to at most %s or raise its members' maximum weights",
                        g.name(), percent(g.min()), percent(inHi), percent(inHi)), names);
            }
            if (g.max() < inLo - TOL) {
                List<String> names = new ArrayList<>(List.of(maxName));
                names.addAll(boundNames(m, assets, in, true));
                throw infeasible(String.format(Locale.ROOT,
                        "group '%s' may hold at most %s, but the lower bounds and fixed weights of its members add up "
                                + "to %s; fix: raise the group maximum to at least %s or lower its members' minimum "
                                + "weights", g.name(), percent(g.max()), percent(inLo), percent(inLo)), names);
            }
            if (g.min() > roomLeft + TOL) {
                List<String> names = new ArrayList<>(List.of(minName, "budget"));
                names.addAll(boundNames(m, assets, out, true));
                throw infeasible(String.format(Locale.ROOT,
                        "group '%s' must hold at least %s, but the assets outside it must hold at least %s (their lower "
                                + "bounds and fixed weights), which leaves only %s of the budget of %s; fix: lower the "
                                + "group minimum to at most %s or the other assets' minimum weights", g.name(),
                        percent(g.min()), percent(sum(lo, out)), percent(roomLeft), percent(budget),
                        percent(roomLeft)), names);
            }
            if (g.max() < mustTake - TOL) {
                List<String> names = new ArrayList<>(List.of(maxName, "budget"));
                names.addAll(boundNames(m, assets, out, false));
                throw infeasible(String.format(Locale.ROOT,
                        "group '%s' may hold at most %s, but the assets outside it can hold at most %s (their upper "
                                + "bounds and fixed weights), so at least %s of the budget of %s must go into it; fix: "
                                + "raise the group maximum to at least %s or the other assets' maximum weights",
                        g.name(), percent(g.max()), percent(sum(hi, out)), percent(mustTake), percent(budget),
                        percent(mustTake)), names);
            }
        }
        List<Group> gs = m.groups();
        for (int x = 0; x < gs.size(); x++) {
            for (int z = 0; z < gs.size(); z++) {
                if (x == z) {
                    continue;
                }
                Group a = gs.get(x);
                Group b = gs.get(z);
                if (b.members().containsAll(a.members()) && a.min() > b.max() + TOL) {
                    throw infeasible(String.format(Locale.ROOT,
                            "group '%s' must hold at least %s, but every member of it also belongs to group '%s', "
                                    + "which may hold at most %s; fix: lower the minimum of '%s' or raise the maximum "
                                    + "of '%s'", a.name(), percent(a.min()), b.name(), percent(b.max()), a.name(),
                            b.name()), List.of(minName(a), maxName(b)));
                }
                if (x < z && disjoint(a, b)) {
                    List<Integer> both = new ArrayList<>(a.members());
                    both.addAll(b.members());
                    double room = budget - sum(lo, complement(n, both));
                    if (Double.isFinite(a.min()) && Double.isFinite(b.min()) && a.min() + b.min() > room + TOL) {
                        throw infeasible(String.format(Locale.ROOT,
                                "groups '%s' and '%s' share no asset and must hold at least %s and %s, together %s, "
                                        + "but the budget leaves only %s for them; fix: lower one of the two group "
                                        + "minimums", a.name(), b.name(), percent(a.min()), percent(b.min()),
                                percent(a.min() + b.min()), percent(room)), List.of(minName(a), minName(b), "budget"));
                    }
                }
            }
        }
    }

    private static String minName(Group g) {
        return g.min() == g.max() ? "group:" + g.name() : g.minName();
    }

    private static String maxName(Group g) {
        return g.min() == g.max() ? "group:" + g.name() : g.maxName();
    }

    private static boolean disjoint(Group a, Group b) {
        for (int i : a.members()) {
            if (b.members().contains(i)) {
                return false;
            }
        }
        return true;
    }

    /**
     * When the simplex method finds the rows and bounds infeasible together: the deletion filter keeps a minimal
     * set of rows that still has no solution with the bounds, and the error names them.
     */
    static NoSolutionException explainRows(QpProblem p, int maxIterations) {
        int m = p.rows();
        boolean[] keep = new boolean[m];
        java.util.Arrays.fill(keep, true);
        for (int r = 0; r < m; r++) {
            keep[r] = false;
            if (feasible(p, keep, maxIterations)) {
                keep[r] = true;
            }
        }
        List<String> names = new ArrayList<>();
        List<String> shown = new ArrayList<>();
        for (int r = 0; r < m; r++) {
            if (keep[r]) {
                names.add(p.names[r]);
                shown.add(p.names[r] + " (" + p.rel[r].symbol() + " " + percent(p.b[r]) + ")");
            }
        }
        boolean boundsMatter = true;
        if (!names.isEmpty()) {
            QpProblem unbounded = new QpProblem(p.sigma, minusInf(p.n), plusInf(p.n), p.a, p.rel, p.b, p.names);
            boundsMatter = feasible(unbounded, keep, maxIterations);
        }
        String what = names.isEmpty() ? "the asset bounds and fixed weights" : String.join(", ", shown)
                + (boundsMatter ? " together with the asset bounds and fixed weights" : "");
        String msg = String.format(Locale.ROOT, "no portfolio meets these constraints together: %s; fix: relax one of "
                + "them", what);
        if (names.isEmpty()) {
            names.add("bounds");
        }
        return infeasible(msg, names);
    }

    /** Feasibility of the rows flagged {@code keep} together with the bounds. */
    static boolean feasible(QpProblem p, boolean[] keep, int maxIterations) {
        List<Integer> idx = new ArrayList<>();
        for (int r = 0; r < p.rows(); r++) {
            if (keep[r]) {
                idx.add(r);
            }
        }
        double[][] a = new double[idx.size()][];
        Relation[] rel = new Relation[idx.size()];
        double[] b = new double[idx.size()];
        for (int q = 0; q < idx.size(); q++) {
            a[q] = p.a[idx.get(q)];
            rel[q] = p.rel[idx.get(q)];
            b[q] = p.b[idx.get(q)];
        }
        BoundedSimplex.Result res = BoundedSimplex.solve(a, rel, b, p.lo, p.hi, null, maxIterations);
        return res.outcome() == BoundedSimplex.Outcome.OPTIMAL;
    }

    /** The error for a target outside the achievable range. */
    static NoSolutionException targetOutside(double target, ReturnRange range, List<String> assets) {
        boolean above = target > range.max();
        double end = above ? range.max() : range.min();
        double[] w = above ? range.maxPortfolio() : range.minPortfolio();
        Map<String, Double> portfolio = new LinkedHashMap<>();
        for (int i = 0; i < w.length; i++) {
            portfolio.put(assets.get(i), w[i]);
        }
        String msg = String.format(Locale.ROOT,
                "the target return %s is %s the %s expected return the mandate allows, %s (achievable range %s to %s); "
                        + "the portfolio at that end holds %s; fix: choose a target between %s and %s", percent(target),
                above ? "above" : "below", above ? "highest" : "lowest", percent(end), percent(range.min()),
                percent(range.max()), holdings(w, assets), percent(range.min()), percent(range.max()));
        return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, msg, List.of("target_return"),
                new double[] {range.min(), range.max()}, portfolio);
    }

    /** "Domestic Equity 35.00 %, Cash 2.00 %, ..." for the largest holdings (at most 12). */
    static String holdings(double[] w, List<String> assets) {
        List<Integer> order = new ArrayList<>();
        for (int i = 0; i < w.length; i++) {
            if (Math.abs(w[i]) > 5e-5) {
                order.add(i);
            }
        }
        order.sort(Comparator.comparingDouble((Integer i) -> -Math.abs(w[i])).thenComparing(i -> i));
        StringBuilder sb = new StringBuilder();
        int shown = Math.min(12, order.size());
        for (int q = 0; q < shown; q++) {
            if (q > 0) {
                sb.append(", ");
            }
            sb.append(assets.get(order.get(q))).append(' ').append(percent(w[order.get(q)]));
        }
        if (order.size() > shown) {
            sb.append(" and ").append(order.size() - shown).append(" smaller holdings");
        }
        if (order.isEmpty()) {
            sb.append("nothing");
        }
        return sb.toString();
    }

    static NoSolutionException infeasible(String msg, List<String> names) {
        return new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, msg, names);
    }

    private static List<String> boundNames(Mandate m, List<String> assets, List<Integer> which, boolean lower) {
        List<String> names = new ArrayList<>();
        for (int i : which) {
            String a = assets.get(i);
            if (m.fixed().containsKey(i)) {
                names.add("fixed:" + a);
            } else if (lower && Double.isFinite(m.lower(i)) && m.lower(i) != 0) {
                names.add("lower:" + a);
            } else if (!lower && Double.isFinite(m.upper(i))) {
                names.add("upper:" + a);
            }
        }
        return names;
    }

    private static List<Integer> all(int n) {
        List<Integer> a = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            a.add(i);
        }
        return a;
    }

    private static List<Integer> complement(int n, List<Integer> in) {
        boolean[] mark = new boolean[n];
        for (int i : in) {
            mark[i] = true;
        }
        List<Integer> out = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            if (!mark[i]) {
                out.add(i);
            }
        }
        return out;
    }

    private static double sum(double[] v, List<Integer> which) {
        double s = 0;
        for (int i : which) {
            s += v[i];
        }
        return s;
    }

    private static double[] minusInf(int n) {
        double[] v = new double[n];
        java.util.Arrays.fill(v, Double.NEGATIVE_INFINITY);
        return v;
    }

    private static double[] plusInf(int n) {
        double[] v = new double[n];
        java.util.Arrays.fill(v, Double.POSITIVE_INFINITY);
        return v;
    }
}
