package org.isorisk.notebooks.chart;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.Shape;
import java.awt.font.FontRenderContext;
import java.awt.font.TextLayout;
import java.awt.geom.AffineTransform;
import java.awt.geom.Line2D;
import java.awt.geom.Rectangle2D;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.knowm.xchart.internal.chartpart.Annotation;

/**
 * Text labels beside points, placed at paint time so they overlap neither each other, nor the other points, nor
 * the curves: for each label (most important first) the first free spot of a ring of candidate positions is taken,
 * then a farther ring with a leader line; a label with no free spot is left out and counted ({@link #omitted()}),
 * so the chart can say so.
 */
final class Labels extends Annotation {

    /** One label at data point (x, y) whose marker has {@code radius} pixels; a larger {@code priority} goes first. */
    record Item(String text, double x, double y, int priority, boolean bold, double radius) {
    }

    private final List<Item> items = new ArrayList<>();
    private final List<double[][]> curves = new ArrayList<>();
    private final List<double[]> points = new ArrayList<>();
    private final List<Item> skipped = new ArrayList<>();
    private int omitted;
    private boolean painted;

    Labels() {
        super(false);
    }

    /** Adds a label. */
    void add(Item item) {
        items.add(item);
        points.add(new double[] {item.x(), item.y(), item.radius()});
    }

    /** Adds a point labels must not cover (radius in pixels). */
    void obstacle(double x, double y, double radius) {
        points.add(new double[] {x, y, radius});
    }

    /** Adds a polyline (data coordinates) labels must not cross. */
    void curve(double[] xs, double[] ys) {
        curves.add(new double[][] {xs.clone(), ys.clone()});
    }

    /** Labels left out at the last paint because every candidate spot was taken. */
    int omitted() {
        return omitted;
    }

    /** The texts of the labels left out at the last paint. */
    List<String> omittedTexts() {
        return skipped.stream().map(Item::text).toList();
    }

    boolean painted() {
        return painted;
    }

    @Override
    public void paint(Graphics2D g) {
        if (!isVisible) {
            return;
        }
        Rectangle2D plot = new Rectangle2D.Double(getXAxisScreenValueForMin(), getYAxisScreenValueForMin(),
                getXAxisScreenValueForMax() - getXAxisScreenValueForMin(),
                getYAxisScreenValueForMax() - getYAxisScreenValueForMin());
        List<Rectangle2D> taken = new ArrayList<>();
        for (double[] p : points) {
            double sx = sx(p[0]);
            double sy = sy(p[1]);
            taken.add(new Rectangle2D.Double(sx - p[2], sy - p[2], 2 * p[2], 2 * p[2]));
        }
        List<Line2D> segments = new ArrayList<>();
        for (double[][] c : curves) {
            for (int i = 1; i < c[0].length; i++) {
                if (Double.isFinite(c[0][i - 1] + c[1][i - 1] + c[0][i] + c[1][i])) {
                    segments.add(new Line2D.Double(sx(c[0][i - 1]), sy(c[1][i - 1]), sx(c[0][i]), sy(c[1][i])));
                }
            }
        }
        FontRenderContext frc = g.getFontRenderContext();
        omitted = 0;
        skipped.clear();
        List<Item> order = new ArrayList<>(items);
        order.sort(Comparator.comparingInt(Item::priority).reversed());
        for (Item it : order) {
            Font font = it.bold() ? Style.labelFont().deriveFont(Font.BOLD) : Style.labelFont();
            TextLayout tl = new TextLayout(it.text(), font, frc);
            Rectangle2D tb = tl.getBounds();
            double w = tb.getWidth() + 4;
            double h = tl.getAscent() + tl.getDescent() + 2;
            double sx = sx(it.x());
            double sy = sy(it.y());
            Rectangle2D spot = null;
            boolean leader = false;
            Rectangle2D own = new Rectangle2D.Double(sx - it.radius(), sy - it.radius(), 2 * it.radius(),
                    2 * it.radius());
            outer:
            for (double ring : it.priority() >= 50 ? new double[] {1.0, 2.2, 3.6, 5.2, 7.0, 9.0}
                    : new double[] {1.0, 2.2, 3.6, 5.2}) {
                double d = (it.radius() + 2) * ring;
                for (int a = 0; a < 16; a++) {
                    // start at east and alternate around the circle: E, W, NE, SE, NW, SW, ...
                    double angle = CANDIDATE_ANGLES[a];
                    double cx = sx + d * Math.cos(angle);
                    double cy = sy - d * Math.sin(angle);
                    double c = Math.cos(angle);
                    double sn = Math.sin(angle);
                    // anchor the box so that it grows away from the point
                    double bx = c > 0.3 ? cx : c < -0.3 ? cx - w : cx - w / 2;
                    double by = sn > 0.3 ? cy - h : sn < -0.3 ? cy : cy - h / 2;
                    Rectangle2D r = new Rectangle2D.Double(bx, by, w, h);
                    if (!free(r, plot, taken, segments)) {
                        continue;
                    }
                    if (ring > 1.0 && !leaderFree(sx, sy, r, own, taken)) {
                        continue;
                    }
                    spot = r;
                    leader = ring > 1.0;
                    break outer;
                }
            }
            if (spot == null) {
                omitted++;
                skipped.add(it);
                continue;
            }
            taken.add(spot);
            if (leader) {
                g.setColor(Palette.MID_GREY);
                g.setStroke(new BasicStroke(0.7f));
                double cx = Math.max(spot.getMinX(), Math.min(sx, spot.getMaxX()));
                double cy = Math.max(spot.getMinY(), Math.min(sy, spot.getMaxY()));
                g.draw(new Line2D.Double(sx, sy, cx, cy));
            }
            double tx = spot.getX() + 2 - tb.getX();
            double ty = spot.getY() + 1 + tl.getAscent();
            Shape outline = tl.getOutline(AffineTransform.getTranslateInstance(tx, ty));
            g.setColor(new Color(255, 255, 255, 220));
            g.setStroke(new BasicStroke(3f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
            g.draw(outline);
            g.setColor(it.bold() ? Palette.BLACK : Palette.DARK_GREY);
            g.fill(outline);
        }
        painted = true;
        bounds = plot;
    }

    private static final double[] CANDIDATE_ANGLES = angles();

    private static double[] angles() {
        double[] order = {0, 180, 30, -30, 150, -150, 60, -60, 120, -120, 90, -90, 15, -15, 165, -165};
        double[] r = new double[order.length];
        for (int i = 0; i < r.length; i++) {
            r[i] = Math.toRadians(order[i]);
        }
        return r;
    }

    /** A leader from the point to the label must not pass over another point or label. */
    private static boolean leaderFree(double sx, double sy, Rectangle2D label, Rectangle2D own,
                                      List<Rectangle2D> taken) {
        double cx = Math.max(label.getMinX(), Math.min(sx, label.getMaxX()));
        double cy = Math.max(label.getMinY(), Math.min(sy, label.getMaxY()));
        Line2D leader = new Line2D.Double(sx, sy, cx, cy);
        for (Rectangle2D t : taken) {
            if (t.equals(own)) {
                continue;
            }
            if (leader.intersects(t)) {
                return false;
            }
        }
        return true;
    }

    private static boolean free(Rectangle2D r, Rectangle2D plot, List<Rectangle2D> taken, List<Line2D> segments) {
        if (!plot.contains(r)) {
            return false;
        }
        for (Rectangle2D t : taken) {
            if (t.intersects(r)) {
                return false;
            }
        }
        for (Line2D s : segments) {
            if (s.intersects(r)) {
                return false;
            }
        }
        return true;
    }

    private double sx(double x) {
        return chart.getScreenXFromChart(x);
    }

    private double sy(double y) {
        return chart.getScreenYFromChart(y);
    }
}
