package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.Shape;
import java.awt.font.TextLayout;
import java.awt.geom.AffineTransform;
import java.awt.geom.Line2D;
import java.awt.geom.Rectangle2D;
import java.util.List;
import org.knowm.xchart.internal.chartpart.Annotation;

/**
 * Vertical guide lines at given x values (corner portfolios), each with an optional label written upwards along the
 * line, on whichever side of the curve point {@code anchor} leaves more room, so that labels do not run over the
 * curve. A label closer than one text height to the previous one on the same side is left out and counted, so the
 * chart can say how many it thinned.
 */
final class Guides extends Annotation {

    /** A guide at x with an optional label (null for none) kept clear of the curve value {@code anchor} (NaN: none). */
    record Guide(double x, String label, double anchor) {
        Guide(double x, String label) {
            this(x, label, Double.NaN);
        }
    }

    private final List<Guide> guides;
    private final Color colour;
    private int omitted;
    private int labelled;
    private int linesSkipped;

    /** Guide lines closer than this to the last one drawn are skipped (a curtain of lines hides the data). */
    static final double MIN_LINE_GAP = 4.0;

    Guides(List<Guide> guides, Color colour) {
        super(false);
        this.guides = List.copyOf(guides);
        this.colour = colour;
    }

    int omitted() {
        return omitted;
    }

    int labelled() {
        return labelled;
    }

    /** Guide lines left out at the last paint because they were closer than {@link #MIN_LINE_GAP} pixels. */
    int linesSkipped() {
        return linesSkipped;
    }

    int lines() {
        return guides.size();
    }

    @Override
    public void paint(Graphics2D g) {
        if (!isVisible) {
            return;
        }
        double top = getYAxisScreenValueForMin();
        double bottom = getYAxisScreenValueForMax();
        double left = getXAxisScreenValueForMin();
        double right = getXAxisScreenValueForMax();
        Font font = Style.labelFont();
        g.setStroke(Style.dashed(1f, 3f, 3f));
        g.setColor(colour);
        linesSkipped = 0;
        double lastLine = Double.NEGATIVE_INFINITY;
        for (Guide gd : guides) {
            double x = chart.getScreenXFromChart(gd.x());
            if (x < left - 0.5 || x > right + 0.5) {
                continue;
            }
            if (x - lastLine < MIN_LINE_GAP) {
                linesSkipped++;
                continue;
            }
            g.draw(new Line2D.Double(x, top, x, bottom));
            lastLine = x;
        }
        omitted = 0;
        labelled = 0;
        double lastAbove = Double.NEGATIVE_INFINITY;
        double lastBelow = Double.NEGATIVE_INFINITY;
        for (Guide gd : guides) {
            if (gd.label() == null || gd.label().isEmpty()) {
                continue;
            }
            double x = chart.getScreenXFromChart(gd.x());
            double sy = Double.isNaN(gd.anchor()) ? bottom : chart.getScreenYFromChart(gd.anchor());
            sy = Math.max(top, Math.min(bottom, sy)); // a curve point off the chart (a capped axis) counts as its edge
            double above = sy - top - 10;
            double below = bottom - sy - 10;
            boolean up = above >= below;
            double room = (up ? above : below) - 6;
            TextLayout tl = new TextLayout(gd.label(), font, g.getFontRenderContext());
            double textHeight = tl.getAscent() + tl.getDescent();
            double last = up ? lastAbove : lastBelow;
            if (room < 40 || x - last < textHeight + 1 || x + textHeight + 2 > right || x < left) {
                omitted++;
                continue;
            }
            String text = gd.label();
            while (tl.getAdvance() > room && text.length() > 4) {
                text = text.substring(0, text.length() - 2).strip();
                tl = new TextLayout(text + "\u2026", font, g.getFontRenderContext());
            }
            // Written upwards just right of the guide: above the curve it starts just over the curve point,
            // below it starts just over the x axis.
            AffineTransform at = new AffineTransform();
            at.translate(x + tl.getAscent() + 2, up ? sy - 10 : bottom - 6);
            at.rotate(-Math.PI / 2);
            Shape outline = tl.getOutline(at);
            g.setColor(new Color(255, 255, 255, 220));
            g.setStroke(new BasicStroke(3f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
            g.draw(outline);
            g.setColor(Palette.DARK_GREY);
            g.fill(outline);
            if (up) {
                lastAbove = x;
            } else {
                lastBelow = x;
            }
            labelled++;
        }
        bounds = new Rectangle2D.Double(left, top, right - left, bottom - top);
    }
}
