package org.isorisk.engine.stress;

import java.util.List;

/**
 * One scenario's outcome over the whole target grid.
 *
 * @param scenario  the scenario
 * @param shocked   the shocked assumptions, with the repair report
 * @param maxTarget highest expected return the mandate allows under the scenario
 * @param points    one per target, in the grid's order
 */
public record ScenarioResult(Scenario scenario, Shocked shocked, double maxTarget, List<ScenarioPoint> points) {
    public ScenarioResult {
        points = List.copyOf(points);
    }
}
