package org.isorisk.engine.model;

/** Outcome of a solve, named as in the JSON contract. */
public enum Status {
    OPTIMAL("optimal"),
    INFEASIBLE("infeasible"),
    INVALID_INPUT("invalid-input"),
    /** A numerical failure (an iteration limit, a bug): reported, never silent. */
    NOT_SOLVED("not-solved");

    private final String label;

    Status(String label) {
        this.label = label;
    }

    public String label() {
        return label;
    }
}
