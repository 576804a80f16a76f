package org.isorisk.engine.stress;

import java.util.List;

/**
 * A return target where the set of binding constraints changes.
 *
 * @param at      the target where it changes: exact (a corner portfolio's return) when {@code exact}, otherwise
 *                NaN and the change lies between {@code from} and {@code to}
 * @param from    grid target before the change
 * @param to      grid target after the change
 * @param entered constraints that start binding
 * @param left    constraints that stop binding
 * @param exact   true when computed from the corner portfolios of the critical line
 */
public record BindingChange(double at, double from, double to, List<String> entered, List<String> left,
                            boolean exact) {
    public BindingChange {
        entered = List.copyOf(entered);
        left = List.copyOf(left);
    }
}
