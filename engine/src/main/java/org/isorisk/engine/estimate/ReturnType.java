package org.isorisk.engine.estimate;

/**
 * Which return a price change becomes. Simple: {@code r = p_t/p_{t−1} − 1}; log (continuously compounded):
 * {@code r = ln(p_t/p_{t−1})}. For a history of returns it states which kind the file holds; they are used as
 * given, not converted.
 */
public enum ReturnType {
    SIMPLE("simple"),
    LOG("log");

    private final String label;

    ReturnType(String label) {
        this.label = label;
    }

    /** The name used on the command line and in reports. */
    public String label() {
        return label;
    }

    /** Parses a label such as {@code log}; null when unknown. */
    public static ReturnType fromLabel(String s) {
        for (ReturnType t : values()) {
            if (t.label.equalsIgnoreCase(s)) {
                return t;
            }
        }
        return null;
    }
}
