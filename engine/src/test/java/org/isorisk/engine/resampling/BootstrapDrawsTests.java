package org.isorisk.engine.resampling;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.apache.commons.math3.stat.correlation.Covariance;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;
import org.junit.jupiter.api.Test;

/** Bootstrap draws: whole rows, moving blocks, the re-estimate, reproducibility. */
class BootstrapDrawsTests {

    /** An invented history of monthly returns of three assets (illustrative numbers). */
    static double[][] history(int rows) {
        Xoshiro256PlusPlus g = new RandomStreams(404).stream(0);
        double[][] r = new double[rows][3];
        for (int t = 0; t < rows; t++) {
            double f = 0.04 * g.nextGaussian();
            r[t][0] = 0.002 + 0.01 * g.nextGaussian();
            r[t][1] = 0.005 + 0.6 * f + 0.02 * g.nextGaussian();
            r[t][2] = 0.007 + 1.1 * f + 0.03 * g.nextGaussian();
        }
        return r;
    }

    @Test
    void rowsAreDrawnUniformlyAndWhole() {
        double[][] h = history(40);
        BootstrapDraws d = BootstrapDraws.of(h, 12, 1, 40, Reestimation.sample(), 3);
        long[] counts = new long[40];
        for (int k = 0; k < 2000; k++) {
            for (int row : d.rowIndices(k)) {
                counts[row]++;
            }
        }
        double[] expected = new double[40];
        java.util.Arrays.fill(expected, 2000.0 * 40 / 40);
        // Commons Math's chi-square goodness-of-fit test: every row equally likely.
        assertTrue(new ChiSquareTest().chiSquareTest(expected, counts) > 0.001);
    }

    @Test
    void movingBlocksAreRunsOfConsecutiveRowsCutAtTheLength() {
        double[][] h = history(40);
        int b = 6;
        BootstrapDraws d = BootstrapDraws.of(h, 12, b, 40, Reestimation.sample(), 3);
        boolean[] startSeen = new boolean[40];
        for (int k = 0; k < 500; k++) {
            int[] rows = d.rowIndices(k);
            assertEquals(40, rows.length);
            for (int i = 0; i < rows.length; i++) {
                if (i % b == 0) {
                    assertTrue(rows[i] >= 0 && rows[i] <= 40 - b, "a block start leaves room for the block");
                    startSeen[rows[i]] = true;
                } else {
                    assertEquals(rows[i - 1] + 1, rows[i], "inside a block the rows are consecutive");
                }
            }
        }
        for (int s = 0; s <= 40 - b; s++) {
            assertTrue(startSeen[s], "every start can occur: " + s);
        }
        assertTrue(!startSeen[40 - b + 1], "no block runs past the end");
    }

    @Test
    void aDrawIsTheEstimateOfItsRows() {
        double[][] h = history(40);
        BootstrapDraws d = BootstrapDraws.of(h, 12, 4, 30, Reestimation.sample(), 9);
        for (long k : new long[] {0, 5, 123456789L}) {
            int[] rows = d.rowIndices(k);
            double[][] sample = new double[rows.length][];
            for (int i = 0; i < rows.length; i++) {
                sample[i] = h[rows[i]];
            }
            // Commons Math's Covariance (divisor T − 1) of the drawn rows, annualised by 12.
            double[][] ref = new Covariance(sample).getCovarianceMatrix().getData();
            DrawnAssumptions a = d.draw(k);
            for (int i = 0; i < 3; i++) {
                double m = 0;
                for (double[] r : sample) {
                    m += r[i];
                }
                assertEquals(12 * m / sample.length, a.expectedReturns()[i], Tolerances.TIGHT);
                for (int j = 0; j < 3; j++) {
                    assertEquals(12 * ref[i][j], a.covariance()[i][j], Tolerances.TIGHT);
                }
            }
        }
    }

    @Test
    void theBootstrapMeanIsCentredOnTheSampleMean() {
        // The iid bootstrap of rows: E*[mean of a resample] = the history's mean, variance s²(T − 1)/T² per
        // period (common knowledge); over D draws the average is within 4 standard errors.
        double[][] h = history(40);
        BootstrapDraws d = BootstrapDraws.of(h, 12, 1, 40, Reestimation.of(CovarianceMethod.LEDOIT_WOLF_IDENTITY), 1);
        int draws = 3000;
        double sum = 0;
        for (int k = 0; k < draws; k++) {
            sum += d.draw(k).expectedReturns()[2];
        }
        double mean = 0;
        for (double[] r : h) {
            mean += r[2];
        }
        mean /= h.length;
        double var = 0;
        for (double[] r : h) {
            var += (r[2] - mean) * (r[2] - mean);
        }
        var /= h.length - 1;
        double se = 12 * Math.sqrt(var * (h.length - 1) / ((double) h.length * h.length) / draws);
        assertEquals(12 * mean, sum / draws, 4 * se);
    }

    @Test
    void drawsAreTheSameBitForBitOnOneAndOnFourThreads() throws Exception {
        BootstrapDraws d = BootstrapDraws.of(history(40), 12, 3, 40, Reestimation.ewma(0.97), 12);
        int draws = 50;
        DrawnAssumptions[] four = new DrawnAssumptions[draws];
        ExecutorService pool = Executors.newFixedThreadPool(4);
        try {
            List<Future<?>> done = new ArrayList<>();
            for (int k = draws - 1; k >= 0; k--) {
                int kk = k;
                done.add(pool.submit(() -> four[kk] = d.draw(kk)));
            }
            for (Future<?> f : done) {
                f.get();
            }
        } finally {
            pool.shutdown();
        }
        for (int k = 0; k < draws; k++) {
            DrawnAssumptions one = d.draw(k);
            assertArrayEquals(one.expectedReturns(), four[k].expectedReturns(), 0.0);
            for (int i = 0; i < 3; i++) {
                assertArrayEquals(one.covariance()[i], four[k].covariance()[i], 0.0);
            }
        }
    }

    @Test
    void badInputsAreRefused() {
        double[][] h = history(10);
        assertEquals("block_length", assertThrows(InputException.class,
                () -> BootstrapDraws.of(h, 12, 0, 10, Reestimation.sample(), 1)).key().orElseThrow());
        assertThrows(InputException.class, () -> BootstrapDraws.of(h, 12, 11, 10, Reestimation.sample(), 1));
        assertThrows(InputException.class, () -> BootstrapDraws.of(h, 12, 2, 1, Reestimation.sample(), 1));
        assertThrows(InputException.class,
                () -> BootstrapDraws.of(new double[][] {{0.1, 0.2}}, 12, 1, 10, Reestimation.sample(), 1));
    }
}
