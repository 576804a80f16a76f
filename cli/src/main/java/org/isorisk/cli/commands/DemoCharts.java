package org.isorisk.cli.commands;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.engine.chart.AssetColours;
import org.isorisk.engine.chart.ChartContext;
import org.isorisk.engine.chart.ChartFormat;
import org.isorisk.engine.chart.ChartSettings;
import org.isorisk.engine.chart.Charts;
import org.isorisk.engine.chart.Figure;
import org.isorisk.engine.chart.FrontierChartData;
import org.isorisk.engine.chart.PortfolioPoint;
import org.isorisk.engine.chart.RiskShares;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.frontier.Grid;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskAnalysis;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.solve.Allocator;

/**
 * The demo's committee charts: the frontier, weights along it, the marginal risk of the return target and the risk
 * contributions of the current holdings beside the proposal, under the scenario's policy file when there is one
 * (else the budget alone), each as PNG, SVG and PDF in {@code charts/}.
 */
final class DemoCharts {
    private DemoCharts() {
    }

    /** Points sampled along the frontier besides its corners. */
    static final int POINTS = 60;

    /** The chart kinds the demo draws, as file names without extension. */
    static final List<String> KINDS = List.of("frontier", "weights", "marginal-risk", "risk-contributions");

    /**
     * Draws every chart into {@code dir/charts} and returns the paragraph of the summary that says what they show.
     *
     * @param policyFile the policy (YAML), or null for the budget alone
     * @param holdings   the provenance of the inputs with the holdings file
     * @param current    risk of the current holdings
     */
    static String write(Path dir, LoadedUniverse universe, Path policyFile, Provenance holdings,
                        RiskDecomposition current, double target, double riskFree) throws IOException {
        PolicyOption.Loaded loaded = (policyFile == null ? new PolicyOption() : PolicyOption.of(policyFile))
                .load(universe);
        LoadedUniverse u = loaded.inputs();
        Mandate mandate = loaded.mandate(java.util.Map.of());
        Provenance prov = u.provenance();
        for (SourceFile f : holdings.inputs()) {
            if (!prov.inputs().contains(f)) {
                prov = prov.withInput(f);
            }
        }
        Frontier f = FrontierCommand.run(loaded, Grid.points(POINTS), false).frontier();
        Solution proposal = Allocator.solve(AllocationRequest.of(u.universe(), mandate, Objective.targetReturn(target)));
        Solution tangency = Allocator.solve(AllocationRequest.of(u.universe(), mandate, Objective.tangency(riskFree)));
        RiskDecomposition proposalRisk = RiskAnalysis.decompose(u.universe(), proposal.weights());
        ChartContext ctx = ChartContext.of(prov, null);
        AssetColours colours = AssetColours.of(u.assets());
        ChartSettings s = ChartSettings.defaults();
        FrontierChartData d = FrontierChartData.of(u.universe(), f).withTangency(riskFree, tangency)
                .withCurrent(new PortfolioPoint("Current", current.volatility(), current.expectedReturn()))
                .withProposed(PortfolioPoint.of("Proposed", proposal));
        List<Figure> figures = List.of(Charts.frontier(d, ctx, colours, s), Charts.weights(f, ctx, colours, s),
                Charts.marginalRisk(f, ctx, s), Charts.riskContributions(RiskShares.of("Current", current),
                        RiskShares.of("Proposed", proposalRisk), ctx, colours, s));
        Path charts = Files.createDirectories(dir.resolve("charts"));
        for (Figure fig : figures) {
            for (ChartFormat fmt : ChartFormat.values()) {
                try (OutputStream out = new java.io.BufferedOutputStream(Files.newOutputStream(
                        charts.resolve(fig.kind().label() + "." + fmt.extension())))) {
                    Charts.write(fig, fmt, s, out);
                }
            }
        }
        List<String> files = new ArrayList<>();
        for (Figure fig : figures) {
            files.add(fig.kind().label());
        }
        String under = policyFile == null ? "the budget alone (short positions allowed)"
                : "the policy " + policyFile.getFileName() + (f.corners().isEmpty()
                ? " (its groups and general limits make the frontier sampled at " + f.points().size() + " targets)"
                : " (" + f.corners().size() + " corner portfolios)");
        return String.format(Locale.ROOT, "Charts in charts/ (PNG at print resolution, SVG, PDF): %s. They are drawn "
                        + "under %s; their proposal is the minimum-variance portfolio under it for the same %s target "
                        + "(volatility %s), and the tangency portfolio is the policy's for a risk-free rate of %s.",
                String.join(", ", files), under, Explain.percent(target), Explain.percent(proposal.volatility()),
                Explain.percent(riskFree));
    }
}
