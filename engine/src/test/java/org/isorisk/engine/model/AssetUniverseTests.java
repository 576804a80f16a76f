package org.isorisk.engine.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.isorisk.engine.Tolerances;
import org.junit.jupiter.api.Test;

/** Products with and copies of the covariance that do not copy the whole matrix. */
class AssetUniverseTests {

    private static AssetUniverse universe(int n) {
        SplittableRandom r = new SplittableRandom(12);
        double[][] g = new double[n][n];
        for (double[] row : g) {
            for (int j = 0; j < n; j++) {
                row[j] = r.nextDouble() - 0.5;
            }
        }
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double v = 0;
                for (int k = 0; k < n; k++) {
                    v += g[i][k] * g[j][k];
                }
                s[i][j] = v;
                s[j][i] = v;
            }
            s[i][i] += 0.1;
        }
        List<String> names = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            names.add("X" + i);
        }
        return new AssetUniverse(names, new double[n], s);
    }

    @Test
    void theCovarianceProductAgreesWithCommonsMath() {
        AssetUniverse u = universe(23);
        double[] x = new double[23];
        for (int i = 0; i < x.length; i++) {
            x[i] = Math.cos(i);
        }
        x[5] = 0; // a zero weight is skipped, not mis-summed
        double[] ref = new Array2DRowRealMatrix(u.covariance()).operate(x); // Commons Math 3.6.1
        double[] got = u.covarianceTimes(x);
        for (int i = 0; i < x.length; i++) {
            assertEquals(ref[i], got[i], Tolerances.TIGHT * 100, "entry " + i);
        }
        assertThrows(IllegalArgumentException.class, () -> u.covarianceTimes(new double[3]));
    }

    @Test
    void theLowerTriangleIsAFreshCopyOfTheCovariancesRows() {
        AssetUniverse u = universe(6);
        double[][] rows = u.covarianceLowerRows();
        for (int i = 0; i < 6; i++) {
            assertEquals(i + 1, rows[i].length);
            for (int j = 0; j <= i; j++) {
                assertEquals(u.covariance(i, j), rows[i][j], 0.0);
            }
        }
        double before = u.covariance(3, 2);
        rows[3][2] = 99;
        assertEquals(before, u.covariance(3, 2), 0.0, "the universe is not modified through the copy");
    }
}
