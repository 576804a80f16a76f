package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;
import org.junit.jupiter.api.Test;

/** Geltner's (1993) desmoothing: recovery of a series smoothed with a known coefficient, and the volatility. */
class DesmoothingTests {

    /** Serially independent "true" quarterly returns (invented, illustrative): mean 2 %, volatility 5 %. */
    private static double[] trueReturns(int n, long seed) {
        Xoshiro256PlusPlus g = new RandomStreams(seed).stream(0);
        double[] r = new double[n];
        for (int t = 0; t < n; t++) {
            r[t] = 0.02 + 0.05 * g.nextGaussian();
        }
        return r;
    }

    /** The appraisal model r*_t = (1 − φ) r_t + φ r*_{t−1}, started at r*_0 = r_0. */
    private static double[] smooth(double[] r, double phi) {
        double[] s = new double[r.length];
        s[0] = r[0];
        for (int t = 1; t < r.length; t++) {
            s[t] = (1 - phi) * r[t] + phi * s[t - 1];
        }
        return s;
    }

    @Test
    void aSeriesSmoothedWithAKnownCoefficientIsRecovered() {
        double[] r = trueReturns(80, 1);
        for (double phi : new double[] {0.3, 0.6, 0.85}) {
            DesmoothedSeries d = Desmoothing.desmooth("Private Real Estate", smooth(r, phi), phi);
            assertFalse(d.estimated());
            assertEquals(phi, d.phi(), 0.0);
            double[] back = d.returns();
            assertEquals(r.length - 1, back.length);
            for (int t = 1; t < r.length; t++) {
                // Inverting the model exactly, up to the rounding of (r*_t − φ r*_{t−1})/(1 − φ).
                assertEquals(r[t], back[t - 1], Tolerances.TIGHT, "φ = " + phi + ", t = " + t);
            }
        }
    }

    @Test
    void theEstimatedCoefficientAndTheRiseInVolatilityMatchTheModel() {
        // For serially independent true returns the smoothed series is AR(1) with coefficient φ, so its
        // first-order autocorrelation estimates φ (standard error about sqrt((1 − φ²)/T), Bartlett), and its
        // variance is (1 − φ)/(1 + φ) times the true one: desmoothing raises the volatility by sqrt((1 + φ)/(1 − φ)).
        int n = 200_000;
        double phi = 0.6;
        DesmoothedSeries d = Desmoothing.desmooth("Private Real Estate", smooth(trueReturns(n, 2), phi), Double.NaN);
        assertTrue(d.estimated());
        assertEquals(phi, d.phi(), 4 * Math.sqrt((1 - phi * phi) / n), "estimated φ");
        assertEquals(Math.sqrt((1 + phi) / (1 - phi)), d.volatilityRatio(), 0.01, "volatility ratio");
        assertEquals(0.05, d.desmoothedVolatility(), 0.05 * 0.01, "the true volatility comes back");
        double[] back = d.returns();
        double mean = 0;
        for (double v : back) {
            mean += v / back.length;
        }
        assertEquals(0.02, mean, 4 * 0.05 / Math.sqrt(n), "the mean is unchanged");
        assertTrue(d.notes().isEmpty());
    }

    @Test
    void theAutocorrelationIsTheTextbookOne() {
        // Hand-computed: x = 1, 2, 3, 4, mean 2.5, deviations −1.5 −0.5 0.5 1.5; Σ d_t d_{t−1} = 0.75 − 0.25 + 0.75
        // = 1.25; Σ d² = 5; ρ₁ = 0.25 (as R's acf(c(1, 2, 3, 4))).
        assertEquals(0.25, Desmoothing.firstOrderAutocorrelation(new double[] {1, 2, 3, 4}), Tolerances.TIGHT);
    }

    @Test
    void aCoefficientOfOneOrMoreIsRefusedAndANegativeOneNoted() {
        double[] r = trueReturns(40, 3);
        InputException e = assertThrows(InputException.class, () -> Desmoothing.desmooth("Private Equity", r, 1.0));
        assertEquals("key 'phi', asset 'Private Equity': the smoothing coefficient must lie strictly between -1 and 1 "
                + "(at 1 the desmoothed returns (r*_t - φ r*_(t-1))/(1 - φ) divide by zero) (value '1.0'); fix: give a "
                + "coefficient such as 0.5, or let it be estimated", e.getMessage());
        assertThrows(InputException.class, () -> Desmoothing.desmooth("Private Equity", r, -1.2));
        assertThrows(InputException.class,
                () -> Desmoothing.desmooth("Private Equity", new double[] {0.01, 0.02}, 0.5));
        assertThrows(InputException.class,
                () -> Desmoothing.desmooth("Private Equity", new double[] {0.01, 0.01, 0.01, 0.01}, Double.NaN));
        DesmoothedSeries negative = Desmoothing.desmooth("Private Equity", r, -0.3);
        assertTrue(negative.volatilityRatio() < 1, "a negative φ lowers the volatility");
        assertTrue(negative.notes().get(0).contains("negative"), negative.notes().toString());
        DesmoothedSeries shortOne = Desmoothing.desmooth("Private Equity", trueReturns(12, 4), Double.NaN);
        assertTrue(shortOne.notes().get(0).contains("only 12 returns"), shortOne.notes().toString());
    }
}
