package org.isorisk.engine;

/** The tolerances every test uses, defined once. */
public final class Tolerances {
    private Tolerances() {
    }

    /** Agreement of two computations of the same formula in double precision. */
    public static final double TIGHT = 1e-12;
    /** Closed-form results against independent references. */
    public static final double CLOSED_FORM = 1e-10;
    /** Iterative methods against references. */
    public static final double NUMERICAL = 1e-7;
    /** General agreement between independent solvers. */
    public static final double GENERAL = 1e-8;
}
