package org.isorisk.engine.model;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * The investment mandate a portfolio must obey, over the assets of one {@link AssetUniverse}.
 *
 * @param budget      sum of weights (1 = fully invested)
 * @param lower       per-asset lower bounds, decimal; {@code -Infinity} for none (copied)
 * @param upper       per-asset upper bounds, decimal; {@code +Infinity} for none (copied)
 * @param fixed       fixed weights by asset index (copied); each becomes the equality {@code fixed:<asset>}
 * @param groups      group limits on sums of weights
 * @param constraints further general linear constraints
 */
public record Mandate(double budget, double[] lower, double[] upper, Map<Integer, Double> fixed, List<Group> groups,
                      List<LinearConstraint> constraints) {

    public Mandate {
        Checks.finite(budget, "budget");
        if (lower == null || upper == null || lower.length != upper.length) {
            throw InputException.of("lower and upper bounds must have one entry per asset").build();
        }
        lower = lower.clone();
        upper = upper.clone();
        for (int i = 0; i < lower.length; i++) {
            if (Double.isNaN(lower[i]) || Double.isNaN(upper[i]) || lower[i] == Double.POSITIVE_INFINITY
                    || upper[i] == Double.NEGATIVE_INFINITY) {
                throw InputException.of("bound of asset number " + (i + 1) + " is not a number").build();
            }
        }
        fixed = Collections.unmodifiableMap(new LinkedHashMap<>(fixed == null ? Map.of() : fixed));
        groups = List.copyOf(groups == null ? List.of() : groups);
        constraints = List.copyOf(constraints == null ? List.of() : constraints);
        int n = lower.length;
        for (Map.Entry<Integer, Double> e : fixed.entrySet()) {
            if (e.getKey() < 0 || e.getKey() >= n) {
                throw InputException.of("fixed weight for an asset outside the universe").value(e.getKey()).build();
            }
            Checks.finite(e.getValue(), "fixed weight");
        }
        for (Group g : groups) {
            for (int m : g.members()) {
                if (m < 0 || m >= n) {
                    throw InputException.of("group '" + g.name() + "' names an asset outside the universe").build();
                }
            }
        }
        for (LinearConstraint c : constraints) {
            if (c.size() != n) {
                throw InputException.of("constraint '" + c.name() + "' must have " + n + " coefficients").build();
            }
        }
    }

    /** Only the budget: short positions allowed, no bounds, groups or fixed weights. */
    public static Mandate budgetOnly(int n, double budget) {
        double[] lo = new double[n];
        double[] hi = new double[n];
        java.util.Arrays.fill(lo, Double.NEGATIVE_INFINITY);
        java.util.Arrays.fill(hi, Double.POSITIVE_INFINITY);
        return new Mandate(budget, lo, hi, Map.of(), List.of(), List.of());
    }

    /** Fully invested ({@code budget = 1}), nothing else. */
    public static Mandate fullyInvested(int n) {
        return budgetOnly(n, 1.0);
    }

    /** Number of assets the mandate covers. */
    public int size() {
        return lower.length;
    }

    @Override
    public double[] lower() {
        return lower.clone();
    }

    @Override
    public double[] upper() {
        return upper.clone();
    }

    /** Lower bound of asset i without copying. */
    public double lower(int i) {
        return lower[i];
    }

    /** Upper bound of asset i without copying. */
    public double upper(int i) {
        return upper[i];
    }

    /** True when some asset has a finite bound. */
    public boolean hasBounds() {
        for (int i = 0; i < lower.length; i++) {
            if (Double.isFinite(lower[i]) || Double.isFinite(upper[i])) {
                return true;
            }
        }
        return false;
    }

    /**
     * True when inequality rows are present beyond simple bounds: a group with a range (min below max) or a
     * general constraint that is not an equality. A group whose min equals its max is the equality
     * {@code group:<name>} and does not count.
     */
    public boolean hasGeneralInequalities() {
        for (Group g : groups) {
            if (g.min() != g.max()) {
                return true;
            }
        }
        for (LinearConstraint c : constraints) {
            if (c.relation() != Relation.EQUAL) {
                return true;
            }
        }
        return false;
    }

    /** True when only the budget, fixed weights and equality rows apply: the closed form is exact. */
    public boolean equalitiesOnly() {
        return !hasBounds() && !hasGeneralInequalities();
    }

    /**
     * Every constraint except simple bounds as rows, in a fixed order: budget, fixed weights, group limits
     * (min then max, only the finite ones), then the general constraints.
     *
     * @param assets asset names, used to name the fixed-weight rows
     */
    public List<LinearConstraint> rows(List<String> assets) {
        int n = size();
        List<LinearConstraint> rows = new ArrayList<>();
        double[] ones = new double[n];
        java.util.Arrays.fill(ones, 1.0);
        rows.add(new LinearConstraint("budget", ones, Relation.EQUAL, budget));
        for (Map.Entry<Integer, Double> e : fixed.entrySet()) {
            double[] a = new double[n];
            a[e.getKey()] = 1.0;
            rows.add(new LinearConstraint("fixed:" + assets.get(e.getKey()), a, Relation.EQUAL, e.getValue()));
        }
        for (Group g : groups) {
            double[] a = new double[n];
            for (int m : g.members()) {
                a[m] = 1.0;
            }
            if (g.min() == g.max()) {
                rows.add(new LinearConstraint("group:" + g.name(), a, Relation.EQUAL, g.min()));
                continue;
            }
            if (Double.isFinite(g.min())) {
                rows.add(new LinearConstraint(g.minName(), a, Relation.AT_LEAST, g.min()));
            }
            if (Double.isFinite(g.max())) {
                rows.add(new LinearConstraint(g.maxName(), a, Relation.AT_MOST, g.max()));
            }
        }
        rows.addAll(constraints);
        return rows;
    }

    /** The same mandate with another budget. */
    public Mandate withBudget(double b) {
        return new Mandate(b, lower, upper, fixed, groups, constraints);
    }

    /** The same mandate with further constraints appended. */
    public Mandate withConstraints(List<LinearConstraint> more) {
        List<LinearConstraint> all = new ArrayList<>(constraints);
        all.addAll(more);
        return new Mandate(budget, lower, upper, fixed, groups, all);
    }

    /** The same mandate with other bounds. */
    public Mandate withBounds(double[] lo, double[] hi) {
        return new Mandate(budget, lo, hi, fixed, groups, constraints);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Mandate m && Double.compare(m.budget, budget) == 0 && java.util.Arrays.equals(m.lower, lower)
                && java.util.Arrays.equals(m.upper, upper) && m.fixed.equals(fixed) && m.groups.equals(groups)
                && m.constraints.equals(constraints);
    }

    @Override
    public int hashCode() {
        return java.util.Arrays.hashCode(lower) * 31 + java.util.Arrays.hashCode(upper);
    }

    @Override
    public String toString() {
        return "Mandate[budget=" + budget + ", groups=" + groups.size() + ", constraints=" + constraints.size() + "]";
    }
}
