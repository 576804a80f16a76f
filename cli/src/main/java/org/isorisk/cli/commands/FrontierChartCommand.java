package org.isorisk.cli.commands;

import org.isorisk.cli.options.Decimal;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import org.isorisk.notebooks.chart.FrontierChartData;
import org.isorisk.notebooks.chart.PortfolioPoint;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code isorisk chart frontier}: the efficient frontier with the assets, corners and highlighted portfolios. */
@Command(name = "frontier", mixinStandardHelpOptions = true, sortOptions = false,
        header = "The efficient frontier: volatility against expected return, mandate and unconstrained.",
        description = {"Draw the efficient frontier (volatility against expected return, in percent): the mandate "
                + "frontier with its corner portfolios, the unconstrained (budget-only) frontier, every asset, the "
                + "minimum-variance portfolio; with --risk-free the tangency portfolio and the capital market line; "
                + "with --current and --target-return the current portfolio and the proposal."})
public final class FrontierChartCommand extends FrontierChartBase {

    @Option(names = "--risk-free", paramLabel = "RATE", converter = Decimal.class,
            description = "Risk-free rate: draws the tangency portfolio under the mandate and the capital market line.")
    Double riskFree;

    @Override
    protected Figure draw(Loaded in, ChartContext ctx, AssetColours colours, ChartSettings settings) {
        FrontierChartData d = FrontierChartData.of(in.universe().universe(), in.frontier());
        if (riskFree != null) {
            double rf = inputs.units().rate(riskFree);
            Solution t = Allocator.solve(AllocationRequest.of(in.universe().universe(), in.mandate(),
                    Objective.tangency(rf)));
            d = d.withTangency(rf, t);
        }
        if (in.current() != null) {
            d = d.withCurrent(new PortfolioPoint("Current", in.current().volatility(), in.current().expectedReturn()));
        }
        if (in.proposal() != null) {
            d = d.withProposed(PortfolioPoint.of("Proposed", in.proposal()));
        }
        return Charts.frontier(d, ctx, colours, settings);
    }
}
