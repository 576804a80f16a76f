package org.isorisk.engine.estimate;

/** What to do with return rows where some asset has no value. */
public enum MissingPolicy {
    /** Drop every return row with a missing value (the default); every estimate then uses the same rows. */
    LISTWISE("listwise"),
    /**
     * Each mean uses the rows where its asset is present and each covariance the rows where both assets are; uses
     * more data but the matrix can fail to be positive semi-definite. Sample covariance only.
     */
    PAIRWISE("pairwise");

    private final String label;

    MissingPolicy(String label) {
        this.label = label;
    }

    /** The name used on the command line and in reports. */
    public String label() {
        return label;
    }

    /** Parses a label such as {@code pairwise}; null when unknown. */
    public static MissingPolicy fromLabel(String s) {
        for (MissingPolicy p : values()) {
            if (p.label.equalsIgnoreCase(s)) {
                return p;
            }
        }
        return null;
    }
}
