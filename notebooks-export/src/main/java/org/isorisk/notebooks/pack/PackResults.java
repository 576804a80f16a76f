package org.isorisk.notebooks.pack;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.risk.Correlations;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.stress.StressResult;

/**
 * The engine results of one pack run, before they are laid out: everything {@link PackComposer} puts into tables
 * and sentences and {@link ChartMaker} draws. The command line's pack use case makes it (it decides which analyses
 * a pack needs and runs them); nothing here computes.
 *
 * @param spec        what the pack file asked for
 * @param universe    the assets and assumptions
 * @param mandate     the mandate every portfolio obeys
 * @param minimum     the minimum-variance portfolio
 * @param targets     one portfolio per target of {@code spec.targets()}, in order
 * @param proposal    the proposed portfolio (one of {@code targets})
 * @param tangency    the tangency portfolio for {@code spec.riskFree()}, when it exists
 * @param noTangency  why there is no tangency portfolio (a note for the run record), when a risk-free rate was
 *                    given and the engine found none
 * @param frontier    the efficient frontier under the mandate, sampled increasing in expected return
 * @param correlations the correlations the covariance implies, with their lowest, highest and average pair
 * @param conditionNumber the condition number of the covariance matrix
 * @param risk        the proposal's risk decomposition (marginal risk, contributions, shares)
 * @param holdings    current weights, when given
 * @param currentRisk the current holdings' risk decomposition, when holdings are given
 * @param fullMove    the full move from the holdings to the proposal (turnover, cost, tracking error), when
 *                    holdings are given
 * @param trading     the policy's trading limits ({@link TradingLimits#none} when it sets none)
 * @param stressSweep the scenarios run along the frontier's targets for the stress chart, when it is asked for
 * @param stress      the scenarios run at the pack's targets, for the stress table, when the pack has scenarios
 * @param rebalance   the move from the holdings toward the proposal's target within the policy's trading limits,
 *                    when holdings are given, the policy limits trading and the target is within reach
 * @param outOfReach  the rebalancer's refusal when the proposal's target is out of reach within the trading
 *                    limits (the pack then proposes no trade list)
 */
public record PackResults(PackSpec spec, AssetUniverse universe, Mandate mandate, Solution minimum,
                          List<Solution> targets, Solution proposal, Optional<Solution> tangency,
                          Optional<String> noTangency, Frontier frontier, Correlations correlations,
                          double conditionNumber, RiskDecomposition risk, Optional<double[]> holdings,
                          Optional<RiskDecomposition> currentRisk, Optional<FullMove> fullMove, TradingLimits trading,
                          Optional<StressResult> stressSweep, Optional<StressResult> stress,
                          Optional<RebalanceResult> rebalance, Optional<NoSolutionException> outOfReach) {
    public PackResults {
        Objects.requireNonNull(spec, "spec");
        Objects.requireNonNull(universe, "universe");
        Objects.requireNonNull(mandate, "mandate");
        targets = List.copyOf(targets);
        tangency = tangency == null ? Optional.empty() : tangency;
        noTangency = noTangency == null ? Optional.empty() : noTangency;
        holdings = holdings == null ? Optional.empty() : holdings.map(double[]::clone);
        currentRisk = currentRisk == null ? Optional.empty() : currentRisk;
        fullMove = fullMove == null ? Optional.empty() : fullMove;
        trading = trading == null ? TradingLimits.none(universe.size()) : trading;
        stressSweep = stressSweep == null ? Optional.empty() : stressSweep;
        stress = stress == null ? Optional.empty() : stress;
        rebalance = rebalance == null ? Optional.empty() : rebalance;
        outOfReach = outOfReach == null ? Optional.empty() : outOfReach;
    }

    @Override
    public Optional<double[]> holdings() {
        return holdings.map(double[]::clone);
    }

    /**
     * The full move from today's holdings to the proposal, priced by the policy's trading limits.
     *
     * @param turnover      two-way turnover {@code Σ|w − w0|}
     * @param cost          the trading costs as a share of the fund (decimal)
     * @param trackingError the proposal's tracking error against today's holdings (annualised, decimal)
     */
    public record FullMove(double turnover, double cost, double trackingError) {
    }
}
