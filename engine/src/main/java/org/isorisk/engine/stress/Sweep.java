package org.isorisk.engine.stress;

import java.util.List;

/**
 * A target sweep under one set of assumptions.
 *
 * @param points    one per target
 * @param minTarget lowest expected return the mandate allows (−∞ without bounds)
 * @param maxTarget highest expected return the mandate allows (+∞ without bounds)
 * @param changes   targets where the binding set changes
 */
public record Sweep(List<TargetPoint> points, double minTarget, double maxTarget, List<BindingChange> changes) {
    public Sweep {
        points = List.copyOf(points);
        changes = List.copyOf(changes);
    }
}
