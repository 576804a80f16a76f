package org.isorisk.engine.stress;

import java.util.List;

/**
 * One scenario's outcome over the whole target grid.
 *
 * @param scenario  the scenario
 * @param shocked   the shocked assumptions, with the repair report
 * @param maxTarget highest expected return the mandate allows under the scenario
 * @param points    one per target, in the grid's order
 * @param sweep     the scenario's own target sweep (portfolios, binding sets), e.g. for the stress-overlay chart
 */
public record ScenarioResult(Scenario scenario, Shocked shocked, double maxTarget, List<ScenarioPoint> points,
                             Sweep sweep) {
    public ScenarioResult {
        points = List.copyOf(points);
    }
}
