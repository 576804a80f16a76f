package org.isorisk.engine.stress;

import java.util.List;
import org.isorisk.engine.model.AssetUniverse;

/**
 * The assumptions after a scenario's shocks.
 *
 * @param universe         the shocked universe (same assets)
 * @param repaired         true when the shocked correlation matrix was not positive semi-definite and was repaired
 * @param smallestEigenvalue smallest eigenvalue of the shocked correlation matrix before any repair
 * @param repairDistance   Frobenius norm of the change the repair made to the correlation matrix (0 if none)
 * @param largestChange    largest change of a single correlation made by the repair (0 if none)
 * @param notes            what was done, in words
 */
public record Shocked(AssetUniverse universe, boolean repaired, double smallestEigenvalue, double repairDistance,
                      double largestChange, List<String> notes) {
    public Shocked {
        notes = List.copyOf(notes);
    }
}
