package org.isorisk.engine.model;

/** How a linear constraint's left side relates to its limit. */
public enum Relation {
    /** {@code a'w = b}. */
    EQUAL("="),
    /** {@code a'w <= b}; its shadow price ∂V*∂b is ≤ 0 when binding. */
    AT_MOST("<="),
    /** {@code a'w >= b}; its shadow price ∂V*∂b is ≥ 0 when binding. */
    AT_LEAST(">=");

    private final String symbol;

    Relation(String symbol) {
        this.symbol = symbol;
    }

    public String symbol() {
        return symbol;
    }
}
