package org.isorisk.notebooks.pack;

import java.util.List;
import java.util.Optional;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.stress.StressResult;

/**
 * The engine results of one pack run, before they are laid out: what the charts are drawn from.
 *
 * @param spec          what the pack file asked for
 * @param universe      the assets and assumptions
 * @param mandate       the mandate every portfolio obeys
 * @param minimum       the minimum-variance portfolio
 * @param targets       one portfolio per target of {@code spec.targets()}, in order
 * @param proposal      the proposed portfolio (one of {@code targets})
 * @param tangency      the tangency portfolio for {@code spec.riskFree()}, when it exists
 * @param frontier      the efficient frontier under the mandate, sampled increasing in expected return
 * @param risk          the proposal's risk decomposition (marginal risk, contributions, shares)
 * @param holdings      current weights, when given
 * @param currentRisk   the current holdings' risk decomposition, when holdings are given
 * @param stressSweep   the scenarios run along the frontier's targets for the stress chart, when it is asked for
 * @param rebalance     the move from the holdings toward the proposal's target within the policy's trading limits,
 *                      when holdings are given, the policy limits trading and the target is within reach
 */
public record PackResults(PackSpec spec, AssetUniverse universe, Mandate mandate, Solution minimum,
                          List<Solution> targets, Solution proposal, Optional<Solution> tangency,
                          Frontier frontier, RiskDecomposition risk, Optional<double[]> holdings,
                          Optional<RiskDecomposition> currentRisk, Optional<StressResult> stressSweep,
                          Optional<RebalanceResult> rebalance) {
    public PackResults {
        stressSweep = stressSweep == null ? Optional.empty() : stressSweep;
        targets = List.copyOf(targets);
        holdings = holdings == null ? Optional.empty() : holdings.map(double[]::clone);
        currentRisk = currentRisk == null ? Optional.empty() : currentRisk;
        rebalance = rebalance == null ? Optional.empty() : rebalance;
    }

    @Override
    public Optional<double[]> holdings() {
        return holdings.map(double[]::clone);
    }
}
