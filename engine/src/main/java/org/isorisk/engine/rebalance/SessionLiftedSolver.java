package org.isorisk.engine.rebalance;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.SolverSession;

/**
 * Lifted problems through the project's active-set QP ({@link Allocator#session}): the lifted variables become
 * pseudo-assets {@code buy:<asset>}, {@code sell:<asset>} and an anchor fixed at 1, with covariance
 * {@code H0 + εI} (positive definite; see {@link Lifted#regularisation()}), expected returns {@code (μ − c, μ + c,
 * μ'w0)}, a budget {@code budget − 1'w0 + 1}, the mandate's groups and rows over both pseudo-assets of each
 * asset, and the turnover row. The session keeps one factorisation and warm-starts each solve from the previous
 * solution of the same problem shape. The net-return target is an inequality: when the minimum-variance point
 * already clears it, that point is the answer (target not binding).
 */
final class SessionLiftedSolver implements LiftedSolver {
    private final SolverSettings settings;
    private SolverSession session;
    private Lifted shape;
    private Solution last;

    SessionLiftedSolver(SolverSettings settings) {
        this.settings = settings;
    }

    @Override
    public QpPoint solve(Lifted p, QpPoint warm) {
        if (shape == null || !sameShape(shape, p)) {
            session = Allocator.session(universe(p), mandate(p), settings);
            shape = p;
            last = null;
        }
        Solution s;
        double[] rowPrices = new double[p.rows.size()];
        if (p.targetRow < 0) {
            s = session.solve(Objective.minimumVariance(), last);
        } else {
            Solution free = session.solve(Objective.minimumVariance(), last);
            double need = p.rows.get(p.targetRow).limit();
            if (p.rows.get(p.targetRow).evaluate(point(p, free)) >= need) {
                s = free;
            } else {
                // pseudo target: (μ − c)'b + (μ + c)'s' + μ'w0·a = m
                s = session.solve(Objective.targetReturn(need + p.base), free);
                rowPrices[p.targetRow] = s.multiplier("target_return").map(Multiplier::variancePerUnit).orElse(0.0);
            }
        }
        last = s;
        double[] y = point(p, s);
        for (int k = 0; k < p.rows.size(); k++) {
            if (k == p.targetRow) {
                continue;
            }
            String name = p.rows.get(k).name();
            rowPrices[k] = s.multiplier(name).map(Multiplier::variancePerUnit).orElse(0.0);
        }
        double[] lo = new double[p.size()];
        double[] hi = new double[p.size()];
        List<String> names = names(p);
        for (int j = 0; j < p.size() - 1; j++) {
            lo[j] = s.multiplier("lower:" + names.get(j)).map(Multiplier::variancePerUnit).orElse(0.0);
            hi[j] = s.multiplier("upper:" + names.get(j)).map(Multiplier::variancePerUnit).orElse(0.0);
        }
        // the anchor's stationarity residual is absorbed by its (fixed) bound
        double[][] h = p.hessian();
        int a = p.anchor();
        double g = 0;
        for (int j = 0; j < p.size(); j++) {
            g += 2 * h[a][j] * y[j];
        }
        for (int k = 0; k < p.rows.size(); k++) {
            g -= rowPrices[k] * p.rows.get(k).coefficient(a);
        }
        lo[a] = Math.max(g, 0);
        hi[a] = Math.min(g, 0);
        return new QpPoint(y, rowPrices, lo, hi);
    }

    /** Highest net return {@code μ'w − c'(b + s)} the lifted problem allows (linear programme). */
    static double maxNetReturn(Lifted p) {
        return Allocator.returnRange(universe(p), mandate(p)).max();
    }

    /** Least two-way turnover {@code 1'b − 1's'} the lifted problem allows, ignoring its turnover row. */
    static double minTurnover(Lifted p) {
        AssetUniverse u = universe(p);
        double[] c = new double[p.size()];
        for (int i = 0; i < p.n; i++) {
            c[i] = 1;
            c[p.n + i] = -1;
        }
        return Allocator.returnRange(u.withAssumptions(c, u.covariance()), mandate(p)).min();
    }

    private static double[] point(Lifted p, Solution s) {
        double[] y = s.weights();
        y[p.anchor()] = 1.0;
        return y;
    }

    private static boolean sameShape(Lifted a, Lifted b) {
        return a.universe == b.universe && java.util.Arrays.equals(a.lower, b.lower)
                && java.util.Arrays.equals(a.upper, b.upper) && a.rows.size() == b.rows.size()
                && a.turnoverRow == b.turnoverRow && limitsEqual(a, b);
    }

    private static boolean limitsEqual(Lifted a, Lifted b) {
        for (int k = 0; k < a.rows.size(); k++) {
            if (k != a.targetRow && a.rows.get(k).limit() != b.rows.get(k).limit()) {
                return false;
            }
        }
        return true;
    }

    static List<String> names(Lifted p) {
        List<String> out = new ArrayList<>();
        for (String a : p.universe.assets()) {
            out.add("buy:" + a);
        }
        for (String a : p.universe.assets()) {
            out.add("sell:" + a);
        }
        out.add("anchor:today");
        return out;
    }

    static AssetUniverse universe(Lifted p) {
        double[][] h = p.hessian();
        double eps = p.regularisation();
        for (int j = 0; j < h.length; j++) {
            h[j][j] += eps;
        }
        double[] mu = p.netMu.clone();
        mu[p.anchor()] = p.base;
        return new AssetUniverse(names(p), mu, h);
    }

    static Mandate mandate(Lifted p) {
        double budget = Double.NaN;
        List<LinearConstraint> rows = new ArrayList<>();
        for (int k = 0; k < p.rows.size(); k++) {
            LinearConstraint c = p.rows.get(k);
            if (k == p.targetRow) {
                continue;
            }
            if (c.name().equals("budget")) {
                budget = c.limit() + 1; // the anchor joins the budget row
            } else {
                rows.add(c); // groups, general rows and turnover keep their names over both pseudo-assets
            }
        }
        double[] lo = p.lower.clone();
        double[] hi = p.upper.clone();
        lo[p.anchor()] = Double.NEGATIVE_INFINITY;
        hi[p.anchor()] = Double.POSITIVE_INFINITY;
        return new Mandate(budget, lo, hi, Map.of(p.anchor(), 1.0), List.of(), rows);
    }
}
