package org.isorisk.engine.stress;

import java.util.List;
import org.isorisk.engine.model.Solution;

/**
 * One target of a sweep.
 *
 * @param target       return target, decimal
 * @param feasible     false when no portfolio of the mandate reaches the target
 * @param solution     the minimum-variance portfolio at the target; null when infeasible
 * @param volatility   its volatility; NaN when infeasible
 * @param marginalRisk marginal risk of the target, ∂σ*∂m (the return target's shadow price in volatility units);
 *                     NaN when infeasible
 * @param binding      the binding constraints other than the budget and the target
 * @param reason       why it is infeasible; empty when feasible
 */
public record TargetPoint(double target, boolean feasible, Solution solution, double volatility, double marginalRisk,
                          List<String> binding, String reason) {
    public TargetPoint {
        binding = List.copyOf(binding);
        reason = reason == null ? "" : reason;
    }
}
