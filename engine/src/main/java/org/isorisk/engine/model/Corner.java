package org.isorisk.engine.model;

import java.util.List;

/**
 * A corner portfolio of the mandate frontier: a point where the set of assets away from their bounds (the
 * free set) changes. Between two adjacent corners weights are affine and variance quadratic in the target.
 *
 * @param portfolio   the corner portfolio with its multipliers (including {@code target_return})
 * @param asset       the asset that enters or leaves the free set here (several joined by ", " at a degenerate
 *                    corner; null at an end of the frontier where nothing changes)
 * @param change      what happens: {@code max-return} (the highest-return end), {@code min-return} (the
 *                    lowest-return end of the inefficient branch), {@code enters}, {@code leaves}, {@code several}
 *                    (several assets change at one degenerate corner), {@code min-variance} (the
 *                    minimum-variance end)
 * @param description a plain sentence, e.g. "As the target falls below 5.10 %, Cash enters the free set ..."
 * @param free        the free set on the stretch from this corner towards the minimum-variance portfolio
 *                    (asset names in universe order; copied); empty when not known
 */
public record Corner(Solution portfolio, String asset, String change, String description, List<String> free) {
    public Corner {
        if (portfolio == null || change == null || description == null) {
            throw new IllegalArgumentException("a corner needs its portfolio, change and description");
        }
        free = List.copyOf(free == null ? List.of() : free);
    }

    /** A corner without its free set. */
    public Corner(Solution portfolio, String asset, String change, String description) {
        this(portfolio, asset, change, description, List.of());
    }

    /** Expected return of the corner portfolio, decimal. */
    public double expectedReturn() {
        return portfolio.expectedReturn();
    }

    /** The return-target multiplier ∂V*∂m at the corner (0 when the portfolio has no target row). */
    public double returnMultiplier() {
        return portfolio.multiplier("target_return").map(Multiplier::variancePerUnit).orElse(0.0);
    }
}
