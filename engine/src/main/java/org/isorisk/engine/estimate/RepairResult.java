package org.isorisk.engine.estimate;

import java.util.List;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.Checks;

/**
 * A repaired matrix and what the repair changed.
 *
 * @param covarianceInput     true when the input was a covariance matrix (volatilities kept), false for a
 *                            correlation matrix
 * @param assets              asset names, in matrix order
 * @param original            the input matrix (copied)
 * @param repaired            the repaired matrix on the input's scale (copied); equal to the input when it was
 *                            already valid
 * @param changed             false when the input was already positive definite with eigenvalues at or above the
 *                            floor, so nothing was changed
 * @param frobeniusDistance   {@code ‖repaired − original‖_F} on the input's scale
 * @param correlationDistance {@code ‖C' − C‖_F} between the correlation matrices (what the method minimises)
 * @param iterations          alternating-projection iterations used (0 when nothing was changed)
 * @param before              extreme eigenvalues of the input (input scale)
 * @param after               extreme eigenvalues of the result (input scale)
 * @param largestChanges      the largest changes of correlation, largest first
 */
public record RepairResult(boolean covarianceInput, List<String> assets, double[][] original, double[][] repaired,
                           boolean changed, double frobeniusDistance, double correlationDistance, int iterations,
                           Spectrum before, Spectrum after, List<Change> largestChanges) {

    public RepairResult {
        assets = List.copyOf(assets);
        original = Checks.squareCopy(original, assets.size(), "original matrix");
        repaired = Checks.squareCopy(repaired, assets.size(), "repaired matrix");
        largestChanges = List.copyOf(largestChanges);
    }

    /**
     * One changed off-diagonal entry.
     *
     * @param first              first asset
     * @param second             second asset
     * @param correlationBefore  input correlation
     * @param correlationAfter   repaired correlation
     * @param valueBefore        input entry on the input's scale
     * @param valueAfter         repaired entry on the input's scale
     */
    public record Change(String first, String second, double correlationBefore, double correlationAfter,
                         double valueBefore, double valueAfter) {
        /** The change of correlation, after minus before. */
        public double correlationChange() {
            return correlationAfter - correlationBefore;
        }
    }

    @Override
    public double[][] original() {
        return copy(original);
    }

    @Override
    public double[][] repaired() {
        return copy(repaired);
    }

    private static double[][] copy(double[][] m) {
        double[][] c = new double[m.length][];
        for (int i = 0; i < m.length; i++) {
            c[i] = m[i].clone();
        }
        return c;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof RepairResult r && r.assets.equals(assets)
                && java.util.Arrays.deepEquals(r.repaired, repaired);
    }

    @Override
    public int hashCode() {
        return assets.hashCode();
    }

    @Override
    public String toString() {
        return "RepairResult[" + assets.size() + " assets, changed=" + changed + ", distance=" + frobeniusDistance + "]";
    }
}
