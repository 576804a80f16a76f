package org.isorisk.engine.model;

/**
 * The scalars of the unconstrained (budget + return target) frontier, Merton (1972):
 * {@code A = 1'Σ⁻¹μ}, {@code B = μ'Σ⁻¹μ}, {@code C = 1'Σ⁻¹1}, {@code D = BC − A²}.
 * With budget {@code b}, the minimum variance at target {@code m} is {@code (C m² − 2A b m + B b²)/D}.
 *
 * @param a      1'Σ⁻¹μ
 * @param b      μ'Σ⁻¹μ
 * @param c      1'Σ⁻¹1
 * @param d      BC − A² (> 0 unless μ is parallel to 1)
 * @param budget sum of weights the frontier is drawn for
 */
public record MertonScalars(double a, double b, double c, double d, double budget) {

    /** Minimum variance {@code V*(m)} for target return {@code m}. */
    public double variance(double m) {
        return (c * m * m - 2 * a * budget * m + b * budget * budget) / d;
    }

    /** Minimum volatility for target {@code m}. */
    public double volatility(double m) {
        return Math.sqrt(Math.max(0, variance(m)));
    }

    /** Return-target shadow price {@code ∂V*∂m = 2(C m − A b)/D}. */
    public double returnMultiplier(double m) {
        return 2 * (c * m - a * budget) / d;
    }

    /** Budget shadow price {@code ∂V*∂b = 2(B b − A m)/D}. */
    public double budgetMultiplier(double m) {
        return 2 * (b * budget - a * m) / d;
    }

    /** Expected return of the global minimum-variance portfolio, {@code A b / C}. */
    public double minimumVarianceReturn() {
        return a * budget / c;
    }

    /** Variance of the global minimum-variance portfolio, {@code b² / C}. */
    public double minimumVariance() {
        return budget * budget / c;
    }
}
