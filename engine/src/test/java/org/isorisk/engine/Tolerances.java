package org.isorisk.engine;

/** The tolerances every test uses, defined once. */
public final class Tolerances {
    private Tolerances() {
    }

    /** Agreement expected from exact arithmetic done in double precision. */
    public static final double TIGHT = 1e-12;
    /** Closed-form solutions against each other or a reference formula. */
    public static final double CLOSED_FORM = 1e-10;
    /** Iterative or numerical methods, finite differences. */
    public static final double NUMERICAL = 1e-7;
    /** Everything else. */
    public static final double GENERAL = 1e-8;
}
