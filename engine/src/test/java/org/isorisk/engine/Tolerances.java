package org.isorisk.engine;

/** The tolerances every test uses, defined once. */
public final class Tolerances {
    private Tolerances() {
    }

    /** Round-off of a few operations on numbers of order one. */
    public static final double TIGHT = 1e-12;
    /** What the closed form promises (relative). */
    public static final double CLOSED_FORM = 1e-10;
    /** What a numerical (iterative) solver promises. */
    public static final double NUMERICAL = 1e-7;
    /** General comparisons of computed values. */
    public static final double GENERAL = 1e-8;
}
