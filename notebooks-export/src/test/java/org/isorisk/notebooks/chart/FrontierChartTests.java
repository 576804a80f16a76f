package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.Test;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;

class FrontierChartTests {

    private static final ChartSettings S = ChartSettings.defaults();

    private static XYSeries series(Figure f, String name) {
        XYSeries s = ((XYChart) f.chart()).getSeries(name);
        if (s == null) {
            throw new AssertionError("no series " + name + " in " + ((XYChart) f.chart()).getSeriesCollection());
        }
        return s;
    }

    private static Figure sampleChart(FrontierChartData d) {
        return Charts.frontier(d, ChartFixtures.context(), AssetColours.of(d.universe().assets()), S);
    }

    /**
     * The frontier's portfolios as the chart must draw them: the corners in the frontier's own order, each sampled
     * point that does not repeat a corner placed after the corners with returns not above its own.
     */
    private static List<Solution> expectedPath(Frontier f) {
        List<Solution> out = new ArrayList<>();
        List<Solution> pts = new ArrayList<>();
        for (Solution p : f.points()) {
            boolean dup = f.corners().stream().anyMatch(c -> Math.abs(c.portfolio().expectedReturn()
                    - p.expectedReturn()) <= 1e-12 * Math.max(1, Math.abs(p.expectedReturn())));
            if (!dup) {
                pts.add(p);
            }
        }
        pts.sort(Comparator.comparingDouble(Solution::expectedReturn));
        int p = 0;
        for (Corner c : f.corners()) {
            while (p < pts.size() && pts.get(p).expectedReturn() < c.portfolio().expectedReturn()) {
                out.add(pts.get(p++));
            }
            out.add(c.portfolio());
        }
        out.addAll(pts.subList(p, pts.size()));
        return out;
    }

    @Test
    void theMandateCurveIsTheFrontiersOwnPortfoliosFromTheMinimumVarianceEnd() {
        Frontier f = ChartFixtures.sampleFrontier();
        Figure fig = sampleChart(FrontierChartData.of(ChartFixtures.sampleFund(), f));
        List<Solution> path = expectedPath(f);
        int k = 0;
        for (int i = 1; i < path.size(); i++) {
            if (path.get(i).volatility() < path.get(k).volatility()) {
                k = i;
            }
        }
        List<Solution> efficient = path.subList(k, path.size());
        XYSeries m = series(fig, FrontierChart.MANDATE);
        assertArrayEquals(efficient.stream().mapToDouble(Solution::volatility).toArray(), m.getXData(), 0.0);
        assertArrayEquals(efficient.stream().mapToDouble(Solution::expectedReturn).toArray(), m.getYData(), 0.0);
        XYSeries c = series(fig, FrontierChart.CORNERS);
        assertArrayEquals(f.corners().stream().mapToDouble(x -> x.portfolio().volatility()).toArray(), c.getXData(), 0.0);
        assertArrayEquals(f.corners().stream().mapToDouble(x -> x.portfolio().expectedReturn()).toArray(), c.getYData(),
                0.0);
        XYSeries mv = series(fig, FrontierChart.MIN_VARIANCE);
        assertEquals(path.get(k).volatility(), mv.getXData()[0], 0.0);
        assertEquals(path.get(k).expectedReturn(), mv.getYData()[0], 0.0);
    }

    @Test
    void eachAssetIsDrawnAtItsVolatilityAndExpectedReturn() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Figure fig = sampleChart(FrontierChartData.of(u, ChartFixtures.sampleFrontier()));
        for (int i = 0; i < u.size(); i++) {
            XYSeries s = series(fig, FrontierChart.ASSET_PREFIX + u.assets().get(i));
            assertEquals(Math.sqrt(u.covariance(i, i)), s.getXData()[0], 0.0);
            assertEquals(u.expectedReturn(i), s.getYData()[0], 0.0);
        }
    }

    @Test
    void theUnconstrainedCurveIsTheClosedFormFrontierWithItsInefficientBranchFaint() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        Figure fig = sampleChart(FrontierChartData.of(u, f));
        MertonScalars ms = f.unconstrained();
        XYSeries eff = series(fig, FrontierChart.UNCONSTRAINED);
        XYSeries ineff = series(fig, FrontierChart.UNCONSTRAINED_INEFFICIENT);
        Mandate budget = Mandate.fullyInvested(u.size());
        // Every 40th point against an independent engine call: the closed-form solve at that target.
        for (XYSeries s : List.of(eff, ineff)) {
            for (int i = 0; i < s.getXData().length; i += 40) {
                double m = s.getYData()[i];
                Solution sol = Allocator.solve(AllocationRequest.of(u, budget, Objective.targetReturn(m)));
                assertEquals(sol.volatility(), s.getXData()[i], Tolerances.CLOSED_FORM * Math.max(1, sol.volatility()));
            }
        }
        for (double m : eff.getYData()) {
            assertTrue(m >= ms.minimumVarianceReturn() - Tolerances.TIGHT);
        }
        for (double m : ineff.getYData()) {
            assertTrue(m <= ms.minimumVarianceReturn() + Tolerances.TIGHT);
        }
        assertTrue(ineff.getLabel().contains("faint"), ineff.getLabel());
        assertTrue(series(fig, FrontierChart.MANDATE).getLabel().contains("efficient only"));
        assertTrue(ineff.getLineColor().getAlpha() < 255, "the inefficient branch is drawn faint");
    }

    @Test
    void theTangencyPortfolioAndItsCapitalMarketLineAreTheEngines() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        // The mandate's own tangency lies on its frontier; take the frontier point with the best Sharpe ratio
        // as the portfolio the engine would return (the chart only draws what it is given).
        double rf = 0.02;
        Solution t = f.points().stream().max(Comparator.comparingDouble(
                s -> (s.expectedReturn() - rf) / s.volatility())).orElseThrow();
        Figure fig = sampleChart(FrontierChartData.of(u, f).withTangency(rf, t));
        XYSeries ts = series(fig, FrontierChart.TANGENCY);
        assertEquals(t.volatility(), ts.getXData()[0], 0.0);
        assertEquals(t.expectedReturn(), ts.getYData()[0], 0.0);
        XYSeries cml = series(fig, FrontierChart.CML);
        assertEquals(0.0, cml.getXData()[0], 0.0);
        assertEquals(rf, cml.getYData()[0], 0.0);
        double slope = (cml.getYData()[1] - cml.getYData()[0]) / (cml.getXData()[1] - cml.getXData()[0]);
        assertEquals((t.expectedReturn() - rf) / t.volatility(), slope, Tolerances.GENERAL);
    }

    @Test
    void aFarAwayUnconstrainedTangencyIsNamedInTheFootnoteInsteadOfSqueezingTheChart() {
        AssetUniverse u = ChartFixtures.sampleFund();
        // A risk-free rate just below the minimum-variance return puts the unconstrained tangency far out on the
        // hyperbola: its return (B − A r)/(A − C r) grows without bound as r approaches A/C (Merton 1972).
        double rf = ChartFixtures.sampleFrontier().unconstrained().minimumVarianceReturn() - 1e-6;
        Solution t = Allocator.solve(AllocationRequest.of(u, Mandate.fullyInvested(u.size()), Objective.tangency(rf)));
        Figure fig = sampleChart(FrontierChartData.of(u, ChartFixtures.sampleFrontier()).withTangency(rf, t));
        assertNull(((XYChart) fig.chart()).getSeries(FrontierChart.TANGENCY));
        assertTrue(fig.notices().stream().anyMatch(n -> n.contains("tangency portfolio (unconstrained) lies outside")),
                fig.notices().toString());
        assertNotNull(((XYChart) fig.chart()).getSeries(FrontierChart.CML));
    }

    @Test
    void currentAndProposedPortfoliosAreHighlightedWhereTheEnginePutsThem() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        PortfolioPoint cur = ChartFixtures.point("Current", u, ChartFixtures.sampleCurrent());
        Solution prop = f.points().get(8);
        Figure fig = sampleChart(FrontierChartData.of(u, f).withCurrent(cur).withProposed(PortfolioPoint.of("Proposed",
                prop)));
        assertEquals(cur.volatility(), series(fig, FrontierChart.CURRENT).getXData()[0], 0.0);
        assertEquals(cur.expectedReturn(), series(fig, FrontierChart.CURRENT).getYData()[0], 0.0);
        assertEquals(prop.volatility(), series(fig, FrontierChart.PROPOSED).getXData()[0], 0.0);
        assertEquals(prop.expectedReturn(), series(fig, FrontierChart.PROPOSED).getYData()[0], 0.0);
        assertEquals("Proposed portfolio", series(fig, FrontierChart.PROPOSED).getLabel());
    }

    @Test
    void aBudgetOnlyFrontierIsDrawnOnceAsTheUnconstrainedCurve() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.closedFormFrontier(u, 20, 0.03, 0.08);
        Figure fig = sampleChart(FrontierChartData.of(u, f));
        XYChart c = (XYChart) fig.chart();
        assertNull(c.getSeries(FrontierChart.MANDATE));
        assertNotNull(c.getSeries(FrontierChart.UNCONSTRAINED));
    }

    @Test
    void assetNamesAreDrawnUpToTheLimitAndOmittedAboveItWithANotice() {
        AssetUniverse big = ChartFixtures.large(200, 3);
        Frontier f = ChartFixtures.closedFormFrontier(big, 12, 0.04, 0.07);
        Figure fig = Charts.frontier(FrontierChartData.of(big, f), ChartFixtures.context(),
                AssetColours.of(big.assets()), S);
        assertTrue(fig.notices().get(0).startsWith("200 assets are drawn as unlabelled points"), fig.notices().get(0));
        assertEquals(200, ((XYChart) fig.chart()).getSeriesCollection().stream().map(x -> x.getName())
                .filter(k -> k.startsWith(FrontierChart.ASSET_PREFIX)).count());
        Figure small = sampleChart(FrontierChartData.of(ChartFixtures.sampleFund(), ChartFixtures.sampleFrontier()));
        assertTrue(small.notices().stream().noneMatch(n -> n.contains("unlabelled")));
    }

    @Test
    void theFootnoteCarriesTheCautionTheAsOfDateAndTheInputHash() {
        Figure fig = sampleChart(FrontierChartData.of(ChartFixtures.sampleFund(), ChartFixtures.sampleFrontier()));
        List<String> foot = fig.footnote();
        assertTrue(foot.contains(Caution.SHORT));
        String last = foot.get(foot.size() - 1);
        assertTrue(last.contains("assumptions as of 2025-06-30"), last);
        assertTrue(last.contains("#3f9a0c1d7e5b"), last);
    }

    @Test
    void anEmptyFrontierIsAnInputErrorNotABlankChart() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier empty = new Frontier(List.of(), List.of(), null, 0.03, 0.03);
        InputException e = assertThrows(InputException.class, () -> sampleChart(FrontierChartData.of(u, empty)));
        assertTrue(e.getMessage().startsWith("the frontier is empty"), e.getMessage());
    }

    @Test
    void aSinglePointFrontierIsAnInputErrorNamingThePoint() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Solution p = ChartFixtures.sampleFrontier().points().get(3);
        Frontier one = new Frontier(List.of(), List.of(p), null, p.expectedReturn(), p.expectedReturn());
        InputException e = assertThrows(InputException.class, () -> sampleChart(FrontierChartData.of(u, one)));
        assertTrue(e.getMessage().startsWith("the frontier has a single portfolio (return "), e.getMessage());
        assertTrue(e.getMessage().contains("fix: "), e.getMessage());
    }
}
