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
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.stat.correlation.Covariance;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.junit.jupiter.api.Test;

/** Parametric draws: what they simulate, what they re-estimate, and that they are reproducible. */
class ParametricDrawsTests {

    /** Four invented asset classes (illustrative): annual expected returns and covariance. */
    static final double[] MU = {0.02, 0.045, 0.065, 0.08};
    static final double[][] SIGMA = covariance(new double[] {0.03, 0.08, 0.16, 0.22}, new double[][] {
            {1, 0.3, 0.1, 0.0}, {0.3, 1, 0.5, 0.4}, {0.1, 0.5, 1, 0.8}, {0.0, 0.4, 0.8, 1}});

    static double[][] covariance(double[] vol, double[][] corr) {
        int n = vol.length;
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                s[i][j] = vol[i] * vol[j] * corr[i][j];
            }
        }
        return s;
    }

    @Test
    void theSimulatedReturnsAreIndependentNormalsWithTheAssumedMomentsJointly() {
        // Whitened by the independent Commons Math Cholesky factor of Σ/P, the simulated returns must be
        // independent standard normals: each coordinate passes a Kolmogorov–Smirnov test against Commons Math's
        // NormalDistribution, and the Hotelling-type statistic T·z̄'z̄ of the mean is χ²(n) (common knowledge: the
        // mean of T independent N(0, I) vectors is N(0, I/T)), checked at the 0.1 % level.
        int t = 20_000;
        int p = 12;
        ParametricDraws d = ParametricDraws.of(MU, SIGMA, t, p, Reestimation.sample(), 5);
        double[][] x = d.simulatedReturns(0);
        int n = MU.length;
        double[][] perPeriod = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                perPeriod[i][j] = SIGMA[i][j] / p;
            }
        }
        RealMatrix l = new CholeskyDecomposition(new Array2DRowRealMatrix(perPeriod)).getL();
        double[][] z = new double[n][t];
        double[] zbar = new double[n];
        for (int s = 0; s < t; s++) {
            double[] y = new double[n];
            for (int i = 0; i < n; i++) {
                double v = x[i][s] - MU[i] / p;
                for (int k = 0; k < i; k++) {
                    v -= l.getEntry(i, k) * y[k];
                }
                y[i] = v / l.getEntry(i, i);
                z[i][s] = y[i];
                zbar[i] += y[i] / t;
            }
        }
        KolmogorovSmirnovTest ks = new KolmogorovSmirnovTest();
        for (int i = 0; i < n; i++) {
            assertTrue(ks.kolmogorovSmirnovTest(new NormalDistribution(0, 1), z[i]) > 0.001, "coordinate " + i);
        }
        double stat = 0;
        for (double v : zbar) {
            stat += t * v * v;
        }
        assertTrue(stat < new ChiSquaredDistribution(n).inverseCumulativeProbability(0.999), "T z̄'z̄ = " + stat);
        // Whitened coordinates uncorrelated: sample correlations within 4/√T of zero (standard error 1/√T).
        double[][] c = new Covariance(transpose(z)).getCovarianceMatrix().getData();
        for (int i = 0; i < n; i++) {
            assertEquals(1, c[i][i], 4 * Math.sqrt(2.0 / t), "variance " + i);
            for (int j = 0; j < i; j++) {
                assertEquals(0, c[i][j] / Math.sqrt(c[i][i] * c[j][j]), 4 / Math.sqrt(t), "correlation " + i + j);
            }
        }
    }

    @Test
    void aDrawIsTheSampleEstimateOfItsSimulatedReturnsAnnualised() {
        ParametricDraws d = ParametricDraws.of(MU, SIGMA, 60, 12, Reestimation.sample(), 8);
        for (long k : new long[] {0, 1, 999}) {
            DrawnAssumptions a = d.draw(k);
            double[][] rows = transpose(d.simulatedReturns(k));
            // Commons Math's Covariance (divisor T − 1), times the 12 periods a year.
            double[][] ref = new Covariance(rows).getCovarianceMatrix().getData();
            for (int i = 0; i < MU.length; i++) {
                double mean = 0;
                for (double[] r : rows) {
                    mean += r[i];
                }
                assertEquals(12 * mean / rows.length, a.expectedReturns()[i], Tolerances.TIGHT, "mean " + i);
                for (int j = 0; j < MU.length; j++) {
                    assertEquals(12 * ref[i][j], a.covariance()[i][j], Tolerances.TIGHT * SIGMA[i][i]);
                }
            }
            assertEquals(k, a.index());
            assertTrue(Double.isNaN(a.shrinkage()));
        }
    }

    @Test
    void drawsScatterAroundTheAssumptionsWithTheSpreadOfTObservations() {
        // E[sample mean] = μ and E[sample covariance (T − 1)] = Σ; the annualised mean of T periods has variance
        // P·Σ_ii/T (common knowledge). Over D draws: means within 4 standard errors, and the variance of the
        // drawn means within 4·sqrt(2/(D − 1)) relative (the χ² standard error of a sample variance).
        int t = 120;
        int p = 12;
        int draws = 4000;
        ParametricDraws d = ParametricDraws.of(MU, SIGMA, t, p, Reestimation.sample(), 2024);
        int n = MU.length;
        double[] sum = new double[n];
        double[] sumSq = new double[n];
        double[][] covSum = new double[n][n];
        for (int k = 0; k < draws; k++) {
            DrawnAssumptions a = d.draw(k);
            for (int i = 0; i < n; i++) {
                double m = a.expectedReturns()[i];
                sum[i] += m;
                sumSq[i] += m * m;
                for (int j = 0; j < n; j++) {
                    covSum[i][j] += a.covariance()[i][j];
                }
            }
        }
        for (int i = 0; i < n; i++) {
            double var = p * SIGMA[i][i] / t;
            double mean = sum[i] / draws;
            assertEquals(MU[i], mean, 4 * Math.sqrt(var / draws), "mean of the drawn expected returns " + i);
            double spread = (sumSq[i] - draws * mean * mean) / (draws - 1);
            assertEquals(var, spread, 4 * Math.sqrt(2.0 / (draws - 1)) * var, "spread of the drawn returns " + i);
            // Var(s_ii) = 2σ_ii²/(T − 1) for normal data; its mean over D draws has standard error
            // σ_ii·sqrt(2/((T − 1)D)).
            assertEquals(SIGMA[i][i], covSum[i][i] / draws, 4 * SIGMA[i][i] * Math.sqrt(2.0 / ((t - 1.0) * draws)),
                    "mean drawn variance " + i);
        }
    }

    @Test
    void theSpreadOfTheDrawnMeansShrinksAsOneOverRootT() {
        // Standard deviation of a mean of T observations ∝ 1/√T: four times the history, half the spread.
        double short_ = spreadOfFirstMean(100);
        double long_ = spreadOfFirstMean(400);
        assertEquals(2.0, short_ / long_, 0.15, "ratio of spreads");
    }

    private static double spreadOfFirstMean(int t) {
        ParametricDraws d = ParametricDraws.of(MU, SIGMA, t, 12,
                Reestimation.of(CovarianceMethod.LEDOIT_WOLF_IDENTITY), 31);
        int draws = 2000;
        double s = 0;
        double s2 = 0;
        for (int k = 0; k < draws; k++) {
            DrawnAssumptions a = d.draw(k);
            assertTrue(a.shrinkage() >= 0 && a.shrinkage() <= 1, "a Ledoit–Wolf intensity");
            double m = a.expectedReturns()[3];
            s += m;
            s2 += m * m;
        }
        double mean = s / draws;
        return Math.sqrt((s2 - draws * mean * mean) / (draws - 1));
    }

    @Test
    void drawsAreTheSameBitForBitOnOneAndOnFourThreads() throws Exception {
        ParametricDraws d = ParametricDraws.of(MU, SIGMA, 36, 12,
                Reestimation.of(CovarianceMethod.LEDOIT_WOLF_CONSTANT_CORRELATION), 77);
        int draws = 64;
        DrawnAssumptions[] one = new DrawnAssumptions[draws];
        for (int k = 0; k < draws; k++) {
            one[k] = d.draw(k);
        }
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
            assertArrayEquals(one[k].expectedReturns(), four[k].expectedReturns(), 0.0, "draw " + k);
            for (int i = 0; i < MU.length; i++) {
                assertArrayEquals(one[k].covariance()[i], four[k].covariance()[i], 0.0, "draw " + k);
            }
            assertEquals(Double.doubleToRawLongBits(one[k].shrinkage()),
                    Double.doubleToRawLongBits(four[k].shrinkage()));
        }
    }

    @Test
    void badInputsAreRefused() {
        InputException e = assertThrows(InputException.class,
                () -> ParametricDraws.of(MU, SIGMA, 1, 12, Reestimation.sample(), 1));
        assertEquals("observations", e.key().orElseThrow());
        assertThrows(InputException.class, () -> ParametricDraws.of(MU, SIGMA, 10, 0, Reestimation.sample(), 1));
        double[][] indefinite = {{0.04, 0.05}, {0.05, 0.04}}; // a correlation of 1.25
        assertThrows(InputException.class,
                () -> ParametricDraws.of(new double[] {0.05, 0.05}, indefinite, 10, 12, Reestimation.sample(), 1));
        assertThrows(InputException.class, () -> Reestimation.ewma(1.5));
        assertThrows(InputException.class, () -> new Reestimation(CovarianceMethod.SAMPLE, 0.9));
    }

    static double[][] transpose(double[][] a) {
        double[][] t = new double[a[0].length][a.length];
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < a[0].length; j++) {
                t[j][i] = a[i][j];
            }
        }
        return t;
    }
}
