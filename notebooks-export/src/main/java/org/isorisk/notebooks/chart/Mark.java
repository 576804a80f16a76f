package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.Shape;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Path2D;
import java.awt.geom.Rectangle2D;
import org.knowm.xchart.style.markers.Marker;

/**
 * Point markers with a size of their own (XChart gives every series one marker size) and a thin outline, so that
 * light fills such as yellow stay visible on white and shapes stay distinct in grayscale.
 */
final class Mark extends Marker {

    /** The shapes used; each kind of point on a chart gets its own. */
    enum Kind { CIRCLE, SQUARE, DIAMOND, TRIANGLE_UP, TRIANGLE_DOWN }

    private final Kind kind;
    private final double size;
    private final Color outline;
    private final float outlineWidth;

    /**
     * @param size         diameter in pixels
     * @param outline      outline colour; null for none
     * @param outlineWidth outline width in pixels
     */
    Mark(Kind kind, double size, Color outline, float outlineWidth) {
        this.kind = kind;
        this.size = size;
        this.outline = outline;
        this.outlineWidth = outlineWidth;
    }

    double size() {
        return size;
    }

    Kind kind() {
        return kind;
    }

    /** The marker's outline shape centred on (x, y). */
    Shape shape(double x, double y) {
        double h = size / 2;
        return switch (kind) {
            case CIRCLE -> new Ellipse2D.Double(x - h, y - h, size, size);
            case SQUARE -> new Rectangle2D.Double(x - h * 0.9, y - h * 0.9, size * 0.9, size * 0.9);
            case DIAMOND -> polygon(new double[] {x, x + h, x, x - h}, new double[] {y - h * 1.15, y, y + h * 1.15, y});
            case TRIANGLE_UP -> polygon(new double[] {x - h, x + h, x}, new double[] {y + h * 0.8, y + h * 0.8, y - h * 1.1});
            case TRIANGLE_DOWN -> polygon(new double[] {x - h, x + h, x}, new double[] {y - h * 0.8, y - h * 0.8, y + h * 1.1});
        };
    }

    private static Shape polygon(double[] xs, double[] ys) {
        Path2D.Double p = new Path2D.Double();
        p.moveTo(xs[0], ys[0]);
        for (int i = 1; i < xs.length; i++) {
            p.lineTo(xs[i], ys[i]);
        }
        p.closePath();
        return p;
    }

    @Override
    public void paint(Graphics2D g, double x, double y, int ignoredSize) {
        Shape s = shape(x, y);
        g.fill(s);
        if (outline != null) {
            Color fill = g.getColor();
            g.setColor(outline);
            g.setStroke(new BasicStroke(outlineWidth, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
            g.draw(s);
            g.setColor(fill);
        }
    }
}
