package org.isorisk.engine.model;

/**
 * A corner portfolio of the mandate frontier: a point where the set of assets away from their bounds (the
 * free set) changes. Between two adjacent corners weights are affine and variance quadratic in the target.
 *
 * @param portfolio   the corner portfolio with its multipliers
 * @param asset       the asset that enters or leaves the free set here (null at the ends of the frontier)
 * @param change      what happens: {@code start}, {@code enters}, {@code leaves}, {@code end}
 * @param description a plain sentence, e.g. "Cash leaves the free set and stays at its lower bound 0.00 %"
 */
public record Corner(Solution portfolio, String asset, String change, String description) {
}
