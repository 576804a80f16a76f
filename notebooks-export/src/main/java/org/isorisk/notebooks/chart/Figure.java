package org.isorisk.notebooks.chart;

import java.awt.Color;
import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.geom.AffineTransform;
import java.awt.geom.Rectangle2D;
import java.awt.image.BufferedImage;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Supplier;
import org.isorisk.engine.explain.Caution;
import org.knowm.xchart.internal.chartpart.AxesChart;
import org.knowm.xchart.internal.chartpart.IChart;

/**
 * A finished chart: an XChart chart with a footnote band below it that carries notices (what the chart leaves
 * out), the caution and the provenance of the numbers. Export it with {@link Charts#write}; tests read the data
 * back from {@link #chart()}'s series.
 */
public final class Figure implements IChart {
    private final Kind kind;
    private final AxesChart<?, ?> chart;
    private final int width;
    private final int height;
    private final List<String> notices;
    private final List<Supplier<String>> paintNotices;
    private final ChartContext context;
    private final boolean legendBelow;

    /** The five kinds of chart. */
    public enum Kind {
        FRONTIER("frontier"), WEIGHTS("weights"), MARGINAL_RISK("marginal-risk"),
        RISK_CONTRIBUTIONS("risk-contributions"), STRESS("stress");

        private final String label;

        Kind(String label) {
            this.label = label;
        }

        /** The name used in file names and on the command line. */
        public String label() {
            return label;
        }
    }

    Figure(Kind kind, AxesChart<?, ?> chart, ChartSettings settings, ChartContext context, List<String> notices,
           List<Supplier<String>> paintNotices) {
        this(kind, chart, settings, context, notices, paintNotices, false);
    }

    /** With {@code legendBelow}, the legend is laid out in columns under the plot instead of XChart's own. */
    Figure(Kind kind, AxesChart<?, ?> chart, ChartSettings settings, ChartContext context, List<String> notices,
           List<Supplier<String>> paintNotices, boolean legendBelow) {
        this.legendBelow = legendBelow;
        if (legendBelow) {
            chart.getStyler().setLegendVisible(false);
        }
        this.kind = kind;
        this.chart = chart;
        this.width = settings.width();
        this.height = settings.height();
        this.context = context;
        this.notices = List.copyOf(notices);
        this.paintNotices = List.copyOf(paintNotices);
    }

    /** What this chart shows. */
    public Kind kind() {
        return kind;
    }

    /** The XChart chart (an {@code XYChart} or a {@code HorizontalBarChart}) with its data series. */
    public AxesChart<?, ?> chart() {
        return chart;
    }

    /**
     * Notices printed above the caution: what the chart thins, groups or omits. Includes those decided while
     * painting (labels dropped to avoid overlaps) once the figure has been painted or exported.
     */
    public List<String> notices() {
        List<String> all = new ArrayList<>(notices);
        for (Supplier<String> s : paintNotices) {
            String t = s.get();
            if (t != null && !t.isEmpty()) {
                all.add(t);
            }
        }
        return all;
    }

    /** The footnote's lines before wrapping: notices, caution, provenance. */
    public List<String> footnote() {
        List<String> lines = new ArrayList<>(notices());
        lines.add(Caution.SHORT);
        lines.add(context.provenanceLine());
        return lines;
    }

    @Override
    public int getWidth() {
        return width;
    }

    @Override
    public int getHeight() {
        return height;
    }

    @Override
    public String getTitle() {
        return chart.getTitle();
    }

    @Override
    public void paint(Graphics2D g, int w, int h) {
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
        g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
        g.setRenderingHint(RenderingHints.KEY_FRACTIONALMETRICS, RenderingHints.VALUE_FRACTIONALMETRICS_ON);
        // The chart's own notices depend on the painted layout, so paint the chart first into the space a
        // footnote of the static lines leaves, then measure the full footnote; reserve two spare lines so that
        // paint-time notices still fit.
        Font font = Style.footnoteFont();
        int lineHeight = lineHeight(g, font);
        List<String> before = wrap(g, font, staticFootnote(), w - 2 * Style.PAD);
        int reserved = (before.size() + spareLines()) * lineHeight + Style.PAD;
        int legendHeight = legendBelow ? LegendBand.height(g, chart, w) : 0;
        int chartHeight = h - reserved - legendHeight;
        g.setColor(Color.WHITE);
        g.fill(new Rectangle2D.Double(0, 0, w, h));
        AffineTransform saved = g.getTransform();
        java.awt.Shape clip = g.getClip();
        chart.paint(g, w, chartHeight);
        g.setTransform(saved);
        g.setClip(clip);
        if (legendBelow) {
            LegendBand.paint(g, chart, w, chartHeight - Style.PAD / 2);
        }
        List<String> lines = wrap(g, font, footnote(), w - 2 * Style.PAD);
        int y = h - Style.PAD / 2 - lines.size() * lineHeight;
        g.setColor(Palette.LIGHT_GREY);
        g.setStroke(new java.awt.BasicStroke(0.8f));
        g.drawLine(Style.PAD, y - lineHeight / 3, w - Style.PAD, y - lineHeight / 3);
        g.setFont(font);
        FontMetrics fm = g.getFontMetrics();
        int noticeLines = wrap(g, font, notices(), w - 2 * Style.PAD).size();
        for (int i = 0; i < lines.size(); i++) {
            g.setColor(i < noticeLines ? Palette.DARK_GREY : Palette.MID_GREY.darker());
            g.drawString(lines.get(i), Style.PAD, y + i * lineHeight + fm.getAscent());
        }
    }

    private int spareLines() {
        return paintNotices.isEmpty() ? 0 : 1;
    }

    private List<String> staticFootnote() {
        List<String> lines = new ArrayList<>(notices);
        lines.add(Caution.SHORT);
        lines.add(context.provenanceLine());
        return lines;
    }

    private static int lineHeight(Graphics2D g, Font font) {
        return (int) Math.ceil(g.getFontMetrics(font).getHeight() * 1.05);
    }

    /** Greedy word wrap of each line to {@code maxWidth} pixels. */
    static List<String> wrap(Graphics2D g, Font font, List<String> lines, int maxWidth) {
        FontMetrics fm = g.getFontMetrics(font);
        List<String> out = new ArrayList<>();
        for (String line : lines) {
            StringBuilder cur = new StringBuilder();
            for (String word : line.split(" ")) {
                String next = cur.length() == 0 ? word : cur + " " + word;
                if (fm.stringWidth(next) > maxWidth && cur.length() > 0) {
                    out.add(cur.toString());
                    cur = new StringBuilder(word);
                } else {
                    cur = new StringBuilder(next);
                }
            }
            out.add(cur.toString());
        }
        return out;
    }

    /** Paints the figure into an image at {@code scale} times its logical size (used by PNG export). */
    BufferedImage image(double scale) {
        int w = (int) Math.round(width * scale);
        int h = (int) Math.round(height * scale);
        BufferedImage img = new BufferedImage(w, h, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = img.createGraphics();
        try {
            g.scale(scale, scale);
            paint(g, width, height);
        } finally {
            g.dispose();
        }
        return img;
    }
}
