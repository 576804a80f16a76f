package org.isorisk.notebooks.chart;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Solution;

/**
 * Which inequality constraints start or stop binding at each corner portfolio, read from the binding flags of the
 * engine's solutions. The binding set of the open stretch between two corners is that of a sampled portfolio
 * inside it, or, when none was sampled, what both end corners share (at a corner the constraint that just became
 * binding and the one just released both hold with equality). At a corner, the constraints that start binding are
 * those of the stretch above it missing from the stretch below, and vice versa. Equalities (budget, return target,
 * fixed weights) bind everywhere and are left out. When the flags tell nothing, the corner's own asset and change
 * are used.
 */
final class CornerChanges {
    private CornerChanges() {
    }

    /**
     * What changes at one corner (or between two samples), with the portfolios to read limit values from: the one
     * where the starting constraints bind and the one where the stopping constraints still bound (both the corner
     * portfolio at a corner).
     */
    record Change(List<String> starts, List<String> stops, Solution above, Solution below) {
        Change(List<String> starts, List<String> stops, Solution portfolio) {
            this(starts, stops, portfolio, portfolio);
        }

        /** A short label, e.g. "Cash at cap 20 %" or "High Yield comes in". */
        String label(Corner fallback) {
            List<String> parts = new ArrayList<>();
            for (String c : starts) {
                parts.add(phrase(c, true, above));
            }
            for (String c : stops) {
                parts.add(phrase(c, false, below));
            }
            if (parts.isEmpty() && fallback != null && fallback.asset() != null) {
                String verb = switch (fallback.change() == null ? "" : fallback.change()) {
                    case "enters" -> " leaves its limit";
                    case "leaves" -> " reaches a limit";
                    default -> " " + fallback.change();
                };
                parts.add(fallback.asset() + verb);
            }
            return String.join("; ", parts);
        }
    }

    /**
     * A few words for one change: "Cash drops out" / "Cash comes in" for a lower limit of 0 %, "Government Bonds at
     * floor 10 %" / "above floor 10 %" for another lower limit, "Equity at cap 35 %" / "below cap 35 %" for an upper
     * limit. The limit's value is the weight the corner portfolio holds the asset at.
     */
    static String phrase(String constraint, boolean starts, Solution p) {
        if (constraint.startsWith("upper:") || constraint.startsWith("lower:")) {
            String asset = constraint.substring(6);
            int i = p.assets().indexOf(asset);
            String value = i < 0 ? "" : " " + Style.percentTicks(2).apply(p.weight(i));
            if (constraint.startsWith("upper:")) {
                return asset + (starts ? " at cap" : " below cap") + value;
            }
            if (i >= 0 && Math.abs(p.weight(i)) < 1e-9) {
                return asset + (starts ? " drops out" : " comes in");
            }
            return asset + (starts ? " at floor" : " above floor") + value;
        }
        if (constraint.startsWith("group:") && (constraint.endsWith(":max") || constraint.endsWith(":min"))) {
            String name = constraint.substring(6, constraint.length() - 4);
            boolean max = constraint.endsWith(":max");
            return "group " + name + (max ? (starts ? " at cap" : " below cap") : (starts ? " at floor" : " above floor"));
        }
        return constraint + (starts ? " binds" : " released");
    }

    /** True for constraints that can start or stop binding (inequalities), false for equalities. */
    static boolean inequality(String c) {
        if (c.equals("budget") || c.equals("target_return") || c.startsWith("fixed:")) {
            return false;
        }
        if (c.startsWith("group:")) {
            return c.endsWith(":min") || c.endsWith(":max");
        }
        return true;
    }

    private static Set<String> binding(Solution s) {
        Set<String> b = new LinkedHashSet<>();
        for (Multiplier m : s.multipliers()) {
            if (m.binding() && inequality(m.constraint())) {
                b.add(m.constraint());
            }
        }
        return b;
    }

    /** A change between two sampled portfolios, placed halfway between their targets. */
    record Between(double m, Change change) {
    }

    /**
     * Where the binding set changes between neighbouring sampled portfolios of a frontier without corners (the
     * numerical frontier of a general mandate): one entry per pair of samples whose binding inequalities differ.
     */
    static List<Between> betweenSamples(List<FrontierPath.Step> steps) {
        List<Between> out = new ArrayList<>();
        for (int j = 1; j < steps.size(); j++) {
            Solution a = steps.get(j - 1).portfolio();
            Solution b = steps.get(j).portfolio();
            Set<String> below = binding(a);
            Set<String> above = binding(b);
            List<String> starts = new ArrayList<>();
            for (String x : above) {
                if (!below.contains(x)) {
                    starts.add(x);
                }
            }
            List<String> stops = new ArrayList<>();
            for (String x : below) {
                if (!above.contains(x)) {
                    stops.add(x);
                }
            }
            if (!starts.isEmpty() || !stops.isEmpty()) {
                out.add(new Between(0.5 * (a.expectedReturn() + b.expectedReturn()),
                        new Change(starts, stops, b, a)));
            }
        }
        return out;
    }

    /** One change per corner of {@code steps} (a path sorted by return), in order. */
    static List<Change> of(List<FrontierPath.Step> steps) {
        List<Integer> cornerIdx = new ArrayList<>();
        for (int j = 0; j < steps.size(); j++) {
            if (steps.get(j).corner() != null) {
                cornerIdx.add(j);
            }
        }
        int k = cornerIdx.size();
        List<Set<String>> stretch = new ArrayList<>();
        for (int c = 0; c + 1 < k; c++) {
            Set<String> s = null;
            for (int j = cornerIdx.get(c) + 1; j < cornerIdx.get(c + 1); j++) {
                s = binding(steps.get(j).portfolio());
                break;
            }
            if (s == null) {
                s = binding(steps.get(cornerIdx.get(c)).portfolio());
                s.retainAll(binding(steps.get(cornerIdx.get(c + 1)).portfolio()));
            }
            stretch.add(s);
        }
        List<Change> out = new ArrayList<>();
        for (int c = 0; c < k; c++) {
            Solution p = steps.get(cornerIdx.get(c)).portfolio();
            if (c == 0 || c == k - 1) {
                out.add(new Change(List.of(), List.of(), p));
                continue;
            }
            Set<String> below = stretch.get(c - 1);
            Set<String> above = stretch.get(c);
            List<String> starts = new ArrayList<>();
            for (String x : above) {
                if (!below.contains(x)) {
                    starts.add(x);
                }
            }
            List<String> stops = new ArrayList<>();
            for (String x : below) {
                if (!above.contains(x)) {
                    stops.add(x);
                }
            }
            out.add(new Change(starts, stops, p));
        }
        return out;
    }
}
