package org.isorisk.engine.stress;

import java.util.List;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.SolverSettings;

/**
 * Everything one stress run needs.
 *
 * @param universe  base assumptions
 * @param mandate   the policy's constraints
 * @param targets   return targets of the sweep, decimal, increasing (copied)
 * @param scenarios scenarios to run against the base (may be empty)
 * @param repair    nearest-correlation repair for shocked matrices that are no longer valid; null to refuse them
 * @param settings  solver settings; {@link SolverSettings#threads()} bounds the worker pool; defaults when null
 */
public record StressRequest(AssetUniverse universe, Mandate mandate, double[] targets, List<Scenario> scenarios,
                            CorrelationRepair repair, SolverSettings settings) {
    public StressRequest {
        if (universe == null || mandate == null || targets == null || targets.length == 0) {
            throw new IllegalArgumentException("universe, mandate and at least one target are required");
        }
        targets = targets.clone();
        scenarios = List.copyOf(scenarios == null ? List.of() : scenarios);
        settings = settings == null ? SolverSettings.defaults() : settings;
    }

    @Override
    public double[] targets() {
        return targets.clone();
    }
}
