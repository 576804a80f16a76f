package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.MertonScalars;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;

/** Base and scenario frontiers on one chart: efficient branches only, each with its minimum-variance portfolio. */
final class StressChart {
    private StressChart() {
    }

    static final String CURVE_PREFIX = "frontier:";
    static final String MIN_PREFIX = "min-variance:";

    private static final List<Color> COLOURS = List.of(Palette.BLACK, Palette.VERMILLION, Palette.BLUE,
            Palette.BLUISH_GREEN, Palette.REDDISH_PURPLE, Palette.ORANGE, Palette.SKY_BLUE);
    private static final List<BasicStroke> STROKES = List.of(Style.solid(2.6f), Style.dashed(2f, 9f, 4f),
            Style.dashed(2f, 2f, 3f), Style.dashed(2f, 12f, 3f, 2f, 3f), Style.dashed(2f, 5f, 5f),
            Style.dashed(2f, 14f, 4f, 4f, 4f), Style.dashed(2f, 3f, 6f));

    static Figure build(List<NamedFrontier> frontiers, ChartContext ctx, ChartSettings s) {
        if (frontiers == null || frontiers.isEmpty()) {
            throw InputException.of("the stress overlay needs at least one frontier (the base)")
                    .fix("give the base frontier and the scenario frontiers").build();
        }
        List<StressCurve> curves = new ArrayList<>();
        for (NamedFrontier nf : frontiers) {
            FrontierPath path = FrontierPath.of(nf.frontier());
            if (path.size() >= 2) {
                int k = path.minimumVolatilityIndex();
                if (path.size() - k < 2) {
                    throw InputException.of("frontier '" + nf.name() + "' has a single portfolio on its efficient "
                            + "branch").fix("compute more frontier points for this scenario").build();
                }
                curves.add(new StressCurve(nf.name(), path.volatilities(k, path.size()), path.returns(k, path.size())));
            } else if (path.size() == 0 && FrontierChart.usable(nf.frontier().unconstrained()) != null
                    && Double.isFinite(nf.frontier().maxReturn())) {
                MertonScalars ms = nf.frontier().unconstrained();
                double[][] c = FrontierChart.hyperbola(ms, ms.minimumVarianceReturn(), nf.frontier().maxReturn());
                curves.add(new StressCurve(nf.name(), c[0], c[1]));
            } else {
                throw InputException.of("frontier '" + nf.name() + "' is " + (path.size() == 1 ? "a single "
                        + "portfolio" : "empty") + ", so it cannot be drawn as a curve")
                        .fix("compute at least two frontier points for every scenario").build();
            }
        }
        return buildCurves(curves, ctx, s, true);
    }

    /**
     * @param minimumVariance true when each curve starts at its own minimum-variance portfolio (whole frontiers), which
     *                        is then marked; false for curves at given targets (a stress run), which start wherever the
     *                        first reachable target is
     */
    static Figure buildCurves(List<StressCurve> given, ChartContext ctx, ChartSettings s, boolean minimumVariance) {
        if (given == null || given.isEmpty()) {
            throw InputException.of("the stress overlay needs at least one frontier (the base)")
                    .fix("give the base frontier and the scenario frontiers").build();
        }
        Set<String> names = new HashSet<>();
        List<double[][]> curves = new ArrayList<>();
        double xMax = 0;
        double yLo = Double.POSITIVE_INFINITY;
        double yHi = Double.NEGATIVE_INFINITY;
        for (StressCurve sc : given) {
            if (!names.add(sc.name())) {
                throw InputException.of("two frontiers of the stress overlay share the name '" + sc.name() + "'")
                        .fix("name each scenario once").build();
            }
            double[][] c = {sc.volatility(), sc.expectedReturn()};
            curves.add(c);
            for (int i = 0; i < c[0].length; i++) {
                xMax = Math.max(xMax, c[0][i]);
                yLo = Math.min(yLo, c[1][i]);
                yHi = Math.max(yHi, c[1][i]);
            }
        }
        XYChart chart = new XYChartBuilder().width(s.width()).height(s.height())
                .title("Frontier under stress scenarios").xAxisTitle("Volatility (annualised, %)")
                .yAxisTitle("Expected return (annualised, %)").build();
        Style.apply(chart.getStyler());
        double span = Math.max(yHi - yLo, 0.005);
        chart.getStyler().setXAxisMin(0.0).setXAxisMax(xMax * 1.1);
        Style.guardTicks(chart, 0.0, xMax * 1.1);
        double yMin = yLo - 0.08 * span;
        chart.getStyler().setYAxisMin(yMin > 0 && yMin < 0.15 * span ? 0.0 : yMin).setYAxisMax(yHi + 0.1 * span);
        chart.getStyler().setxAxisTickLabelsFormattingFunction(Style.percentTicks(2));
        chart.getStyler().setyAxisTickLabelsFormattingFunction(Style.percentTicks(2));
        for (int j = 0; j < given.size(); j++) {
            double[][] c = curves.get(j);
            Color col = COLOURS.get(j % COLOURS.size());
            XYSeries line = FrontierChart.line(chart, CURVE_PREFIX + given.get(j).name(), c[0], c[1], col,
                    STROKES.get(j % STROKES.size()));
            String name = given.get(j).name();
            boolean saysBase = name.toLowerCase(java.util.Locale.ROOT).contains("base");
            line.setLabel(j == 0 && !saysBase ? name + " (base)" : name);
            if (!minimumVariance) {
                continue;
            }
            XYSeries mv = FrontierChart.points(chart, MIN_PREFIX + given.get(j).name(), new double[] {c[0][0]},
                    new double[] {c[1][0]}, col, new Mark(Mark.Kind.SQUARE, 9, Palette.BLACK, 1f));
            mv.setShowInLegend(false);
        }
        chart.addAnnotation(new DashedPaths());
        List<String> notices = List.of(minimumVariance ? "Efficient branches of the mandate frontier under each set of "
                + "assumptions; squares mark each minimum-variance portfolio." : "The least volatility the mandate "
                + "allows at each return target under each set of assumptions; targets a scenario cannot reach are left "
                + "out.");
        return new Figure(Figure.Kind.STRESS, chart, s, ctx, notices, List.of(), true);
    }
}
