package org.isorisk.engine.model;

import java.util.OptionalDouble;

/**
 * A mandate policy as read from a policy file: the {@link Mandate} the solvers use, plus the keys that other
 * steps use (the return target rule for {@code solve}, turnover and trading costs for rebalancing).
 *
 * @param mandate      budget, bounds, fixed weights, groups and general constraints
 * @param targetReturn the return target the policy sets, decimal, annualised; empty when it sets none
 * @param turnoverMax  largest allowed one-way-plus-other-way turnover {@code Σ|w − w₀|}, decimal; empty when none
 * @param costsBps     proportional trading cost per asset in basis points (copied); null when the policy gives none
 * @param source       where the policy came from (file name), for messages
 * @param maxTrade     per-asset largest |trade| for rebalancing, decimal (copied); null when the policy gives none
 * @param minTrade     smallest trade a rebalance keeps, decimal weight; 0 when the policy gives none
 * @param noTrade      indices of assets a rebalance must not trade (copied)
 */
public record Policy(Mandate mandate, OptionalDouble targetReturn, OptionalDouble turnoverMax, double[] costsBps,
                     String source, double[] maxTrade, double minTrade, java.util.Set<Integer> noTrade) {

    /** A policy without per-asset trade limits, minimum trade size or no-trade list. */
    public Policy(Mandate mandate, OptionalDouble targetReturn, OptionalDouble turnoverMax, double[] costsBps,
                  String source) {
        this(mandate, targetReturn, turnoverMax, costsBps, source, null, 0, java.util.Set.of());
    }

    public Policy {
        if (mandate == null) {
            throw new IllegalArgumentException("a policy needs its mandate");
        }
        targetReturn = targetReturn == null ? OptionalDouble.empty() : targetReturn;
        turnoverMax = turnoverMax == null ? OptionalDouble.empty() : turnoverMax;
        if (costsBps != null) {
            costsBps = Checks.finiteCopy(costsBps, mandate.size(), "trading costs");
        }
        if (maxTrade != null) {
            if (maxTrade.length != mandate.size()) {
                throw new IllegalArgumentException("one trade limit per asset");
            }
            maxTrade = maxTrade.clone();
        }
        Checks.finite(minTrade, "minimum trade size");
        noTrade = java.util.Collections.unmodifiableSortedSet(new java.util.TreeSet<>(noTrade == null
                ? java.util.Set.of() : noTrade));
    }

    @Override
    public double[] maxTrade() {
        return maxTrade == null ? null : maxTrade.clone();
    }

    @Override
    public double[] costsBps() {
        return costsBps == null ? null : costsBps.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Policy p && p.mandate.equals(mandate) && p.targetReturn.equals(targetReturn)
                && p.turnoverMax.equals(turnoverMax) && java.util.Arrays.equals(p.costsBps, costsBps);
    }

    @Override
    public int hashCode() {
        return mandate.hashCode();
    }

    @Override
    public String toString() {
        return "Policy[" + source + ", " + mandate + "]";
    }
}
