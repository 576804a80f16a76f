package org.isorisk.notebooks.chart;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.function.Supplier;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Multiplier;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYChartBuilder;
import org.knowm.xchart.XYSeries;

/**
 * The marginal risk of the return target: the target's shadow price in volatility units, {@code ∂σ*∂m}
 * (the {@code volatility_per_unit} of {@code target_return}), against the target. The y axis reads it as the
 * volatility a committee buys with each further step of target return (first order): {@code ∂σ*∂m × step}.
 */
final class MarginalRiskChart {
    private MarginalRiskChart() {
    }

    static final String MANDATE = "mandate";
    static final String UNCONSTRAINED = "unconstrained";
    static final String CORNERS = "corners";
    static final String TARGET = "target_return";

    /** The return target's shadow price in volatility units; NaN when the portfolio has no return target. */
    private static double volPerUnit(org.isorisk.engine.model.Solution p) {
        return p.multiplier(TARGET).map(Multiplier::volatilityPerUnit).orElse(Double.NaN);
    }

    static Figure build(Frontier f, ChartContext ctx, ChartSettings s) {
        FrontierPath path = FrontierPath.of(f);
        MertonScalars ms = FrontierChart.usable(f.unconstrained());
        boolean mandate = path.size() > 0 && !path.closedFormOnly(f);
        int start = path.size() == 0 ? 0 : path.minimumVolatilityIndex();
        List<Double> mx = new ArrayList<>();
        List<Double> my = new ArrayList<>();
        List<FrontierPath.Step> cornerSteps = new ArrayList<>();
        for (int j = start; j < path.size(); j++) {
            FrontierPath.Step st = path.steps.get(j);
            Optional<Multiplier> mult = st.portfolio().multiplier(TARGET);
            if (mult.isPresent() && Double.isFinite(mult.get().volatilityPerUnit())) {
                mx.add(st.m());
                my.add(mult.get().volatilityPerUnit());
            }
            if (st.corner() != null) {
                cornerSteps.add(st);
            }
        }
        if (path.size() == 1) {
            throw InputException.of("the frontier has a single portfolio, so the marginal risk of the return target "
                    + "cannot be drawn against the target").fix("compute at least two frontier points").build();
        }
        if (mandate && mx.size() < 2) {
            throw InputException.of("the frontier's portfolios carry fewer than two return-target multipliers "
                    + "(constraint 'target_return'), so there is no marginal-risk curve to draw")
                    .fix("solve the frontier points with a return target").build();
        }
        double lo;
        double hi;
        if (!mx.isEmpty()) {
            lo = mx.get(0);
            hi = mx.get(mx.size() - 1);
        } else if (ms != null && Double.isFinite(f.maxReturn()) && f.maxReturn() > ms.minimumVarianceReturn()) {
            lo = ms.minimumVarianceReturn();
            hi = f.maxReturn();
        } else {
            throw InputException.of("the frontier is empty: no portfolios carry a return-target multiplier and no "
                    + "finite target range is known").fix("compute the frontier first").build();
        }
        if (ms != null) {
            lo = Math.min(lo, ms.minimumVarianceReturn());
        }

        XYChart chart = new XYChartBuilder().width(s.width()).height(s.height())
                .title("Marginal risk of the return target")
                .xAxisTitle("Target expected return (annualised, %)")
                .yAxisTitle("Extra volatility per +" + Style.percent(s.marginalStep(), 2) + " of target (%)").build();
        Style.apply(chart.getStyler());
        chart.getStyler().setxAxisTickLabelsFormattingFunction(Style.percentTicks(2));
        double step = s.marginalStep();
        chart.getStyler().setyAxisTickLabelsFormattingFunction(v -> Style.percentTicks(3).apply(v * step));
        chart.getStyler().setXAxisMin(lo).setXAxisMax(hi);
        Style.guardTicks(chart, lo, hi);

        double yMax = 0;
        double yMin = 0;
        if (ms != null) {
            double m0 = ms.minimumVarianceReturn();
            int k = FrontierChart.HYPERBOLA_POINTS;
            double[] xs = new double[k];
            double[] ys = new double[k];
            for (int i = 0; i < k; i++) {
                double m = m0 + (hi - m0) * i / (k - 1);
                xs[i] = m;
                double sigma = ms.volatility(m);
                // ∂σ*/∂m = (∂V*/∂m)/(2σ*), with ∂V*/∂m from Merton's scalars; 0 at the minimum-variance portfolio.
                ys[i] = sigma > 0 ? ms.returnMultiplier(m) / (2 * sigma) : 0;
            }
            XYSeries u = FrontierChart.line(chart, UNCONSTRAINED, xs, ys, Palette.BLUE, Style.dashed(2f, 8f, 4f));
            u.setLabel("Unconstrained (budget only, short positions allowed)");
            for (double y : ys) {
                yMax = Math.max(yMax, y);
                yMin = Math.min(yMin, y);
            }
        }
        if (mandate) {
            double[] xs = mx.stream().mapToDouble(Double::doubleValue).toArray();
            double[] ys = my.stream().mapToDouble(Double::doubleValue).toArray();
            XYSeries m = FrontierChart.line(chart, MANDATE, xs, ys, Palette.BLACK, Style.solid(2.6f));
            m.setLabel("Mandate (efficient branch)");
            for (double y : ys) {
                yMax = Math.max(yMax, y);
                yMin = Math.min(yMin, y);
            }
            List<Double> cx = new ArrayList<>();
            List<Double> cy = new ArrayList<>();
            for (FrontierPath.Step st : cornerSteps) {
                Optional<Multiplier> mult = st.portfolio().multiplier(TARGET);
                if (mult.isPresent() && Double.isFinite(mult.get().volatilityPerUnit())) {
                    cx.add(st.m());
                    cy.add(mult.get().volatilityPerUnit());
                }
            }
            if (!cx.isEmpty()) {
                XYSeries c = FrontierChart.points(chart, CORNERS, cx.stream().mapToDouble(Double::doubleValue).toArray(),
                        cy.stream().mapToDouble(Double::doubleValue).toArray(), Palette.BLACK,
                        new Mark(Mark.Kind.DIAMOND, cx.size() > 40 ? 4 : 8, null, 0));
                c.setLabel("Corner portfolios");
            }
        }
        chart.addAnnotation(new DashedPaths());
        List<String> notices = new ArrayList<>();
        notices.add(String.format(Locale.ROOT, "Curves: \u2202\u03c3*/\u2202m, the return target's shadow price in "
                + "volatility units, read on the axis as the volatility added by %s more target (first order).",
                Style.percent(step, 2)));
        // A steep rise at the maximum-return end would flatten everything else: then the axis stops at twice the
        // 85th percentile of the mandate curve and the chart says how high the curve goes.
        if (my.size() >= 5) {
            double[] sorted = my.stream().mapToDouble(Double::doubleValue).sorted().toArray();
            double p85 = sorted[(int) Math.floor(0.85 * (sorted.length - 1))];
            if (p85 > 0 && yMax > 3 * p85) {
                int at = my.indexOf(sorted[sorted.length - 1]);
                notices.add(String.format(Locale.ROOT, "Near the maximum-return end the curve rises to %s per +%s "
                                + "of target (at a target of %s), above the top of the chart.",
                        Style.percent(sorted[sorted.length - 1] * step, 2), Style.percent(step, 2),
                        Style.percent(mx.get(at), 2)));
                yMax = 2 * p85;
            }
        }
        double span = Math.max(yMax - yMin, 1e-6);
        chart.getStyler().setYAxisMin(yMin < 0 ? yMin - 0.05 * span : 0.0);
        chart.getStyler().setYAxisMax(yMax + 0.08 * span);

        List<Supplier<String>> later = new ArrayList<>();
        // Where the binding constraints change: at the corner portfolios, or, for a sampled frontier without
        // corners, halfway between the two samples around each change.
        List<double[]> marks = new ArrayList<>(); // {x, anchor}
        List<String> texts = new ArrayList<>();
        List<Boolean> labellableFlags = new ArrayList<>();
        boolean sampledChanges = false;
        List<FrontierPath.Step> efficient = path.size() == 0 ? List.of() : path.steps.subList(start, path.size());
        if (mandate && !cornerSteps.isEmpty()) {
            List<CornerChanges.Change> changes = CornerChanges.of(efficient);
            for (int j = 0; j < cornerSteps.size(); j++) {
                FrontierPath.Step st = cornerSteps.get(j);
                String label = changes.get(j).label(st.corner());
                marks.add(new double[] {st.m(), volPerUnit(st.portfolio())});
                texts.add(label);
                labellableFlags.add(j > 0 && j < cornerSteps.size() - 1 && !label.isEmpty());
            }
        } else if (mandate) {
            List<CornerChanges.Between> between = CornerChanges.betweenSamples(efficient);
            for (CornerChanges.Between b : between) {
                double anchor = 0.5 * (volPerUnit(b.change().above()) + volPerUnit(b.change().below()));
                marks.add(new double[] {b.m(), Double.isNaN(anchor) ? volPerUnit(b.change().above()) : anchor});
                String label = b.change().label(null);
                texts.add(label);
                labellableFlags.add(!label.isEmpty());
            }
            sampledChanges = !between.isEmpty();
            if (sampledChanges) {
                notices.add("Dashed lines: the binding constraints change between the two sampled targets around "
                        + "the line (with groups or general limits the frontier is sampled, not traced corner by corner).");
            }
        }
        if (!marks.isEmpty()) {
            List<Integer> candidates = new ArrayList<>();
            for (int j = 0; j < marks.size(); j++) {
                if (labellableFlags.get(j)) {
                    candidates.add(j);
                }
            }
            // More than the limit: label an evenly spread subset rather than the first ones.
            java.util.Set<Integer> chosen = new java.util.HashSet<>();
            int limit = s.cornerLabelLimit();
            for (int q = 0; q < candidates.size(); q++) {
                if (candidates.size() <= limit || (long) q * limit / candidates.size()
                        != (long) (q + 1) * limit / candidates.size()) {
                    chosen.add(candidates.get(q));
                }
            }
            List<Guides.Guide> guides = new ArrayList<>();
            for (int j = 0; j < marks.size(); j++) {
                guides.add(new Guides.Guide(marks.get(j)[0], chosen.contains(j) ? texts.get(j) : null,
                        marks.get(j)[1]));
            }
            Guides g = new Guides(guides, Palette.alpha(Palette.BLACK, 0.35));
            chart.addAnnotation(g);
            int limited = candidates.size() - chosen.size();
            int total = candidates.size();
            String what = sampledChanges ? "change labels" : "corner labels";
            later.add(() -> {
                int dropped = g.omitted() + limited;
                String labelsText = dropped > 0 ? String.format(Locale.ROOT, "%d of %d %s left out so that the rest "
                        + "stay legible", dropped, total, what) : null;
                String linesText = g.linesSkipped() > 0 ? String.format(Locale.ROOT, "%d of %d guides closer than %.0f "
                        + "pixels to their neighbour left out", g.linesSkipped(), g.lines(), Guides.MIN_LINE_GAP) : null;
                if (labelsText == null && linesText == null) {
                    return null;
                }
                return labelsText == null ? linesText + "." : linesText == null ? labelsText + "."
                        : labelsText + "; " + linesText + ".";
            });
        }
        return new Figure(Figure.Kind.MARGINAL_RISK, chart, s, ctx, notices, later, true);
    }
}
