package org.isorisk.engine.linalg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.isorisk.engine.Tolerances;
import org.junit.jupiter.api.Test;

/** The Lanczos estimate against Commons Math's full symmetric eigendecomposition. */
class SpectrumTests {

    @Test
    void lanczosExtremesAgreeWithTheFullEigendecompositionToTheStatedAccuracy() {
        for (int n : new int[] {30, 120, 260}) {
            for (double delta : new double[] {0.05, 1e-3}) {
                double[][] a = CholeskyTests.spd(n, 31 * n, delta);
                check(a, "random n=" + n + " δ=" + delta);
            }
        }
    }

    @Test
    void lanczosHandlesAClusteredBottomOfTheSpectrum() {
        // A factor model: three strong directions above many nearly equal idiosyncratic variances, the hard
        // case for the smallest eigenvalue (a tight cluster at the bottom).
        int n = 300;
        SplittableRandom r = new SplittableRandom(4);
        double[][] b = new double[n][3];
        for (double[] row : b) {
            for (int k = 0; k < 3; k++) {
                row[k] = 0.15 * (r.nextDouble() - 0.5);
            }
        }
        double[][] a = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double s = 0;
                for (int k = 0; k < 3; k++) {
                    s += b[i][k] * b[j][k];
                }
                a[i][j] = s;
                a[j][i] = s;
            }
            a[i][i] += 0.02 + 0.002 * r.nextDouble();
        }
        check(a, "factor model");
    }

    @Test
    void withoutAFactorTheNegativeSmallestEigenvalueIsFound() {
        double[][] a = CholeskyTests.spd(150, 8, 0.05);
        // Shift down so that a few eigenvalues turn negative.
        double shift = new EigenDecomposition(new Array2DRowRealMatrix(a)).getRealEigenvalues()[145];
        for (int i = 0; i < a.length; i++) {
            a[i][i] -= shift;
        }
        Spectrum est = Spectrum.iterative(a, null);
        double[] ev = new EigenDecomposition(new Array2DRowRealMatrix(a)).getRealEigenvalues();
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double v : ev) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        assertTrue(est.smallest() < 0);
        assertEquals(lo, est.smallest(), 1e-5 * hi);
        assertEquals(hi, est.largest(), 1e-5 * hi);
        assertFalse(est.exact());
        assertEquals(Double.POSITIVE_INFINITY, est.conditionNumber());
    }

    @Test
    void smallMatricesUseTheExactDecomposition() {
        double[][] a = {{4, 1}, {1, 3}};
        Spectrum s = Spectrum.of(a);
        // Eigenvalues of [[4, 1], [1, 3]]: (7 ± √5)/2, by hand.
        assertEquals((7 - Math.sqrt(5)) / 2, s.smallest(), Tolerances.TIGHT);
        assertEquals((7 + Math.sqrt(5)) / 2, s.largest(), Tolerances.TIGHT);
        assertTrue(s.exact());
        assertEquals((7 + Math.sqrt(5)) / (7 - Math.sqrt(5)), s.conditionNumber(), Tolerances.TIGHT);
    }

    @Test
    void largeMatricesGetTheIterativeEstimateThroughTheFrontDoor() {
        double[][] a = CholeskyTests.spd(Spectrum.EXACT_LIMIT + 20, 77, 0.05);
        Spectrum s = Spectrum.of(a, Cholesky.factor(a));
        assertFalse(s.exact());
        assertTrue(s.smallest() > 0 && s.largest() > s.smallest());
    }

    private static void check(double[][] a, String what) {
        Spectrum est = Spectrum.iterative(a, Cholesky.factor(a));
        RealMatrix m = new Array2DRowRealMatrix(a);
        double[] ev = new EigenDecomposition(m).getRealEigenvalues();
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double v : ev) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        // The documented accuracy: each extreme to a relative Spectrum.RELATIVE_ACCURACY (with a margin of 10
        // for the Ritz-gap estimate), and never outside the spectrum.
        double tol = 10 * Spectrum.RELATIVE_ACCURACY;
        assertEquals(lo, est.smallest(), tol * lo, what + " smallest");
        assertEquals(hi, est.largest(), tol * hi, what + " largest");
        assertTrue(est.largest() <= hi * (1 + Tolerances.TIGHT), what + " largest inside the spectrum");
        assertTrue(est.smallest() >= lo * (1 - Tolerances.TIGHT), what + " smallest inside the spectrum");
        assertEquals(hi / lo, est.conditionNumber(), 2 * tol * hi / lo, what + " condition number");
    }
}
