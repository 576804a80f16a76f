package org.isorisk.engine.estimate;

/** What the numbers of a {@link History} are: prices (levels) or returns per period. */
public enum ValueKind {
    /** Prices or index levels; returns are computed between consecutive rows. */
    PRICES("prices"),
    /** Returns per period, decimal (0.01 is 1 %), used as given. */
    RETURNS("returns");

    private final String label;

    ValueKind(String label) {
        this.label = label;
    }

    /** The name used on the command line and in reports. */
    public String label() {
        return label;
    }

    /** Parses a label such as {@code prices}; null when unknown. */
    public static ValueKind fromLabel(String s) {
        for (ValueKind k : values()) {
            if (k.label.equalsIgnoreCase(s)) {
                return k;
            }
        }
        return null;
    }
}
