package org.isorisk.cli.commands;

import java.nio.file.Path;
import org.isorisk.cli.options.ChartFileOptions;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Figure;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * What the frontier-based charts share: the assumptions, the mandate ({@code --policy}, or the budget alone), the
 * frontier exactly as {@code isorisk frontier} computes it (exact corners under bounds, sampled under groups or
 * general limits, the closed form without a policy), the optional proposal and current portfolio, and the output
 * file.
 */
abstract class FrontierChartBase extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Mixin
    PolicyOption policyOption;

    @Option(names = "--points", paramLabel = "N", defaultValue = "60",
            description = "Frontier portfolios sampled from the minimum-variance to the maximum-return end, besides "
                    + "the corner portfolios (default: ${DEFAULT-VALUE}).")
    int points;

    @Option(names = "--target-return", paramLabel = "RETURN", converter = Decimal.class,
            description = "Return target of the proposal to highlight (annualised, decimal unless --units percent).")
    Double target;

    @Option(names = "--current", paramLabel = "FILE",
            description = "The current portfolio (CSV asset,weight or asset,market_value) to highlight.")
    Path current;

    @Mixin
    ChartFileOptions chartFile;

    /** What the subclass draws, from everything loaded. */
    protected abstract Figure draw(Loaded in, ChartContext ctx, AssetColours colours, ChartSettings settings);

    /** The inputs as loaded and computed by the engine. */
    record Loaded(LoadedUniverse universe, Mandate mandate, Frontier frontier, Solution proposal,
                  RiskDecomposition current, Provenance provenance) {
    }

    @Override
    protected ExitCode execute() {
        chartFile.format(); // refuse an unknown format before any work
        if (points < 2) {
            throw org.isorisk.engine.error.InputException.of("--points must be at least 2 for a frontier chart")
                    .value(points).fix("give --points 2 or more (default 60)").build();
        }
        Loaded in = load();
        ChartSettings s = chartFile.settings();
        Figure fig = draw(in, chartFile.context(in.provenance()), AssetColours.of(in.universe().assets()), s);
        ChartCommand.write(this, fig, chartFile.file(), s);
        return ExitCode.OK;
    }

    private Loaded load() {
        PolicyOption.Loaded loaded = policyOption.load(inputs);
        LoadedUniverse u = loaded.inputs();
        warn(u.warnings());
        Provenance prov = u.provenance();
        Mandate mandate = loaded.mandate();
        // the same frontier as 'isorisk frontier': exact corners, sampled QP or closed form, as the mandate allows
        Frontier f = FrontierCommand.run(loaded, Grid.points(points), false).frontier();
        Solution proposal = target == null ? null : Allocator.solve(AllocationRequest.of(u.universe(), mandate,
                Objective.targetReturn(inputs.units().rate(target))));
        RiskDecomposition now = null;
        if (current != null) {
            PortfolioFile c = PortfolioReader.read(current, "current", u.assets(), inputs.units());
            warn(c.warnings());
            prov = prov.withInput(c.source());
            now = RiskAnalysis.decompose(u.universe(), c.weights());
        }
        return new Loaded(u, mandate, f, proposal, now, prov);
    }
}
