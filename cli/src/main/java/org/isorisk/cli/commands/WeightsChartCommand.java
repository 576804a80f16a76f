package org.isorisk.cli.commands;

import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import picocli.CommandLine.Command;

/** {@code isorisk chart weights}: every asset's weight along the frontier as stacked bands. */
@Command(name = "weights", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Weights along the frontier as stacked bands, with guides at the corner portfolios.",
        description = {"Draw every asset's weight along the frontier as stacked bands, from the minimum-variance end "
                + "to the maximum return, with guides where the binding constraints change; with many assets the "
                + "small ones are grouped as \"other\" (the threshold is stated on the chart)."})
public final class WeightsChartCommand extends FrontierChartBase {

    @Override
    protected Figure draw(Loaded in, ChartContext ctx, AssetColours colours, ChartSettings settings) {
        return Charts.weights(in.frontier(), ctx, colours, settings);
    }
}
