package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.options.OutputOptions;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.FrontierView;
import org.isorisk.engine.frontier.Frontiers;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import org.isorisk.notebooks.chart.FrontierChartData;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine;

/** {@code isorisk frontier}: corner portfolios and a sampled efficient frontier, with the unconstrained one beside. */
@Command(name = "frontier", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Corner portfolios and a sampled efficient frontier under a policy.",
        description = {"The efficient frontier: with --policy, under the mandate; without, under the budget alone "
                + "(short positions allowed). For budget, bounds and fixed weights the corner portfolios are exact "
                + "(critical line method), each saying which asset enters or leaves the free set; with group limits or "
                + "general linear constraints the grid is solved point by point by the active-set QP. Each point has "
                + "its return, volatility, the shadow price of the return target, the binding constraints and the "
                + "weights, beside the unconstrained closed-form frontier's volatility at the same return.",
                "Targets the mandate cannot reach are listed as refused, with the achievable range."})
public final class FrontierCommand extends BaseCommand {

    /** Points sampled when neither --points nor --targets is given. */
    public static final int DEFAULT_POINTS = 11;

    @Mixin
    InputOptions inputs;

    @Mixin
    PolicyOption policyOption;

    @Option(names = "--points", paramLabel = "N",
            description = "Sample N targets evenly spaced from the minimum-variance return to the highest return "
                    + "(default: " + DEFAULT_POINTS + "; 0 for the corners only).")
    Integer points;

    @Option(names = "--targets", paramLabel = "FROM:TO:STEP",
            description = "Sample these targets instead, e.g. 0.03:0.07:0.005 (ends included; in the units of "
                    + "--units). Targets below the minimum-variance return are on the inefficient branch.")
    String targets;

    @Option(names = "--inefficient",
            description = "Also list the corner portfolios of the inefficient branch (below the minimum-variance "
                    + "return; critical line method).")
    boolean inefficient;

    @OutputPath(RunFiles.Kind.CHART)
    @Option(names = "--chart", paramLabel = "FILE",
            description = "Also draw the frontier chart into FILE; the extension gives the format: .png (twice the "
                    + "chart's size, for print), .svg or .pdf.")
    Path chart;

    @Mixin
    OutputOptions output;

    @Override
    protected ExitCode execute() {
        if (points != null && targets != null) {
            throw new CommandLine.ParameterException(spec.commandLine(),
                    "give --points N or --targets FROM:TO:STEP, not both");
        }
        if (points != null && points < 0) {
            throw new CommandLine.ParameterException(spec.commandLine(),
                    "--points must be 0 or more (0 lists the corner portfolios only), not " + points);
        }
        ChartCommand.checkFormat(chart);
        PolicyOption.Loaded loaded = policyOption.load(inputs);
        Grid grid = points != null ? Grid.points(points) : targets != null ? explicit(targets, inputs.units())
                : Grid.points(DEFAULT_POINTS);
        FrontierView view = run(loaded, grid, inefficient);
        Figure fig = null;
        if (chart != null) {
            LoadedUniverse u = loaded.inputs();
            fig = Charts.frontier(FrontierChartData.of(u.universe(), view.frontier()),
                    ChartContext.of(u.provenance(), null), AssetColours.of(u.assets()), ChartSettings.defaults());
        }
        emit(view, output.out());
        if (fig != null) {
            ChartCommand.writeBeside(this, fig, chart);
        }
        return ExitCode.OK;
    }

    private static Grid explicit(String text, Units units) {
        Grid g = Grid.parse(text);
        return units == Units.DECIMAL ? g : Grid.targets(units.rate(g.from()), units.rate(g.to()), units.rate(g.step()));
    }

    /**
     * The frontier of the loaded universe under its policy (or the budget alone): the critical line method when
     * only the budget, bounds and fixed weights apply, the warm-started QP sweep otherwise; shared with the demo.
     */
    static FrontierView run(PolicyOption.Loaded loaded, Grid grid, boolean inefficient) {
        AssetUniverse u = loaded.inputs().universe();
        Mandate m = loaded.mandate();
        List<String> notes = new ArrayList<>();
        long t0 = System.nanoTime();
        Frontier f;
        Method method;
        if (!loaded.present()) {
            f = Frontiers.unconstrained(u, m.budget(), grid, null);
            method = Method.CLOSED_FORM;
            notes.add(Allocator.SHORTS_NOTE);
            notes.add("Without bounds the frontier is one hyperbola (Merton 1972): there are no corner portfolios.");
        } else if (Allocator.criticalLineApplies(m)) {
            f = Frontiers.mandate(u, m, grid, inefficient, null);
            method = Method.CRITICAL_LINE;
            notes.add("Corner portfolios by the critical line method (Markowitz 1956): exact. Between two neighbouring "
                    + "corners the weights are affine in the target, so every sampled point is solved exactly from "
                    + "its two corners.");
        } else {
            f = Frontiers.sampled(u, m, grid, null);
            method = Method.NUMERICAL;
            notes.add("Corner portfolios are not computed for this mandate: its group limits or general linear "
                    + "constraints put it outside the critical line method, so each sampled point is solved by the "
                    + "active-set QP, warm-started from the previous point. Between sampled points the frontier is not "
                    + "known exactly.");
            if (inefficient) {
                notes.add("--inefficient lists the corners of the inefficient branch, which only the critical line "
                        + "method computes; targets below the minimum-variance return given with --targets are still "
                        + "solved.");
            }
        }
        double millis = (System.nanoTime() - t0) / 1e6;
        if (f.unconstrained() != null) {
            notes.add("The unconstrained frontier (budget only, short positions allowed, closed form) is shown for "
                    + "comparison: at the same return its volatility is never above the mandate's.");
        }
        return new FrontierView(f, method, loaded.name(), loaded.inputs(), notes, loaded.inputs().warnings(), millis);
    }
}
