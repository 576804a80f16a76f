package org.isorisk.cli.usecase;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Branch;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.Breach;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.risk.Correlations;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.stress.CorrelationRepair;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.StressProgress;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.notebooks.pack.PackResults;
import org.isorisk.notebooks.pack.PackSpec;

/**
 * The analyses a committee pack needs, run through the engine in order: the minimum-variance portfolio, one
 * portfolio per target, the tangency portfolio when a risk-free rate is given, a sampled frontier, the move from
 * the holdings toward the proposed target within the policy's trading limits and after its costs
 * ({@link Rebalancer}, as {@code isorisk rebalance} makes it) with today's breaches of the policy, the risk
 * decomposition of the proposal (the portfolio the trades reach) and of the holdings, the correlations and
 * conditioning of the assumptions, and the stress scenarios (along the frontier when the stress chart is asked
 * for, at the pack's targets, and the proposal under each). One story: the proposal every section describes is the
 * portfolio the trade list reaches. A stress point the solver cannot solve is reported, not a failure of the pack
 * ({@link PackStress}). Every number comes from an engine call; the result is a {@link PackResults} that
 * {@code notebooks.pack.PackComposer} lays out.
 */
public final class PackAnalysis {
    private PackAnalysis() {
    }

    /**
     * What a pack asks of the engine.
     *
     * @param universe  the assets and their assumptions
     * @param mandate   the mandate (from the policy file, or the budget alone)
     * @param spec      the pack file
     * @param holdings  current weights in universe order, when a holdings file was given
     * @param scenarios stress scenarios to run at the pack's targets (read from the pack file's scenario file)
     * @param trading   the policy's trading limits ({@link TradingLimits#of}); when they restrict trading and
     *                  holdings are given, the trade list is the rebalancer's move within them; none when null
     */
    public record Request(AssetUniverse universe, Mandate mandate, PackSpec spec, Optional<double[]> holdings,
                          List<Scenario> scenarios, TradingLimits trading) {

        public Request {
            Objects.requireNonNull(universe, "universe");
            Objects.requireNonNull(mandate, "mandate");
            Objects.requireNonNull(spec, "spec");
            holdings = holdings == null ? Optional.empty() : holdings.map(double[]::clone);
            scenarios = scenarios == null ? List.of() : List.copyOf(scenarios);
            trading = trading == null ? TradingLimits.none(universe.size()) : trading;
            if (trading.size() != universe.size()) {
                throw new IllegalArgumentException("the trading limits must cover the universe's " + universe.size()
                        + " assets");
            }
        }

        @Override
        public Optional<double[]> holdings() {
            return holdings.map(double[]::clone);
        }
    }

    /**
     * How far a pack's analyses have got, for a progress line: each step is announced as it starts; the stress runs
     * also count their solves. The command line shows a step only when it takes long.
     */
    public interface Steps {
        /** Nothing is shown. */
        Steps NONE = new Steps() {
            @Override
            public void step(String what) {
            }

            @Override
            public StressProgress counted(String what) {
                return StressProgress.NONE;
            }
        };

        /** A step starts (and the one before it ends), e.g. "sampling the frontier". */
        void step(String what);

        /** A step that counts its solves starts; the returned progress receives the counts. */
        StressProgress counted(String what);
    }

    /**
     * Runs the analyses.
     *
     * @throws NoSolutionException when a portfolio the pack needs has no solution (e.g. a target above what
     *                             the mandate allows); the message names the target. A stress point that cannot be
     *                             solved does not fail the pack: it is reported ({@link PackResults#notSolved()})
     */
    public static PackResults run(Request r) {
        return run(r, Steps.NONE);
    }

    /** Runs the analyses, announcing each step to {@code steps}. */
    public static PackResults run(Request r, Steps steps) {
        return run(r, steps, PackStress.ENGINE);
    }

    /** Runs the analyses with {@code stressRunner} in place of the engine's stress run (tests). */
    static PackResults run(Request r, Steps steps, PackStress.Runner stressRunner) {
        PackSpec spec = r.spec();
        AssetUniverse u = r.universe();
        steps.step("solving the portfolios");
        AllocationRequest base = AllocationRequest.of(u, r.mandate(), Objective.minimumVariance());
        Solution minimum = Allocator.solve(base);
        List<Solution> targets = new ArrayList<>();
        for (double t : spec.targets()) {
            Solution s;
            try {
                s = Allocator.solve(base.withObjective(Objective.targetReturn(t)));
            } catch (NoSolutionException e) {
                throw new NoSolutionException(e.reason(), "target return " + Explain.percent(t) + " of the pack file: "
                        + e.getMessage(), e.constraints());
            }
            targets.add(Branch.annotated(s)); // a target below the minimum-variance return says so
        }
        Solution target = targets.get(spec.targets().indexOf(spec.proposed()));
        Optional<Solution> tangency = Optional.empty();
        Optional<String> noTangency = Optional.empty();
        if (spec.riskFree().isPresent()) {
            try {
                tangency = Optional.of(Allocator.solve(base.withObjective(Objective.tangency(spec.riskFree().get()))));
            } catch (NoSolutionException e) {
                noTangency = Optional.of("No tangency portfolio: " + e.getMessage());
            }
        }
        steps.step("sampling the frontier");
        Frontier frontier = frontier(base, spec.frontierPoints());
        // The trade list: the rebalancer's least-risk move from the holdings that reaches the proposed target after
        // costs within the policy's trading limits, as 'isorisk rebalance' makes it. The proposal is the portfolio
        // the trades reach; without a move (a target out of reach within the limits, reported in the pack, not a
        // failure of the pack) or without holdings it is the target portfolio.
        Optional<RebalanceResult> rebalance = Optional.empty();
        Optional<NoSolutionException> outOfReach = Optional.empty();
        Optional<PackResults.FullMove> fullMove = Optional.empty();
        List<Breach> breaches = List.of();
        if (r.holdings().isPresent()) {
            steps.step("moving the holdings toward the proposed target");
            double[] h = r.holdings().get();
            double[] w = target.weights();
            fullMove = Optional.of(new PackResults.FullMove(TradingLimits.turnover(h, w), r.trading().cost(h, w),
                    RiskAnalysis.trackingError(u, w, h).value(), r.trading().brokenBy(h, w, u.assets())));
            RebalanceRequest move = rebalanceRequest(r, base);
            try {
                rebalance = Optional.of(Rebalancer.rebalance(move));
                breaches = rebalance.get().breaches();
            } catch (NoSolutionException e) {
                outOfReach = Optional.of(e);
                breaches = Rebalancer.breaches(u, r.mandate(), move.holdings().alignedTo(u, r.mandate().budget()));
            }
        }
        Solution proposal = rebalance.map(RebalanceResult::proposal).orElse(target);
        RiskDecomposition risk = RiskAnalysis.decompose(u, proposal.weights());
        Optional<RiskDecomposition> currentRisk = r.holdings().map(h -> RiskAnalysis.decompose(u, h));
        List<PackResults.NotSolved> notSolved = new ArrayList<>();
        // The stress chart draws each scenario's frontier: the scenarios run at the frontier's own targets.
        Optional<StressResult> sweep = Optional.empty();
        if (spec.charts().contains(PackSpec.ChartChoice.STRESS) && !r.scenarios().isEmpty()) {
            double[] along = frontier.points().stream().mapToDouble(Solution::expectedReturn).sorted().distinct()
                    .toArray();
            if (along.length > 0) {
                PackStress.Outcome o = PackStress.run(new StressRequest(u, r.mandate(), along, r.scenarios(),
                                CorrelationRepair.higham(u.assets()), base.settings()), PackResults.StressRun.ALONG_FRONTIER,
                        stressRunner, steps.counted("stress scenarios along the frontier"));
                sweep = Optional.of(o.result());
                notSolved.addAll(o.notSolved());
            }
        }
        // The stress table: the scenarios at the pack's own targets, and the proposal under each scenario.
        Optional<StressResult> stress = Optional.empty();
        List<PackResults.UnderStress> underStress = new ArrayList<>();
        if (!r.scenarios().isEmpty()) {
            double[] grid = spec.targets().stream().mapToDouble(Double::doubleValue).toArray();
            PackStress.Outcome o = PackStress.run(new StressRequest(u, r.mandate(), grid, r.scenarios(),
                            CorrelationRepair.higham(u.assets()), base.settings()), PackResults.StressRun.AT_TARGETS,
                    stressRunner, steps.counted("stress scenarios at the targets"));
            stress = Optional.of(o.result());
            notSolved.addAll(o.notSolved());
            for (ScenarioResult sr : o.result().scenarios()) {
                AssetUniverse shocked = sr.shocked().universe();
                RiskDecomposition p = RiskAnalysis.decompose(shocked, proposal.weights());
                Optional<RiskDecomposition> now = r.holdings().map(h -> RiskAnalysis.decompose(shocked, h));
                underStress.add(new PackResults.UnderStress(sr.scenario().name(), p.expectedReturn(), p.volatility(),
                        now.map(RiskDecomposition::expectedReturn).orElse(Double.NaN),
                        now.map(RiskDecomposition::volatility).orElse(Double.NaN)));
            }
        }
        return new PackResults(spec, u, r.mandate(), minimum, targets, proposal, tangency, noTangency, frontier,
                Correlations.of(u), Spectrum.of(u.covariance()).conditionNumber(), risk, r.holdings(), currentRisk,
                fullMove, r.trading(), sweep, stress, rebalance, outOfReach, breaches, notSolved, underStress);
    }

    /**
     * The rebalance the pack's trade list comes from: today's holdings (with the pack file's fund size, for
     * amounts), the policy's trading limits, and the proposed target as the return to reach after costs.
     */
    static RebalanceRequest rebalanceRequest(Request r, AllocationRequest base) {
        double size = r.spec().fundSize().orElse(Double.NaN);
        Holdings h = Holdings.ofWeights(r.universe().assets(), r.holdings().orElseThrow(), size);
        return new RebalanceRequest(r.universe(), r.mandate(), h, r.trading(),
                new RebalanceObjective.TargetReturn(r.spec().proposed()), base.settings());
    }

    /**
     * The efficient frontier with {@code points} portfolios from the minimum-variance end to the highest return
     * the mandate allows, through the engine's front door for frontiers: exact (critical line method, with its
     * corner portfolios) where only budget, bounds and fixed weights apply, sampled by the warm-started QP
     * otherwise.
     */
    private static Frontier frontier(AllocationRequest base, int points) {
        AssetUniverse u = base.universe();
        Mandate m = base.mandate();
        return Allocator.criticalLineApplies(m)
                ? Frontiers.mandate(u, m, Grid.points(points), base.settings())
                : Frontiers.sampled(u, m, Grid.points(points), base.settings());
    }
}
