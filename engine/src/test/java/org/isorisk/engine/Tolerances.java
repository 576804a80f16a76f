package org.isorisk.engine;

/** The tolerances every test uses, defined once (EJML style: general and tight). */
public final class Tolerances {
    private Tolerances() {
    }

    /** Round-off level of a well-conditioned dense computation. */
    public static final double TIGHT = 1e-12;
    /** What a closed-form (Cholesky) solve must reach. */
    public static final double CLOSED_FORM = 1e-10;
    /** What an iterative or active-set method promises. */
    public static final double NUMERICAL = 1e-7;
    /** General agreement between two independent exact methods. */
    public static final double GENERAL = 1e-8;
}
