package org.isorisk.engine.views;

/**
 * One asset's row of the blend's table, annualised total returns, decimal.
 *
 * @param asset      the asset's name
 * @param prior      {@code r_f + Π_i}
 * @param posterior  {@code r_f + μ̄_i}
 */
public record AssetLine(String asset, double prior, double posterior) {

    /** {@code posterior − prior}. */
    public double change() {
        return posterior - prior;
    }
}
