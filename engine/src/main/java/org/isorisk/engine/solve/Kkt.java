package org.isorisk.engine.solve;

import java.util.List;
import org.isorisk.engine.linalg.Dense;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Relation;

/**
 * The one KKT certificate of the project. In the convention ∂V*∂limit, the Lagrangian
 * {@code L = w'Σw − Σ_k s_k (a_k'w − b_k) − Σ_i (sl_i + su_i)(w_i − bound_i)} gives stationarity
 * {@code 2Σw = Σ_k s_k a_k + sl + su}, with {@code s ≤ 0} on {@code <=} rows and upper bounds and {@code s ≥ 0} on
 * {@code >=} rows and lower bounds.
 */
public final class Kkt {
    private Kkt() {
    }

    /**
     * Computes the certificate of a candidate solution.
     *
     * @param sigma       covariance (not modified)
     * @param w           weights (not modified)
     * @param rows        constraint rows (not modified)
     * @param rowPrices   shadow price of each row, ∂V*∂b_k
     * @param lower       lower bounds ({@code -Infinity} for none)
     * @param upper       upper bounds ({@code +Infinity} for none)
     * @param lowerPrices shadow price of each lower bound (≥ 0; 0 when slack or absent)
     * @param upperPrices shadow price of each upper bound (≤ 0; 0 when slack or absent)
     * @param condition   condition number to report
     * @param threshold   the method's promised tolerance
     * @param convex      whether Σ is positive semi-definite
     */
    public static Certificate certify(double[][] sigma, double[] w, List<LinearConstraint> rows, double[] rowPrices,
                                      double[] lower, double[] upper, double[] lowerPrices, double[] upperPrices,
                                      double condition, double threshold, boolean convex) {
        return certifyProduct(multiply(sigma, w), w, rows, rowPrices, lower, upper, lowerPrices, upperPrices,
                condition, threshold, convex);
    }

    /**
     * The same certificate from an already computed {@code Σw} (which the caller also needs, e.g. for the
     * variance), so that one product serves both.
     *
     * @param sigmaW {@code Σw} computed from the full covariance and the candidate weights (not modified)
     */
    static Certificate certifyProduct(double[] sigmaW, double[] w, List<LinearConstraint> rows, double[] rowPrices,
                                      double[] lower, double[] upper, double[] lowerPrices, double[] upperPrices,
                                      double condition, double threshold, boolean convex) {
        return certifyProduct(sigmaW, w, rows, null, rowPrices, lower, upper, lowerPrices, upperPrices, condition,
                threshold, convex);
    }

    /**
     * The same certificate with the rows' limits given apart: {@code limits[k]} stands for the limit of row k, so
     * that a caller certifying many points against rows that differ only in their limit (the return target of
     * each corner of a frontier) builds the rows once.
     *
     * @param limits the limit of each row, or null for the rows' own limits (not modified)
     */
    static Certificate certifyProduct(double[] sigmaW, double[] w, List<LinearConstraint> rows, double[] limits,
                                      double[] rowPrices, double[] lower, double[] upper, double[] lowerPrices,
                                      double[] upperPrices, double condition, double threshold, boolean convex) {
        return certifyProduct(sigmaW, null, w, rows, limits, rowPrices, lower, upper, lowerPrices, upperPrices,
                condition, threshold, convex);
    }

    /**
     * The same certificate for the objective {@code w'Σw − 2q'w} with a linear term (surplus variance, tracking
     * error, where {@code q} is the covariance of the assets with the liability over the funded ratio, or
     * {@code Σb}): stationarity becomes {@code 2Σw − 2q = Σ_k s_k a_k + sl + su}, and each asset's scale counts
     * {@code |2q_i|} beside {@code |2(Σw)_i|}. The multipliers are still ∂V*∂limit of that objective.
     *
     * @param linear {@code q}, or null for none (not modified)
     */
    static Certificate certifyProduct(double[] sigmaW, double[] linear, double[] w, List<LinearConstraint> rows,
                                      double[] limits, double[] rowPrices, double[] lower, double[] upper,
                                      double[] lowerPrices, double[] upperPrices, double condition, double threshold,
                                      boolean convex) {
        int n = w.length;
        double[] residual = new double[n];
        double[] scale = new double[n];
        for (int i = 0; i < n; i++) {
            double q = linear == null ? 0 : 2 * linear[i];
            residual[i] = 2 * sigmaW[i] - q;
            scale[i] = Math.abs(2 * sigmaW[i]) + Math.abs(q);
        }
        double primal = 0;
        double dual = 0;
        double comp = 0;
        for (int k = 0; k < rows.size(); k++) {
            LinearConstraint c = rows.get(k);
            double s = rowPrices[k];
            for (int i = 0; i < n; i++) {
                double t = s * c.coefficient(i);
                residual[i] -= t;
                scale[i] += Math.abs(t);
            }
            double limit = limits == null ? c.limit() : limits[k];
            double slack = c.evaluate(w) - limit;
            double violation = switch (c.relation()) {
                case EQUAL -> Math.abs(slack);
                case AT_MOST -> Math.max(0, slack);
                case AT_LEAST -> Math.max(0, -slack);
            };
            primal = Math.max(primal, violation / Math.max(1, Math.abs(limit)));
            if (c.relation() == Relation.AT_MOST) {
                dual = Math.max(dual, Math.max(0, s));
                comp = Math.max(comp, Math.abs(s * slack));
            } else if (c.relation() == Relation.AT_LEAST) {
                dual = Math.max(dual, Math.max(0, -s));
                comp = Math.max(comp, Math.abs(s * slack));
            }
        }
        for (int i = 0; i < n; i++) {
            double sl = lowerPrices == null ? 0 : lowerPrices[i];
            double su = upperPrices == null ? 0 : upperPrices[i];
            residual[i] -= sl + su;
            scale[i] += Math.abs(sl) + Math.abs(su);
            if (lower != null && Double.isFinite(lower[i])) {
                primal = Math.max(primal, Math.max(0, lower[i] - w[i]));
                comp = Math.max(comp, Math.abs(sl * (w[i] - lower[i])));
            } else if (sl != 0) {
                dual = Math.max(dual, Math.abs(sl));
            }
            if (upper != null && Double.isFinite(upper[i])) {
                primal = Math.max(primal, Math.max(0, w[i] - upper[i]));
                comp = Math.max(comp, Math.abs(su * (upper[i] - w[i])));
            } else if (su != 0) {
                dual = Math.max(dual, Math.abs(su));
            }
            dual = Math.max(dual, Math.max(0, -sl));
            dual = Math.max(dual, Math.max(0, su));
        }
        double worstResidual = 0;
        double worstScale = 0;
        for (int i = 0; i < n; i++) {
            worstResidual = Math.max(worstResidual, Math.abs(residual[i]));
            worstScale = Math.max(worstScale, scale[i]);
        }
        double unit = worstScale > 0 ? worstScale : 1;
        return new Certificate(worstResidual / unit, primal, dual / unit, comp / unit, condition, threshold, convex);
    }

    /** {@code Σw} over the full (symmetric) matrix. */
    static double[] multiply(double[][] sigma, double[] w) {
        return Dense.multiplySymmetric(sigma, w);
    }
}
