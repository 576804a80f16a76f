package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.stat.correlation.Covariance;
import org.apache.commons.math3.stat.regression.OLSMultipleLinearRegression;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;
import org.junit.jupiter.api.Test;

/**
 * Stambaugh's (1997) combined estimator against a direct computation written independently here: Commons Math's
 * OLS regression of each short history on the longer ones over their common period, then
 * {@code μ̂₂ = α + Bμ̂₁}, {@code Σ̂₂₁ = BΣ̂₁₁}, {@code Σ̂₂₂ = Σₑ + BΣ̂₁₁B'}.
 */
class UnequalHistoriesTests {

    private static final List<String> ASSETS = List.of("Equity", "Bonds", "Credit", "Private Debt", "Infrastructure");

    /** Invented correlated monthly returns (illustrative); the last two assets start late (NaN before). */
    private static double[][] rows(int len, int startFourth, int startFifth, long seed) {
        Xoshiro256PlusPlus g = new RandomStreams(seed).stream(0);
        double[][] r = new double[len][5];
        for (int t = 0; t < len; t++) {
            double f = 0.04 * g.nextGaussian();
            r[t][0] = 0.006 + f + 0.01 * g.nextGaussian();
            r[t][1] = 0.003 - 0.1 * f + 0.012 * g.nextGaussian();
            r[t][2] = 0.004 + 0.3 * f + 0.015 * g.nextGaussian();
            r[t][3] = t < startFourth ? Double.NaN : 0.005 + 0.4 * f + 0.3 * r[t][2] + 0.02 * g.nextGaussian();
            r[t][4] = t < startFifth ? Double.NaN : 0.005 + 0.5 * f + 0.025 * g.nextGaussian();
        }
        return r;
    }

    @Test
    void twoBlocksAgreeWithTheRegressionComputedIndependently() {
        // Assets 0–2 have 120 returns, assets 3 and 4 the last 48.
        double[][] r = rows(120, 72, 72, 5);
        for (UnequalHistories.Divisor d : UnequalHistories.Divisor.values()) {
            CombinedMoments ours = UnequalHistories.combine(ASSETS, r, d);
            Reference ref = Reference.of(r, new int[] {0, 1, 2}, new int[] {3, 4}, 72, d, null, null);
            compare(ref, ours, d.toString());
            assertArrayEquals(new int[] {0, 0, 0, 72, 72}, ours.firstRows());
            assertArrayEquals(new int[] {120, 120, 120, 48, 48}, ours.observations());
        }
    }

    @Test
    void threeStartDatesAreCombinedStartByStart() {
        // Assets 0–2 from row 0, asset 3 from row 40, asset 4 from row 90: asset 3 is regressed on 0–2 over rows
        // 40…, then asset 4 on 0–3 over rows 90… with the combined estimates of 0–3.
        double[][] r = rows(150, 40, 90, 6);
        UnequalHistories.Divisor d = UnequalHistories.Divisor.UNBIASED;
        CombinedMoments ours = UnequalHistories.combine(ASSETS, r, d);
        Reference step1 = Reference.of(r, new int[] {0, 1, 2}, new int[] {3}, 40, d, null, null);
        Reference step2 = Reference.of(r, new int[] {0, 1, 2, 3}, new int[] {4}, 90, d, step1.mean, step1.cov);
        compare(step2, ours, "three starts");
        double smallest = new EigenDecomposition(new Array2DRowRealMatrix(ours.covariance())).getRealEigenvalues()[4];
        assertTrue(smallest > 0, "positive definite by construction: " + smallest);
    }

    @Test
    void equalLengthsGiveThePlainSampleEstimates() {
        double[][] r = rows(60, 0, 0, 7);
        CombinedMoments ours = UnequalHistories.combine(ASSETS, r, UnequalHistories.Divisor.UNBIASED);
        // Commons Math's Covariance (divisor T − 1) and the column means.
        double[][] ref = new Covariance(r).getCovarianceMatrix().getData();
        for (int i = 0; i < 5; i++) {
            double m = 0;
            for (double[] row : r) {
                m += row[i] / r.length;
            }
            assertEquals(m, ours.means()[i], Tolerances.TIGHT);
            assertEquals(m, ours.ownMeans()[i], Tolerances.TIGHT);
            for (int j = 0; j < 5; j++) {
                assertEquals(ref[i][j], ours.covariance()[i][j], Tolerances.TIGHT * ref[i][i]);
            }
        }
        CombinedMoments ml = UnequalHistories.combine(ASSETS, r, UnequalHistories.Divisor.MAXIMUM_LIKELIHOOD);
        assertEquals(ref[0][1] * 59 / 60, ml.covariance()[0][1], Tolerances.TIGHT * ref[0][0], "divisor T");
    }

    @Test
    void gapsAndTooShortCommonPeriodsAreRefused() {
        double[][] gap = rows(50, 10, 10, 8);
        gap[30][3] = Double.NaN;
        InputException e = assertThrows(InputException.class,
                () -> UnequalHistories.combine(ASSETS, gap, UnequalHistories.Divisor.UNBIASED));
        assertEquals("Private Debt", e.asset().orElseThrow());
        assertTrue(e.problem().contains("gap"), e.getMessage());
        double[][] tooShort = rows(50, 46, 46, 8); // 4 common returns, 3 assets to regress on: 5 needed
        InputException s = assertThrows(InputException.class,
                () -> UnequalHistories.combine(ASSETS, tooShort, UnequalHistories.Divisor.UNBIASED));
        assertEquals("asset 'Private Debt': the history is too short to be regressed on the 3 assets whose histories "
                + "start earlier: 4 returns in common, at least 5 needed; fix: give a longer history of this asset, or "
                + "fewer assets with longer histories", s.getMessage());
    }

    private static void compare(Reference ref, CombinedMoments ours, String label) {
        double scale = ref.cov[0][0];
        for (int i = 0; i < 5; i++) {
            assertEquals(ref.mean[i], ours.means()[i], Tolerances.CLOSED_FORM * 0.01, label + " mean " + i);
            for (int j = 0; j < 5; j++) {
                assertEquals(ref.cov[i][j], ours.covariance()[i][j], Tolerances.CLOSED_FORM * scale,
                        label + " covariance " + i + "," + j);
            }
        }
    }

    /** The direct computation: OLS per short asset, then the intercept-and-slope form of the estimator. */
    private record Reference(double[] mean, double[][] cov) {

        /**
         * @param longer   the assets that start earlier
         * @param shorter  the assets that start at {@code start}
         * @param known    the combined mean of all assets so far (null: the longer ones' full-sample moments)
         * @param knownCov the combined covariance so far
         */
        static Reference of(double[][] r, int[] longer, int[] shorter, int start, UnequalHistories.Divisor d,
                            double[] known, double[][] knownCov) {
            int n = r[0].length;
            int len = r.length;
            double[] mean = known == null ? new double[n] : known.clone();
            double[][] cov = new double[n][n];
            if (knownCov != null) {
                for (int i = 0; i < n; i++) {
                    cov[i] = knownCov[i].clone();
                }
            } else {
                double[][] x = new double[len][longer.length];
                for (int t = 0; t < len; t++) {
                    for (int a = 0; a < longer.length; a++) {
                        x[t][a] = r[t][longer[a]];
                    }
                }
                double[][] c = new Covariance(x).getCovarianceMatrix().getData(); // divisor T − 1
                for (int a = 0; a < longer.length; a++) {
                    double m = 0;
                    for (int t = 0; t < len; t++) {
                        m += r[t][longer[a]] / len;
                    }
                    mean[longer[a]] = m;
                    for (int b = 0; b < longer.length; b++) {
                        cov[longer[a]][longer[b]] = d == UnequalHistories.Divisor.UNBIASED ? c[a][b]
                                : c[a][b] * (len - 1) / len;
                    }
                }
            }
            int s = len - start;
            double[][] xs = new double[s][longer.length];
            for (int t = 0; t < s; t++) {
                for (int a = 0; a < longer.length; a++) {
                    xs[t][a] = r[start + t][longer[a]];
                }
            }
            List<double[]> slopes = new ArrayList<>();
            List<double[]> residuals = new ArrayList<>();
            for (int b : shorter) {
                double[] y = new double[s];
                for (int t = 0; t < s; t++) {
                    y[t] = r[start + t][b];
                }
                OLSMultipleLinearRegression ols = new OLSMultipleLinearRegression();
                ols.newSampleData(y, xs);
                double[] beta = ols.estimateRegressionParameters(); // intercept first
                double[] slope = java.util.Arrays.copyOfRange(beta, 1, beta.length);
                slopes.add(slope);
                residuals.add(ols.estimateResiduals());
                double mu = beta[0];
                for (int a = 0; a < longer.length; a++) {
                    mu += slope[a] * mean[longer[a]];
                }
                mean[b] = mu;
            }
            double div = d == UnequalHistories.Divisor.UNBIASED ? s - 1 : s;
            for (int p = 0; p < shorter.length; p++) {
                double[] bp = slopes.get(p);
                for (int a = 0; a < longer.length; a++) {
                    double v = 0;
                    for (int c = 0; c < longer.length; c++) {
                        v += bp[c] * cov[longer[c]][longer[a]];
                    }
                    cov[shorter[p]][longer[a]] = v;
                    cov[longer[a]][shorter[p]] = v;
                }
                for (int q = 0; q < shorter.length; q++) {
                    double[] bq = slopes.get(q);
                    double e = 0;
                    for (int t = 0; t < s; t++) {
                        e += residuals.get(p)[t] * residuals.get(q)[t];
                    }
                    double v = e / div;
                    for (int a = 0; a < longer.length; a++) {
                        for (int c = 0; c < longer.length; c++) {
                            v += bp[a] * cov[longer[a]][longer[c]] * bq[c];
                        }
                    }
                    cov[shorter[p]][shorter[q]] = v;
                }
            }
            return new Reference(mean, cov);
        }
    }
}
