package org.isorisk.engine.risk;

/**
 * One asset's part in a portfolio's risk.
 *
 * @param asset     asset name
 * @param weight    the asset's weight (or active weight, for tracking error), decimal
 * @param marginal  marginal contribution {@code (Σw)_i/σ}: volatility added per unit of weight, to first order
 * @param component component contribution {@code w_i (Σw)_i/σ}; the components add up to σ
 * @param share     component divided by σ, so that shares add up to 1 (may be negative for a hedge)
 */
public record Contribution(String asset, double weight, double marginal, double component, double share) {
}
