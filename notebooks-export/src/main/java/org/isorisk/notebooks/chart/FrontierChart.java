package org.isorisk.notebooks.chart;

import java.awt.Color;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.Supplier;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Solution;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries.XYSeriesRenderStyle;
import org.knowm.xchart.XYSeries;
import org.knowm.xchart.style.lines.SeriesLines;
import org.knowm.xchart.style.markers.SeriesMarkers;

/** The efficient-frontier chart: volatility (x) against expected return (y), both in percent. */
final class FrontierChart {
    private FrontierChart() {
    }

    /** Series names, so tests and other charts can find them. */
    static final String UNCONSTRAINED = "unconstrained";
    static final String UNCONSTRAINED_INEFFICIENT = "unconstrained-inefficient";
    static final String MANDATE = "mandate";
    static final String MANDATE_INEFFICIENT = "mandate-inefficient";
    static final String CORNERS = "corners";
    static final String MIN_VARIANCE = "min-variance";
    static final String MIN_VARIANCE_UNCONSTRAINED = "min-variance-unconstrained";
    static final String CML = "cml";
    static final String TANGENCY = "tangency";
    static final String CURRENT = "current";
    static final String PROPOSED = "proposed";
    static final String ASSET_PREFIX = "asset:";
    static final String ASSETS_LEGEND = "assets-legend";

    /** Points sampled on each branch of the closed-form hyperbola. */
    static final int HYPERBOLA_POINTS = 241;

    static Figure build(FrontierChartData d, ChartContext ctx, AssetColours colours, ChartSettings s) {
        AssetUniverse u = d.universe();
        Frontier f = d.frontier();
        MertonScalars ms = usable(d.unconstrained());
        FrontierPath path = FrontierPath.of(f);
        boolean mandateCurve = path.size() > 0 && !path.closedFormOnly(f);
        if (path.size() == 1) {
            throw InputException.of(String.format(Locale.ROOT, "the frontier has a single portfolio (return %s, "
                            + "volatility %s), which is a point, not a curve", Style.percent(path.steps.get(0).m(), 2),
                    Style.percent(path.steps.get(0).sigma(), 2)))
                    .fix("ask for at least two frontier points, or loosen the mandate so that more than one return "
                            + "is attainable").build();
        }
        if (!mandateCurve && ms == null) {
            throw InputException.of("the frontier is empty: it has no corner portfolios, no sampled points and no "
                    + "closed-form scalars, so there is nothing to draw").fix("compute the frontier first").build();
        }
        if (path.size() == 0 && ms == null) {
            throw InputException.of("the frontier is empty").fix("compute the frontier first").build();
        }
        int n = u.size();

        // Ranges: everything the chart must show, with a margin; volatility starts at zero.
        double xMax = 0;
        double yLo = Double.POSITIVE_INFINITY;
        double yHi = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            xMax = Math.max(xMax, Math.sqrt(Math.max(0, u.covariance(i, i))));
            yLo = Math.min(yLo, u.expectedReturn(i));
            yHi = Math.max(yHi, u.expectedReturn(i));
        }
        for (FrontierPath.Step st : path.steps) {
            xMax = Math.max(xMax, st.sigma());
            yLo = Math.min(yLo, st.m());
            yHi = Math.max(yHi, st.m());
        }
        List<PortfolioPoint> highlights = new ArrayList<>();
        if (d.current() != null) {
            highlights.add(d.current());
        }
        if (d.proposed() != null) {
            highlights.add(d.proposed());
        }
        for (PortfolioPoint p : highlights) {
            xMax = Math.max(xMax, p.volatility());
            yLo = Math.min(yLo, p.expectedReturn());
            yHi = Math.max(yHi, p.expectedReturn());
        }
        if (ms != null) {
            xMax = Math.max(xMax, ms.volatility(ms.minimumVarianceReturn()));
            yLo = Math.min(yLo, ms.minimumVarianceReturn());
            yHi = Math.max(yHi, ms.minimumVarianceReturn());
        }
        if (!Double.isNaN(d.riskFree())) {
            yLo = Math.min(yLo, d.riskFree());
            yHi = Math.max(yHi, d.riskFree());
        }
        // The tangency portfolio widens the chart only when it lies near the rest: an unconstrained (leveraged,
        // short-selling) tangency far out would squeeze the mandate frontier into a corner. Then the chart says
        // where it is instead of drawing it.
        List<String> notices = new ArrayList<>();
        boolean tangencyShown = false;
        if (d.tangency() != null) {
            Solution t = d.tangency();
            double ySpan0 = Math.max(yHi - yLo, 0.01);
            tangencyShown = t.volatility() <= 1.35 * xMax && t.expectedReturn() <= yHi + 0.35 * ySpan0
                    && t.expectedReturn() >= yLo - 0.35 * ySpan0;
            if (tangencyShown) {
                xMax = Math.max(xMax, t.volatility());
                yLo = Math.min(yLo, t.expectedReturn());
                yHi = Math.max(yHi, t.expectedReturn());
            } else {
                notices.add(String.format(Locale.ROOT, "The tangency portfolio (%s) lies outside the chart at "
                                + "volatility %s and expected return %s; the capital market line points towards it.",
                        tangencyKind(t), Style.percent(t.volatility(), 2), Style.percent(t.expectedReturn(), 2)));
            }
        }
        double span = Math.max(yHi - yLo, 0.01);
        xMax = xMax * 1.12 + 1e-4;
        double yMin = Math.min(yLo - 0.08 * span, Double.isNaN(d.riskFree()) ? yLo - 0.08 * span : d.riskFree() - 0.04 * span);
        double yMax = yHi + 0.12 * span;
        if (yMin > 0 && yMin < 0.15 * span) {
            yMin = 0; // start the return axis at 0 % when it is close anyway
        }

        XYChart chart = new XYChartBuilder().width(s.width()).height(s.height())
                .title("Efficient frontier").xAxisTitle("Volatility (annualised, %)")
                .yAxisTitle("Expected return (annualised, %)").build();
        Style.apply(chart.getStyler());
        chart.getStyler().setXAxisMin(0.0).setXAxisMax(xMax);
        Style.guardTicks(chart, 0.0, xMax);
        chart.getStyler().setYAxisMin(yMin).setYAxisMax(yMax);
        chart.getStyler().setxAxisTickLabelsFormattingFunction(Style.percentTicks(2));
        chart.getStyler().setyAxisTickLabelsFormattingFunction(Style.percentTicks(2));

        Labels labels = new Labels();

        if (ms != null) {
            double m0 = ms.minimumVarianceReturn();
            double[] mRange = returnsWithin(ms, xMax, yMin, yMax);
            if (mRange != null) {
                double lo = Math.max(mRange[0], yMin);
                double hi = Math.min(mRange[1], yMax);
                if (hi > m0) {
                    double[][] eff = hyperbola(ms, Math.max(lo, m0), hi);
                    XYSeries e = line(chart, UNCONSTRAINED, eff[0], eff[1], Palette.BLUE, Style.dashed(2f, 8f, 4f));
                    e.setLabel("Unconstrained (budget only, shorts)");
                    labels.curve(eff[0], eff[1]);
                }
                if (lo < m0) {
                    double[][] ineff = hyperbola(ms, lo, Math.min(hi, m0));
                    XYSeries e = line(chart, UNCONSTRAINED_INEFFICIENT, ineff[0], ineff[1],
                            Palette.alpha(Palette.BLUE, 0.45), Style.dashed(1.2f, 2f, 4f));
                    e.setLabel("Unconstrained, inefficient (faint)");
                    labels.curve(ineff[0], ineff[1]);
                }
            }
        }
        if (mandateCurve) {
            int k = path.minimumVolatilityIndex();
            if (k > 0) {
                XYSeries e = line(chart, MANDATE_INEFFICIENT, path.volatilities(0, k + 1), path.returns(0, k + 1),
                        Palette.alpha(Palette.BLACK, 0.4), Style.dashed(1.4f, 2f, 4f));
                e.setLabel("Mandate, inefficient (faint)");
                labels.curve(path.volatilities(0, k + 1), path.returns(0, k + 1));
            }
            double[] xs = path.volatilities(k, path.size());
            double[] ys = path.returns(k, path.size());
            XYSeries m = line(chart, MANDATE, xs, ys, Palette.BLACK, Style.solid(2.6f));
            String kind = f.corners().isEmpty() ? "Mandate frontier, sampled" : "Mandate frontier";
            m.setLabel(kind + (k > 0 ? ", efficient (solid)" : " (efficient only)"));
            labels.curve(xs, ys);
            List<FrontierPath.Step> corners = path.steps.subList(k, path.size()).stream()
                    .filter(st -> st.corner() != null).toList();
            if (!corners.isEmpty()) {
                double[] cx = corners.stream().mapToDouble(FrontierPath.Step::sigma).toArray();
                double[] cy = corners.stream().mapToDouble(FrontierPath.Step::m).toArray();
                // many corners (large universes) as small marks, so that the curve stays visible between them
                XYSeries c = points(chart, CORNERS, cx, cy, Palette.BLACK,
                        new Mark(Mark.Kind.DIAMOND, corners.size() > 40 ? 4 : 7, null, 0));
                c.setLabel("Corner portfolios (" + corners.size() + ")");
            }
            FrontierPath.Step mv = path.steps.get(k);
            XYSeries mvs = points(chart, MIN_VARIANCE, new double[] {mv.sigma()}, new double[] {mv.m()},
                    Palette.WHITE_SMOKE, new Mark(Mark.Kind.SQUARE, 11, Palette.BLACK, 2f));
            mvs.setLabel("Min. variance (mandate)");
            labels.add(new Labels.Item("Min. variance", mv.sigma(), mv.m(), 50, true, 7));
        }
        if (ms != null) {
            double m0 = ms.minimumVarianceReturn();
            XYSeries mvu = points(chart, MIN_VARIANCE_UNCONSTRAINED, new double[] {ms.volatility(m0)},
                    new double[] {m0}, Palette.WHITE_SMOKE, new Mark(Mark.Kind.SQUARE, 10, Palette.BLUE, 2f));
            mvu.setLabel(mandateCurve ? "Min. variance (unconstrained)" : "Minimum variance");
            if (!mandateCurve) {
                labels.add(new Labels.Item("Min. variance", ms.volatility(m0), m0, 50, true, 7));
            } else {
                labels.obstacle(ms.volatility(m0), m0, 6);
            }
        }
        if (d.tangency() != null) {
            Solution t = d.tangency();
            double rf = d.riskFree();
            double slope = (t.expectedReturn() - rf) / t.volatility();
            double xEnd = xMax;
            double yEnd = rf + slope * xEnd;
            if (yEnd > yMax) {
                xEnd = (yMax - rf) / slope;
                yEnd = yMax;
            }
            XYSeries cml = line(chart, CML, new double[] {0, xEnd}, new double[] {rf, yEnd}, Palette.VERMILLION,
                    Style.dashed(1.8f, 10f, 3f, 2f, 3f));
            cml.setLabel("Capital market line (risk-free " + Style.percentTicks(2).apply(rf) + ")");
            labels.curve(new double[] {0, xEnd}, new double[] {rf, yEnd});
            if (tangencyShown) {
                XYSeries ts = points(chart, TANGENCY, new double[] {t.volatility()}, new double[] {t.expectedReturn()},
                        Palette.VERMILLION, new Mark(Mark.Kind.CIRCLE, 12, Palette.BLACK, 1.2f));
                ts.setLabel("Tangency (" + tangencyKind(t) + ")");
                labels.add(new Labels.Item("Tangency", t.volatility(), t.expectedReturn(), 80, true, 8));
            }
        }
        highlight(chart, labels, CURRENT, d.current(), Palette.VERMILLION, Mark.Kind.TRIANGLE_DOWN, 90);
        highlight(chart, labels, PROPOSED, d.proposed(), Palette.BLUISH_GREEN, Mark.Kind.TRIANGLE_UP, 100);

        // Assets last so that they sit on top of the curves; one series per asset keeps its run colour.
        boolean named = n <= s.assetLabelLimit();
        double assetSize = named ? 10 : 6;
        for (int i = 0; i < n; i++) {
            String a = u.assets().get(i);
            double sx = Math.sqrt(Math.max(0, u.covariance(i, i)));
            double sy = u.expectedReturn(i);
            XYSeries p = points(chart, ASSET_PREFIX + a, new double[] {sx}, new double[] {sy}, colours.colour(a),
                    new Mark(Mark.Kind.CIRCLE, assetSize, Palette.DARK_GREY, 0.8f));
            p.setShowInLegend(false);
            if (named) {
                labels.add(new Labels.Item(a, sx, sy, 10, false, assetSize / 2 + 1));
            } else {
                labels.obstacle(sx, sy, assetSize / 2);
            }
        }
        // One legend entry for all assets, in a neutral colour (each asset keeps its own colour on the chart).
        XYSeries legend = points(chart, ASSETS_LEGEND, new double[] {Double.NaN}, new double[] {Double.NaN},
                Palette.MID_GREY, new Mark(Mark.Kind.CIRCLE, assetSize, Palette.DARK_GREY, 0.8f));
        legend.setLabel(named ? "Assets" : "Assets (" + n + ", unlabelled)");
        if (!named) {
            notices.add(String.format(Locale.ROOT, "%d assets are drawn as unlabelled points (names are shown up to "
                    + "%d assets); the tables list them by name.", n, s.assetLabelLimit()));
        }
        chart.addAnnotation(new DashedPaths()); // before the labels, which must stay on top
        chart.addAnnotation(labels);
        // Names are listed when there are few, so that the notice stays on one line of the footnote.
        Supplier<String> omitted = () -> {
            if (!labels.painted() || labels.omitted() == 0) {
                return null;
            }
            List<String> names = labels.omittedTexts();
            return labels.omitted() == 1 ? "1 label left out to avoid overlaps: " + names.get(0) + "."
                    : names.size() <= 3 ? labels.omitted() + " labels left out to avoid overlaps: "
                    + String.join(", ", names) + "." : labels.omitted() + " labels left out to avoid overlaps.";
        };
        return new Figure(Figure.Kind.FRONTIER, chart, s, ctx, notices, List.of(omitted), true);
    }

    /**
     * The closed-form scalars when they describe a frontier ({@code D > 0}); null when every expected return is
     * equal (μ parallel to 1), where there is no unconstrained frontier to draw.
     */
    static MertonScalars usable(MertonScalars ms) {
        return ms != null && ms.d() > 0 && ms.c() > 0 && Double.isFinite(ms.d()) ? ms : null;
    }

    private static String tangencyKind(Solution t) {
        return t.method() == Method.CLOSED_FORM ? "unconstrained" : "mandate";
    }

    private static void highlight(XYChart chart, Labels labels, String name, PortfolioPoint p, Color colour,
                                  Mark.Kind kind, int priority) {
        if (p == null) {
            return;
        }
        XYSeries s = points(chart, name, new double[] {p.volatility()}, new double[] {p.expectedReturn()}, colour,
                new Mark(kind, 15, Palette.BLACK, 1.2f));
        s.setLabel(p.name() + " portfolio");
        labels.add(new Labels.Item(p.name(), p.volatility(), p.expectedReturn(), priority, true, 9));
    }

    static XYSeries line(XYChart chart, String name, double[] x, double[] y, Color colour,
                         java.awt.BasicStroke stroke) {
        XYSeries s = chart.addSeries(name, x, y);
        s.setXYSeriesRenderStyle(XYSeriesRenderStyle.Line);
        s.setMarker(SeriesMarkers.NONE);
        s.setLineColor(colour);
        s.setLineStyle(stroke);
        // XChart restarts the dash pattern at every segment, so a densely sampled dashed curve would look solid:
        // such curves are drawn by DashedPaths as one path each.
        if (stroke.getDashArray() != null && x.length > 2) {
            DashedPaths.takeOver(s);
        }
        return s;
    }

    static XYSeries points(XYChart chart, String name, double[] x, double[] y, Color colour, Mark marker) {
        XYSeries s = chart.addSeries(name, x, y);
        s.setXYSeriesRenderStyle(XYSeriesRenderStyle.Scatter);
        s.setMarker(marker);
        s.setMarkerColor(colour);
        s.setLineStyle(SeriesLines.NONE);
        return s;
    }

    /**
     * The returns {@code m} at which the closed-form frontier's volatility is at most {@code xMax}: the roots of
     * {@code C m² − 2Ab m + Bb² − D xMax² = 0}; null when even the minimum-variance portfolio lies beyond.
     */
    static double[] returnsWithin(MertonScalars ms, double xMax, double yMin, double yMax) {
        double a = ms.c();
        double b = -2 * ms.a() * ms.budget();
        double c = ms.b() * ms.budget() * ms.budget() - ms.d() * xMax * xMax;
        double disc = b * b - 4 * a * c;
        if (!(disc > 0)) {
            return null;
        }
        double r = Math.sqrt(disc);
        return new double[] {(-b - r) / (2 * a), (-b + r) / (2 * a)};
    }

    /** The closed-form frontier sampled at evenly spaced returns in [lo, hi]: {volatilities, returns}. */
    static double[][] hyperbola(MertonScalars ms, double lo, double hi) {
        int k = HYPERBOLA_POINTS;
        double[] xs = new double[k];
        double[] ys = new double[k];
        for (int i = 0; i < k; i++) {
            double m = lo + (hi - lo) * i / (k - 1);
            ys[i] = m;
            xs[i] = ms.volatility(m);
        }
        return new double[][] {xs, ys};
    }
}
