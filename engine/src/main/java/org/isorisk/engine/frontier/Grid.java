package org.isorisk.engine.frontier;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;

/**
 * Which targets a frontier samples: none, {@code N} points evenly spaced in return between the
 * minimum-variance and the maximum-return ends, or explicit targets {@code from:to:step} (inclusive ends).
 *
 * @param points number of evenly spaced points (0 when {@code targets} is used)
 * @param from   first explicit target, decimal (NaN when {@code points} is used)
 * @param to     last explicit target, decimal
 * @param step   spacing of explicit targets, decimal, positive
 */
public record Grid(int points, double from, double to, double step) {

    /** Largest number of targets a grid may produce; default-sized grids stay far below it. */
    public static final int MAX_TARGETS = 100_000;

    public Grid {
        if (points < 0) {
            throw InputException.of("the number of frontier points must be at least 0").value(points).build();
        }
        if (points == 0 && !Double.isNaN(from)) {
            if (!Double.isFinite(from) || !Double.isFinite(to) || !(step > 0) || !Double.isFinite(step)) {
                throw InputException.of("targets need a finite start and end and a positive step")
                        .value(from + ":" + to + ":" + step).fix("write targets as from:to:step, e.g. 0.03:0.07:0.005")
                        .build();
            }
            if (to < from) {
                throw InputException.of("the targets' end is below their start").value(from + ":" + to + ":" + step)
                        .fix("write from:to:step with from at most to").build();
            }
            if ((to - from) / step + 1 > MAX_TARGETS) {
                throw InputException.of("the targets' step gives more than " + MAX_TARGETS + " targets")
                        .value(from + ":" + to + ":" + step).fix("use a larger step").build();
            }
        }
    }

    /** No sampled points (corners only). */
    public static Grid none() {
        return new Grid(0, Double.NaN, Double.NaN, Double.NaN);
    }

    /** {@code n} points evenly spaced in return between the minimum-variance and maximum-return ends. */
    public static Grid points(int n) {
        return new Grid(n, Double.NaN, Double.NaN, Double.NaN);
    }

    /** Targets {@code from, from + step, ..., to} (decimals; the end is included when the step lands on it). */
    public static Grid targets(double from, double to, double step) {
        return new Grid(0, from, to, step);
    }

    /**
     * Parses {@code from:to:step} in decimals, e.g. {@code 0.03:0.07:0.005}.
     *
     * @throws InputException naming the text and the expected form
     */
    public static Grid parse(String text) {
        String[] parts = text == null ? new String[0] : text.trim().split(":");
        if (parts.length != 3) {
            throw InputException.of("targets must be written from:to:step").value(text)
                    .fix("e.g. 0.03:0.07:0.005 for 3 % to 7 % in steps of 0.5 %").build();
        }
        double[] v = new double[3];
        for (int i = 0; i < 3; i++) {
            try {
                v[i] = Double.parseDouble(parts[i].trim());
            } catch (NumberFormatException e) {
                throw InputException.of("targets must be numbers written from:to:step").value(text)
                        .fix("e.g. 0.03:0.07:0.005 (decimals, a point as decimal separator)").build();
            }
        }
        return targets(v[0], v[1], v[2]);
    }

    /** True when this grid lists explicit targets. */
    public boolean explicit() {
        return points == 0 && !Double.isNaN(from);
    }

    /**
     * The targets for a frontier whose efficient part runs from {@code low} (minimum-variance return) to
     * {@code high} (maximum return).
     */
    public double[] targets(double low, double high) {
        if (explicit()) {
            List<Double> out = new ArrayList<>();
            long count = (long) Math.floor((to - from) / step * (1 + 1e-12) + 1e-9) + 1;
            for (long k = 0; k < count; k++) {
                out.add(from + k * step);
            }
            return out.stream().mapToDouble(Double::doubleValue).toArray();
        }
        if (points == 0) {
            return new double[0];
        }
        if (points == 1 || !(high > low)) {
            return new double[] {low};
        }
        double[] t = new double[points];
        for (int k = 0; k < points; k++) {
            t[k] = k == points - 1 ? high : low + (high - low) * k / (points - 1);
        }
        return t;
    }

    @Override
    public String toString() {
        return explicit() ? String.format(Locale.ROOT, "targets %s:%s:%s", from, to, step)
                : points + " points";
    }
}
