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
 */
public record Policy(Mandate mandate, OptionalDouble targetReturn, OptionalDouble turnoverMax, double[] costsBps,
                     String source) {
    public Policy {
        if (mandate == null) {
            throw new IllegalArgumentException("a policy needs its mandate");
        }
        targetReturn = targetReturn == null ? OptionalDouble.empty() : targetReturn;
        turnoverMax = turnoverMax == null ? OptionalDouble.empty() : turnoverMax;
        if (costsBps != null) {
            costsBps = Checks.finiteCopy(costsBps, mandate.size(), "trading costs");
        }
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
