package org.isorisk.notebooks.chart;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Frontier;

/**
 * A frontier with the name of the assumptions it was computed under, for the stress overlay ("Base",
 * "Rates shock", ...).
 *
 * @param name     legend text
 * @param frontier the frontier under that scenario
 */
public record NamedFrontier(String name, Frontier frontier) {
    public NamedFrontier {
        if (name == null || name.isBlank() || frontier == null) {
            throw InputException.of("each frontier of a stress overlay needs a name and a frontier").build();
        }
    }
}
