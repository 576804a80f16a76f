package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.OutputOptions;
import org.isorisk.cli.render.RiskView;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code isorisk risk}: decompose the risk of a given portfolio, optionally against a benchmark. */
@Command(name = "risk", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Decompose the risk of a given portfolio; tracking error against a benchmark.",
        description = {"Decompose the risk of a given portfolio: volatility, each asset's marginal and component "
                + "contribution (they add up to the volatility) and share of risk; with --benchmark, the tracking "
                + "error and the contributions to it. --expected-returns is optional here."})
public final class RiskCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Option(names = "--weights", paramLabel = "FILE", required = true,
            description = "The portfolio: CSV asset,weight (decimals) or asset,market_value (holdings); unlisted "
                    + "assets count as 0.")
    Path weights;

    @Option(names = "--benchmark", paramLabel = "FILE",
            description = "A benchmark portfolio in the same layout: adds the tracking error.")
    Path benchmark;

    @Mixin
    OutputOptions output;

    @Override
    protected ExitCode execute() {
        LoadedUniverse u = inputs.load(false);
        List<String> warnings = new ArrayList<>(u.warnings());
        PortfolioFile p = PortfolioReader.read(weights, "weights", u.assets(), inputs.units());
        warnings.addAll(p.warnings());
        Provenance prov = u.provenance().withInput(p.source());
        RiskDecomposition risk = RiskAnalysis.decompose(u.universe(), p.weights());
        RiskDecomposition benchRisk = null;
        TrackingError te = null;
        String benchLabel = null;
        if (benchmark != null) {
            PortfolioFile b = PortfolioReader.read(benchmark, "benchmark", u.assets(), inputs.units());
            warnings.addAll(b.warnings());
            prov = prov.withInput(b.source());
            benchRisk = RiskAnalysis.decompose(u.universe(), b.weights());
            te = RiskAnalysis.trackingError(u.universe(), p.weights(), b.weights());
            benchLabel = b.source().name();
        }
        emit(new RiskView("the portfolio in " + p.source().name(), risk, p.marketValue(), u.hasExpectedReturns(),
                benchLabel, benchRisk, te, prov, warnings), output.out());
        return ExitCode.OK;
    }
}
