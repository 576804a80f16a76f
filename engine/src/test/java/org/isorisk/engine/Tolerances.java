package org.isorisk.engine;

/** The tolerances every test uses, defined once. */
public final class Tolerances {
    private Tolerances() {
    }

    /** Round-off level of exact identities in double precision. */
    public static final double TIGHT = 1e-12;
    /** What a closed-form (Cholesky) solve promises. */
    public static final double CLOSED_FORM = 1e-10;
    /** What an iterative or active-set method promises. */
    public static final double NUMERICAL = 1e-7;
    /** General comparisons. */
    public static final double GENERAL = 1e-8;
}
