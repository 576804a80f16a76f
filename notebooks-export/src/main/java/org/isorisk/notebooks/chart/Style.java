package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.util.Locale;
import java.util.function.Function;
import org.knowm.xchart.style.AxesChartStyler;
import org.knowm.xchart.style.Styler;

/** The house look shared by every chart: fonts, greys, strokes and locale-independent percent ticks. */
final class Style {
    private Style() {
    }

    /** Outer padding in pixels. */
    static final int PAD = 14;

    static final String FAMILY = Font.SANS_SERIF; // DejaVu Sans under fontconfig (fonts-dejavu-core)

    static Font titleFont() {
        return new Font(FAMILY, Font.BOLD, 17);
    }

    static Font axisTitleFont() {
        return new Font(FAMILY, Font.PLAIN, 13);
    }

    static Font tickFont() {
        return new Font(FAMILY, Font.PLAIN, 12);
    }

    static Font legendFont() {
        return new Font(FAMILY, Font.PLAIN, 12);
    }

    static Font labelFont() {
        return new Font(FAMILY, Font.PLAIN, 11);
    }

    static Font footnoteFont() {
        return new Font(FAMILY, Font.PLAIN, 10);
    }

    static BasicStroke solid(float width) {
        return new BasicStroke(width, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND);
    }

    static BasicStroke dashed(float width, float... pattern) {
        return new BasicStroke(width, BasicStroke.CAP_BUTT, BasicStroke.JOIN_ROUND, 10f, pattern, 0f);
    }

    /**
     * A decimal shown as a percent with {@code decimals} places, never with the machine's decimal comma:
     * 0.065 → "6.5 %". XChart formats ticks with the default locale (LIBRARIES.md), so charts pass this instead.
     */
    static Function<Double, String> percent(int decimals) {
        String f = "%." + decimals + "f %%";
        return v -> String.format(Locale.ROOT, f, clean(v) * 100);
    }

    /** The same as {@link #percent(int)} for one value. */
    static String percent(double v, int decimals) {
        return String.format(Locale.ROOT, "%." + decimals + "f %%", clean(v) * 100);
    }

    private static double clean(double v) {
        return Math.abs(v) < 1e-13 ? 0.0 : v; // no "-0.0 %"
    }

    /**
     * Tick labels in percent with as few decimals as the value needs (at most {@code maxDecimals}): 0.05 → "5 %",
     * 0.025 → "2.5 %"; locale-independent.
     */
    static Function<Double, String> percentTicks(int maxDecimals) {
        return v -> {
            String t = String.format(Locale.ROOT, "%." + maxDecimals + "f", clean(v) * 100);
            if (t.contains(".")) {
                t = t.replaceAll("0+$", "").replaceAll("\\.$", "");
            }
            return ("-0".equals(t) ? "0" : t) + " %";
        };
    }

    /** Name of the hidden series that keeps XChart's x ticks at round values. */
    static final String TICK_GUARD = "tick-guard";

    /**
     * Adds, as the chart's first series, a hidden two-point series at the ends of the x axis. XChart puts the x ticks
     * at the data's own x values when those are equally spaced to within an absolute 0.0001 (so, on a decimal
     * return axis, whenever the targets come from an even grid), which gives labels such as 4.36 %, 4.56 %; the
     * guard's two values come first, out of order, so the spacing test fails and the ticks fall on round values.
     */
    static void guardTicks(org.knowm.xchart.XYChart chart, double xMin, double xMax) {
        org.knowm.xchart.XYSeries g = chart.addSeries(TICK_GUARD, new double[] {xMax, xMin},
                new double[] {Double.NaN, Double.NaN});
        g.setXYSeriesRenderStyle(org.knowm.xchart.XYSeries.XYSeriesRenderStyle.Scatter);
        g.setMarker(org.knowm.xchart.style.markers.SeriesMarkers.NONE);
        g.setShowInLegend(false);
    }

    /** Applies the house look to an XChart styler. */
    static void apply(AxesChartStyler s) {
        s.setLocale(Locale.ROOT);
        s.setChartBackgroundColor(Color.WHITE);
        s.setPlotBackgroundColor(Color.WHITE);
        s.setPlotBorderVisible(true);
        s.setPlotBorderColor(Palette.MID_GREY);
        s.setPlotGridLinesColor(Palette.GRID);
        s.setPlotGridLinesStroke(new BasicStroke(1f));
        s.setChartFontColor(Palette.BLACK);
        s.setChartTitleFont(titleFont());
        s.setChartTitleBoxVisible(false);
        s.setChartTitlePadding(8);
        s.setChartPadding(PAD);
        s.setAxisTitleFont(axisTitleFont());
        s.setAxisTickLabelsFont(tickFont());
        s.setAxisTickLabelsColor(Palette.DARK_GREY);
        s.setAxisTickMarksColor(Palette.MID_GREY);
        s.setAxisTitlePadding(8);
        s.setLegendFont(legendFont());
        s.setLegendBorderColor(Palette.LIGHT_GREY);
        s.setLegendBackgroundColor(new Color(255, 255, 255, 235));
        s.setLegendPadding(6);
        s.setLegendSeriesLineLength(28);
        s.setAnnotationTextFont(labelFont());
        s.setAnnotationTextFontColor(Palette.DARK_GREY);
        s.setAntiAlias(true);
        s.setTextAntiAlias(true);
        s.setPlotMargin(6);
        s.setMarkerSize(8);
        s.setLegendPosition(Styler.LegendPosition.OutsideE);
    }
}
