package org.isorisk.engine.model;

/**
 * The shadow price of one constraint in the project's single convention: the derivative of the optimal
 * variance with respect to the constraint's limit (envelope theorem), {@code ∂V*∂limit}.
 * Upper bounds and {@code <=} limits have shadow price ≤ 0 when binding, lower bounds and {@code >=} limits ≥ 0;
 * slack inequalities have 0.
 *
 * @param constraint        name as in the JSON contract: {@code budget}, {@code target_return},
 *                          {@code lower:<asset>}, {@code upper:<asset>}, {@code group:<name>:min|max}, ...
 * @param variancePerUnit   {@code ∂V*∂limit}
 * @param volatilityPerUnit {@code ∂σ*∂limit = (∂V*∂limit)/(2σ*)}
 * @param binding           true for equalities and for inequalities that hold with equality at the optimum
 */
public record Multiplier(String constraint, double variancePerUnit, double volatilityPerUnit, boolean binding) {
    public Multiplier {
        if (constraint == null || constraint.isBlank()) {
            throw new IllegalArgumentException("a multiplier needs its constraint's name");
        }
    }
}
