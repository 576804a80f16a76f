package org.isorisk.cli.commands;

import java.nio.file.Path;
import org.isorisk.cli.ExitCode;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.engine.chart.AssetColours;
import org.isorisk.engine.chart.ChartContext;
import org.isorisk.engine.chart.ChartFormat;
import org.isorisk.engine.chart.ChartSettings;
import org.isorisk.engine.chart.Charts;
import org.isorisk.engine.chart.Figure;
import org.isorisk.engine.chart.RiskShares;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.risk.RiskAnalysis;
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

    @Option(names = "--out", paramLabel = "FILE", required = true,
            description = "The chart file; its extension gives the format: .png, .svg or .pdf.")
    Path out;

    @Option(names = "--png-scale", paramLabel = "X", defaultValue = "2",
            description = "Resolution of a PNG as a multiple of the chart's 800 x 600 size (default: ${DEFAULT-VALUE}, "
                    + "for print; 1 for screens).")
    double pngScale;

    @Option(names = "--fund", paramLabel = "NAME",
            description = "The fund's name for the footnote (default: the inputs' '# scenario:' line).")
    String fund;

    @Override
    protected ExitCode execute() {
        ChartFormat.fromFileName(out.toString()); // refuse an unknown format before any work
        LoadedUniverse u = inputs.load(false, "chart risk-contributions");
        PortfolioFile p = PortfolioReader.read(weights, "weights", u.assets(), inputs.units());
        Provenance prov = u.provenance().withInput(p.source());
        RiskShares proposed = RiskShares.of("Proposed", RiskAnalysis.decompose(u.universe(), p.weights()));
        RiskShares now = null;
        if (current != null) {
            PortfolioFile c = PortfolioReader.read(current, "current", u.assets(), inputs.units());
            prov = prov.withInput(c.source());
            now = RiskShares.of("Current", RiskAnalysis.decompose(u.universe(), c.weights()));
        }
        for (String w : u.warnings()) {
            err().println("isorisk: warning: " + w);
        }
        ChartSettings s = ChartSettings.defaults().withPngScale(pngScale);
        Figure fig = Charts.riskContributions(now, proposed, ChartContext.of(prov, fund), AssetColours.of(u.assets()),
                s);
        ChartCommand.write(this, fig, out, s);
        return ExitCode.OK;
    }
}
