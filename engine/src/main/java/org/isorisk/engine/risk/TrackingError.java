package org.isorisk.engine.risk;

import java.util.Optional;

/**
 * Tracking error of a portfolio against a benchmark: {@code sqrt((w−b)'Σ(w−b))}, the volatility of the
 * difference in returns.
 *
 * @param value  the tracking error, decimal, annualised
 * @param active decomposition of the active portfolio {@code w − b}: its contributions add up to the tracking
 *               error; null when the tracking error is zero (then there is nothing to decompose)
 */
public record TrackingError(double value, RiskDecomposition active) {

    /** The decomposition of active risk, when the tracking error is not zero. */
    public Optional<RiskDecomposition> decomposition() {
        return Optional.ofNullable(active);
    }
}
