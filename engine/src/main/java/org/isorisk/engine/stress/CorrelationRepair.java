package org.isorisk.engine.stress;

import java.util.List;
import org.isorisk.engine.estimate.Repair;
import org.isorisk.engine.estimate.RepairSettings;

/** Maps a symmetric matrix with unit diagonal that is not positive semi-definite to a valid correlation matrix. */
@FunctionalInterface
public interface CorrelationRepair {
    /**
     * @param correlation symmetric, unit diagonal (not modified)
     * @return the repaired correlation matrix (symmetric, unit diagonal, positive semi-definite)
     */
    double[][] nearest(double[][] correlation);

    /**
     * The project's nearest-correlation repair ({@link Repair#correlation}, Higham 2002, with the estimate
     * package's default eigenvalue floor).
     *
     * @param assets asset names in matrix order, for messages
     */
    static CorrelationRepair higham(List<String> assets) {
        return c -> Repair.correlation(assets, c, RepairSettings.defaults(), "shocked correlation").repaired();
    }
}
