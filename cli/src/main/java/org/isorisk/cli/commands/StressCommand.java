package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.Fingerprint;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.options.OutputOptions;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.ProgressLine;
import org.isorisk.cli.render.StressView;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.ScenarioFile;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.stress.CorrelationRepair;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.Scope;
import org.isorisk.engine.stress.Shock;
import org.isorisk.engine.stress.Stress;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.Sweep;
import org.isorisk.engine.stress.TargetPoint;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import org.isorisk.notebooks.chart.StressCurve;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code isorisk stress}: a sweep of return targets, under the base assumptions and under scenarios. */
@Command(name = "stress", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Sweep return targets under the mandate, under the base assumptions and under stress scenarios.",
        description = {"Sweep return targets under the mandate: for each, the minimum volatility, the marginal risk "
                + "of the target, the binding constraints and whether it can be reached; the highest achievable "
                + "target; where the binding set changes. With scenarios (a file or the flags below), the same under "
                + "shocked assumptions: change in volatility, the risk of keeping the base proposal, the turnover to "
                + "re-optimise. Progress goes to stderr."})
public final class StressCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Mixin
    PolicyOption policyOption;

    @Option(names = "--targets", paramLabel = "FROM:TO:STEP", required = true,
            description = "Grid of return targets, decimals, e.g. 0.04:0.09:0.0025.")
    String targets;

    @Option(names = "--scenarios", paramLabel = "FILE",
            description = "Stress scenarios (YAML; see the README, section Stress scenario file).")
    Path scenarios;

    @Option(names = "--vol-multiplier", paramLabel = "K", converter = Decimal.class,
            description = "Scenario: every volatility multiplied by K (e.g. 1.5).")
    Double volMultiplier;

    @Option(names = "--correlation-shift", paramLabel = "F", converter = Decimal.class,
            description = "Scenario: every correlation moved the fraction F of the way towards 1 (crisis correlation).")
    Double correlationShift;

    @Option(names = "--return-shift", paramLabel = "SCOPE=DELTA",
            description = "Scenario: expected returns of a group, an asset or 'all' shifted by DELTA (decimal, e.g. "
                    + "Equity=-0.02); repeatable, one scenario each.")
    Map<String, String> returnShift = new LinkedHashMap<>();

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: the processors).")
    Integer threads;

    @Option(names = "--quiet", description = "No progress on stderr.")
    boolean quiet;

    @OutputPath(RunFiles.Kind.CHART)
    @Option(names = "--chart", paramLabel = "FILE",
            description = "Also draw the stress overlay (minimum volatility against the target, base and every "
                    + "scenario) into FILE; the extension gives the format: .png, .svg or .pdf.")
    Path chart;

    @Mixin
    OutputOptions output;

    @Override
    protected ExitCode execute() {
        ChartCommand.checkFormat(chart);
        double[] grid = Grid.parse(targets).targets(Double.NaN, Double.NaN);
        for (int i = 0; i < grid.length; i++) {
            grid[i] = inputs.units().rate(grid[i]);
        }
        PolicyOption.Loaded pl = policyOption.load(inputs);
        LoadedUniverse u = pl.inputs();
        List<String> assets = u.assets();
        List<String> warnings = new ArrayList<>(u.warnings());
        Policy p = pl.policyOrBudget();
        Map<String, List<Integer>> groups = pl.groups();
        List<Scenario> list = new ArrayList<>();
        Provenance prov = u.provenance();
        if (scenarios != null) {
            list.addAll(ScenarioFile.read(scenarios, assets, groups, f -> inputs.covarianceFor(
                    RunFiles.reading("covariance file named in --scenarios", f), warnings)));
            prov = prov.withInput(Fingerprint.of("scenarios", scenarios, "--scenarios"));
        }
        int n = assets.size();
        if (volMultiplier != null) {
            list.add(new Scenario(String.format(Locale.ROOT, "vol-x%s", volMultiplier), "",
                    List.of(new Shock.VolatilityMultiplier(Scope.all(n), volMultiplier))));
        }
        if (correlationShift != null) {
            list.add(new Scenario(String.format(Locale.ROOT, "correlation+%s", correlationShift), "",
                    List.of(new Shock.CorrelationShift(Scope.all(n), correlationShift))));
        }
        for (Map.Entry<String, String> e : returnShift.entrySet()) {
            Scope s = scope(e.getKey().strip(), assets, groups);
            double d = inputs.units().rate(TradingOptions.decimal("--return-shift", e.getKey(), e.getValue()));
            list.add(new Scenario("return " + s.name() + " " + e.getValue().strip(), "",
                    List.of(new Shock.ReturnShift(s, d))));
        }
        SolverSettings settings = threads == null ? SolverSettings.defaults()
                : SolverSettings.defaults().withThreads(Math.max(1, threads));
        CorrelationRepair repair = CorrelationRepair.higham(assets);
        StressRequest req = new StressRequest(u.universe(), p.mandate(), grid, list, repair, settings);
        long t0 = System.nanoTime();
        StressResult r;
        try (ProgressLine bar = new ProgressLine(err(), ProgressLine.stderrIsTerminal(), "stress")) {
            r = Stress.run(req, quiet ? null : bar);
        }
        double millis = (System.nanoTime() - t0) / 1e6;
        if (chart != null) {
            List<StressCurve> curves = new ArrayList<>();
            List<String> left = new ArrayList<>();
            addCurve(curves, left, "base", r.base());
            for (ScenarioResult s : r.scenarios()) {
                addCurve(curves, left, s.scenario().name(), s.sweep());
            }
            if (!left.isEmpty()) {
                warnings.add("left out of the chart (fewer than two feasible targets): " + String.join(", ", left));
            }
            if (curves.isEmpty() || !curves.get(0).name().equals("base")) {
                throw InputException.of("the stress chart needs at least two feasible targets under the base "
                        + "assumptions").fix("choose targets within the achievable range, "
                        + org.isorisk.engine.explain.Explain.percent(r.base().minTarget()) + " to "
                        + org.isorisk.engine.explain.Explain.percent(r.base().maxTarget())).build();
            }
            Figure fig = Charts.stressCurves(curves, ChartContext.of(prov, null), ChartSettings.defaults());
            ChartCommand.writeBeside(this, fig, chart);
        }
        emit(new StressView(r, prov, warnings, millis), output.out());
        return ExitCode.OK;
    }

    /** The feasible targets of a sweep as one curve of the overlay; named in {@code left} when too few. */
    private static void addCurve(List<StressCurve> curves, List<String> left, String name, Sweep sweep) {
        List<double[]> pts = new ArrayList<>();
        for (TargetPoint p : sweep.points()) {
            if (p.feasible()) {
                pts.add(new double[] {p.volatility(), p.target()});
            }
        }
        if (pts.size() < 2) {
            left.add(name);
            return;
        }
        double[] v = new double[pts.size()];
        double[] m = new double[pts.size()];
        for (int i = 0; i < pts.size(); i++) {
            v[i] = pts.get(i)[0];
            m[i] = pts.get(i)[1];
        }
        curves.add(new StressCurve(name, v, m));
    }

    private static Scope scope(String name, List<String> assets, Map<String, List<Integer>> groups) {
        if (name.equals("all")) {
            return Scope.all(assets.size());
        }
        if (groups.containsKey(name)) {
            return new Scope(Scope.Kind.GROUP, name, groups.get(name));
        }
        int i = assets.indexOf(name);
        if (i >= 0) {
            return new Scope(Scope.Kind.ASSET, name, List.of(i));
        }
        throw InputException.of("--return-shift names neither 'all', a group of the policy nor an asset").value(name)
                .fix("use 'all', a group (" + String.join(", ", groups.keySet()) + ") or an asset name").build();
    }
}
