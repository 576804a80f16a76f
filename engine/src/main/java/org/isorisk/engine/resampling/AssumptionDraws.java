package org.isorisk.engine.resampling;

/**
 * A source of drawn assumption sets. Every implementation is immutable and thread-safe, and
 * {@link #draw(long)} is a pure function of the seed, the draw index and the inputs given at construction.
 */
public interface AssumptionDraws {

    /** The assumption set of draw {@code index} (zero-based), re-estimated from its own sample. */
    DrawnAssumptions draw(long index);

    /** The seed the draws come from (recorded with every result). */
    long seed();

    /** Number of periods in each drawn sample. */
    int observations();

    /** Periods per year used to annualise. */
    int periodsPerYear();
}
