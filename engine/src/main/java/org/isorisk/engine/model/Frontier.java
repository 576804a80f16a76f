package org.isorisk.engine.model;

import java.util.List;

/**
 * An efficient frontier: corner portfolios (exact turning points of the mandate frontier, ordered from the
 * minimum-variance end to the maximum-return end) and portfolios sampled on a grid of targets.
 *
 * @param corners       corner portfolios, increasing in expected return; empty for the closed-form frontier
 * @param points        sampled portfolios, increasing in expected return
 * @param unconstrained the closed-form frontier's scalars for comparison; null when not available
 * @param minReturn     expected return of the minimum-variance portfolio under the mandate
 * @param maxReturn     highest expected return the mandate allows (infinite without bounds)
 */
public record Frontier(List<Corner> corners, List<Solution> points, MertonScalars unconstrained, double minReturn,
                       double maxReturn) {
    public Frontier {
        corners = List.copyOf(corners);
        points = List.copyOf(points);
    }
}
