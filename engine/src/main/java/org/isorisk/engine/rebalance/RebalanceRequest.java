package org.isorisk.engine.rebalance;

import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;

/**
 * Everything one rebalance needs.
 *
 * @param universe  assets and assumptions
 * @param mandate   the policy's constraints on the proposal
 * @param holdings  today's portfolio
 * @param limits    trading limits (turnover, per-asset, costs, minimum trade, no-trade list)
 * @param objective what the proposal aims at
 * @param settings  solver tolerances and limits; defaults when null
 */
public record RebalanceRequest(AssetUniverse universe, Mandate mandate, Holdings holdings, TradingLimits limits,
                               RebalanceObjective objective, SolverSettings settings) {
    public RebalanceRequest {
        if (universe == null || mandate == null || holdings == null || limits == null || objective == null) {
            throw new IllegalArgumentException("universe, mandate, holdings, limits and objective are required");
        }
        if (mandate.size() != universe.size() || limits.size() != universe.size()) {
            throw new IllegalArgumentException("mandate and limits must cover the universe's " + universe.size()
                    + " assets");
        }
        settings = settings == null ? SolverSettings.defaults() : settings;
    }

    public RebalanceRequest withLimits(TradingLimits l) {
        return new RebalanceRequest(universe, mandate, holdings, l, objective, settings);
    }

    public RebalanceRequest withObjective(RebalanceObjective o) {
        return new RebalanceRequest(universe, mandate, holdings, limits, o, settings);
    }
}
