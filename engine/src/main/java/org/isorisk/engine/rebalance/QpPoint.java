package org.isorisk.engine.rebalance;

/**
 * A solution of the lifted problem with its multipliers in the project's convention ∂V*∂limit.
 *
 * @param x           lifted point (w, b, s)
 * @param rowPrices   one per row of {@link Lifted#rows}
 * @param lowerPrices one per variable (≥ 0, 0 when slack)
 * @param upperPrices one per variable (≤ 0, 0 when slack)
 */
record QpPoint(double[] x, double[] rowPrices, double[] lowerPrices, double[] upperPrices) {
}
