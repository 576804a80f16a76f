package org.isorisk.notebooks.chart;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.knowm.xchart.HorizontalBarChart;
import org.knowm.xchart.HorizontalBarChartBuilder;
import org.knowm.xchart.HorizontalBarSeries;

/**
 * Risk contributions: each asset's share of portfolio volatility (Euler) as horizontal bars, the current and the
 * proposed portfolio side by side, sorted by the proposed share, largest at the top.
 */
final class RiskContributionChart {
    private RiskContributionChart() {
    }

    static final String OTHER = "Other";

    static Figure build(RiskShares current, RiskShares proposed, ChartContext ctx, AssetColours colours,
                        ChartSettings s) {
        if (proposed == null) {
            throw InputException.of("the risk-contribution chart needs the proposed portfolio's contributions")
                    .build();
        }
        List<String> assets = proposed.assets();
        if (current != null && !current.assets().equals(assets)) {
            throw InputException.of("the current and the proposed portfolio's contributions cover different assets")
                    .fix("decompose both portfolios over the same universe").build();
        }
        for (String a : assets) {
            colours.colour(a); // the run's universe must know every asset
        }
        int n = assets.size();
        List<Integer> order = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            order.add(i);
        }
        // Largest proposed share first; ties by the current share, then by name.
        order.sort(Comparator.comparingDouble((Integer i) -> -proposed.share(i))
                .thenComparingDouble(i -> current == null ? 0 : -current.share(i)).thenComparing(assets::get));
        List<Integer> own = order;
        List<Integer> rest = List.of();
        if (n > s.barLimit()) {
            List<Integer> bySize = new ArrayList<>(order);
            bySize.sort(Comparator.comparingDouble((Integer i) -> -Math.max(Math.abs(proposed.share(i)),
                    current == null ? 0 : Math.abs(current.share(i)))).thenComparing(assets::get));
            List<Integer> keep = bySize.subList(0, s.barLimit() - 1);
            own = order.stream().filter(keep::contains).toList();
            rest = order.stream().filter(i -> !keep.contains(i)).toList();
        }
        List<String> categories = new ArrayList<>();
        List<Double> prop = new ArrayList<>();
        List<Double> cur = new ArrayList<>();
        for (int i : own) {
            categories.add(assets.get(i));
            prop.add(proposed.share(i));
            cur.add(current == null ? 0 : current.share(i));
        }
        if (!rest.isEmpty()) {
            double p = 0;
            double c = 0;
            for (int i : rest) {
                p += proposed.share(i);
                c += current == null ? 0 : current.share(i);
            }
            categories.add(String.format(Locale.ROOT, "%s (%d assets)", OTHER, rest.size()));
            prop.add(p);
            cur.add(c);
        }
        // XChart draws the first category at the top: the largest proposed share comes first.
        int rows = categories.size();
        int height = Math.max(s.height(), 150 + rows * (current == null ? 18 : 28));
        ChartSettings sized = s.withSize(s.width(), Math.min(height, 4 * s.height()));
        HorizontalBarChart chart = new HorizontalBarChartBuilder().width(sized.width()).height(sized.height())
                .title("Risk contributions").xAxisTitle("Share of portfolio volatility (%, Euler "
                        + "contributions, sum 100 %)").yAxisTitle("").build();
        Style.apply(chart.getStyler());
        // every category gets its name (XChart otherwise skips labels closer than its spacing hint)
        chart.getStyler().setXAxisMaxLabelCount(Math.max(2, rows));
        chart.getStyler().setPlotContentSize(0.97);
        chart.getStyler().setXAxisDecimalPattern("0.0");
        // one decimal everywhere: XChart writes the bar labels with the x axis's formatter too
        chart.getStyler().setxAxisTickLabelsFormattingFunction(v -> Style.percent(v, 1));
        chart.getStyler().setPlotGridHorizontalLinesVisible(false);
        chart.getStyler().setAvailableSpaceFill(0.8);
        chart.getStyler().setLabelsVisible(true);
        chart.getStyler().setLabelsFont(Style.labelFont());
        chart.getStyler().setLabelsFontColorAutomaticEnabled(false);
        chart.getStyler().setLabelsFontColor(Palette.DARK_GREY);
        chart.getStyler().setLabelsPosition(1.02);
        double lo = 0;
        double hi = 0;
        for (int j = 0; j < rows; j++) {
            lo = Math.min(lo, Math.min(prop.get(j), cur.get(j)));
            hi = Math.max(hi, Math.max(prop.get(j), cur.get(j)));
        }
        double span = hi - lo;
        chart.getStyler().setXAxisMin(lo < -1e-6 ? lo - 0.12 * span : 0.0);
        chart.getStyler().setXAxisMax(hi + 0.14 * span);
        // Series order: XChart stacks the bars of one category downwards in series order, so add the proposed
        // portfolio first: it is drawn above the current one.
        HorizontalBarSeries p = chart.addSeries(proposed.portfolio(), prop, categories);
        p.setFillColor(Palette.BLUE);
        p.setLabel(proposed.portfolio() + " portfolio");
        if (current != null) {
            HorizontalBarSeries c = chart.addSeries(current.portfolio(), cur, categories);
            c.setFillColor(Palette.tint(Palette.MID_GREY, 0.7));
            c.setLabel(current.portfolio() + " portfolio");
        }
        List<String> notices = new ArrayList<>();
        notices.add("Each bar is the asset's share of the portfolio's volatility, w\u1d62(\u03a3w)\u1d62/\u03c3\u00b2; "
                + "negative shares are assets that lower the total risk.");
        if (!rest.isEmpty()) {
            notices.add(String.format(Locale.ROOT, "The %d assets with the largest shares are shown; the other %d are "
                    + "summed in \"%s\".", own.size(), rest.size(), OTHER));
        }
        return new Figure(Figure.Kind.RISK_CONTRIBUTIONS, chart, sized, ctx, notices, List.of(), true);
    }
}
