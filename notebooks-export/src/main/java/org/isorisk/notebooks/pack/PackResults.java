package org.isorisk.notebooks.pack;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.Breach;
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
 * @param proposal    the proposed portfolio: the one the pack's trades reach (the rebalancer's portfolio after
 *                    the trades, {@code rebalance.proposal()}) when holdings are given and the target is within
 *                    reach; otherwise the target portfolio ({@link #targetPortfolio()})
 * @param tangency    the tangency portfolio for {@code spec.riskFree()}, when it exists
 * @param noTangency  why there is no tangency portfolio (a note for the run record), when a risk-free rate was
 *                    given and the engine found none
 * @param frontier    the efficient frontier under the mandate, sampled increasing in expected return
 * @param correlations the correlations the covariance implies, with their lowest, highest and average pair
 * @param conditionNumber the condition number of the covariance matrix
 * @param risk        the risk decomposition of {@code proposal} (marginal risk, contributions, shares)
 * @param holdings    current weights, when given
 * @param currentRisk the current holdings' risk decomposition, when holdings are given
 * @param fullMove    the full move from the holdings to the target portfolio (turnover, cost, tracking error),
 *                    when holdings are given
 * @param trading     the policy's trading limits ({@link TradingLimits#none} when it sets none)
 * @param stressSweep the scenarios run along the frontier's targets for the stress chart, when it is asked for
 * @param stress      the scenarios run at the pack's targets, for the stress table, when the pack has scenarios
 * @param rebalance   the least-risk move from the holdings that reaches the proposed target after costs within
 *                    the policy's trading limits (the rebalancer's, as {@code isorisk rebalance} makes it), when
 *                    holdings are given and the target is within reach
 * @param outOfReach  the rebalancer's refusal when the proposal's target is out of reach within the trading
 *                    limits (the pack then proposes no trade list)
 * @param breaches    the limits of the mandate today's holdings break (with the trades that cure them when there
 *                    is a move); empty without holdings
 * @param notSolved   stress points the solver could not solve, reported instead of failing the pack; each is also
 *                    in its {@code StressResult} as a point without a solution whose reason is the solver's message
 * @param underStress the proposal (and today's holdings) under each scenario of {@code stress}, in its order
 */
public record PackResults(PackSpec spec, AssetUniverse universe, Mandate mandate, Solution minimum,
                          List<Solution> targets, Solution proposal, Optional<Solution> tangency,
                          Optional<String> noTangency, Frontier frontier, Correlations correlations,
                          double conditionNumber, RiskDecomposition risk, Optional<double[]> holdings,
                          Optional<RiskDecomposition> currentRisk, Optional<FullMove> fullMove, TradingLimits trading,
                          Optional<StressResult> stressSweep, Optional<StressResult> stress,
                          Optional<RebalanceResult> rebalance, Optional<NoSolutionException> outOfReach,
                          List<Breach> breaches, List<NotSolved> notSolved, List<UnderStress> underStress) {
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
        breaches = breaches == null ? List.of() : List.copyOf(breaches);
        notSolved = notSolved == null ? List.of() : List.copyOf(notSolved);
        underStress = underStress == null ? List.of() : List.copyOf(underStress);
        Objects.requireNonNull(proposal, "proposal");
        targetPortfolio(spec, targets); // one portfolio per target, the proposed one among them
    }

    /**
     * Two portfolios count as the same when no weight differs by more than this (1e-6, a ten-thousandth of a
     * percentage point): far above the solvers' tolerance on weights that meet the same optimum by different
     * routes (the target QP, the rebalancer's lifted QP), far below the 0.01 % a table shows.
     */
    public static final double SAME_WEIGHTS = 1e-6;

    /** The least-risk portfolio at the proposed target under the mandate, before trading limits and costs. */
    public Solution targetPortfolio() {
        return targetPortfolio(spec, targets);
    }

    private static Solution targetPortfolio(PackSpec spec, List<Solution> targets) {
        int k = spec.targets().indexOf(spec.proposed());
        if (k < 0 || k >= targets.size()) {
            throw new IllegalArgumentException("no portfolio for the proposed target");
        }
        return targets.get(k);
    }

    /**
     * True when the proposal is not the target portfolio: the trading limits or the costs keep the trades from
     * reaching it (weights differ by more than {@link #SAME_WEIGHTS}); the pack then shows both side by side.
     */
    public boolean proposalDiffersFromTarget() {
        double[] a = proposal.weights();
        double[] b = targetPortfolio().weights();
        for (int i = 0; i < a.length; i++) {
            if (!(Math.abs(a[i] - b[i]) <= SAME_WEIGHTS)) {
                return true;
            }
        }
        return false;
    }

    @Override
    public Optional<double[]> holdings() {
        return holdings.map(double[]::clone);
    }

    /**
     * The full move from today's holdings to the target portfolio, priced by the policy's trading limits.
     *
     * @param turnover      two-way turnover {@code Σ|w − w0|}
     * @param cost          the trading costs as a share of the fund (decimal)
     * @param trackingError the target portfolio's tracking error against today's holdings (annualised, decimal)
     * @param breaks        the trading limits the full move would break ({@code TradingLimits.brokenBy}: turnover,
     *                      trade_limit:&lt;asset&gt;, no_trade:&lt;asset&gt;); empty when it keeps them
     */
    public record FullMove(double turnover, double cost, double trackingError, List<String> breaks) {
        public FullMove {
            breaks = breaks == null ? List.of() : List.copyOf(breaks);
        }

        /** A full move that breaks no trading limit. */
        public FullMove(double turnover, double cost, double trackingError) {
            this(turnover, cost, trackingError, List.of());
        }
    }

    /** Which stress run a point belongs to. */
    public enum StressRun {
        /** The scenarios at the pack file's targets: the stress table ({@code stress}). */
        AT_TARGETS,
        /** The scenarios along the frontier's targets: the stress chart ({@code stressSweep}). */
        ALONG_FRONTIER
    }

    /** How a stress point ended, named as in the JSON contract. */
    public enum PointStatus {
        OPTIMAL("optimal"), INFEASIBLE("infeasible"), NOT_SOLVED("not-solved");

        private final String label;

        PointStatus(String label) {
            this.label = label;
        }

        /** The contract's name: {@code optimal}, {@code infeasible}, {@code not-solved}. */
        public String label() {
            return label;
        }
    }

    /**
     * A stress point the solver could not solve; the pack reports it and goes on.
     *
     * @param run      which run it belongs to
     * @param scenario the scenario's name; empty for today's assumptions
     * @param target   the return target, decimal
     * @param status   {@link PointStatus#NOT_SOLVED} for a numerical failure, {@link PointStatus#INFEASIBLE} for a
     *                 constraint-qualification failure (the JSON contract reports those as infeasible)
     * @param reason   the solver's message
     */
    public record NotSolved(StressRun run, Optional<String> scenario, double target, PointStatus status,
                            String reason) {
        public NotSolved {
            Objects.requireNonNull(run, "run");
            scenario = scenario == null ? Optional.empty() : scenario;
            Objects.requireNonNull(status, "status");
            if (status == PointStatus.OPTIMAL) {
                throw new IllegalArgumentException("a point that was solved is not reported as not solved");
            }
            reason = reason == null ? "" : reason;
        }
    }

    /**
     * The proposal and today's holdings under one scenario's assumptions (the engine's risk decomposition with
     * the scenario's expected returns and covariance).
     *
     * @param scenario          the scenario's name
     * @param proposalReturn    the proposal's expected return under the scenario, decimal, annualised
     * @param proposalVolatility the proposal's volatility under the scenario
     * @param currentReturn     today's holdings' expected return under the scenario; NaN without holdings
     * @param currentVolatility today's holdings' volatility under the scenario; NaN without holdings
     */
    public record UnderStress(String scenario, double proposalReturn, double proposalVolatility, double currentReturn,
                              double currentVolatility) {
    }
}
