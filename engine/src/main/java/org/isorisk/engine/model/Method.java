package org.isorisk.engine.model;

/** The solution method; {@link #AUTO} lets the allocator choose and the solution says which it used. */
public enum Method {
    AUTO("auto"),
    /** KKT system of the Lagrangian solved through a Cholesky factor; exact when only equalities apply. */
    CLOSED_FORM("closed-form"),
    /** Markowitz's critical line method: exact corner portfolios for budget, bounds and fixed weights. */
    CRITICAL_LINE("critical-line"),
    /** Active-set convex quadratic programming for the general mandate. */
    NUMERICAL("numerical");

    private final String label;

    Method(String label) {
        this.label = label;
    }

    /** The name used in the JSON contract and on the command line. */
    public String label() {
        return label;
    }

    /** Parses a label such as {@code closed-form}; null when unknown. */
    public static Method fromLabel(String s) {
        for (Method m : values()) {
            if (m.label.equalsIgnoreCase(s)) {
                return m;
            }
        }
        return null;
    }
}
