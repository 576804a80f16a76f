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
    void largeMatricesWithAKnownSpectrumAreEstimatedToTheStatedAccuracy() {
        // Above Spectrum.SINGLE_PRECISION_MIN the estimate starts in single precision and is refined in double.
        checkKnown(0.0095, 9.0);
    }

    @Test
    void anIllConditionedLargeMatrixStillMeetsTheStatedAccuracy() {
        // Condition number 1e9: single precision cannot resolve the smallest eigenvalue, so the double-precision
        // check must catch it and the double run decide.
        checkKnown(9e-9, 9.0);
    }

    /**
     * Reference by construction: Σ = H D H with the reflection H = I − 2vv' (v a unit vector) has exactly the
     * eigenvalues D (Golub & Van Loan, "Matrix Computations", 4th ed., 2013, §5.1: Householder reflections are
     * orthogonal and symmetric), and takes O(n²) to build. D: a dense cluster of idiosyncratic-like variances,
     * the given smallest just below it, the given largest and two more factor-like ones above.
     */
    private static void checkKnown(double smallest, double largest) {
        double[][] a = knownSpectrum(smallest, largest, new double[Spectrum.SINGLE_PRECISION_MIN + 76]);
        Spectrum s = Spectrum.of(a, Cholesky.factor(a));
        assertFalse(s.exact());
        double tol = Spectrum.RELATIVE_ACCURACY;
        // Building H D H in double precision perturbs the eigenvalues by about 1e-16·λmax, which is what
        // limits the smallest one's relative accuracy when the condition number is large.
        double floor = 1e-14 * largest;
        assertEquals(smallest, s.smallest(), tol * smallest + floor, s.toString());
        assertEquals(largest, s.largest(), tol * largest, s.toString());
        assertTrue(s.largest() <= largest * (1 + 1e-12), s.toString());
    }

    /** H D H for the eigenvalues d (filled here: the cluster, the given extremes and two more; see checkKnown). */
    private static double[][] knownSpectrum(double smallest, double largest, double[] d) {
        int n = d.length;
        SplittableRandom r = new SplittableRandom(5);
        for (int i = 0; i < n; i++) {
            d[i] = 0.01 + 0.03 * r.nextDouble();
        }
        d[0] = smallest;
        d[1] = largest;
        d[2] = 3.5;
        d[3] = 1.2;
        double[] v = new double[n];
        double norm = 0;
        for (int i = 0; i < n; i++) {
            v[i] = r.nextDouble() - 0.5;
            norm += v[i] * v[i];
        }
        norm = Math.sqrt(norm);
        double vdv = 0;
        for (int i = 0; i < n; i++) {
            v[i] /= norm;
            vdv += v[i] * d[i] * v[i];
        }
        double[][] a = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                // (H D H)_ij = D_i δ_ij − 2 v_i v_j (D_i + D_j) + 4 v_i v_j (v'Dv)
                a[i][j] = (i == j ? d[i] : 0) - 2 * v[i] * v[j] * (d[i] + d[j]) + 4 * v[i] * v[j] * vdv;
            }
        }
        return a;
    }

    @Test
    void theFactorOnlyEstimateMeetsTheConditionAccuracyAgainstTheFullEigendecomposition() {
        // Spectrum.ofFactor at Spectrum.CONDITION_ACCURACY, the certificate's estimate, against Commons Math's
        // EigenDecomposition of the matrix; n = 40 takes the exact path (from L L'), the others Lanczos.
        for (int n : new int[] {40, 120, 260}) {
            for (double delta : new double[] {0.05, 1e-3}) {
                double[][] a = CholeskyTests.spd(n, 17 * n, delta);
                checkFactorOnly(a, "random n=" + n + " δ=" + delta);
            }
        }
    }

    @Test
    void aLargeMatrixWithAKnownSpectrumMeetsTheConditionAccuracyFromItsFactor() {
        // Above Spectrum.SINGLE_PRECISION_MIN: the single-precision run with packed columns, refined in double.
        // Reference by construction (H D H, see knownSpectrum).
        double[] d = new double[Spectrum.SINGLE_PRECISION_MIN + 76];
        double[][] a = knownSpectrum(0.0095, 9.0, d);
        Spectrum s = Spectrum.ofFactor(Cholesky.factor(a), Spectrum.CONDITION_ACCURACY);
        assertFalse(s.exact());
        double tol = Spectrum.CONDITION_ACCURACY;
        assertEquals(0.0095, s.smallest(), tol * 0.0095, s.toString());
        assertEquals(9.0, s.largest(), tol * 9.0, s.toString());
        assertTrue(s.largest() <= 9.0 * (1 + 1e-12) && s.smallest() >= 0.0095 * (1 - 1e-10), s.toString());
        // The default accuracy through the same packed single-precision path.
        Spectrum fine = Spectrum.of(a, Cholesky.factor(a));
        assertEquals(0.0095, fine.smallest(), Spectrum.RELATIVE_ACCURACY * 0.0095, fine.toString());
    }

    @Test
    void anAccuracyOutsideTheSupportedRangeIsRefused() {
        double[][] a = CholeskyTests.spd(Spectrum.EXACT_LIMIT + 10, 3, 0.05);
        org.junit.jupiter.api.Assertions.assertThrows(IllegalArgumentException.class,
                () -> Spectrum.iterative(a, Cholesky.factor(a), 0.5));
        org.junit.jupiter.api.Assertions.assertThrows(IllegalArgumentException.class,
                () -> Spectrum.ofFactor(Cholesky.factor(a), 0));
    }

    private static void checkFactorOnly(double[][] a, String what) {
        Spectrum est = Spectrum.ofFactor(Cholesky.factor(a), Spectrum.CONDITION_ACCURACY);
        double[] ev = new EigenDecomposition(new Array2DRowRealMatrix(a)).getRealEigenvalues(); // Commons Math
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double v : ev) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        // The stopping rule's error estimate (the gap to the next Ritz value standing in for the true gap) can
        // understate the error when the bottom of the spectrum is clustered, so, as for the default accuracy
        // above, a margin over the asked accuracy: 5 (measured errors reach about 2.6 % on these matrices).
        double tol = 5 * Spectrum.CONDITION_ACCURACY;
        assertEquals(lo, est.smallest(), tol * lo, what + " smallest");
        assertEquals(hi, est.largest(), tol * hi, what + " largest");
        assertTrue(est.largest() <= hi * (1 + 1e-10), what + " largest inside the spectrum");
        assertTrue(est.smallest() >= lo * (1 - 1e-10), what + " smallest inside the spectrum");
        assertEquals(hi / lo, est.conditionNumber(), 2 * tol * hi / lo, what + " condition number");
        assertTrue(est.conditionNumber() <= hi / lo * (1 + 1e-10), what + " condition number not overstated");
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
