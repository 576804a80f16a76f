package org.isorisk.engine.estimate;

/**
 * One finding of the data-quality assessment or of the estimation, as a value: what, how serious, where, and
 * a one-line message that names the asset, date and row and says what would fix it.
 *
 * @param code     what kind of problem
 * @param severity errors stop the estimate; warnings are printed with it
 * @param asset    the asset concerned, or null when the finding is about the whole table
 * @param row      one-based table row (the header is row 1), or 0 when not about one row
 * @param message  the exact sentence shown to the user
 */
public record Issue(Code code, Severity severity, String asset, int row, String message) {

    public Issue {
        if (code == null || severity == null || message == null || message.isBlank()) {
            throw new IllegalArgumentException("code, severity and message are required");
        }
    }

    /** How serious a finding is. */
    public enum Severity {
        /** The estimate cannot be computed from this table as it stands. */
        ERROR("error"),
        /** The estimate is computed but may mislead; read before using it. */
        WARNING("warning"),
        /** Worth knowing (e.g. how many rows were dropped). */
        INFO("info");

        private final String label;

        Severity(String label) {
            this.label = label;
        }

        public String label() {
            return label;
        }
    }

    /** The kinds of finding, each with a stable name for JSON. */
    public enum Code {
        DATES_OUT_OF_ORDER("dates-out-of-order"),
        DUPLICATE_DATE("duplicate-date"),
        GAP("gap"),
        FREQUENCY_MISMATCH("frequency-mismatch"),
        MISSING_CELLS("missing-cells"),
        PAIRWISE_DELETION("pairwise-deletion"),
        STALE_PRICES("stale-prices"),
        NON_POSITIVE_PRICE("non-positive-price"),
        RETURN_BELOW_MINUS_ONE("return-below-minus-one"),
        TOO_FEW_OBSERVATIONS("too-few-observations"),
        FEW_OBSERVATIONS("few-observations"),
        NOT_POSITIVE_SEMIDEFINITE("not-positive-semidefinite"),
        HISTORICAL_MEAN("historical-mean"),
        REFERENCE_WEIGHTS("reference-weights");

        private final String label;

        Code(String label) {
            this.label = label;
        }

        public String label() {
            return label;
        }
    }

    static Issue error(Code c, String asset, int row, String message) {
        return new Issue(c, Severity.ERROR, asset, row, message);
    }

    static Issue warning(Code c, String asset, int row, String message) {
        return new Issue(c, Severity.WARNING, asset, row, message);
    }

    static Issue info(Code c, String asset, int row, String message) {
        return new Issue(c, Severity.INFO, asset, row, message);
    }
}
