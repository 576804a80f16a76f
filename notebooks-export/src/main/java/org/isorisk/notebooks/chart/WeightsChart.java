package org.isorisk.notebooks.chart;

import java.awt.Color;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Frontier;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries.XYSeriesRenderStyle;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.Styler;
import org.knowm.xchart.style.markers.SeriesMarkers;

/**
 * Weights along the frontier as stacked bands. XChart has no stacked XY area, so each band is a closed polygon
 * between two cumulative sums (LIBRARIES.md): the band of the k-th asset runs from the sum of the first k−1
 * weights to the sum of the first k. Long positions stack upwards from 0 %, short positions downwards, so a
 * frontier with shorts is drawn truthfully too. Straight edges between the portfolios are exact: weights are
 * affine in the target between corner portfolios.
 */
final class WeightsChart {
    private WeightsChart() {
    }

    static final String BAND_PREFIX = "band:";
    static final String OTHER = "band:other";
    /** Weights above this below zero are rounding noise of a weight held at 0, not a short position. */
    static final double SHORT_NOISE = 1e-9;

    /** The assets (by index) that get a band of their own, most important first; the rest form "other". */
    record Grouping(List<Integer> own, List<Integer> other, double otherPeak) {
    }

    static Grouping group(FrontierPath path, int n, ChartSettings s) {
        double[] peak = new double[n];
        for (FrontierPath.Step st : path.steps) {
            for (int i = 0; i < n; i++) {
                peak[i] = Math.max(peak[i], Math.abs(st.portfolio().weight(i)));
            }
        }
        List<Integer> idx = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            idx.add(i);
        }
        if (n <= s.bandLimit()) {
            return new Grouping(idx, List.of(), 0);
        }
        List<Integer> byPeak = new ArrayList<>(idx);
        byPeak.sort(Comparator.comparingDouble((Integer i) -> -peak[i]).thenComparing(i -> i));
        List<Integer> own = new ArrayList<>();
        List<Integer> other = new ArrayList<>();
        for (int i : byPeak) {
            if (own.size() < s.bandLimit() && peak[i] >= s.otherThreshold()) {
                own.add(i);
            } else {
                other.add(i);
            }
        }
        own.sort(Comparator.naturalOrder()); // keep the universe's order in the stack
        other.sort(Comparator.naturalOrder());
        double otherPeak = 0;
        for (int i : other) {
            otherPeak = Math.max(otherPeak, peak[i]);
        }
        return new Grouping(own, other, otherPeak);
    }

    static Figure build(Frontier f, ChartContext ctx, AssetColours colours, ChartSettings s) {
        FrontierPath path = FrontierPath.of(f);
        if (path.size() < 2) {
            throw InputException.of(path.size() == 0 ? "the frontier is empty: there are no portfolios whose weights "
                            + "could be drawn" : "the frontier has a single portfolio, so there is no range of targets "
                            + "to draw weights along")
                    .fix("compute the frontier with corner portfolios or at least two points").build();
        }
        // From the minimum-variance end to the maximum: the inefficient branch, if sampled, is left out.
        int start = path.minimumVolatilityIndex();
        List<FrontierPath.Step> steps = path.steps.subList(start, path.size());
        if (steps.size() < 2) {
            throw InputException.of("the frontier's efficient branch has a single portfolio")
                    .fix("compute points above the minimum-variance return").build();
        }
        List<String> assets = steps.get(0).portfolio().assets();
        int n = assets.size();
        Grouping grouping = group(new FrontierPathView(steps).path(), n, s);
        int k = steps.size();
        double[] xs = new double[k];
        for (int j = 0; j < k; j++) {
            xs[j] = steps.get(j).m();
        }
        // Band layers in stacking order (bottom first): own assets in universe order, then "other".
        List<double[]> layers = new ArrayList<>();
        List<String> names = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        List<Color> fills = new ArrayList<>();
        for (int i : grouping.own()) {
            double[] w = new double[k];
            for (int j = 0; j < k; j++) {
                w[j] = steps.get(j).portfolio().weight(i);
            }
            layers.add(w);
            names.add(BAND_PREFIX + assets.get(i));
            boolean held = false;
            for (double v : w) {
                held |= Math.abs(v) > 1e-9;
            }
            labels.add(held ? assets.get(i) : assets.get(i) + " (not held)");
            fills.add(colours.colour(assets.get(i)));
        }
        if (!grouping.other().isEmpty()) {
            double[] pos = new double[k];
            double[] neg = new double[k];
            for (int j = 0; j < k; j++) {
                for (int i : grouping.other()) {
                    double w = steps.get(j).portfolio().weight(i);
                    if (w >= 0) {
                        pos[j] += w;
                    } else {
                        neg[j] += w;
                    }
                }
            }
            layers.add(pos);
            names.add(OTHER);
            labels.add(String.format(Locale.ROOT, "Other: %d assets, each at most %s", grouping.other().size(),
                    Style.percent(grouping.otherPeak(), 1)));
            fills.add(Palette.LIGHT_GREY);
            boolean anyNeg = false;
            for (double v : neg) {
                anyNeg |= v < -SHORT_NOISE;
            }
            if (anyNeg) {
                layers.add(neg);
                names.add(OTHER + ":short");
                labels.add("Other, short positions");
                fills.add(Palette.MID_GREY);
            }
        }
        double[] posBase = new double[k];
        double[] negBase = new double[k];
        double top = 0;
        double bottom = 0;
        List<double[][]> polys = new ArrayList<>();
        BandLabels bandLabels = new BandLabels();
        int layer = 0;
        for (double[] w : layers) {
            double[] lo = new double[k];
            double[] hi = new double[k];
            for (int j = 0; j < k; j++) {
                // A layer that changes sign along the frontier is split at 0: its long part stacks up, its short
                // part down. The polygon for it covers both.
                if (w[j] >= -SHORT_NOISE) { // rounding noise of a weight held at 0 stacks with the longs
                    lo[j] = posBase[j];
                    hi[j] = posBase[j] + w[j];
                    posBase[j] = hi[j];
                } else {
                    hi[j] = negBase[j];
                    lo[j] = negBase[j] + w[j];
                    negBase[j] = lo[j];
                }
                top = Math.max(top, hi[j]);
                bottom = Math.min(bottom, lo[j]);
            }
            polys.add(band(xs, lo, hi));
            String name = labels.get(layer).startsWith("Other") ? "Other" : labels.get(layer);
            bandLabels.add(new BandLabels.Band(name, fills.get(layer), xs, lo, hi));
            layer++;
        }

        XYChart chart = new XYChartBuilder().width(s.width()).height(s.height())
                .title("Weights along the frontier")
                .xAxisTitle("Target expected return (annualised, %), minimum variance \u2192 maximum return")
                .yAxisTitle("Portfolio weight (%)").build();
        Style.apply(chart.getStyler());
        chart.getStyler().setLegendPosition(Styler.LegendPosition.OutsideE);
        chart.getStyler().setXAxisMin(xs[0]).setXAxisMax(xs[k - 1]);
        Style.guardTicks(chart, xs[0], xs[k - 1]);
        double ySpan = top - bottom;
        chart.getStyler().setYAxisMin(bottom < -1e-9 ? bottom - 0.02 * ySpan : 0.0);
        chart.getStyler().setYAxisMax(top + 0.02 * ySpan);
        chart.getStyler().setxAxisTickLabelsFormattingFunction(Style.percentTicks(2));
        chart.getStyler().setyAxisTickLabelsFormattingFunction(Style.percentTicks(1));
        chart.getStyler().setPlotGridLinesVisible(false);
        chart.getStyler().setPlotContentSize(0.985);
        chart.getStyler().setLegendFont(Style.legendFont().deriveFont(11f));
        // Legend top to bottom as the bands are stacked: add the top band first.
        for (int b = layers.size() - 1; b >= 0; b--) {
            double[][] p = polys.get(b);
            XYSeries series = chart.addSeries(names.get(b), p[0], p[1]);
            series.setXYSeriesRenderStyle(XYSeriesRenderStyle.PolygonArea);
            series.setMarker(SeriesMarkers.NONE);
            series.setFillColor(fills.get(b));
            series.setLineColor(java.awt.Color.WHITE);
            series.setLineStyle(Style.solid(0.8f));
            series.setLabel(labels.get(b));
        }
        List<String> notices = new ArrayList<>();
        if (!grouping.other().isEmpty()) {
            notices.add(String.format(Locale.ROOT, "With %d assets, %d get a band of their own (at most %d, each "
                            + "reaching at least %s somewhere on the frontier); the other %d are summed as \"other\".",
                    n, grouping.own().size(), s.bandLimit(), Style.percent(s.otherThreshold(), 1),
                    grouping.other().size()));
        }
        List<Guides.Guide> guides = new ArrayList<>();
        boolean anyCorner = false;
        for (FrontierPath.Step st : steps) {
            anyCorner |= st.corner() != null;
            if (st.corner() != null && st != steps.get(0) && st != steps.get(k - 1)) {
                guides.add(new Guides.Guide(st.m(), null));
            }
        }
        if (!guides.isEmpty()) {
            notices.add(0, "Dashed verticals: corner portfolios, where an asset reaches or leaves a limit; between "
                    + "them the weights change in straight lines.");
        } else if (!anyCorner) {
            for (CornerChanges.Between b : CornerChanges.betweenSamples(steps)) {
                guides.add(new Guides.Guide(b.m(), null));
            }
            if (!guides.isEmpty()) {
                notices.add(0, "Dashed verticals: the binding constraints change between the two sampled targets "
                        + "around each line; between samples the weights are drawn straight.");
            }
        }
        List<java.util.function.Supplier<String>> later = new ArrayList<>();
        if (!guides.isEmpty()) {
            Guides g = new Guides(guides, Palette.alpha(Palette.BLACK, 0.4));
            chart.addAnnotation(g);
            later.add(() -> g.linesSkipped() == 0 ? null : String.format(Locale.ROOT, "%d of %d guides left out: "
                    + "closer than %.0f pixels to their neighbour.", g.linesSkipped(), g.lines(), Guides.MIN_LINE_GAP));
        }
        chart.addAnnotation(bandLabels); // after the guides, so that names sit on top
        return new Figure(Figure.Kind.WEIGHTS, chart, s, ctx, notices, later);
    }

    /** Polygon of a band: along the top edge left to right, back along the bottom edge. */
    static double[][] band(double[] xs, double[] lo, double[] hi) {
        int k = xs.length;
        double[] px = new double[2 * k + 1];
        double[] py = new double[2 * k + 1];
        for (int j = 0; j < k; j++) {
            px[j] = xs[j];
            py[j] = hi[j];
            px[2 * k - 1 - j] = xs[j];
            py[2 * k - 1 - j] = lo[j];
        }
        px[2 * k] = xs[0];
        py[2 * k] = hi[0];
        return new double[][] {px, py};
    }

    /** A view of part of a path. */
    private record FrontierPathView(List<FrontierPath.Step> steps) {
        FrontierPath path() {
            return FrontierPath.ofSteps(steps);
        }
    }
}
