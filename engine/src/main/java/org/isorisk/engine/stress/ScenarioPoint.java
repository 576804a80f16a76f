package org.isorisk.engine.stress;

import java.util.List;

/**
 * One scenario at one target.
 *
 * @param target       return target, decimal
 * @param feasible     false when no portfolio reaches the target under the scenario
 * @param volatility   minimum volatility under the scenario; NaN when infeasible
 * @param change       {@code volatility − base minimum volatility at the same target}; NaN when either is infeasible
 * @param baseRisk     volatility of the base proposal (the base optimum at this target) under the scenario's
 *                     assumptions: the risk of keeping today's proposal; NaN when the base is infeasible
 * @param baseReturn   expected return of the base proposal under the scenario's assumptions
 * @param turnover     two-way turnover {@code Σ|w_scenario − w_base|} needed to re-optimise; NaN when either is
 *                     infeasible
 * @param marginalRisk marginal risk of the target under the scenario, ∂σ*∂m
 * @param binding      binding constraints other than budget and target
 * @param reason       why it is infeasible; empty when feasible
 */
public record ScenarioPoint(double target, boolean feasible, double volatility, double change, double baseRisk,
                            double baseReturn, double turnover, double marginalRisk, List<String> binding,
                            String reason) {
    public ScenarioPoint {
        binding = List.copyOf(binding);
        reason = reason == null ? "" : reason;
    }
}
