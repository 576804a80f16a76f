package org.isorisk.engine.linalg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.isorisk.engine.Tolerances;
import org.junit.jupiter.api.Test;

/** The one search for perfectly correlated pairs and the two definiteness thresholds, on hand-built matrices. */
class DefinitenessTests {

    @Test
    void aPairWithCorrelationOneIsFoundWithItsIndices() {
        // Volatilities 20 % and 40 %, covariance 0.08 = 0.2 · 0.4: correlation exactly 1 (by hand).
        double[][] a = {
                {0.0100, 0.0020, 0.0040},
                {0.0020, 0.0400, 0.0800},
                {0.0040, 0.0800, 0.1600}};
        Definiteness.Pair p = Definiteness.perfectlyCorrelatedPair(a);
        assertEquals(1, p.first());
        assertEquals(2, p.second());
        assertEquals(1.0, p.correlation(), Tolerances.TIGHT);
        assertFalse(p.outsideRange());
    }

    @Test
    void aPairWithCorrelationMinusOneIsFoundToo() {
        // Covariance −0.02 = −0.1 · 0.2: correlation −1 (by hand).
        double[][] a = {{0.01, -0.02}, {-0.02, 0.04}};
        Definiteness.Pair p = Definiteness.perfectlyCorrelatedPair(a);
        assertEquals(-1.0, p.correlation(), Tolerances.TIGHT);
        assertFalse(p.outsideRange());
    }

    @Test
    void aCorrelationBeyondOneByMoreThanTheToleranceIsOutsideTheRange() {
        // Covariance 0.02 with variances 0.01 and 0.01: implied correlation 2 (by hand).
        Definiteness.Pair p = Definiteness.perfectlyCorrelatedPair(new double[][] {{0.01, 0.02}, {0.02, 0.01}});
        assertEquals(2.0, p.correlation(), Tolerances.TIGHT);
        assertTrue(p.outsideRange());
        // Just inside the tolerance on either side of 1 still counts as perfect, not outside.
        double inside = 1 + Definiteness.CORRELATION_TOLERANCE / 2;
        assertFalse(Definiteness.perfectlyCorrelatedPair(new double[][] {{1, inside}, {inside, 1}}).outsideRange());
        double below = 1 - Definiteness.CORRELATION_TOLERANCE / 2;
        assertEquals(below, Definiteness.perfectlyCorrelatedPair(new double[][] {{1, below}, {below, 1}})
                .correlation(), 0);
    }

    @Test
    void aHighButImperfectCorrelationIsNoPair() {
        double rho = 1 - 10 * Definiteness.CORRELATION_TOLERANCE;
        assertNull(Definiteness.perfectlyCorrelatedPair(new double[][] {{1, rho}, {rho, 1}}));
        assertNull(Definiteness.perfectlyCorrelatedPair(new double[][] {{0.04, 0.019}, {0.019, 0.01}}));
    }

    @Test
    void theFirstPairInRowOrderIsReported() {
        // Rows 0–1 and 2–3 are both perfectly correlated (covariance = product of volatilities 0.1 · 0.1).
        double[][] a = {
                {0.01, 0.01, 0, 0},
                {0.01, 0.01, 0, 0},
                {0, 0, 0.01, 0.01},
                {0, 0, 0.01, 0.01}};
        Definiteness.Pair p = Definiteness.perfectlyCorrelatedPair(a);
        assertEquals(0, p.first());
        assertEquals(1, p.second());
    }

    @Test
    void aZeroVarianceHasNoImpliedCorrelationAndIsSkipped() {
        assertNull(Definiteness.perfectlyCorrelatedPair(new double[][] {{0, 0}, {0, 0.04}}));
    }

    @Test
    void aPairThatIsNotPerfectlyCorrelatedCannotBeMade() {
        assertThrows(IllegalArgumentException.class, () -> new Definiteness.Pair(0, 1, 0.5));
        assertThrows(IllegalArgumentException.class, () -> new Definiteness.Pair(1, 1, 1.0));
    }

    @Test
    void theFileThresholdIsStricterThanTheSolverThreshold() {
        // Condition number 5e12 (eigenvalues 1 and 2e-13): singular for an assumption file, not for the solver.
        Spectrum sp = new Spectrum(2e-13, 1, true);
        assertFalse(Definiteness.positiveDefinite(sp, Definiteness.INPUT));
        assertTrue(Definiteness.positiveDefinite(sp, Definiteness.SINGULAR));
        assertFalse(Definiteness.positiveDefinite(new Spectrum(1e-13, 1, true), Definiteness.SINGULAR));
        assertFalse(Definiteness.positiveDefinite(new Spectrum(Double.NaN, 1, true), Definiteness.SINGULAR));
        assertTrue(Definiteness.positiveDefinite(new Spectrum(0.5, 1, true), Definiteness.INPUT));
    }
}
