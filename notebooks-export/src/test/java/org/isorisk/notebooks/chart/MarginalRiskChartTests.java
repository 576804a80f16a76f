package org.isorisk.notebooks.chart;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.Test;
import org.knowm.xchart.XYChart;
import org.knowm.xchart.XYSeries;

class MarginalRiskChartTests {

    private static final ChartSettings S = ChartSettings.defaults();

    private static double volPerUnit(Solution s) {
        return s.multiplier("target_return").map(Multiplier::volatilityPerUnit).orElseThrow();
    }

    @Test
    void theMandateCurveIsTheReturnTargetsVolatilityPerUnitAtEachFrontierPortfolio() {
        Frontier f = ChartFixtures.sampleFrontier();
        Figure fig = Charts.marginalRisk(f, ChartFixtures.context(), S);
        XYSeries m = ((XYChart) fig.chart()).getSeries(MarginalRiskChart.MANDATE);
        FrontierPath path = FrontierPath.of(f);
        List<Solution> expected = new ArrayList<>();
        for (FrontierPath.Step st : path.steps.subList(path.minimumVolatilityIndex(), path.size())) {
            if (st.portfolio().multiplier("target_return").isPresent()) {
                expected.add(st.portfolio());
            }
        }
        assertEquals(expected.size(), m.getXData().length);
        for (int j = 0; j < expected.size(); j++) {
            assertEquals(expected.get(j).expectedReturn(), m.getXData()[j], 0.0);
            assertEquals(volPerUnit(expected.get(j)), m.getYData()[j], 0.0);
        }
    }

    @Test
    void theUnconstrainedCurveMatchesTheClosedFormSolvesShadowPrice() {
        AssetUniverse u = ChartFixtures.sampleFund();
        Frontier f = ChartFixtures.sampleFrontier();
        Figure fig = Charts.marginalRisk(f, ChartFixtures.context(), S);
        XYSeries un = ((XYChart) fig.chart()).getSeries(MarginalRiskChart.UNCONSTRAINED);
        Mandate budget = Mandate.fullyInvested(u.size());
        assertEquals(0.0, un.getYData()[0], Tolerances.GENERAL); // zero at the minimum-variance portfolio
        for (int i = 20; i < un.getXData().length; i += 55) {
            double m = un.getXData()[i];
            Solution s = Allocator.solve(AllocationRequest.of(u, budget, Objective.targetReturn(m)));
            assertEquals(volPerUnit(s), un.getYData()[i], Tolerances.GENERAL * Math.max(1, volPerUnit(s)));
        }
    }

    @Test
    void theYAxisReadsTheShadowPriceAsVolatilityPerStepOfTarget() {
        Figure fig = Charts.marginalRisk(ChartFixtures.sampleFrontier(), ChartFixtures.context(), S);
        XYChart c = (XYChart) fig.chart();
        // ∂σ*/∂m = 0.8 means +0.25 % of target costs 0.2 % of volatility
        assertEquals("0.2 %", c.getStyler().getyAxisTickLabelsFormattingFunction().apply(0.8));
        assertTrue(c.getYAxisTitle().contains("+0.25 %"), c.getYAxisTitle());
    }

    @Test
    void cornerChangesNameTheConstraintThatStartsOrStopsBinding() {
        // Hand-assembled corners: Cash reaches its cap of 20 % at the second corner, Government Bonds leave a floor
        // of 10 % at the third; the stretches between are read from the binding flags.
        List<String> assets = List.of("Cash", "Government Bonds", "Domestic Equity");
        Solution a = solution(assets, new double[] {0.10, 0.60, 0.30}, 0.03, List.of("lower:Government Bonds"));
        Solution b = solution(assets, new double[] {0.20, 0.50, 0.30}, 0.04,
                List.of("lower:Government Bonds", "upper:Cash"));
        Solution c = solution(assets, new double[] {0.20, 0.10, 0.70}, 0.05,
                List.of("lower:Government Bonds", "upper:Cash"));
        Solution d = solution(assets, new double[] {0.20, 0.05, 0.75}, 0.06, List.of("upper:Cash"));
        List<FrontierPath.Step> steps = List.of(new FrontierPath.Step(a, corner(a)),
                new FrontierPath.Step(b, corner(b)), new FrontierPath.Step(c, corner(c)),
                new FrontierPath.Step(d, corner(d)));
        List<CornerChanges.Change> ch = CornerChanges.of(steps);
        assertEquals(List.of("upper:Cash"), ch.get(1).starts());
        assertEquals("Cash at cap 20 %", ch.get(1).label(null));
        assertEquals(List.of("lower:Government Bonds"), ch.get(2).stops());
        assertEquals("Government Bonds above floor 10 %", ch.get(2).label(null));
        assertEquals("", ch.get(0).label(null));
    }

    @Test
    void aZeroFloorReadsAsDroppingOutOrComingIn() {
        List<String> assets = List.of("Cash", "Commodities");
        Solution s = solution(assets, new double[] {1.0, 0.0}, 0.03, List.of());
        assertEquals("Commodities drops out", CornerChanges.phrase("lower:Commodities", true, s));
        assertEquals("Commodities comes in", CornerChanges.phrase("lower:Commodities", false, s));
        assertEquals("group Equity at cap", CornerChanges.phrase("group:Equity:max", true, s));
    }

    @Test
    void aSteepRiseAtTheMaximumReturnEndIsCappedAndNamed() {
        List<String> assets = List.of("A", "B");
        List<Corner> corners = new ArrayList<>();
        double[] slope = {0.0, 0.1, 0.2, 0.3, 0.4, 0.5, 6.0}; // ∂σ*/∂m at the corners
        for (int j = 0; j < slope.length; j++) {
            Solution s = solution(assets, new double[] {1 - 0.1 * j, 0.1 * j}, 0.03 + 0.005 * j, List.of());
            List<Multiplier> mult = new ArrayList<>(s.multipliers());
            mult.set(1, new Multiplier("target_return", 2 * 0.1 * slope[j], slope[j], true));
            corners.add(corner(new Solution(s.method(), assets, s.weights(), s.expectedReturn(), s.variance(),
                    s.volatility(), mult, s.certificate(), List.of())));
        }
        Frontier f = new Frontier(corners, List.of(), null, 0.03, 0.06);
        Figure fig = Charts.marginalRisk(f, ChartFixtures.context(), S);
        XYChart c = (XYChart) fig.chart();
        assertEquals(6.0, c.getSeries(MarginalRiskChart.MANDATE).getYData()[6], 0.0); // the data keep the value
        assertTrue(c.getStyler().getYAxisMax() < 1.2, "axis capped at twice the 85th percentile");
        assertTrue(fig.notices().contains("Near the maximum-return end the curve rises to 1.50 % per +0.25 % of "
                + "target (at a target of 6.00 %), above the top of the chart."), fig.notices().toString());
    }

    @Test
    void portfoliosWithoutAReturnTargetMultiplierCannotMakeACurve() {
        List<String> assets = List.of("A", "B");
        Solution a = solution(assets, new double[] {0.5, 0.5}, 0.03, List.of());
        Solution b = solution(assets, new double[] {0.4, 0.6}, 0.04, List.of());
        List<Multiplier> none = List.of(new Multiplier("budget", 0.01, 0.1, true));
        Solution a2 = new Solution(a.method(), assets, a.weights(), 0.03, 0.01, 0.1, none, a.certificate(), List.of());
        Solution b2 = new Solution(b.method(), assets, b.weights(), 0.04, 0.012, 0.11, none, b.certificate(),
                List.of());
        Frontier f = new Frontier(List.of(corner(a2), corner(b2)), List.of(), null, 0.03, 0.04);
        InputException e = assertThrows(InputException.class,
                () -> Charts.marginalRisk(f, ChartFixtures.context(), S));
        assertTrue(e.getMessage().contains("'target_return'"), e.getMessage());
    }

    @Test
    void anEmptyOrSinglePointFrontierIsAnInputError() {
        Frontier empty = new Frontier(List.of(), List.of(), null, 0, 0);
        InputException e = assertThrows(InputException.class,
                () -> Charts.marginalRisk(empty, ChartFixtures.context(), S));
        assertTrue(e.getMessage().startsWith("the frontier is empty"), e.getMessage());
        Solution p = ChartFixtures.sampleFrontier().points().get(2);
        Frontier one = new Frontier(List.of(), List.of(p), null, 0, 0);
        InputException e1 = assertThrows(InputException.class,
                () -> Charts.marginalRisk(one, ChartFixtures.context(), S));
        assertTrue(e1.getMessage().startsWith("the frontier has a single portfolio"), e1.getMessage());
    }

    private static Corner corner(Solution s) {
        return new Corner(s, null, "enters", "test corner");
    }

    /** A hand-made bounded solution with the named bounds binding and a return-target multiplier. */
    static Solution solution(List<String> assets, double[] w, double m, List<String> binding) {
        Solution base = ChartFixtures.sampleFrontier().points().get(0);
        List<Multiplier> mult = new ArrayList<>();
        mult.add(new Multiplier("budget", 0.01, 0.05, true));
        mult.add(new Multiplier("target_return", 0.2 * m, m, true));
        for (String a : assets) {
            for (String side : List.of("lower:", "upper:")) {
                boolean b = binding.contains(side + a);
                mult.add(new Multiplier(side + a, b ? 0.001 : 0, b ? 0.01 : 0, b));
            }
        }
        return new Solution(base.method(), assets, w, m, 0.01, 0.1, mult, base.certificate(), List.of());
    }
}
