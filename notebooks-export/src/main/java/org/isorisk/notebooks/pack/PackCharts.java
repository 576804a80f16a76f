package org.isorisk.notebooks.pack;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.TargetPoint;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.chart.AssetColours;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartFormat;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import org.isorisk.notebooks.chart.FrontierChartData;
import org.isorisk.notebooks.chart.PortfolioPoint;
import org.isorisk.notebooks.chart.RiskShares;
import org.isorisk.notebooks.chart.StressCurve;

/**
 * Draws the pack's charts with {@code notebooks.chart}: the frontier (with the proposal, the current holdings and
 * the tangency portfolio), the weights along the frontier, the marginal risk of the return target along the
 * frontier, and the risk contributions of the current and proposed portfolios. Each chart is written as PNG and
 * SVG, and as PDF when the pack file asks for it; every number drawn comes from {@link PackResults}.
 */
public final class PackCharts implements ChartMaker {
    private final ChartContext context;
    private final ChartSettings settings;

    /**
     * @param context  the as-of date, input hash and fund name every chart's footnote carries
     * @param settings sizes and limits; {@link ChartSettings#defaults()} for the pack
     */
    public PackCharts(ChartContext context, ChartSettings settings) {
        this.context = Objects.requireNonNull(context, "context");
        this.settings = Objects.requireNonNull(settings, "settings");
    }

    @Override
    public List<PackContent.Chart> draw(PackResults r) {
        List<PackContent.Chart> out = new ArrayList<>();
        AssetColours colours = AssetColours.of(r.universe().assets());
        boolean pdf = r.spec().chartFormats().contains(PackSpec.ChartFormat.PDF);
        for (PackSpec.ChartChoice c : r.spec().charts()) {
            switch (c) {
                case FRONTIER -> {
                    FrontierChartData d = FrontierChartData.of(r.universe(), r.frontier())
                            .withProposed(PortfolioPoint.of("Proposed", r.proposal()));
                    if (r.tangency().isPresent() && r.spec().riskFree().isPresent()) {
                        d = d.withTangency(r.spec().riskFree().get(), r.tangency().get());
                    }
                    if (r.currentRisk().isPresent()) {
                        d = d.withCurrent(new PortfolioPoint("Current", r.currentRisk().get().volatility(),
                                r.currentRisk().get().expectedReturn()));
                    }
                    out.add(chart("frontier", PackContent.ChartKind.FRONTIER, "Efficient frontier",
                            "The least volatility the mandate allows for each expected return, with the assets, the "
                                    + "proposal and the current holdings.",
                            Charts.frontier(d, context, colours, settings), pdf));
                }
                case WEIGHTS -> out.add(chart("weights", PackContent.ChartKind.WEIGHTS, "Weights along the frontier",
                        "How each asset's weight changes from the minimum-variance end of the frontier upward.",
                        Charts.weights(r.frontier(), context, colours, settings), pdf));
                case MARGINAL_RISK -> out.add(chart("marginal-risk", PackContent.ChartKind.MARGINAL_RISK,
                        "Marginal risk of the return target",
                        "How much volatility a higher return target costs at each point of the frontier (the "
                                + "target's shadow price in volatility units).",
                        Charts.marginalRisk(r.frontier(), context, settings), pdf));
                case RISK_CONTRIBUTION -> out.add(chart("risk-contributions", PackContent.ChartKind.RISK_CONTRIBUTION,
                        "Where the risk comes from",
                        "Each asset's share of portfolio volatility (contributions add up to the volatility).",
                        Charts.riskContributions(r.currentRisk().map(x -> RiskShares.of("Current", x)).orElse(null),
                                RiskShares.of("Proposed", r.risk()), context, colours, settings), pdf));
                case STRESS -> r.stressSweep().ifPresent(sr -> out.add(chart("stress", PackContent.ChartKind.STRESS,
                        "The frontier under stress",
                        "The least volatility the mandate allows for each return target under today's assumptions and "
                                + "under each stress scenario (targets out of reach under a scenario are left out).",
                        Charts.stressCurves(stressCurves(sr), context, settings), pdf)));
                default -> throw new IllegalStateException(c.name());
            }
        }
        return out;
    }

    /** The base sweep and each scenario as a curve of (volatility, target), feasible targets only. */
    static List<StressCurve> stressCurves(StressResult sr) {
        List<StressCurve> curves = new ArrayList<>();
        List<Double> bv = new ArrayList<>();
        List<Double> bm = new ArrayList<>();
        for (TargetPoint p : sr.base().points()) {
            if (p.feasible()) {
                bv.add(p.volatility());
                bm.add(p.target());
            }
        }
        curves.add(new StressCurve("Today's assumptions", unbox(bv), unbox(bm)));
        for (ScenarioResult s : sr.scenarios()) {
            List<Double> v = new ArrayList<>();
            List<Double> m = new ArrayList<>();
            for (ScenarioPoint p : s.points()) {
                if (p.feasible()) {
                    v.add(p.volatility());
                    m.add(p.target());
                }
            }
            if (v.size() >= 2) {
                curves.add(new StressCurve(s.scenario().name(), unbox(v), unbox(m)));
            }
        }
        return curves;
    }

    private static double[] unbox(List<Double> xs) {
        return xs.stream().mapToDouble(Double::doubleValue).toArray();
    }

    private PackContent.Chart chart(String name, PackContent.ChartKind kind, String title, String caption, Figure f,
                                    boolean pdf) {
        try {
            ByteArrayOutputStream png = new ByteArrayOutputStream();
            Charts.write(f, ChartFormat.PNG, settings, png);
            ByteArrayOutputStream svg = new ByteArrayOutputStream();
            Charts.write(f, ChartFormat.SVG, settings, svg);
            ByteArrayOutputStream pdfOut = new ByteArrayOutputStream();
            if (pdf) {
                Charts.write(f, ChartFormat.PDF, settings, pdfOut);
            }
            return new PackContent.Chart(name, kind, title, caption, png.toByteArray(),
                    svg.toString(StandardCharsets.UTF_8), pdfOut.toByteArray());
        } catch (IOException e) {
            throw new UncheckedIOException("the " + name + " chart could not be drawn", e);
        }
    }
}
