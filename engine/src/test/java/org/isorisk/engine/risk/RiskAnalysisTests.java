package org.isorisk.engine.risk;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.junit.jupiter.api.Test;

class RiskAnalysisTests {

    // Two assets, volatilities 0.1 and 0.2, correlation 0.5: Σ = [[0.01, 0.01], [0.01, 0.04]].
    private static final AssetUniverse TWO = new AssetUniverse(List.of("A", "B"), new double[] {0.05, 0.08},
            new double[][] {{0.01, 0.01}, {0.01, 0.04}});

    @Test
    void aTwoAssetPortfolioDecomposesAsComputedByHand() {
        // Hand-computed for w = (0.6, 0.4): Σw = (0.010, 0.022), V = 0.6·0.010 + 0.4·0.022 = 0.0148,
        // marginal = Σw/σ, component = w·Σw/σ = (0.006, 0.0088)/σ, shares = (0.006, 0.0088)/0.0148.
        RiskDecomposition d = RiskAnalysis.decompose(TWO, new double[] {0.6, 0.4});
        double sigma = Math.sqrt(0.0148);
        assertEquals(0.0148, d.variance(), Tolerances.TIGHT);
        assertEquals(sigma, d.volatility(), Tolerances.TIGHT);
        assertEquals(0.062, d.expectedReturn(), Tolerances.TIGHT);
        assertArrayEquals(new double[] {0.010 / sigma, 0.022 / sigma}, d.marginal(), Tolerances.TIGHT);
        assertArrayEquals(new double[] {0.006 / sigma, 0.0088 / sigma}, d.component(), Tolerances.TIGHT);
        assertEquals(0.006 / 0.0148, d.share(0), Tolerances.TIGHT);
        assertEquals(0.0088 / 0.0148, d.share(1), Tolerances.TIGHT);
        assertEquals("A", d.contributions().get(0).asset());
        assertEquals(1.0, d.totalWeight(), Tolerances.TIGHT);
    }

    @Test
    void trackingErrorMatchesTheHandComputedValue() {
        // Hand-computed: w − b = (0.1, −0.1), Σ(w − b) = (0, −0.003), (w − b)'Σ(w − b) = 0.0003, TE = sqrt(0.0003);
        // A's active risk component is 0.1·0/TE = 0, so B carries all of it.
        TrackingError te = RiskAnalysis.trackingError(TWO, new double[] {0.6, 0.4}, new double[] {0.5, 0.5});
        assertEquals(Math.sqrt(0.0003), te.value(), Tolerances.TIGHT);
        RiskDecomposition a = te.decomposition().orElseThrow();
        assertArrayEquals(new double[] {0.1, -0.1}, a.weights(), Tolerances.TIGHT);
        assertEquals(0.0, a.share(0), Tolerances.TIGHT);
        assertEquals(1.0, a.share(1), Tolerances.TIGHT);
    }

    @Test
    void aPortfolioHasNoTrackingErrorAgainstItself() {
        TrackingError te = RiskAnalysis.trackingError(TWO, new double[] {0.3, 0.7}, new double[] {0.3, 0.7});
        assertEquals(0.0, te.value());
        assertTrue(te.decomposition().isEmpty());
    }

    @Test
    void componentsAddUpToVolatilityAndMarginalsAreTheGradientOnRandomProblems() {
        // Euler's theorem for the degree-one homogeneous σ(w); marginals checked against a central finite
        // difference of σ (definition of the derivative). Fixed seed, 20 problems of 8 assets.
        Random rnd = new Random(20250630L);
        for (int trial = 0; trial < 20; trial++) {
            AssetUniverse u = randomUniverse(rnd, 8);
            double[] w = new double[8];
            for (int i = 0; i < 8; i++) {
                w[i] = rnd.nextGaussian();
            }
            RiskDecomposition d = RiskAnalysis.decompose(u, w);
            double sum = 0;
            for (double c : d.component()) {
                sum += c;
            }
            assertEquals(d.volatility(), sum, Tolerances.TIGHT * d.volatility());
            assertTrue(d.eulerResidual() <= Tolerances.TIGHT * d.volatility());
            double h = 1e-6;
            for (int i = 0; i < 8; i++) {
                double[] up = w.clone();
                double[] dn = w.clone();
                up[i] += h;
                dn[i] -= h;
                double fd = (RiskAnalysis.decompose(u, up).volatility() - RiskAnalysis.decompose(u, dn).volatility())
                        / (2 * h);
                assertEquals(fd, d.marginal()[i], Tolerances.NUMERICAL);
            }
        }
    }

    @Test
    void aPortfolioWithoutRiskCannotBeDecomposed() {
        InputException e = assertThrows(InputException.class,
                () -> RiskAnalysis.decompose(TWO, new double[] {0, 0}));
        assertEquals("the portfolio has zero volatility, so its risk cannot be split into contributions; fix: give a "
                + "portfolio with at least one non-zero weight", e.getMessage());
    }

    @Test
    void theSummaryNamesTheExtremesAndTheConditionNumber() {
        // [[a, b], [b, a]] has eigenvalues a ± b (hand-computed): 0.015 and 0.005, condition number 3.
        AssetUniverse u = new AssetUniverse(List.of("A", "B"), new double[] {0.02, 0.07},
                new double[][] {{0.01, 0.005}, {0.005, 0.01}});
        AssumptionSummary s = AssumptionSummary.of(u, null);
        assertEquals(2, s.assets());
        assertEquals(0.005, s.smallestEigenvalue(), Tolerances.TIGHT);
        assertEquals(0.015, s.largestEigenvalue(), Tolerances.TIGHT);
        assertEquals(3.0, s.conditionNumber(), Tolerances.CLOSED_FORM);
        assertEquals("A", s.lowestReturn().asset());
        assertEquals("B", s.highestReturn().asset());
        assertEquals(0.1, s.highestVolatility().value(), Tolerances.TIGHT);
    }

    static AssetUniverse randomUniverse(Random rnd, int n) {
        double[][] g = new double[n][3];
        for (double[] r : g) {
            for (int k = 0; k < 3; k++) {
                r[k] = 0.1 * rnd.nextGaussian();
            }
        }
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double v = 0;
                for (int k = 0; k < 3; k++) {
                    v += g[i][k] * g[j][k];
                }
                s[i][j] = v + (i == j ? 0.002 + 0.01 * rnd.nextDouble() : 0);
            }
        }
        List<String> names = new ArrayList<>();
        double[] mu = new double[n];
        for (int i = 0; i < n; i++) {
            names.add("X" + i);
            mu[i] = 0.02 + 0.06 * rnd.nextDouble();
        }
        return new AssetUniverse(names, mu, s);
    }
}
