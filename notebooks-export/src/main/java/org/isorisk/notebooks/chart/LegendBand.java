package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.geom.Line2D;
import java.awt.geom.Rectangle2D;
import java.util.ArrayList;
import java.util.List;
import org.knowm.xchart.HorizontalBarSeries;
import org.knowm.xchart.XYSeries.XYSeriesRenderStyle;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.internal.chartpart.AxesChart;
import org.knowm.xchart.internal.series.AxesChartSeries;
import org.knowm.xchart.style.lines.SeriesLines;

/**
 * A legend laid out in columns below the plot, so that long entries wrap into rows instead of running off the
 * chart (XChart's horizontal legend is a single line). Entries are the chart's series shown in the legend, in
 * order, each with a sample of its line, marker or fill.
 */
final class LegendBand {
    private static final int SAMPLE = 30;
    private static final int GAP = 6;
    private static final int COLUMN_GAP = 18;

    private LegendBand() {
    }

    private record Entry(String text, AxesChartSeries series) {
    }

    private static List<Entry> entries(AxesChart<?, ?> chart) {
        List<Entry> out = new ArrayList<>();
        for (Object o : chart.getSeriesCollection()) {
            AxesChartSeries s = (AxesChartSeries) o;
            if (s.isShowInLegend()) { // disabled series included: DashedPaths draws them
                out.add(new Entry(s.getLabel(), s));
            }
        }
        return out;
    }

    private static int columnWidth(Graphics2D g, List<Entry> entries) {
        FontMetrics fm = g.getFontMetrics(Style.legendFont());
        int w = 0;
        for (Entry e : entries) {
            w = Math.max(w, SAMPLE + GAP + fm.stringWidth(e.text()));
        }
        return w;
    }

    private static int columns(int available, int colWidth, int count) {
        return Math.max(1, Math.min(count, (available + COLUMN_GAP) / (colWidth + COLUMN_GAP)));
    }

    private static int rowHeight(Graphics2D g) {
        return (int) Math.ceil(g.getFontMetrics(Style.legendFont()).getHeight() * 1.25);
    }

    /** Height the legend needs at this width. */
    static int height(Graphics2D g, AxesChart<?, ?> chart, int width) {
        List<Entry> entries = entries(chart);
        if (entries.isEmpty()) {
            return 0;
        }
        int avail = width - 2 * Style.PAD;
        int cols = columns(avail, columnWidth(g, entries), entries.size());
        int rows = (entries.size() + cols - 1) / cols;
        return rows * rowHeight(g) + 6;
    }

    /** Paints the legend with its top at {@code top}. */
    static void paint(Graphics2D g, AxesChart<?, ?> chart, int width, int top) {
        List<Entry> entries = entries(chart);
        if (entries.isEmpty()) {
            return;
        }
        int avail = width - 2 * Style.PAD;
        int colWidth = columnWidth(g, entries);
        int cols = columns(avail, colWidth, entries.size());
        int rows = (entries.size() + cols - 1) / cols;
        int rh = rowHeight(g);
        // centre the block of columns
        int blockWidth = cols * colWidth + (cols - 1) * COLUMN_GAP;
        int left = Style.PAD + Math.max(0, (avail - blockWidth) / 2);
        Font font = Style.legendFont();
        g.setFont(font);
        FontMetrics fm = g.getFontMetrics();
        for (int k = 0; k < entries.size(); k++) {
            int col = k / rows; // column-major: read down, then across
            int row = k % rows;
            int x = left + col * (colWidth + COLUMN_GAP);
            int y = top + 3 + row * rh;
            double cy = y + rh / 2.0;
            sample(g, entries.get(k).series(), x, cy);
            g.setColor(Palette.BLACK);
            g.drawString(entries.get(k).text(), x + SAMPLE + GAP, (float) (cy + fm.getAscent() / 2.0 - 1.5));
        }
    }

    private static void sample(Graphics2D g, AxesChartSeries s, double x, double cy) {
        if (s instanceof XYSeries xy) {
            XYSeriesRenderStyle st = xy.getXYSeriesRenderStyle().orElse(XYSeriesRenderStyle.Line);
            if (st == XYSeriesRenderStyle.PolygonArea || st == XYSeriesRenderStyle.Area) {
                box(g, xy.getFillColor(), x, cy);
                return;
            }
            if (xy.getLineStyle() != null && xy.getLineStyle() != SeriesLines.NONE && st != XYSeriesRenderStyle.Scatter) {
                g.setColor(xy.getLineColor());
                BasicStroke bs = xy.getLineStyle();
                g.setStroke(new BasicStroke(bs.getLineWidth(), BasicStroke.CAP_BUTT, bs.getLineJoin(),
                        bs.getMiterLimit(), bs.getDashArray(), bs.getDashPhase()));
                g.draw(new Line2D.Double(x, cy, x + SAMPLE, cy));
            }
            if (xy.getMarker() != null && !(xy.getMarker() instanceof org.knowm.xchart.style.markers.None)) {
                g.setColor(xy.getMarkerColor());
                xy.getMarker().paint(g, x + SAMPLE / 2.0, cy, 8);
            }
        } else if (s instanceof HorizontalBarSeries hb) {
            box(g, hb.getFillColor(), x, cy);
        }
    }

    private static void box(Graphics2D g, Color fill, double x, double cy) {
        Rectangle2D r = new Rectangle2D.Double(x + 4, cy - 6, SAMPLE - 8, 12);
        g.setColor(fill);
        g.fill(r);
        g.setColor(Palette.MID_GREY);
        g.setStroke(new BasicStroke(0.6f));
        g.draw(r);
    }
}
