package org.isorisk.notebooks.chart;

import java.util.List;
import org.isorisk.engine.error.InputException;

/**
 * One portfolio's risk contributions as shares of its volatility (Euler: {@code w_i (Σw)_i / σ²}, summing to 1),
 * as the engine's risk decomposition computed them, for the risk-contribution bars.
 *
 * @param portfolio legend text, e.g. "Proposed"
 * @param assets    asset names, in the order of {@code shares}
 * @param shares    each asset's share of volatility, decimal (0.25 = a quarter of the risk); may be negative
 */
public record RiskShares(String portfolio, List<String> assets, double[] shares) {

    /** How far the shares may sum from 1 (they are a decomposition of the whole volatility). */
    static final double SUM_TOLERANCE = 1e-6;

    public RiskShares {
        if (portfolio == null || portfolio.isBlank()) {
            throw InputException.of("risk contributions need the portfolio's name").build();
        }
        if (assets == null || shares == null || assets.size() != shares.length || assets.isEmpty()) {
            throw InputException.of("risk contributions of '" + portfolio + "' need one share per asset").build();
        }
        assets = List.copyOf(assets);
        shares = shares.clone();
        double sum = 0;
        for (int i = 0; i < shares.length; i++) {
            if (!Double.isFinite(shares[i])) {
                throw InputException.of("risk contribution is not a finite number").asset(assets.get(i))
                        .value(shares[i]).build();
            }
            sum += shares[i];
        }
        if (Math.abs(sum - 1) > SUM_TOLERANCE) {
            throw InputException.of("risk contributions of '" + portfolio + "' must sum to 100 % of volatility "
                    + "(Euler decomposition)").value(Style.percent(sum, 4))
                    .fix("pass component contributions divided by the portfolio's volatility").build();
        }
    }

    /** The shares of an engine risk decomposition: component contribution over volatility, per asset. */
    public static RiskShares of(String portfolio, org.isorisk.engine.risk.RiskDecomposition d) {
        double[] sh = new double[d.assets().size()];
        for (int i = 0; i < sh.length; i++) {
            sh[i] = d.share(i);
        }
        return new RiskShares(portfolio, d.assets(), sh);
    }

    @Override
    public double[] shares() {
        return shares.clone();
    }

    /** Share of asset i without copying. */
    double share(int i) {
        return shares[i];
    }
}
