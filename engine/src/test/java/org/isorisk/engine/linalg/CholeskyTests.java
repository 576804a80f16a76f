package org.isorisk.engine.linalg;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.isorisk.engine.Tolerances;
import org.junit.jupiter.api.Test;

/**
 * The blocked factorisation against Commons Math's {@code CholeskyDecomposition} and against reconstruction,
 * on sizes below, at and around multiples of the block size, one and two threads.
 */
class CholeskyTests {

    /** Sizes around the block size (64) and the threshold for two threads (384). */
    private static final int[] SIZES = {1, 2, 7, 63, 64, 65, 129, 200, 383, 384, 449};

    @Test
    void factorReconstructsTheMatrixToTwelveDigits() {
        for (int n : SIZES) {
            double[][] a = spd(n, n, 0.05);
            for (int threads : new int[] {1, 2}) {
                Cholesky c = Cholesky.factor(a, threads);
                assertNotNull(c, "n=" + n);
                double[][] l = lower(c);
                double worst = 0;
                for (int i = 0; i < n; i++) {
                    for (int j = 0; j <= i; j++) {
                        double s = 0;
                        double[] li = l[i];
                        double[] lj = l[j];
                        for (int k = 0; k <= j; k++) {
                            s += li[k] * lj[k];
                        }
                        // Backward stability (Higham 2002, theorem 10.3): |LL' − A| ≤ γ_{n+1}|L||L'|, and
                        // |L||L'| ≤ sqrt(a_ii a_jj) entrywise by Cauchy–Schwarz.
                        worst = Math.max(worst, Math.abs(s - a[i][j]) / Math.sqrt(a[i][i] * a[j][j]));
                    }
                    if (i + 1 < n) {
                        assertEquals(0.0, c.factorEntry(i, i + 1), 0.0, "above the diagonal");
                    }
                }
                assertTrue(worst <= Tolerances.TIGHT, "n=" + n + " threads=" + threads + ": " + worst);
            }
        }
    }

    @Test
    void factorAgreesWithCommonsMath() {
        for (int n : new int[] {1, 2, 7, 63, 64, 65, 129, 385}) {
            double[][] a = spd(n, 100 + n, 0.05);
            Cholesky c = Cholesky.factor(a, 2);
            RealMatrix ref = new CholeskyDecomposition(new Array2DRowRealMatrix(a)).getL();
            double worst = 0;
            for (int i = 0; i < n; i++) {
                for (int j = 0; j <= i; j++) {
                    // |L_ij| ≤ sqrt(a_ii) (row i of L has norm sqrt(a_ii)): the natural scale of entry (i, j).
                    worst = Math.max(worst, Math.abs(c.factorEntry(i, j) - ref.getEntry(i, j)) / Math.sqrt(a[i][i]));
                }
            }
            assertTrue(worst <= Tolerances.TIGHT, "n=" + n + ": " + worst);
        }
    }

    @Test
    void everyBlockSizeGivesTheSameFactorToRounding() {
        double[][] a = spd(150, 21, 0.05);
        Cholesky reference = Cholesky.factor(a, 1, 150); // one block: the unblocked algorithm
        for (int block : new int[] {4, 7, 16, 64, 100}) {
            Cholesky c = Cholesky.factor(a, 1, block);
            for (int i = 0; i < a.length; i++) {
                for (int j = 0; j <= i; j++) {
                    assertEquals(reference.factorEntry(i, j), c.factorEntry(i, j), Tolerances.TIGHT * Math.sqrt(a[i][i]),
                            "block " + block + " entry " + i + "," + j);
                }
            }
        }
    }

    @Test
    void twoThreadsGiveBitForBitTheSameFactorAsOne() {
        double[][] a = spd(449, 5, 0.05);
        Cholesky one = Cholesky.factor(a, 1);
        Cholesky two = Cholesky.factor(a, 2);
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j <= i; j++) {
                assertEquals(one.factorEntry(i, j), two.factorEntry(i, j), 0.0);
            }
        }
    }

    @Test
    void largeSystemsFactoredWithTwoThreadsGiveBitForBitTheSameSolution() {
        int n = 1061;
        // Diagonally dominant, hence positive definite, and cheap to build at this size.
        SplittableRandom r = new SplittableRandom(11);
        double[][] a = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < i; j++) {
                double v = r.nextDouble() - 0.5;
                a[i][j] = v;
                a[j][i] = v;
            }
            a[i][i] = n;
        }
        double[] b = new double[n];
        for (int i = 0; i < n; i++) {
            b[i] = r.nextDouble();
        }
        double[] one = Cholesky.factor(a, 1).solve(b);
        Cholesky two = Cholesky.factor(a, 2);
        assertArrayEquals(one, two.solve(b), 0.0);
        // And it solves the system: residual of a well-conditioned system at rounding level.
        double worst = 0;
        double[] x = two.solve(b);
        for (int i = 0; i < n; i++) {
            double s = 0;
            for (int j = 0; j < n; j++) {
                s += a[i][j] * x[j];
            }
            worst = Math.max(worst, Math.abs(s - b[i]));
        }
        assertTrue(worst <= Tolerances.TIGHT * n, "residual " + worst);
    }

    @Test
    void solvesMatchCommonsMathAndSeveralRightHandSidesMatchOneAtATime() {
        for (int n : new int[] {1, 5, 64, 130, 400}) {
            double[][] a = spd(n, 200 + n, 0.05);
            Cholesky c = Cholesky.factor(a);
            SplittableRandom r = new SplittableRandom(n);
            double[][] b = new double[6][n];
            for (double[] v : b) {
                for (int i = 0; i < n; i++) {
                    v[i] = r.nextDouble() - 0.5;
                }
            }
            double[][] together = c.solve(b);
            for (int k = 0; k < b.length; k++) {
                double[] alone = c.solve(b[k]);
                double[] ref = new CholeskyDecomposition(new Array2DRowRealMatrix(a)).getSolver()
                        .solve(new org.apache.commons.math3.linear.ArrayRealVector(b[k])).toArray();
                double scale = 0;
                for (double x : ref) {
                    scale = Math.max(scale, Math.abs(x));
                }
                for (int i = 0; i < n; i++) {
                    assertEquals(ref[i], alone[i], Tolerances.CLOSED_FORM * scale, "n=" + n + " i=" + i);
                    assertEquals(alone[i], together[k][i], Tolerances.TIGHT * scale, "n=" + n + " rhs " + k);
                }
            }
            // The inputs are not modified.
            assertArrayEquals(spd(n, 200 + n, 0.05)[0], a[0], 0.0);
        }
    }

    @Test
    void aMatrixThatIsNotPositiveDefiniteIsDetected() {
        // Indefinite from the start: a 2×2 block with determinant < 0.
        assertNull(Cholesky.factor(new double[][] {{1, 2}, {2, 1}}));
        assertNull(Cholesky.factor(new double[][] {{0}}));
        assertNull(Cholesky.factor(new double[][] {{-1}}));
        // Positive definite except for a defect deep in the third block: the last pivot turns negative.
        for (int n : new int[] {150, 450}) {
            double[][] a = spd(n, 9, 0.05);
            Cholesky ok = Cholesky.factor(a, 2);
            assertNotNull(ok);
            // Subtract slightly more than the last pivot squared from the last diagonal entry: the Schur
            // complement there becomes negative while every leading block stays positive definite.
            double lastPivot = ok.factorEntry(n - 1, n - 1);
            a[n - 1][n - 1] -= lastPivot * lastPivot * 1.01;
            assertNull(Cholesky.factor(a, 2), "n=" + n);
            assertNull(Cholesky.factor(a, 1), "n=" + n);
            a[n - 1][n - 1] += lastPivot * lastPivot * 0.02;
            assertNotNull(Cholesky.factor(a, 2), "n=" + n + " positive definite again");
        }
        // Not a number anywhere makes a pivot fail too.
        double[][] nan = spd(70, 3, 0.05);
        nan[69][69] = Double.NaN;
        assertNull(Cholesky.factor(nan));
    }

    @Test
    void minimumPivotBoundsTheSmallestEigenvalueFromAbove() {
        double[][] a = spd(90, 12, 0.01);
        Cholesky c = Cholesky.factor(a);
        double smallest = Spectrum.exact(a).smallest();
        assertTrue(c.minPivot() * c.minPivot() >= smallest * (1 - Tolerances.TIGHT));
    }

    private static double[][] lower(Cholesky c) {
        int n = c.size();
        double[][] l = new double[n][];
        for (int i = 0; i < n; i++) {
            l[i] = new double[i + 1];
            for (int j = 0; j <= i; j++) {
                l[i][j] = c.factorEntry(i, j);
            }
        }
        return l;
    }

    /** A random symmetric positive definite matrix G G'/n + δ I, G uniform in [−1, 1]. */
    @Test
    void factoringRowsInPlaceGivesTheSameFactorAndItsProductIsTheMatrix() {
        for (int n : new int[] {5, 70, Cholesky.PARALLEL_MIN + 16}) {
            double[][] a = spd(n, 41 + n, 0.05);
            double[][] rows = new double[n][];
            for (int i = 0; i < n; i++) {
                rows[i] = java.util.Arrays.copyOf(a[i], i + 1);
            }
            assertTrue(Cholesky.factorRowsInPlace(rows, 2));
            Cholesky whole = Cholesky.factor(a, 2);
            for (int i = 0; i < n; i++) {
                for (int j = 0; j <= i; j++) {
                    assertEquals(whole.factorEntry(i, j), rows[i][j], 0.0, "same algorithm, same entry " + i + "," + j);
                }
            }
            Cholesky wrapped = Cholesky.ofRows(rows);
            double[] x = new double[n];
            for (int i = 0; i < n; i++) {
                x[i] = Math.sin(i + 1.0);
            }
            // Reference: Commons Math's matrix-vector product with the matrix itself.
            double[] ref = new org.apache.commons.math3.linear.Array2DRowRealMatrix(a).operate(x);
            double[] got = wrapped.multiply(x);
            double scale = 0;
            for (double v : ref) {
                scale = Math.max(scale, Math.abs(v));
            }
            for (int i = 0; i < n; i++) {
                assertEquals(ref[i], got[i], 1e-12 * n * Math.max(1, scale), "L L'x entry " + i);
            }
            double[] x2 = new double[n];
            for (int i = 0; i < n; i++) {
                x2[i] = 1.0 / (i + 2.0);
            }
            double[][] both = wrapped.multiply(new double[][] {x, x2});
            double[] ref2 = new org.apache.commons.math3.linear.Array2DRowRealMatrix(a).operate(x2); // Commons Math
            for (int i = 0; i < n; i++) {
                assertEquals(got[i], both[0][i], 1e-12 * n * Math.max(1, scale), "block product, first vector " + i);
                assertEquals(ref2[i], both[1][i], 1e-12 * n * Math.max(1, scale), "block product, second vector " + i);
            }
            double[] back = wrapped.solve(got);
            for (int i = 0; i < n; i++) {
                assertEquals(x[i], back[i], 1e-8, "solve undoes multiply, entry " + i);
            }
        }
    }

    @Test
    void aMatrixThatIsNotPositiveDefiniteIsReportedWhenFactoredInPlace() {
        double[][] rows = {{1}, {2, 1}}; // [[1, 2], [2, 1]] has eigenvalues 3 and −1 (by hand)
        assertFalse(Cholesky.factorRowsInPlace(rows, 1));
        assertThrows(IllegalArgumentException.class, () -> Cholesky.ofRows(new double[][] {{1}, {0.5, 0}}));
    }

    static double[][] spd(int n, long seed, double delta) {
        SplittableRandom r = new SplittableRandom(seed);
        double[][] g = new double[n][n];
        for (double[] row : g) {
            for (int j = 0; j < n; j++) {
                row[j] = 2 * r.nextDouble() - 1;
            }
        }
        double[][] a = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double s = 0;
                for (int p = 0; p < n; p++) {
                    s += g[i][p] * g[j][p];
                }
                a[i][j] = s / n;
                a[j][i] = s / n;
            }
            a[i][i] += delta;
        }
        return a;
    }
}
