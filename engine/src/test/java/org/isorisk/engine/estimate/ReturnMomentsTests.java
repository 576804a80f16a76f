package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.stat.correlation.Covariance;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

/**
 * The plain-array front of the estimators gives what {@link Estimator} gives on the same returns, and the sample
 * moments what Commons Math gives.
 */
class ReturnMomentsTests {

    @Test
    void everyMethodMatchesTheEstimatorOnTheSameHistory() {
        History h = Histories.returnHistory(300, 6, 41);
        double[][] columns = Histories.columns(h.values());
        for (CovarianceMethod m : CovarianceMethod.values()) {
            EstimationSettings s = EstimationSettings.defaults().withFrequency(Frequency.DAILY).withMethod(m);
            if (m == CovarianceMethod.EWMA) {
                s = s.withDecay(0.97);
            }
            Estimate e = Estimator.estimate(h, s, null);
            ReturnMoments.Result r = ReturnMoments.of(columns, m, m == CovarianceMethod.EWMA ? 0.97 : Double.NaN);
            int ppy = e.periodsPerYear();
            for (int i = 0; i < h.size(); i++) {
                assertEquals(e.expectedReturns()[i], r.mean(i) * ppy, Tolerances.TIGHT, m + " mean " + i);
                for (int j = 0; j < h.size(); j++) {
                    assertEquals(e.covariance(i, j), r.covariance(i, j) * ppy, Tolerances.TIGHT * e.covariance(i, i),
                            m + " covariance " + i + "," + j);
                }
            }
            if (m.shrinks()) {
                assertEquals(e.shrinkage().intensity(), r.shrinkage(), Tolerances.TIGHT, m + " intensity");
            } else {
                assertTrue(Double.isNaN(r.shrinkage()), m + " has no intensity");
            }
        }
    }

    @Test
    void sampleCovarianceMatchesCommonsMath() {
        double[][] rows = Histories.returns(50, 4, 9);
        ReturnMoments.Result r = ReturnMoments.of(Histories.columns(rows), CovarianceMethod.SAMPLE, Double.NaN);
        // Commons Math's Covariance: bias-corrected (divisor T − 1).
        double[][] ref = new Covariance(rows).getCovarianceMatrix().getData();
        assertTrue(Histories.maxAbsDiff(ref, r.covariance()) <= Tolerances.TIGHT * Histories.maxAbs(ref));
    }

    @Test
    void completeRowsDropRowsWithAMissingValueAndTurnPricesIntoReturns() {
        double[][] prices = {{100, 50}, {110, 55}, {Double.NaN, 60}, {121, 66}, {133.1, 72.6}};
        History h = new History("p.csv", java.util.List.of("A", "B"), Histories.weekdays(5), null, prices,
                ValueKind.PRICES);
        double[][] r = ReturnMoments.completeReturnRows(h, ReturnType.SIMPLE);
        // Hand-computed: the missing price removes the returns on both sides of it.
        assertEquals(2, r.length);
        assertArrayEquals(new double[] {0.1, 0.1}, r[0], 1e-15);
        assertArrayEquals(new double[] {0.1, 0.1}, r[1], 1e-14);
    }

    @Test
    void aDecayOutsideTheUnitIntervalIsRefused() {
        double[][] columns = Histories.columns(Histories.returns(20, 2, 1));
        assertThrows(InputException.class, () -> ReturnMoments.of(columns, CovarianceMethod.EWMA, 1.0));
        assertThrows(IllegalArgumentException.class,
                () -> ReturnMoments.of(new double[][] {{0.1}}, CovarianceMethod.SAMPLE, Double.NaN));
    }
}
