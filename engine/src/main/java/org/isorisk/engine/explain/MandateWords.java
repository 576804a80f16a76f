package org.isorisk.engine.explain;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;

/**
 * A mandate in plain sentences, one per rule, for readers who do not read constraint names: the budget, the
 * limits on single assets (the most common pair of limits stated once, the exceptions by name), fixed
 * weights, group limits and any further linear limits.
 */
public final class MandateWords {
    private MandateWords() {
    }

    /**
     * The sentences describing {@code m}.
     *
     * @param m      the mandate
     * @param assets asset names in the mandate's order
     */
    public static List<String> describe(Mandate m, List<String> assets) {
        if (assets.size() != m.size()) {
            throw new IllegalArgumentException("one name per asset of the mandate");
        }
        List<String> out = new ArrayList<>();
        out.add(m.budget() == 1.0 ? "Fully invested: the weights add up to 100.00 %."
                : "The weights add up to " + Explain.percent(m.budget()) + ".");
        bounds(m, assets, out);
        for (Map.Entry<Integer, Double> e : m.fixed().entrySet()) {
            out.add(assets.get(e.getKey()) + " is held at exactly " + Explain.percent(e.getValue()) + ".");
        }
        for (Group g : m.groups()) {
            List<String> members = g.members().stream().map(assets::get).toList();
            out.add("Group " + g.name() + " (" + String.join(", ", members) + "): " + range(g.min(), g.max())
                    + " in total.");
        }
        for (LinearConstraint c : m.constraints()) {
            out.add("Further limit " + c.name() + ": " + combination(c, assets) + " " + word(c.relation()) + " "
                    + Explain.percent(c.limit()) + ".");
        }
        return out;
    }

    private static void bounds(Mandate m, List<String> assets, List<String> out) {
        if (!m.hasBounds()) {
            out.add("No limits on single assets: short positions (negative weights) are allowed.");
            return;
        }
        Map<String, List<Integer>> byRange = new LinkedHashMap<>();
        for (int i = 0; i < m.size(); i++) {
            if (m.fixed().containsKey(i)) {
                continue;
            }
            byRange.computeIfAbsent(range(m.lower(i), m.upper(i)), k -> new ArrayList<>()).add(i);
        }
        String common = null;
        int most = 0;
        for (Map.Entry<String, List<Integer>> e : byRange.entrySet()) {
            if (e.getValue().size() > most) {
                most = e.getValue().size();
                common = e.getKey();
            }
        }
        if (common == null) {
            return;
        }
        if (byRange.size() == 1) {
            out.add("Each asset: " + common + ".");
        } else {
            out.add("Each asset not named below: " + common + ".");
            for (Map.Entry<String, List<Integer>> e : byRange.entrySet()) {
                if (!e.getKey().equals(common)) {
                    for (int i : e.getValue()) {
                        out.add(assets.get(i) + ": " + e.getKey() + ".");
                    }
                }
            }
        }
        boolean shorts = false;
        for (int i = 0; i < m.size(); i++) {
            shorts |= m.lower(i) < 0;
        }
        if (shorts) {
            out.add("Assets with a negative lower limit may be held short down to that limit.");
        }
    }

    /** "between 0.00 % and 35.00 %", "at least 10.00 %", "at most 5.00 %", "no limit". */
    public static String range(double lo, double hi) {
        boolean hasLo = Double.isFinite(lo);
        boolean hasHi = Double.isFinite(hi);
        if (hasLo && hasHi) {
            return lo == hi ? "exactly " + Explain.percent(lo)
                    : "between " + Explain.percent(lo) + " and " + Explain.percent(hi);
        }
        if (hasLo) {
            return "at least " + Explain.percent(lo);
        }
        if (hasHi) {
            return "at most " + Explain.percent(hi) + " (no lower limit)";
        }
        return "no limit";
    }

    private static String word(Relation r) {
        return switch (r) {
            case EQUAL -> "equals";
            case AT_MOST -> "is at most";
            case AT_LEAST -> "is at least";
        };
    }

    private static String combination(LinearConstraint c, List<String> assets) {
        List<String> terms = new ArrayList<>();
        for (int i = 0; i < c.size(); i++) {
            double a = c.coefficient(i);
            if (a == 0) {
                continue;
            }
            terms.add(a == 1 ? assets.get(i) : String.format(Locale.ROOT, "%s × %s", trim(a), assets.get(i)));
        }
        return terms.isEmpty() ? "nothing" : String.join(" + ", terms);
    }

    private static String trim(double a) {
        String s = String.format(Locale.ROOT, "%.4f", a);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
    }
}
