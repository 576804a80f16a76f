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

    /**
     * The feasible portfolios of the sweep as a frontier (sampled points only, increasing in return; no corners),
     * for charts.
     */
    public org.isorisk.engine.model.Frontier asFrontier() {
        List<org.isorisk.engine.model.Solution> s = points.stream().filter(TargetPoint::feasible)
                .map(TargetPoint::solution)
                .sorted(java.util.Comparator.comparingDouble(org.isorisk.engine.model.Solution::expectedReturn))
                .toList();
        double min = s.stream().min(java.util.Comparator.comparingDouble(org.isorisk.engine.model.Solution::variance))
                .map(org.isorisk.engine.model.Solution::expectedReturn).orElse(Double.NaN);
        return new org.isorisk.engine.model.Frontier(List.of(), s, null, min, maxTarget);
    }
}
