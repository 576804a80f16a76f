package org.isorisk.engine.explain;

/** The caution that every human-readable result and every JSON object carries; one text, used everywhere. */
public final class Caution {
    private Caution() {
    }

    /** The full caution. */
    public static final String TEXT = "Illustrative model output, not investment advice. Results depend entirely on the "
            + "assumptions supplied (expected returns, risks, correlations) and on the model; the fund's investment "
            + "policy, local regulation and licensed professionals decide.";

    /** Short form for chart footnotes. */
    public static final String SHORT = "Illustrative model output, not investment advice; depends on the assumptions. "
            + "The investment policy, regulation and licensed professionals decide.";
}
