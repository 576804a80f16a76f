package org.isorisk.cli.commands;

import java.nio.file.Path;
import org.isorisk.cli.options.ChartFileOptions;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import org.isorisk.notebooks.chart.RiskShares;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code isorisk chart risk-contributions}: each asset's share of volatility, proposed beside current. */
@Command(name = "risk-contributions", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Horizontal bars of each asset's share of portfolio volatility, current beside proposed.",
        description = {"Draw each asset's share of the portfolio's volatility (Euler contributions, adding up to "
                + "100 %) as horizontal bars, the proposed portfolio beside the current one, sorted by the proposed "
                + "share. --expected-returns is optional here."})
public final class RiskContributionsChartCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Option(names = "--weights", paramLabel = "FILE", required = true,
            description = "The proposed portfolio: CSV asset,weight (decimals) or asset,market_value.")
    Path weights;

    @Option(names = "--current", paramLabel = "FILE",
            description = "The current portfolio in the same layout, drawn beside the proposal.")
    Path current;

    @Mixin
    ChartFileOptions chartFile;

    @Override
    protected ExitCode execute() {
        chartFile.format(); // refuse an unknown format before any work
        LoadedUniverse u = inputs.load(false);
        warn(u.warnings());
        PortfolioFile p = PortfolioReader.read(weights, "weights", u.assets(), inputs.units());
        warn(p.warnings());
        Provenance prov = u.provenance().withInput(p.source());
        RiskShares proposed = RiskShares.of("Proposed", RiskAnalysis.decompose(u.universe(), p.weights()));
        RiskShares now = null;
        if (current != null) {
            PortfolioFile c = PortfolioReader.read(current, "current", u.assets(), inputs.units());
            warn(c.warnings());
            prov = prov.withInput(c.source());
            now = RiskShares.of("Current", RiskAnalysis.decompose(u.universe(), c.weights()));
        }
        ChartSettings s = chartFile.settings();
        Figure fig = Charts.riskContributions(now, proposed, chartFile.context(prov), AssetColours.of(u.assets()), s);
        ChartCommand.write(this, fig, chartFile.file(), s);
        return ExitCode.OK;
    }
}
