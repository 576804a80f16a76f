package org.isorisk.engine.risk;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;

/**
 * Decomposes the risk of given portfolios. With {@code σ(w) = sqrt(w'Σw)} homogeneous of degree one,
 * Euler's theorem gives {@code σ = Σ_i w_i ∂σ/∂w_i} with {@code ∂σ/∂w_i = (Σw)_i/σ}: the component
 * contributions {@code w_i (Σw)_i/σ} add up to the volatility.
 */
public final class RiskAnalysis {
    private RiskAnalysis() {
    }

    /**
     * Volatility and contributions of portfolio {@code w}.
     *
     * @param u the assets and their covariance
     * @param w weights in universe order, decimal (not modified)
     * @throws InputException when the portfolio has zero volatility (nothing to decompose)
     */
    public static RiskDecomposition decompose(AssetUniverse u, double[] w) {
        RiskDecomposition d = decomposeOrNull(u, w);
        if (d == null) {
            throw InputException.of("the portfolio has zero volatility, so its risk cannot be split into contributions")
                    .fix("give a portfolio with at least one non-zero weight").build();
        }
        return d;
    }

    /**
     * Tracking error of {@code w} against benchmark {@code b} and the decomposition of active risk.
     *
     * @param w portfolio weights (not modified)
     * @param b benchmark weights (not modified)
     */
    public static TrackingError trackingError(AssetUniverse u, double[] w, double[] b) {
        check(u, b);
        check(u, w);
        double[] d = new double[w.length];
        for (int i = 0; i < w.length; i++) {
            d[i] = w[i] - b[i];
        }
        RiskDecomposition active = decomposeOrNull(u, d);
        return new TrackingError(active == null ? 0.0 : active.volatility(), active);
    }

    /**
     * Sharpe ratio {@code (m − r_f)/σ}: excess expected return per unit of volatility (Sharpe 1966).
     *
     * @param expectedReturn decimal, annualised
     * @param volatility     decimal, annualised
     * @param riskFree       decimal, annualised
     */
    public static double sharpeRatio(double expectedReturn, double volatility, double riskFree) {
        return (expectedReturn - riskFree) / volatility;
    }

    private static RiskDecomposition decomposeOrNull(AssetUniverse u, double[] w) {
        check(u, w);
        int n = w.length;
        double[] sw = new double[n];
        double var = 0;
        double ret = 0;
        for (int i = 0; i < n; i++) {
            double s = 0;
            for (int j = 0; j < n; j++) {
                s += u.covariance(i, j) * w[j];
            }
            sw[i] = s;
            var += w[i] * s;
            ret += u.expectedReturn(i) * w[i];
        }
        if (!(var > 0)) {
            return null;
        }
        double vol = Math.sqrt(var);
        double[] marginal = new double[n];
        double[] component = new double[n];
        double sum = 0;
        for (int i = 0; i < n; i++) {
            marginal[i] = sw[i] / vol;
            component[i] = w[i] * marginal[i];
            sum += component[i];
        }
        return new RiskDecomposition(u.assets(), w, ret, var, vol, marginal, component, Math.abs(sum - vol));
    }

    private static void check(AssetUniverse u, double[] w) {
        if (w == null || w.length != u.size()) {
            throw new IllegalArgumentException("one weight per asset of the universe");
        }
        for (double x : w) {
            if (!Double.isFinite(x)) {
                throw InputException.of("a weight is not a finite number").value(x).build();
            }
        }
    }
}
