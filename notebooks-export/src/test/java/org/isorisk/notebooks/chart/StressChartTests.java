package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.junit.jupiter.api.Test;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;

class StressChartTests {

    private static final ChartSettings S = ChartSettings.defaults();

    @Test
    void eachNamedFrontierIsOneCurveOfItsOwnPortfolios() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier base = ChartFixtures.sampleFrontier();
        Frontier shock = ChartFixtures.closedFormFrontier(u, 10, 0.035, 0.08);
        Figure fig = Charts.stressOverlay(List.of(new NamedFrontier("Base", base), new NamedFrontier("Rates up", shock)),
                ChartFixtures.context(), S);
        XYChart c = (XYChart) fig.chart();
        for (NamedFrontier nf : List.of(new NamedFrontier("Base", base), new NamedFrontier("Rates up", shock))) {
            FrontierPath p = FrontierPath.of(nf.frontier());
            int k = p.minimumVolatilityIndex();
            XYSeries s = c.getSeries(StressChart.CURVE_PREFIX + nf.name());
            assertArrayEquals(p.volatilities(k, p.size()), s.getXData(), 0.0);
            assertArrayEquals(p.returns(k, p.size()), s.getYData(), 0.0);
        }
        assertEquals("Base", c.getSeries(StressChart.CURVE_PREFIX + "Base").getLabel());
        assertEquals("Rates up", c.getSeries(StressChart.CURVE_PREFIX + "Rates up").getLabel());
    }

    @Test
    void scenarioCurvesWithoutPortfoliosAreDrawnAsGiven() {
        double[] vol = {0.05, 0.06, 0.08};
        double[] ret = {0.04, 0.05, 0.06};
        Figure fig = Charts.stressCurves(List.of(new StressCurve("Base", vol, ret),
                new StressCurve("crisis", new double[] {0.06, 0.075}, new double[] {0.04, 0.05})),
                ChartFixtures.context(), S);
        XYSeries s = ((XYChart) fig.chart()).getSeries(StressChart.CURVE_PREFIX + "crisis");
        assertArrayEquals(new double[] {0.06, 0.075}, s.getXData(), 0.0);
        assertArrayEquals(new double[] {0.04, 0.05}, s.getYData(), 0.0);
        InputException one = assertThrows(InputException.class,
                () -> new StressCurve("crash", new double[] {0.1}, new double[] {0.05}));
        assertEquals("curve 'crash' has a single point, so it cannot be drawn as a curve; fix: compute at least two "
                + "frontier points for every scenario", one.getMessage());
    }

    @Test
    void theBaseIsMarkedWhenItsNameDoesNotSaySo() {
        Figure fig = Charts.stressOverlay(List.of(new NamedFrontier("Today", ChartFixtures.sampleFrontier())),
                ChartFixtures.context(), S);
        assertEquals("Today (base)", ((XYChart) fig.chart()).getSeries(StressChart.CURVE_PREFIX + "Today")
                .getLabel());
    }

    @Test
    void noFrontiersTwiceTheSameNameOrAnEmptyScenarioAreInputErrors() {
        InputException none = assertThrows(InputException.class,
                () -> Charts.stressOverlay(List.of(), ChartFixtures.context(), S));
        assertTrue(none.getMessage().startsWith("the stress overlay needs at least one frontier"));
        Frontier f = ChartFixtures.sampleFrontier();
        InputException twice = assertThrows(InputException.class, () -> Charts.stressOverlay(
                List.of(new NamedFrontier("A", f), new NamedFrontier("A", f)), ChartFixtures.context(), S));
        assertTrue(twice.getMessage().contains("share the name 'A'"), twice.getMessage());
        Frontier empty = new Frontier(List.of(), List.of(), null, 0, 0);
        InputException e = assertThrows(InputException.class, () -> Charts.stressOverlay(
                List.of(new NamedFrontier("Base", f), new NamedFrontier("Crash", empty)), ChartFixtures.context(), S));
        assertTrue(e.getMessage().startsWith("frontier 'Crash' is empty"), e.getMessage());
    }
}
