package org.isorisk.cli.commands;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import org.isorisk.cli.ExitCode;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.CheckView;
import org.isorisk.cli.render.DemoSummary;
import org.isorisk.cli.render.FrontierView;
import org.isorisk.cli.render.RiskView;
import org.isorisk.cli.render.SolveView;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.AtomicWrite;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.ResultJson;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.risk.AssumptionSummary;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code isorisk demo}: the whole job on the invented sample fund: check the assumptions, solve the
 * minimum-variance, a target-return and the tangency portfolio, decompose the risk of the current holdings and
 * of the proposal; write every result into one folder and print a summary.
 */
@Command(name = "demo", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Run the whole job on the invented sample fund into one folder.",
        description = {"Run everything on the invented sample fund (a fictional pension scheme, illustrative numbers, "
                + "not market data): check, minimum-variance, target-return and tangency portfolios with their shadow "
                + "prices, risk of the current holdings and of the proposal. Results (JSON, CSV, the summary and a copy "
                + "of the inputs) go into one folder, written atomically.",
                "With the sample policy (policy.yaml) it also solves the minimum-variance and target-return portfolios "
                        + "under the mandate, with their binding constraints explained, and the frontier under the "
                        + "mandate (frontier.json, frontier.csv)."})
public final class DemoCommand extends BaseCommand {

    /** The sample files, bundled in the jar from the repository's {@code sample-data/} folder. */
    public static final List<String> SAMPLE_FILES = List.of("expected_returns.csv", "covariance.csv",
            "volatilities.csv", "correlation.csv", "holdings.csv", "benchmark.csv", "policy.yaml", "README.md");

    private static final List<String> REQUIRED = List.of("expected_returns.csv", "covariance.csv", "holdings.csv");

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "isorisk-demo",
            description = "Folder for the results (default: ${DEFAULT-VALUE}); replaced as a whole if an earlier demo "
                    + "wrote it, refused if it holds anything else.")
    Path out;

    @Option(names = "--data", paramLabel = "DIR",
            description = "Run on the scenario in DIR instead (expected_returns.csv, covariance.csv, holdings.csv in "
                    + "the layouts of the README); default: the bundled sample fund.")
    Path data;

    @Option(names = "--target-return", paramLabel = "RETURN", converter = Decimal.class, defaultValue = "0.05",
            description = "Return target of the proposal (decimal; default: ${DEFAULT-VALUE}).")
    double target;

    @Option(names = "--risk-free", paramLabel = "RATE", converter = Decimal.class, defaultValue = "0.024",
            description = "Risk-free rate of the tangency portfolio (decimal; default: ${DEFAULT-VALUE}).")
    double riskFree;

    @Option(names = "--charts", negatable = true, defaultValue = "true", fallbackValue = "true",
            description = "Draw the committee charts into charts/ (PNG, SVG, PDF); --no-charts skips them, which is "
                    + "faster (default: draw them).")
    boolean charts;

    @Override
    protected ExitCode execute() {
        String[] summary = new String[1];
        AtomicWrite.folder(out, dir -> summary[0] = run(dir));
        out().print(summary[0]);
        out().flush();
        return ExitCode.OK;
    }

    private String run(Path dir) throws IOException {
        Path in = dir.resolve("inputs");
        Files.createDirectories(in);
        copyInputs(in);
        LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(in.resolve("expected_returns.csv"),
                in.resolve("covariance.csv")));
        List<String> warnings = new ArrayList<>(u.warnings());
        CheckView check = new CheckView(u, AssumptionSummary.of(u.universe(), u.spectrum()));
        Mandate budget = Mandate.fullyInvested(u.assets().size());
        SolveView minVar = SolveCommand.run(u, budget, Objective.minimumVariance(), Map.of(), warnings);
        SolveView proposal = SolveCommand.run(u, budget, Objective.targetReturn(target), Map.of(), warnings);
        SolveView tangency = SolveCommand.run(u, budget, Objective.tangency(riskFree), Map.of(), warnings);

        PortfolioFile h = PortfolioReader.read(in.resolve("holdings.csv"), "holdings", u.assets(), Units.DECIMAL);
        warnings.addAll(h.warnings());
        Provenance prov = u.provenance().withInput(h.source());
        RiskDecomposition current = RiskAnalysis.decompose(u.universe(), h.weights());
        TrackingError te = RiskAnalysis.trackingError(u.universe(), proposal.solution().weights(), h.weights());
        RiskView currentView = new RiskView("the current holdings (holdings.csv)", current, h.marketValue(), true,
                null, null, null, prov, warnings);
        RiskView proposalView = new RiskView("the target-return proposal", proposal.risk(), OptionalDouble.empty(),
                true, "the current holdings", current, te, prov, warnings);

        Path policyFile = in.resolve("policy.yaml");
        SolveView mandateMinVar = null;
        SolveView mandateTarget = null;
        FrontierView frontier = null;
        if (Files.isRegularFile(policyFile)) {
            PolicyOption.Loaded loaded = PolicyOption.of(policyFile).load(u);
            Mandate m = loaded.mandate(Map.of());
            mandateMinVar = SolveCommand.run(loaded.inputs(), m, Objective.minimumVariance(), Method.AUTO, Map.of(),
                    loaded.name(), List.of(), warnings);
            mandateTarget = SolveCommand.run(loaded.inputs(), m, Objective.targetReturn(target), Method.AUTO, Map.of(),
                    loaded.name(), List.of(), warnings);
            frontier = FrontierCommand.run(loaded, Grid.points(FrontierCommand.DEFAULT_POINTS), false);
            json(dir.resolve("mandate-minimum-variance.json"), mandateMinVar.json());
            json(dir.resolve("mandate-target-return.json"), mandateTarget.json());
            json(dir.resolve("frontier.json"), frontier.json());
            Files.writeString(dir.resolve("frontier.csv"), frontier.csv());
        }

        json(dir.resolve("check.json"), check.json());
        json(dir.resolve("minimum-variance.json"), minVar.json());
        json(dir.resolve("target-return.json"), proposal.json());
        json(dir.resolve("tangency.json"), tangency.json());
        json(dir.resolve("risk-current.json"), currentView.json());
        json(dir.resolve("risk-proposal.json"), proposalView.json());
        Path policy = in.resolve("policy.yaml");
        String charts = this.charts ? DemoCharts.write(dir, u, Files.isRegularFile(policy) ? policy : null, prov,
                current, target, riskFree) : null;
        DemoSummary s = new DemoSummary(u, check.summary(), minVar, proposal, tangency, h, current, te, prov, warnings,
                out, mandateMinVar, mandateTarget, frontier, charts);
        Files.writeString(dir.resolve("weights.csv"), s.weightsCsv());
        Files.writeString(dir.resolve("multipliers.csv"), s.multipliersCsv());
        Files.writeString(dir.resolve("risk.csv"), s.riskCsv());
        String text = s.table();
        Files.writeString(dir.resolve("summary.txt"), text);
        return text;
    }

    private void json(Path file, ObjectNode o) throws IOException {
        String text = AtomicWrite.text(w -> ResultJson.write(ResultJson.finish(o, elapsedMillis()), w));
        Files.writeString(file, text);
    }

    private void copyInputs(Path in) throws IOException {
        for (String name : SAMPLE_FILES) {
            Path target = in.resolve(name);
            if (data != null) {
                Path src = data.resolve(name);
                if (Files.isRegularFile(src)) {
                    Files.copy(src, target, StandardCopyOption.REPLACE_EXISTING);
                } else if (REQUIRED.contains(name)) {
                    throw InputException.of("the demo data folder has no " + name).file(data.toString())
                            .fix("put " + String.join(", ", REQUIRED) + " in the folder, or leave out --data").build();
                }
                continue;
            }
            try (InputStream s = DemoCommand.class.getResourceAsStream("/org/isorisk/cli/sample-data/" + name)) {
                if (s == null) {
                    throw new IllegalStateException("the sample file " + name + " is missing from the build");
                }
                Files.copy(s, target, StandardCopyOption.REPLACE_EXISTING);
            }
        }
    }
}
