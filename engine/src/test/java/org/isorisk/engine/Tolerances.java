package org.isorisk.engine;

/** The test suite's tolerances, defined once. */
public final class Tolerances {
    private Tolerances() {
    }

    /** Agreement of two exact computations in double precision. */
    public static final double TIGHT = 1e-12;
    /** Closed-form results against published formulas. */
    public static final double CLOSED_FORM = 1e-10;
    /** Results of iterative or finite-difference methods. */
    public static final double NUMERICAL = 1e-7;
    /** General agreement between independent exact methods. */
    public static final double GENERAL = 1e-8;
}
