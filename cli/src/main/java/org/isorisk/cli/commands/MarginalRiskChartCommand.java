package org.isorisk.cli.commands;

import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import picocli.CommandLine.Command;

/** {@code isorisk chart marginal-risk}: the return target's shadow price in volatility units against the target. */
@Command(name = "marginal-risk", mixinStandardHelpOptions = true, sortOptions = false,
        header = "The marginal risk of the return target (its shadow price in volatility) against the target.",
        description = {"Draw the return target's shadow price in volatility units, d(sigma*)/dm, against the target, "
                + "for the mandate and the unconstrained frontier: what each further 0.25 % of target return costs "
                + "in volatility; kinks labelled with the constraint that starts or stops binding."})
public final class MarginalRiskChartCommand extends FrontierChartBase {

    @Override
    protected Figure draw(Loaded in, ChartContext ctx, AssetColours colours, ChartSettings settings) {
        return Charts.marginalRisk(in.frontier(), ctx, settings);
    }
}
