package org.isorisk.engine.chart;

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
