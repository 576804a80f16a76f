package org.isorisk.engine.rebalance;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;

/**
 * The rebalance in split buy/sell variables with w eliminated: {@code y = (b, s')} in {@code R^{2n}}, where
 * {@code b ≥ 0} are the buys, {@code s' = −s ≤ 0} the sells (signed so that the budget stays a budget) and
 * {@code w = w0 + b + s'}. Then
 * <ul>
 *   <li>objective {@code w'Σw = (w0 + b + s')'Σ(w0 + b + s')}: its linear part enters through an anchor variable
 *   {@code a} fixed at 1 (last entry of y), so that the objective stays a pure quadratic form {@code y'H0y} with
 *   {@code H0 = M'ΣM}, {@code M = [I I w0]}: positive semi-definite and singular (a round trip
 *   {@code b_i = −s'_i} changes nothing);</li>
 *   <li>every mandate row {@code a'w ◇ h} becomes {@code a'b + a's' ◇ h − a'w0} (same multiplier ∂V*∂h), the
 *   budget a budget of {@code budget − 1'w0};</li>
 *   <li>turnover (two-way) {@code 1'b − 1's' ≤ τ}; net return {@code (μ − c)'b + (μ + c)'s' ≥ m − μ'w0};</li>
 *   <li>the bounds of w fold into simple bounds: {@code b_i ∈ [max(0, l_i − w0_i), min(T_i, max(0, u_i − w0_i))]},
 *   {@code s_i ∈ [max(0, w0_i − u_i), min(T_i, max(0, w0_i − l_i))]}, which imply {@code l ≤ w ≤ u} and force
 *   the trades that cure a breached bound; frozen assets have {@code b_i = s_i = 0}.</li>
 * </ul>
 * Which limit a variable's bound comes from (the asset's bound or its trade limit) is kept, to name the
 * multiplier.
 */
final class Lifted {
    /** Where a bound of a lifted variable comes from. */
    enum Source { NONE, ZERO, ASSET_LOWER, ASSET_UPPER, TRADE_LIMIT, FROZEN }

    final int n;
    final AssetUniverse universe;
    final double[] w0;
    final List<LinearConstraint> rows = new ArrayList<>();
    final double[] lower;
    final double[] upper;
    final Source[] lowerSource;
    final Source[] upperSource;
    final int mandateRows;
    final int turnoverRow;
    final int targetRow;
    final double[] netMu;
    final double base;

    Lifted(AssetUniverse u, Mandate m, double[] w0, TradingLimits lim, boolean[] frozen, Double target) {
        this.n = u.size();
        this.universe = u;
        this.w0 = w0.clone();
        int p = 2 * n + 1;
        double[] lo = new double[n];
        double[] hi = new double[n];
        for (int i = 0; i < n; i++) {
            lo[i] = m.lower(i);
            hi[i] = m.upper(i);
        }
        for (var e : m.fixed().entrySet()) {
            lo[e.getKey()] = e.getValue();
            hi[e.getKey()] = e.getValue();
        }
        for (LinearConstraint c : m.rows(u.assets())) {
            if (c.name().startsWith("fixed:")) {
                continue; // a fixed weight is a pair of bounds here
            }
            double[] a = new double[p];
            double shift = 0;
            for (int i = 0; i < n; i++) {
                a[i] = c.coefficient(i);
                a[n + i] = c.coefficient(i);
                shift += c.coefficient(i) * w0[i];
            }
            rows.add(new LinearConstraint(c.name(), a, c.relation(), c.limit() - shift));
        }
        mandateRows = rows.size();
        if (Double.isFinite(lim.maxTurnover())) {
            double[] a = new double[p];
            for (int i = 0; i < n; i++) {
                a[i] = 1;
                a[n + i] = -1;
            }
            turnoverRow = rows.size();
            rows.add(new LinearConstraint("turnover", a, Relation.AT_MOST, lim.maxTurnover()));
        } else {
            turnoverRow = -1;
        }
        netMu = new double[p]; // the anchor's entry stays 0: μ'w0 is moved to the limit
        double r0 = 0;
        for (int i = 0; i < n; i++) {
            netMu[i] = u.expectedReturn(i) - lim.cost(i);
            netMu[n + i] = u.expectedReturn(i) + lim.cost(i);
            r0 += u.expectedReturn(i) * w0[i];
        }
        base = r0;
        if (target != null) {
            targetRow = rows.size();
            rows.add(new LinearConstraint("target_return", netMu, Relation.AT_LEAST, target - r0));
        } else {
            targetRow = -1;
        }
        lower = new double[p];
        upper = new double[p];
        lowerSource = new Source[p];
        upperSource = new Source[p];
        lower[2 * n] = 1;
        upper[2 * n] = 1;
        lowerSource[2 * n] = Source.NONE;
        upperSource[2 * n] = Source.NONE;
        for (int i = 0; i < n; i++) {
            double t = lim.maxTrade(i);
            // buys b_i
            double bLo = Math.max(0, lo[i] - w0[i]);
            double bRoom = Math.max(0, hi[i] - w0[i]);
            lower[i] = bLo;
            lowerSource[i] = bLo > 0 ? Source.ASSET_LOWER : Source.ZERO;
            if (frozen[i]) {
                upper[i] = 0;
                upperSource[i] = Source.FROZEN;
            } else if (bRoom <= t) {
                upper[i] = bRoom;
                upperSource[i] = Double.isFinite(bRoom) ? Source.ASSET_UPPER : Source.NONE;
            } else {
                upper[i] = t;
                upperSource[i] = Source.TRADE_LIMIT;
            }
            // sells s'_i = −s_i
            double sLo = Math.max(0, w0[i] - hi[i]);
            double sRoom = Math.max(0, w0[i] - lo[i]);
            int k = n + i;
            upper[k] = -sLo;
            upperSource[k] = sLo > 0 ? Source.ASSET_UPPER : Source.ZERO;
            if (frozen[i]) {
                lower[k] = 0;
                lowerSource[k] = Source.FROZEN;
            } else if (sRoom <= t) {
                lower[k] = -sRoom;
                lowerSource[k] = Double.isFinite(sRoom) ? Source.ASSET_LOWER : Source.NONE;
            } else {
                lower[k] = -t;
                lowerSource[k] = Source.TRADE_LIMIT;
            }
            if (frozen[i] && (bLo > 0 || sLo > 0)) {
                // a breach that must be cured but may not be traded: make the box empty on purpose
                lower[i] = bLo;
                upper[i] = 0;
            }
        }
    }

    /** The Hessian {@code H0 = M'ΣM} of the objective {@code y'H0y} (no regularisation). */
    double[][] hessian() {
        int p = 2 * n + 1;
        int a = 2 * n;
        double[][] h = new double[p][p];
        double[] g = new double[n];
        double v0 = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double s = universe.covariance(i, j);
                h[i][j] = s;
                h[i][n + j] = s;
                h[n + i][j] = s;
                h[n + i][n + j] = s;
                g[i] += s * w0[j];
            }
            v0 += w0[i] * g[i];
        }
        for (int i = 0; i < n; i++) {
            h[i][a] = g[i];
            h[a][i] = g[i];
            h[n + i][a] = g[i];
            h[a][n + i] = g[i];
        }
        h[a][a] = v0;
        return h;
    }

    /** Position of the anchor variable (fixed at 1). */
    int anchor() {
        return 2 * n;
    }

    /**
     * The regularisation {@code ε} added to the diagonal of {@code H0} for solvers that need a positive definite
     * Hessian: {@code 1e-9 × mean(diag Σ)}. It removes the zero-curvature round trips and changes the optimum by
     * {@code O(ε)}; the certificate is computed on the unregularised problem, where it adds a stationarity residual
     * of at most {@code 2ε·max|y|} (about 1e-10 relative), far inside the 1e-7 promised for numerical solutions.
     */
    double regularisation() {
        double t = 0;
        for (int i = 0; i < n; i++) {
            t += universe.covariance(i, i);
        }
        return REGULARISATION * t / n;
    }

    /** Relative size of {@link #regularisation()}: 1e-9. */
    static final double REGULARISATION = 1e-9;

    /** Number of lifted variables, the anchor included. */
    int size() {
        return 2 * n + 1;
    }

    /** True when some variable's box is empty (a breach that a frozen asset or a trade limit cannot cure). */
    boolean emptyBox() {
        for (int j = 0; j < 2 * n; j++) {
            if (lower[j] > upper[j]) {
                return true;
            }
        }
        return false;
    }

    /** Removes idle round trips: keeps w and replaces (b, s') by the positive and negative parts of w − w0. */
    double[] net(double[] y) {
        double[] z = y.clone();
        for (int i = 0; i < n; i++) {
            double d = y[i] + y[n + i];
            z[i] = Math.min(Math.max(d, lower[i]), Math.max(upper[i], 0));
            z[n + i] = d - z[i];
        }
        return z;
    }

    /** The weights {@code w = w0 + b + s'}. */
    double[] weights(double[] y) {
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = w0[i] + y[i] + y[n + i];
        }
        return w;
    }

    /** Net expected return {@code μ'w − c'(b + s)}. */
    double netReturn(double[] y) {
        double r = base;
        for (int j = 0; j < 2 * n; j++) {
            r += netMu[j] * y[j];
        }
        return r;
    }

    /** Two-way turnover {@code 1'b − 1's'}. */
    double turnover(double[] y) {
        double t = 0;
        for (int i = 0; i < n; i++) {
            t += y[i] - y[n + i];
        }
        return t;
    }
}
