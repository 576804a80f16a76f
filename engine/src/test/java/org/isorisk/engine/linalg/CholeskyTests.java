package org.isorisk.engine.linalg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.synthetic.FactorModels;
import org.junit.jupiter.api.Test;

class CholeskyTests {

    @Test
    void theFactorMatchesCommonsMathAcrossSeveralBlocks() {
        // Reference: Apache Commons Math's CholeskyDecomposition (independent library); 101 rows span several
        // row blocks and a partial last one.
        double[][] a = FactorModels.universe(101, 5).covariance();
        Cholesky c = Cholesky.factor(a);
        assertNotNull(c);
        double[][] ref = new org.apache.commons.math3.linear.CholeskyDecomposition(new Array2DRowRealMatrix(a))
                .getL().getData();
        for (int i = 0; i < 101; i++) {
            for (int j = 0; j < 101; j++) {
                assertEquals(ref[i][j], c.factorEntry(i, j), Tolerances.CLOSED_FORM, "L[" + i + "][" + j + "]");
            }
        }
        double[] b = new double[101];
        b[7] = 1;
        double[] x = c.solve(b);
        double[] back = new double[101];
        for (int i = 0; i < 101; i++) {
            for (int j = 0; j < 101; j++) {
                back[i] += a[i][j] * x[j];
            }
            assertEquals(b[i], back[i], Tolerances.CLOSED_FORM);
        }
    }

    @Test
    void aMatrixThatIsNotPositiveDefiniteHasNoFactor() {
        assertNull(Cholesky.factor(new double[][] {{1, 2}, {2, 1}}));
    }
}
