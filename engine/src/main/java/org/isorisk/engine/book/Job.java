package org.isorisk.engine.book;

import java.util.Locale;

/** The job run for every portfolio of a book, named as the single commands are. */
public enum Job {
    /** {@code isorisk solve}: the minimum-variance portfolio for the row's target under its mandate. */
    SOLVE,
    /** {@code isorisk rebalance}: today's holdings to a proposal within the policy and the trading limits. */
    REBALANCE,
    /** {@code isorisk stress}: the row's target under the base assumptions and every scenario. */
    STRESS;

    /** The name on the command line and in results: {@code solve}, {@code rebalance}, {@code stress}. */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The job named {@code s} (ignoring case), or null. */
    public static Job of(String s) {
        for (Job j : values()) {
            if (j.label().equalsIgnoreCase(s.strip())) {
                return j;
            }
        }
        return null;
    }
}
