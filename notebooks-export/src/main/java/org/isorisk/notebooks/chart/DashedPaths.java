package org.isorisk.notebooks.chart;

import java.awt.Graphics2D;
import java.awt.Shape;
import java.awt.geom.Path2D;
import java.awt.geom.Rectangle2D;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.internal.chartpart.Annotation;

/**
 * Draws the chart's dashed curves as single paths. XChart strokes a line series segment by segment and restarts the
 * dash pattern at each one, so a curve sampled every few pixels looks solid; such series are kept in the chart
 * (their data and legend entry stay) but disabled for XChart, and drawn here, each as one path with its own colour
 * and stroke, so the dashes run on along the curve.
 */
final class DashedPaths extends Annotation {

    DashedPaths() {
        super(false);
    }

    /** Hands a dashed line series over to this layer (see the class comment). */
    static void takeOver(XYSeries s) {
        s.setEnabled(false);
    }

    @Override
    public void paint(Graphics2D g) {
        if (!isVisible) {
            return;
        }
        Rectangle2D plot = new Rectangle2D.Double(getXAxisScreenValueForMin(), getYAxisScreenValueForMin(),
                getXAxisScreenValueForMax() - getXAxisScreenValueForMin(),
                getYAxisScreenValueForMax() - getYAxisScreenValueForMin());
        Shape clip = g.getClip();
        g.clip(plot);
        for (Object o : chart.getSeriesCollection()) {
            if (!(o instanceof XYSeries s) || s.isEnabled() || s.getLineStyle() == null
                    || s.getLineStyle().getDashArray() == null) {
                continue;
            }
            double[] xs = s.getXData();
            double[] ys = s.getYData();
            Path2D.Double path = new Path2D.Double();
            boolean open = false;
            for (int i = 0; i < xs.length; i++) {
                if (!Double.isFinite(xs[i]) || !Double.isFinite(ys[i])) {
                    open = false;
                    continue;
                }
                double sx = chart.getScreenXFromChart(xs[i]);
                double sy = chart.getScreenYFromChart(ys[i]);
                if (open) {
                    path.lineTo(sx, sy);
                } else {
                    path.moveTo(sx, sy);
                    open = true;
                }
            }
            g.setColor(s.getLineColor());
            g.setStroke(s.getLineStyle());
            g.draw(path);
        }
        g.setClip(clip);
        bounds = plot;
    }
}
