package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Solution;
import org.junit.jupiter.api.Test;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;

class WeightsChartTests {

    private static final ChartSettings S = ChartSettings.defaults();

    /** Top edge minus bottom edge of a band polygon at its j-th x (the polygon runs along the top, back the bottom). */
    private static double thickness(XYSeries band, int j, int k) {
        double[] y = band.getYData();
        return y[j] - y[2 * k - 1 - j];
    }

    @Test
    void eachBandIsTheAssetsWeightAtEveryPortfolioOfTheFrontier() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        Figure fig = Charts.weights(f, ChartFixtures.context(), AssetColours.of(u.assets()), S);
        XYChart c = (XYChart) fig.chart();
        FrontierPath path = FrontierPath.of(f);
        List<FrontierPath.Step> steps = path.steps.subList(path.minimumVolatilityIndex(), path.size());
        int k = steps.size();
        for (int i = 0; i < u.size(); i++) {
            XYSeries band = c.getSeries(WeightsChart.BAND_PREFIX + u.assets().get(i));
            assertEquals(2 * k + 1, band.getXData().length);
            for (int j = 0; j < k; j++) {
                assertEquals(steps.get(j).m(), band.getXData()[j], 0.0);
                assertEquals(steps.get(j).portfolio().weight(i), thickness(band, j, k), Tolerances.TIGHT);
            }
        }
        // The top of the stack is the budget at every portfolio (long-only frontier).
        for (int j = 0; j < k; j++) {
            double top = Double.NEGATIVE_INFINITY;
            for (int i = 0; i < u.size(); i++) {
                top = Math.max(top, c.getSeries(WeightsChart.BAND_PREFIX + u.assets().get(i)).getYData()[j]);
            }
            assertEquals(1.0, top, 1e-9);
        }
    }

    @Test
    void shortPositionsStackBelowZero() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.closedFormFrontier(u, 9, 0.03, 0.09);
        Figure fig = Charts.weights(f, ChartFixtures.context(), AssetColours.of(u.assets()), S);
        XYChart c = (XYChart) fig.chart();
        boolean sawShort = false;
        int k = f.points().size();
        for (int i = 0; i < u.size(); i++) {
            XYSeries band = c.getSeries(WeightsChart.BAND_PREFIX + u.assets().get(i));
            for (int j = 0; j < k; j++) {
                double w = f.points().get(j).weight(i);
                // a short band lies entirely at or below zero, a long one at or above
                double hiEdge = band.getYData()[j];
                double loEdge = band.getYData()[2 * k - 1 - j];
                if (w < -WeightsChart.SHORT_NOISE) {
                    sawShort = true;
                    assertTrue(hiEdge <= Tolerances.TIGHT);
                } else {
                    assertTrue(loEdge >= -Tolerances.TIGHT);
                }
                assertEquals(Math.abs(w), hiEdge - loEdge, Tolerances.TIGHT);
            }
        }
        assertTrue(sawShort, "the budget-only frontier of the sample fund has short positions");
    }

    @Test
    void manyAssetsAreGroupedAsOtherWithTheThresholdStated() {
        AssetUniverse big = ChartFixtures.large(60, 5);
        Frontier f = ChartFixtures.closedFormFrontier(big, 6, 0.05, 0.07);
        Figure fig = Charts.weights(f, ChartFixtures.context(), AssetColours.of(big.assets()), S);
        XYChart c = (XYChart) fig.chart();
        long own = c.getSeriesCollection().stream().map(x -> x.getName()).filter(n -> n.startsWith(WeightsChart.BAND_PREFIX)
                && !n.startsWith(WeightsChart.OTHER)).count();
        assertEquals(S.bandLimit(), own);
        XYSeries other = c.getSeries(WeightsChart.OTHER);
        assertTrue(other.getLabel().startsWith("Other: 48 assets, each at most "), other.getLabel());
        assertTrue(fig.notices().stream().anyMatch(n -> n.contains("12 get a band of their own")
                && n.contains("2.0 %")), fig.notices().toString());
        // "other" holds the long parts of the grouped assets, exactly.
        FrontierPath path = FrontierPath.of(f);
        WeightsChart.Grouping g = WeightsChart.group(path, big.size(), S);
        int k = f.points().size();
        for (int j = 0; j < k; j++) {
            double sum = 0;
            for (int i : g.other()) {
                sum += Math.max(0, f.points().get(j).weight(i));
            }
            assertEquals(sum, thickness(other, j, k), Tolerances.TIGHT);
        }
    }

    @Test
    void cornerPortfoliosGetVerticalGuides() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        Figure fig = Charts.weights(f, ChartFixtures.context(), AssetColours.of(u.assets()), S);
        assertTrue(f.corners().size() > 2);
        assertTrue(fig.notices().get(0).startsWith("Dashed verticals: corner portfolios"), fig.notices().get(0));
    }

    @Test
    void anEmptyOrSinglePointFrontierIsAnInputError() {
        AssetUniverse u = ChartFixtures.sampleFund();
        AssetColours colours = AssetColours.of(u.assets());
        Frontier empty = new Frontier(List.of(), List.of(), null, 0, 0);
        InputException e = assertThrows(InputException.class,
                () -> Charts.weights(empty, ChartFixtures.context(), colours, S));
        assertTrue(e.getMessage().startsWith("the frontier is empty"), e.getMessage());
        Solution p = ChartFixtures.sampleFrontier().points().get(2);
        Frontier one = new Frontier(List.of(), new ArrayList<>(List.of(p)), null, 0, 0);
        InputException e1 = assertThrows(InputException.class,
                () -> Charts.weights(one, ChartFixtures.context(), colours, S));
        assertTrue(e1.getMessage().startsWith("the frontier has a single portfolio"), e1.getMessage());
    }
}
