package org.isorisk.engine.linalg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class UpdatableCholeskyTests {

    @Test
    void solvesMatchAFreshFactorisationAfterManyInsertionsAndDeletions() {
        double[][] sigma = FactorModels.universe(60, 7).covariance();
        UpdatableCholesky chol = new UpdatableCholesky(60);
        List<Integer> members = new ArrayList<>();
        Random rnd = new Random(11);
        for (int step = 0; step < 400; step++) {
            boolean add = members.size() < 2 || (members.size() < 50 && rnd.nextDouble() < 0.6);
            if (add) {
                int i;
                do {
                    i = rnd.nextInt(60);
                } while (members.contains(i));
                double[] col = new double[members.size()];
                for (int k = 0; k < members.size(); k++) {
                    col[k] = sigma[members.get(k)][i];
                }
                assertTrue(chol.append(col, sigma[i][i], 1e-14) > 1e-14);
                members.add(i);
            } else {
                int pos = rnd.nextInt(members.size());
                chol.remove(pos);
                members.remove(pos);
            }
            if (step % 50 == 49) {
                checkAgainstCommonsMath(sigma, members, chol);
            }
        }
    }

    /** Reference: Apache Commons Math's Cholesky decomposition of the same block (independent library). */
    private static void checkAgainstCommonsMath(double[][] sigma, List<Integer> members, UpdatableCholesky chol) {
        int m = members.size();
        double[][] block = new double[m][m];
        double[] b = new double[m];
        for (int i = 0; i < m; i++) {
            b[i] = 1 + i % 3;
            for (int j = 0; j < m; j++) {
                block[i][j] = sigma[members.get(i)][members.get(j)];
            }
        }
        double[] expected = new CholeskyDecomposition(new Array2DRowRealMatrix(block)).getSolver()
                .solve(new ArrayRealVector(b)).toArray();
        double[] x = b.clone();
        chol.solveInPlace(x);
        assertEquals(m, chol.size());
        for (int i = 0; i < m; i++) {
            assertEquals(expected[i], x[i], Tolerances.CLOSED_FORM * Math.max(1, Math.abs(expected[i])));
        }
    }

    @Test
    void refusesAnAppendThatMakesTheMatrixSingular() {
        UpdatableCholesky chol = new UpdatableCholesky(3);
        chol.append(new double[0], 4.0, 1e-14);
        // [[4, 2], [2, 1]] is singular: the second row is half the first.
        double rel = chol.append(new double[] {2.0}, 1.0, 1e-14);
        assertTrue(rel <= 1e-14, "relative pivot " + rel);
        assertEquals(1, chol.size());
    }

    @Test
    void halfSolvesAndColumnsCarriedThroughTheRotationsOfADeletionMatchAFreshFactor() {
        // Reference: Apache Commons Math's Cholesky factor of the same block (independent library); the factor of a
        // positive definite matrix with a positive diagonal is unique, so L itself can be compared.
        double[][] sigma = FactorModels.universe(40, 5).covariance();
        UpdatableCholesky chol = new UpdatableCholesky(40);
        List<Integer> members = new ArrayList<>();
        double[] y = new double[40]; // L⁻¹b for b_i = 1 + i (by asset), carried along
        double[] col = new double[40]; // L⁻¹σ_{F,j} for the outside asset j = 39, carried along
        double[] cos = new double[40];
        double[] sin = new double[40];
        double[] old = new double[40];
        Random rnd = new Random(23);
        for (int step = 0; step < 300; step++) {
            boolean add = members.size() < 2 || (members.size() < 30 && rnd.nextDouble() < 0.6);
            if (add) {
                int i;
                do {
                    i = rnd.nextInt(39);
                } while (members.contains(i));
                int m = members.size();
                // The new row of the factor is L⁻¹s, here from a forward solve of the current factor.
                double[] l = new double[40];
                double[] dummy1 = new double[40];
                double[] dummy2 = new double[40];
                for (int k = 0; k < m; k++) {
                    l[k] = sigma[members.get(k)][i];
                }
                chol.forwardInPlace(l, dummy1, dummy2);
                assertTrue(chol.appendRow(l, sigma[i][i], 1e-14) > 1e-14);
                double d = chol.factorEntry(m, m);
                double sy = 0;
                double sc = 0;
                for (int k = 0; k < m; k++) {
                    sy += l[k] * y[k];
                    sc += l[k] * col[k];
                }
                y[m] = (1 + i - sy) / d;
                col[m] = (sigma[i][39] - sc) / d;
                members.add(i);
            } else {
                int pos = rnd.nextInt(members.size());
                chol.remove(pos, cos, sin, old);
                int m = chol.size();
                UpdatableCholesky.rotate(y, pos, m, cos, sin);
                UpdatableCholesky.rotate(col, pos, m, cos, sin);
                members.remove(pos);
            }
            if (step % 30 == 29) {
                int m = members.size();
                double[][] block = new double[m][m];
                for (int a = 0; a < m; a++) {
                    for (int b = 0; b < m; b++) {
                        block[a][b] = sigma[members.get(a)][members.get(b)];
                    }
                }
                var ref = new CholeskyDecomposition(new Array2DRowRealMatrix(block)).getL();
                double[] b1 = new double[m];
                double[] b2 = new double[m];
                for (int a = 0; a < m; a++) {
                    for (int b = 0; b <= a; b++) {
                        assertEquals(ref.getEntry(a, b), chol.factorEntry(a, b), Tolerances.CLOSED_FORM);
                    }
                    b1[a] = 1 + members.get(a);
                    b2[a] = sigma[members.get(a)][39];
                }
                double[] b3 = new double[m];
                double[] fy = b1.clone();
                double[] fc = b2.clone();
                chol.forwardInPlace(fy, fc, b3);
                for (int a = 0; a < m; a++) {
                    assertEquals(fy[a], y[a], Tolerances.CLOSED_FORM * Math.max(1, Math.abs(fy[a])));
                    assertEquals(fc[a], col[a], Tolerances.CLOSED_FORM * Math.max(1, Math.abs(fc[a])));
                }
                // The backward half finishes the solve: S⁻¹b against Commons Math's solver.
                double[] xa = fy.clone();
                double[] xb = fc.clone();
                chol.backwardInPlace(xa, xb);
                double[] ea = new CholeskyDecomposition(new Array2DRowRealMatrix(block)).getSolver()
                        .solve(new ArrayRealVector(b1)).toArray();
                double[] eb = new CholeskyDecomposition(new Array2DRowRealMatrix(block)).getSolver()
                        .solve(new ArrayRealVector(b2)).toArray();
                for (int a = 0; a < m; a++) {
                    assertEquals(ea[a], xa[a], Tolerances.CLOSED_FORM * Math.max(1, Math.abs(ea[a])));
                    assertEquals(eb[a], xb[a], Tolerances.CLOSED_FORM * Math.max(1, Math.abs(eb[a])));
                }
            }
        }
    }
}
