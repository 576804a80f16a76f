package org.isorisk.engine.model;

/**
 * Evidence that a solution satisfies the Karush-Kuhn-Tucker conditions of its problem.
 *
 * @param stationarity    {@code ‖2Σw − Σ_k ν_k a_k‖∞}, relative to {@code max(1, ‖2Σw‖∞)}
 * @param primal          largest violation of an equality, bound or inequality
 * @param dual            largest wrong-signed inequality multiplier (0 when all signs are right)
 * @param complementarity {@code max |multiplier × slack|}
 * @param conditionNumber condition number of Σ (2-norm), or of the reduced system when Σ is not used whole:
 *                        exact up to 64 assets, above that a Lanczos estimate to about 1 % or better, never
 *                        above the true value (linalg.Spectrum#CONDITION_ACCURACY)
 * @param threshold       the tolerance the method promises: 1e-10 closed form, 1e-7 numerical
 * @param convex          true when Σ is positive (semi-)definite, so the KKT conditions are sufficient and the
 *                        minimum is global (unique when positive definite)
 */
public record Certificate(double stationarity, double primal, double dual, double complementarity,
                          double conditionNumber, double threshold, boolean convex) {

    /** True when every residual is within the method's threshold and the problem is convex. */
    public boolean passes() {
        return convex && stationarity <= threshold && primal <= threshold && dual <= threshold
                && complementarity <= threshold;
    }

    /** Largest of the four residuals. */
    public double worst() {
        return Math.max(Math.max(stationarity, primal), Math.max(dual, complementarity));
    }
}
