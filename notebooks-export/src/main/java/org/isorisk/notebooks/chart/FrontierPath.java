package org.isorisk.notebooks.chart;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Solution;

/**
 * The portfolios of a frontier in the order they are drawn: corners and sampled points merged and sorted by
 * expected return, a sampled point that repeats a corner dropped. Between adjacent corners the weights are affine
 * in the target, so straight lines between these portfolios draw the weights exactly.
 */
final class FrontierPath {
    /** One portfolio on the path; {@code corner} is null for a sampled point. */
    record Step(Solution portfolio, Corner corner) {
        double m() {
            return portfolio.expectedReturn();
        }

        double sigma() {
            return portfolio.volatility();
        }
    }

    final List<Step> steps;

    private FrontierPath(List<Step> steps) {
        this.steps = steps;
    }

    static FrontierPath of(Frontier f) {
        List<Step> all = new ArrayList<>();
        // The inefficient branch's corners, when the engine traced it, up to (not including) the minimum-variance
        // portfolio, which is also the first corner of the efficient branch.
        for (Corner c : f.inefficientCorners()) {
            if (c.portfolio().expectedReturn() < f.minReturn() - 1e-12 * Math.max(1, Math.abs(f.minReturn()))) {
                all.add(new Step(c.portfolio(), c));
            }
        }
        for (Corner c : f.corners()) {
            all.add(new Step(c.portfolio(), c));
        }
        // A sampled point that repeats a corner (same return up to rounding) is dropped; corners are all kept (the
        // engine may list one portfolio twice at a kink, with the multipliers of each side).
        List<Step> points = new ArrayList<>();
        for (Solution s : f.points()) {
            boolean repeats = false;
            for (Step c : all) {
                repeats |= same(c.m(), s.expectedReturn());
            }
            for (Step p : points) {
                repeats |= same(p.m(), s.expectedReturn());
            }
            if (!repeats) {
                points.add(new Step(s, null));
            }
        }
        // Merge the points into the corners' own order (increasing in return; at a kink the engine's order of the
        // two corners is kept, since each carries the multipliers of its side): a point goes after every corner
        // whose return does not exceed its own.
        points.sort(Comparator.comparingDouble(Step::m));
        List<Step> out = new ArrayList<>();
        int p = 0;
        for (Step c : all) {
            while (p < points.size() && points.get(p).m() < c.m()) {
                out.add(points.get(p++));
            }
            out.add(c);
        }
        while (p < points.size()) {
            out.add(points.get(p++));
        }
        return new FrontierPath(List.copyOf(out));
    }

    private static boolean same(double a, double b) {
        return Math.abs(a - b) <= 1e-12 * Math.max(1, Math.max(Math.abs(a), Math.abs(b)));
    }

    static FrontierPath ofSteps(List<Step> steps) {
        return new FrontierPath(List.copyOf(steps));
    }

    int size() {
        return steps.size();
    }

    /** True when every portfolio came from the closed form: the frontier is the unconstrained one. */
    boolean closedFormOnly(Frontier f) {
        return f.corners().isEmpty() && steps.stream().allMatch(s -> s.portfolio().method() == Method.CLOSED_FORM);
    }

    /** Index of the minimum-volatility portfolio (the start of the efficient branch). */
    int minimumVolatilityIndex() {
        int best = 0;
        for (int i = 1; i < steps.size(); i++) {
            if (steps.get(i).sigma() < steps.get(best).sigma()) {
                best = i;
            }
        }
        return best;
    }

    double[] returns(int from, int to) {
        double[] r = new double[to - from];
        for (int i = from; i < to; i++) {
            r[i - from] = steps.get(i).m();
        }
        return r;
    }

    double[] volatilities(int from, int to) {
        double[] r = new double[to - from];
        for (int i = from; i < to; i++) {
            r[i - from] = steps.get(i).sigma();
        }
        return r;
    }

    List<Step> corners() {
        return steps.stream().filter(s -> s.corner() != null).toList();
    }
}
