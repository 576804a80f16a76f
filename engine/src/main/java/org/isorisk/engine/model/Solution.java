package org.isorisk.engine.model;

import java.util.List;
import java.util.Optional;

/**
 * An optimal portfolio with everything needed to explain and trust it.
 *
 * @param method         how it was computed
 * @param assets         asset names, in the order of {@code weights}
 * @param weights        portfolio weights, decimal (copied)
 * @param expectedReturn {@code μ'w}, decimal, annualised
 * @param variance       {@code w'Σw}
 * @param volatility     {@code sqrt(w'Σw)}
 * @param multipliers    one entry per constraint of the problem, in the project's sign convention (copied,
 *                       unless it is a {@link CompactMultipliers}, which is immutable and kept as it is)
 * @param certificate    KKT residuals and conditioning
 * @param notes          plain-language remarks for the reader (e.g. "short positions allowed")
 */
public record Solution(Method method, List<String> assets, double[] weights, double expectedReturn, double variance,
                       double volatility, List<Multiplier> multipliers, Certificate certificate, List<String> notes) {

    public Solution {
        assets = List.copyOf(assets);
        weights = weights.clone();
        // A compact list is already immutable: kept as it is (copying it would make one record per entry).
        multipliers = multipliers instanceof CompactMultipliers ? multipliers : List.copyOf(multipliers);
        notes = List.copyOf(notes);
        if (weights.length != assets.size()) {
            throw new IllegalArgumentException("one weight per asset");
        }
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }

    /** Weight of asset i without copying. */
    public double weight(int i) {
        return weights[i];
    }

    /** The multiplier of the named constraint, if the problem had it. */
    public Optional<Multiplier> multiplier(String constraint) {
        if (multipliers instanceof CompactMultipliers c) {
            return c.named(constraint);
        }
        return multipliers.stream().filter(m -> m.constraint().equals(constraint)).findFirst();
    }

    /** The binding constraints' multipliers. */
    public List<Multiplier> binding() {
        return multipliers.stream().filter(Multiplier::binding).toList();
    }

    /** Status of a solution object is always optimal; failures are exceptions. */
    public Status status() {
        return Status.OPTIMAL;
    }

    /** The same solution with more notes. */
    public Solution withNotes(List<String> more) {
        List<String> all = new java.util.ArrayList<>(notes);
        all.addAll(more);
        return new Solution(method, assets, weights, expectedReturn, variance, volatility, multipliers, certificate, all);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Solution s && s.method == method && s.assets.equals(assets)
                && java.util.Arrays.equals(s.weights, weights) && s.multipliers.equals(multipliers);
    }

    @Override
    public int hashCode() {
        return java.util.Arrays.hashCode(weights);
    }

    @Override
    public String toString() {
        return "Solution[" + method.label() + ", return=" + expectedReturn + ", volatility=" + volatility + "]";
    }
}
