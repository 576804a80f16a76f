package org.isorisk.cli.commands;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
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
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.pack.ChartMaker;
import org.isorisk.notebooks.pack.PackResults;
import org.isorisk.notebooks.pack.PackSpec;

/**
 * The pack's charts from {@code engine.chart}: the frontier (with the current, proposed and tangency portfolios),
 * weights along it, the marginal risk of the return target and the risk contributions, each as PNG and SVG (and
 * PDF when the pack file asks for it). Drawing only: every number comes from the pack's engine results.
 */
final class PackCharts implements ChartMaker {
    private final ChartContext context;

    PackCharts(ChartContext context) {
        this.context = context;
    }

    @Override
    public List<PackContent.Chart> draw(PackResults r) {
        PackSpec spec = r.spec();
        AssetColours colours = AssetColours.of(r.universe().assets());
        ChartSettings s = ChartSettings.defaults();
        List<PackContent.Chart> out = new ArrayList<>();
        for (PackSpec.ChartChoice c : spec.charts()) {
            Figure fig;
            PackContent.ChartKind kind;
            String title;
            String caption;
            switch (c) {
                case FRONTIER -> {
                    FrontierChartData d = FrontierChartData.of(r.universe(), r.frontier())
                            .withProposed(PortfolioPoint.of("Proposed", r.proposal()));
                    if (r.tangency().isPresent() && spec.riskFree().isPresent()) {
                        d = d.withTangency(spec.riskFree().get(), r.tangency().get());
                    }
                    if (r.currentRisk().isPresent()) {
                        RiskDecomposition cur = r.currentRisk().get();
                        d = d.withCurrent(new PortfolioPoint("Current", cur.volatility(), cur.expectedReturn()));
                    }
                    fig = Charts.frontier(d, context, colours, s);
                    kind = PackContent.ChartKind.FRONTIER;
                    title = "Efficient frontier under the mandate";
                    caption = "Expected return against volatility: the mandate's frontier beside the frontier with the "
                            + "budget alone, the assets, and the current and proposed portfolios.";
                }
                case WEIGHTS -> {
                    fig = Charts.weights(r.frontier(), context, colours, s);
                    kind = PackContent.ChartKind.WEIGHTS;
                    title = "Weights along the frontier";
                    caption = "How the mix changes as the return target rises; vertical guides mark corner portfolios.";
                }
                case MARGINAL_RISK -> {
                    fig = Charts.marginalRisk(r.frontier(), context, s);
                    kind = PackContent.ChartKind.MARGINAL_RISK;
                    title = "Marginal risk of the return target";
                    caption = "Extra volatility per unit of extra target return (the target's shadow price); at the "
                            + "proposal's " + Explain.percent(r.proposal().expectedReturn()) + " target.";
                }
                case RISK_CONTRIBUTION -> {
                    RiskShares current = r.currentRisk().map(x -> RiskShares.of("Current", x)).orElse(null);
                    fig = Charts.riskContributions(current, RiskShares.of("Proposed", r.risk()), context, colours, s);
                    kind = PackContent.ChartKind.RISK_CONTRIBUTION;
                    title = "Risk contributions";
                    caption = "Each asset's share of portfolio volatility (Euler contributions, summing to 100 %).";
                }
                default -> {
                    continue; // stress charts come with the stress results
                }
            }
            byte[] png = render(fig, ChartFormat.PNG, s);
            String svg = new String(render(fig, ChartFormat.SVG, s), StandardCharsets.UTF_8);
            byte[] pdf = spec.chartFormats().contains(PackSpec.ChartFormat.PDF) ? render(fig, ChartFormat.PDF, s) : null;
            out.add(new PackContent.Chart(c.key(), kind, title, caption, png, svg, pdf));
        }
        return out;
    }

    private static byte[] render(Figure fig, ChartFormat format, ChartSettings s) {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        try {
            Charts.write(fig, format, s, b);
        } catch (IOException e) {
            throw new UncheckedIOException("could not draw the " + fig.kind().label() + " chart", e);
        }
        return b.toByteArray();
    }
}
