package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;
import org.knowm.xchart.HorizontalBarChart;
import org.knowm.xchart.HorizontalBarSeries;

class RiskContributionChartTests {

    private static final ChartSettings S = ChartSettings.defaults();

    private static double[] values(HorizontalBarSeries s) {
        return s.getXData().stream().mapToDouble(Number::doubleValue).toArray();
    }

    @Test
    void barsAreEachAssetsShareSortedByTheProposedPortfolioLargestFirst() {
        AssetUniverse u = ChartFixtures.sampleFund();
        RiskShares cur = ChartFixtures.shares("Current", u, ChartFixtures.sampleCurrent());
        RiskShares prop = ChartFixtures.shares("Proposed", u, ChartFixtures.sampleFrontier().points().get(9).weights());
        Figure fig = Charts.riskContributions(cur, prop, ChartFixtures.context(), AssetColours.of(u.assets()), S);
        HorizontalBarChart c = (HorizontalBarChart) fig.chart();
        HorizontalBarSeries p = c.getSeries("Proposed");
        HorizontalBarSeries q = c.getSeries("Current");
        List<?> cats = p.getYData();
        assertEquals(u.size(), cats.size());
        double[] pv = values(p);
        double[] qv = values(q);
        for (int j = 0; j < cats.size(); j++) {
            int i = u.assets().indexOf((String) cats.get(j));
            assertEquals(prop.shares()[i], pv[j], 0.0);
            assertEquals(cur.shares()[i], qv[j], 0.0);
            if (j > 0) {
                assertTrue(pv[j] <= pv[j - 1], "sorted, largest proposed share first");
            }
        }
        assertEquals(1.0, Arrays.stream(pv).sum(), Tolerances.GENERAL);
    }

    @Test
    void manyAssetsKeepTheLargestBarsAndSumTheRestAsOther() {
        AssetUniverse big = ChartFixtures.large(200, 11);
        double[] w = new double[200];
        Arrays.fill(w, 1.0 / 200);
        double[] v = new double[200];
        for (int i = 0; i < 200; i++) {
            v[i] = 1.0 + (i % 7);
        }
        double sum = Arrays.stream(v).sum();
        for (int i = 0; i < 200; i++) {
            v[i] /= sum;
        }
        RiskShares prop = ChartFixtures.shares("Proposed", big, v);
        RiskShares cur = ChartFixtures.shares("Current", big, w);
        Figure fig = Charts.riskContributions(cur, prop, ChartFixtures.context(), AssetColours.of(big.assets()), S);
        HorizontalBarSeries p = ((HorizontalBarChart) fig.chart()).getSeries("Proposed");
        List<?> cats = p.getYData();
        assertEquals(S.barLimit(), cats.size());
        String other = (String) cats.get(cats.size() - 1);
        assertEquals("Other (181 assets)", other);
        double[] pv = values(p);
        double shown = 0;
        for (int j = 0; j < cats.size() - 1; j++) {
            shown += pv[j];
        }
        assertEquals(1.0 - shown, pv[pv.length - 1], Tolerances.GENERAL);
        // the kept bars are the assets with the largest shares (of either portfolio)
        double minKept = Double.POSITIVE_INFINITY;
        List<Integer> kept = new ArrayList<>();
        for (int j = 0; j < cats.size() - 1; j++) {
            int i = big.assets().indexOf((String) cats.get(j));
            kept.add(i);
            minKept = Math.min(minKept, Math.max(Math.abs(prop.shares()[i]), Math.abs(cur.shares()[i])));
        }
        for (int i = 0; i < 200; i++) {
            if (!kept.contains(i)) {
                assertTrue(Math.max(Math.abs(prop.shares()[i]), Math.abs(cur.shares()[i])) <= minKept);
            }
        }
        assertTrue(fig.notices().stream().anyMatch(n -> n.contains("the other 181 are summed")), fig.notices().toString());
    }

    @Test
    void sharesThatDoNotAddUpToTheWholeVolatilityAreRejected() {
        InputException e = assertThrows(InputException.class,
                () -> new RiskShares("Proposed", List.of("A", "B"), new double[] {0.5, 0.4}));
        assertTrue(e.getMessage().contains("must sum to 100 % of volatility"), e.getMessage());
    }

    @Test
    void assetsTheRunDoesNotKnowAreRejected() {
        RiskShares p = new RiskShares("Proposed", List.of("A", "B"), new double[] {0.5, 0.5});
        InputException e = assertThrows(InputException.class, () -> Charts.riskContributions(null, p,
                ChartFixtures.context(), AssetColours.of(List.of("A", "C")), S));
        assertTrue(e.getMessage().startsWith("asset 'B': the chart has no colour"), e.getMessage());
    }
}
