package org.isorisk.engine.stress;

import java.util.List;

/**
 * A whole stress run.
 *
 * @param base      the target sweep under the base assumptions
 * @param scenarios one result per scenario, in the request's order
 * @param threads   worker threads used
 * @param notes     remarks for the reader (repairs, methods)
 */
public record StressResult(Sweep base, List<ScenarioResult> scenarios, int threads, List<String> notes) {
    public StressResult {
        scenarios = List.copyOf(scenarios);
        notes = List.copyOf(notes);
    }
}
