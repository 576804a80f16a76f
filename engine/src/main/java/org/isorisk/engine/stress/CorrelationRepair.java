package org.isorisk.engine.stress;

/** Maps a symmetric matrix with unit diagonal that is not positive semi-definite to a valid correlation matrix. */
@FunctionalInterface
public interface CorrelationRepair {
    /**
     * @param correlation symmetric, unit diagonal (not modified)
     * @return the repaired correlation matrix (symmetric, unit diagonal, positive semi-definite)
     */
    double[][] nearest(double[][] correlation);
}
