package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.Shape;
import java.awt.font.TextLayout;
import java.awt.geom.AffineTransform;
import java.awt.geom.Rectangle2D;
import java.util.ArrayList;
import java.util.List;
import org.knowm.xchart.internal.chartpart.Annotation;

/**
 * Names written inside the bands of a stacked chart where each band is thick enough to hold them, so that the
 * chart reads without matching greys to the legend (in grayscale print several fills look alike). A band too thin
 * everywhere keeps only its legend entry.
 */
final class BandLabels extends Annotation {

    /** One band: its name, fill, and lower and upper edges at the x values. */
    record Band(String name, Color fill, double[] xs, double[] lo, double[] hi) {
    }

    private final List<Band> bands = new ArrayList<>();
    private int labelled;

    BandLabels() {
        super(false);
    }

    void add(Band b) {
        bands.add(b);
    }

    int labelled() {
        return labelled;
    }

    @Override
    public void paint(Graphics2D g) {
        if (!isVisible) {
            return;
        }
        Font font = Style.labelFont();
        labelled = 0;
        double left = getXAxisScreenValueForMin();
        double right = getXAxisScreenValueForMax();
        for (Band b : bands) {
            TextLayout tl = new TextLayout(b.name(), font, g.getFontRenderContext());
            double w = tl.getAdvance() + 6;
            double h = tl.getAscent() + tl.getDescent() + 2;
            // Try screen x positions 4 pixels apart; at each, the label's box must fit between the lowest point of
            // the band's upper edge and the highest point of its lower edge over the label's whole width (a sloping
            // band leaves less room for horizontal text than its vertical thickness). Keep the roomiest place.
            double bestX = Double.NaN;
            double bestRoom = 0;
            double bestCy = 0;
            for (double x = left + w / 2; x <= right - w / 2; x += 4) {
                double maxTop = Double.NEGATIVE_INFINITY;
                double minBottom = Double.POSITIVE_INFINITY;
                for (double dx = -w / 2; dx <= w / 2; dx += 2) {
                    maxTop = Math.max(maxTop, edge(b, x + dx, true));
                    minBottom = Math.min(minBottom, edge(b, x + dx, false));
                }
                double room = minBottom - maxTop;
                if (room > bestRoom) {
                    bestRoom = room;
                    bestX = x;
                    bestCy = 0.5 * (maxTop + minBottom);
                }
            }
            if (Double.isNaN(bestX) || bestRoom < h + 2) {
                continue;
            }
            double cy = bestCy;
            double tx = bestX - tl.getAdvance() / 2;
            double ty = cy + (tl.getAscent() - tl.getDescent()) / 2;
            Shape outline = tl.getOutline(AffineTransform.getTranslateInstance(tx, ty));
            Color text = Palette.textOn(b.fill());
            g.setColor(text == Color.WHITE ? new Color(0, 0, 0, 70) : new Color(255, 255, 255, 110));
            g.setStroke(new BasicStroke(2f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
            g.draw(outline);
            g.setColor(text);
            g.fill(outline);
            labelled++;
        }
        bounds = new Rectangle2D.Double(left, getYAxisScreenValueForMin(), right - left,
                getYAxisScreenValueForMax() - getYAxisScreenValueForMin());
    }

    /** Screen y of the band's upper ({@code top}) or lower edge at screen x; NaN outside the data. */
    private double edge(Band b, double sx, boolean top) {
        double[] xs = b.xs();
        double[] ys = top ? b.hi() : b.lo();
        for (int j = 1; j < xs.length; j++) {
            double x0 = chart.getScreenXFromChart(xs[j - 1]);
            double x1 = chart.getScreenXFromChart(xs[j]);
            if (sx >= x0 && sx <= x1) {
                double t = x1 > x0 ? (sx - x0) / (x1 - x0) : 0;
                double y = ys[j - 1] + t * (ys[j] - ys[j - 1]);
                return chart.getScreenYFromChart(y);
            }
        }
        return Double.NaN;
    }
}
