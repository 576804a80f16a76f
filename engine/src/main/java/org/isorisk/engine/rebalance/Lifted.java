package org.isorisk.engine.rebalance;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;

/**
 * The rebalance lifted to split buy/sell variables: {@code x = (w, b, s)} in {@code R^{3n}} with
 * {@code w − b + s = w0}, {@code 0 ≤ b, s ≤ T}, the mandate's rows and bounds on w, the turnover row
 * {@code 1'(b + s) ≤ τ} and, when a target is set, the net-return row {@code μ'w − c'(b + s) ≥ m}.
 * The objective is {@code x'Hx} with {@code H = blockdiag(Σ, 0, 0)}: positive semi-definite, singular in (b, s).
 *
 * <p>At an optimum with a binding turnover row or a binding costly target, {@code b_i s_i = 0} holds
 * automatically (stationarity in b_i plus s_i gives {@code lb_i + ls_i = −2π_τ + 2c_iπ_m > 0}); otherwise round
 * trips are possible but idle, and {@link #net(double[])} removes them without changing w or any multiplier.
 */
final class Lifted {
    final int n;
    final double[][] sigma;
    final double[] w0;
    final List<LinearConstraint> rows = new ArrayList<>();
    final double[] lower;
    final double[] upper;
    /** Row positions: mandate rows are 0..mandateRows-1, trade identities next, then turnover and target. */
    final int mandateRows;
    final int turnoverRow;
    final int targetRow;
    final boolean[] frozen;

    Lifted(AssetUniverse u, Mandate m, double[] w0, TradingLimits lim, boolean[] frozen, Double target) {
        this.n = u.size();
        this.sigma = u.covariance();
        this.w0 = w0.clone();
        this.frozen = frozen.clone();
        int p = 3 * n;
        for (LinearConstraint c : m.rows(u.assets())) {
            rows.add(new LinearConstraint(c.name(), Arrays.copyOf(c.coefficients(), p), c.relation(), c.limit()));
        }
        mandateRows = rows.size();
        for (int i = 0; i < n; i++) {
            double[] a = new double[p];
            a[i] = 1;
            a[n + i] = -1;
            a[2 * n + i] = 1;
            rows.add(new LinearConstraint("trade:" + u.assets().get(i), a, Relation.EQUAL, w0[i]));
        }
        if (Double.isFinite(lim.maxTurnover())) {
            double[] a = new double[p];
            Arrays.fill(a, n, p, 1.0);
            turnoverRow = rows.size();
            rows.add(new LinearConstraint("turnover", a, Relation.AT_MOST, lim.maxTurnover()));
        } else {
            turnoverRow = -1;
        }
        if (target != null) {
            double[] a = new double[p];
            for (int i = 0; i < n; i++) {
                a[i] = u.expectedReturn(i);
                a[n + i] = -lim.cost(i);
                a[2 * n + i] = -lim.cost(i);
            }
            targetRow = rows.size();
            rows.add(new LinearConstraint("target_return", a, Relation.AT_LEAST, target));
        } else {
            targetRow = -1;
        }
        lower = new double[p];
        upper = new double[p];
        for (int i = 0; i < n; i++) {
            lower[i] = m.lower(i);
            upper[i] = m.upper(i);
            double t = frozen[i] ? 0 : lim.maxTrade(i);
            upper[n + i] = t;
            upper[2 * n + i] = t;
        }
    }

    /** The lifted Hessian {@code blockdiag(Σ, 0, 0)} of the objective {@code x'Hx}. */
    double[][] hessian() {
        int p = 3 * n;
        double[][] h = new double[p][p];
        for (int i = 0; i < n; i++) {
            System.arraycopy(sigma[i], 0, h[i], 0, n);
        }
        return h;
    }

    /** Number of lifted variables. */
    int size() {
        return 3 * n;
    }

    /** The lifted point of a portfolio w: {@code b = max(w − w0, 0)}, {@code s = max(w0 − w, 0)}. */
    double[] lift(double[] w) {
        double[] x = new double[3 * n];
        for (int i = 0; i < n; i++) {
            x[i] = w[i];
            double d = w[i] - w0[i];
            x[n + i] = Math.max(d, 0);
            x[2 * n + i] = Math.max(-d, 0);
        }
        return x;
    }

    /** Removes idle round trips: keeps w and replaces (b, s) by the positive and negative parts of w − w0. */
    double[] net(double[] x) {
        double[] y = x.clone();
        for (int i = 0; i < n; i++) {
            double d = x[n + i] - x[2 * n + i];
            y[n + i] = Math.max(d, 0);
            y[2 * n + i] = Math.max(-d, 0);
            y[i] = w0[i] + d;
        }
        return y;
    }

    /** The weights part of a lifted point. */
    double[] weights(double[] x) {
        return Arrays.copyOf(x, n);
    }
}
