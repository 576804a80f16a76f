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
}
