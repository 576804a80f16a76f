package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.solve.Factored;
import org.junit.jupiter.api.Test;

class RepairTests {

    private static final RepairSettings EXACT = RepairSettings.defaults().withMinEigenvalue(0);

    private static double smallestEigenvalue(double[][] a) {
        double lo = Double.POSITIVE_INFINITY;
        for (double v : new EigenDecomposition(new Array2DRowRealMatrix(a)).getRealEigenvalues()) {
            lo = Math.min(lo, v);
        }
        return lo;
    }

    @Test
    void higham2002ThreeByThreeExampleIsReproduced() {
        // Higham (2002), IMA J. Numer. Anal. 22, the 3 × 3 example A = [1 1 0; 1 1 1; 0 1 1]; its nearest
        // correlation matrix has off-diagonals 0.7607 (adjacent) and 0.1573 (corner), to four decimals: values
        // from memory.
        double[][] a = {{1, 1, 0}, {1, 1, 1}, {0, 1, 1}};
        RepairResult r = Repair.correlation(List.of("x", "y", "z"), a, EXACT, "a.csv");
        double[][] x = r.repaired();
        assertEquals(0.7607, x[0][1], 1e-4);
        assertEquals(0.7607, x[1][2], 1e-4);
        assertEquals(0.1573, x[0][2], 1e-4);
        assertTrue(r.changed());
        assertTrue(smallestEigenvalue(x) > -1e-10, "positive semi-definite");
        assertEquals(r.correlationDistance(), r.frobeniusDistance(), Tolerances.TIGHT);
        // The two adjacent pairs move most (1 → 0.7607), then the corner (0 → 0.1573).
        List<RepairResult.Change> ch = r.largestChanges();
        assertEquals(3, ch.size());
        assertEquals(0.7607 - 1, ch.get(0).correlationChange(), 1e-4);
        assertEquals(0.7607 - 1, ch.get(1).correlationChange(), 1e-4);
        assertEquals("x", ch.get(2).first());
        assertEquals("z", ch.get(2).second());
    }

    /** Eigenvalue clipping: negative eigenvalues set to 0, then rescaled to a unit diagonal (a feasible point). */
    private static double[][] clipped(double[][] a) {
        EigenDecomposition ed = new EigenDecomposition(new Array2DRowRealMatrix(a));
        double[] ev = ed.getRealEigenvalues();
        double[][] v = ed.getV().getData();
        int n = a.length;
        double[][] x = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                for (int k = 0; k < n; k++) {
                    x[i][j] += v[i][k] * Math.max(ev[k], 0) * v[j][k];
                }
            }
        }
        double[][] c = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                c[i][j] = x[i][j] / Math.sqrt(x[i][i] * x[j][j]);
            }
        }
        return c;
    }

    private static double distance(double[][] a, double[][] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < a.length; j++) {
                s += (a[i][j] - b[i][j]) * (a[i][j] - b[i][j]);
            }
        }
        return Math.sqrt(s);
    }

    @Test
    void randomBrokenMatricesBecomePsdWithUnitDiagonalAndNoFartherThanEigenvalueClipping() {
        Random rnd = new Random(42);
        int broken = 0;
        for (int trial = 0; trial < 30; trial++) {
            int n = 4 + rnd.nextInt(9);
            double[][] a = new double[n][n];
            for (int i = 0; i < n; i++) {
                a[i][i] = 1;
                for (int j = i + 1; j < n; j++) {
                    a[i][j] = a[j][i] = 2 * rnd.nextDouble() - 1;
                }
            }
            if (smallestEigenvalue(a) >= 0) {
                continue;
            }
            broken++;
            RepairResult r = Repair.correlation(Histories.names(n), a, EXACT, "random");
            double[][] x = r.repaired();
            for (int i = 0; i < n; i++) {
                assertEquals(1.0, x[i][i], 0, "unit diagonal");
                for (int j = 0; j < n; j++) {
                    assertEquals(x[i][j], x[j][i], 0, "symmetric");
                }
            }
            assertTrue(smallestEigenvalue(x) > -Tolerances.GENERAL, "PSD: " + smallestEigenvalue(x));
            double clip = distance(a, clipped(a));
            assertTrue(r.correlationDistance() <= clip + Tolerances.GENERAL,
                    "Higham " + r.correlationDistance() + " vs clipping " + clip);
            assertEquals(distance(a, x), r.frobeniusDistance(), Tolerances.TIGHT);
        }
        assertTrue(broken >= 20, "most random unit-diagonal matrices are indefinite: " + broken);
    }

    @Test
    void aCovarianceKeepsItsVolatilitiesAndBecomesPositiveDefiniteSoSolveAcceptsIt() {
        double[] vol = {0.05, 0.15, 0.20, 0.12};
        double[][] corr = {{1, 0.9, 0.9, -0.2}, {0.9, 1, 0.1, 0.5}, {0.9, 0.1, 1, 0.5}, {-0.2, 0.5, 0.5, 1}};
        double[][] cov = new double[4][4];
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                cov[i][j] = corr[i][j] * vol[i] * vol[j];
            }
        }
        List<String> names = List.of("Bonds", "Equity", "Property", "Commodities");
        AssetUniverse broken = new AssetUniverse(names, new double[] {0.02, 0.06, 0.05, 0.04}, cov);
        NoSolutionException refused = assertThrows(NoSolutionException.class, () -> Factored.of(broken));
        assertTrue(refused.getMessage().contains(Repair.COMMAND), refused.getMessage());

        RepairResult r = Repair.covariance(names, cov, RepairSettings.defaults(), "cov.csv");
        double[][] x = r.repaired();
        for (int i = 0; i < 4; i++) {
            assertEquals(cov[i][i], x[i][i], 0, "variance kept");
        }
        assertNotNull(Cholesky.factor(x), "positive definite after the repair");
        assertTrue(r.after().smallest() > 0);
        assertTrue(r.before().smallest() < 0);
        Factored.of(broken.withAssumptions(broken.expectedReturns(), x));
        // Largest changes first, measured in correlation.
        List<RepairResult.Change> ch = r.largestChanges();
        for (int k = 1; k < ch.size(); k++) {
            assertTrue(Math.abs(ch.get(k - 1).correlationChange()) >= Math.abs(ch.get(k).correlationChange()));
        }
        RepairResult.Change top = ch.get(0);
        int i = names.indexOf(top.first());
        int j = names.indexOf(top.second());
        assertEquals(cov[i][j], top.valueBefore(), 0);
        assertEquals(x[i][j], top.valueAfter(), 0);
        assertEquals(x[i][j] / (vol[i] * vol[j]), top.correlationAfter(), Tolerances.TIGHT);
        assertEquals(distance(cov, x), r.frobeniusDistance(), Tolerances.TIGHT);
    }

    @Test
    void theDefaultFloorKeepsTheSmallestEigenvalueAtOneInTenThousand() {
        double[][] a = {{1, 1, 0}, {1, 1, 1}, {0, 1, 1}};
        RepairResult r = Repair.correlation(List.of("x", "y", "z"), a, RepairSettings.defaults(), "a.csv");
        double lo = smallestEigenvalue(r.repaired());
        assertTrue(lo >= 0.99e-4 && lo < 1e-3, "floor 1e-4: " + lo);
        RepairResult exact = Repair.correlation(List.of("x", "y", "z"), a, EXACT, "a.csv");
        assertTrue(Math.abs(r.correlationDistance() - exact.correlationDistance()) < 1e-3,
                r.correlationDistance() + " vs " + exact.correlationDistance());
    }

    @Test
    void aValidMatrixIsLeftUnchanged() {
        double[][] c = {{0.04, 0.01}, {0.01, 0.09}};
        RepairResult r = Repair.covariance(List.of("a", "b"), c, RepairSettings.defaults(), "cov.csv");
        assertFalse(r.changed());
        assertEquals(0, r.frobeniusDistance(), 0);
        assertEquals(c[0][1], r.repaired()[0][1], 0);
        assertEquals(List.of(), r.largestChanges());
    }

    @Test
    void aMatrixThatCannotBeRepairedAsGivenIsABadInputNamingTheEntry() {
        double[][] asym = {{0.04, 0.01}, {0.02, 0.09}};
        InputException e = assertThrows(InputException.class,
                () -> Repair.covariance(List.of("a", "b"), asym, RepairSettings.defaults(), "cov.csv"));
        assertEquals("cov.csv: the matrix is not symmetric: the entry for ('a', 'b') is 0.01 but the entry for "
                + "('b', 'a') is 0.02; fix: make the two entries equal; a repair does not guess which is right",
                e.getMessage());
        double[][] zeroVar = {{0.04, 0.01}, {0.01, 0}};
        e = assertThrows(InputException.class,
                () -> Repair.covariance(List.of("a", "b"), zeroVar, RepairSettings.defaults(), "cov.csv"));
        assertEquals("cov.csv, asset 'b': variance is not positive, so the volatility cannot be kept (value '0.0'); "
                + "fix: give a positive variance on the diagonal", e.getMessage());
        double[][] badDiag = {{1, 0.5}, {0.5, 0.9}};
        e = assertThrows(InputException.class,
                () -> Repair.correlation(List.of("a", "b"), badDiag, RepairSettings.defaults(), "corr.csv"));
        assertEquals("corr.csv, asset 'b': a correlation matrix has 1 on its diagonal (value '0.9'); fix: set the "
                + "diagonal to 1, or repair it as a covariance matrix", e.getMessage());
    }
}
