package org.isorisk.engine.chart;

import java.time.LocalDate;
import java.util.Locale;
import org.isorisk.engine.error.InputException;

/**
 * Where a chart's numbers come from, printed in its footnote beside the caution: the date the assumptions refer
 * to, a short hash of the input files (so a printed chart can be matched to its inputs) and the fund's name.
 *
 * @param asOf      the as-of date of the capital-market assumptions; null when the inputs give none (the footnote
 *                  then says so)
 * @param inputHash a hash of the inputs, hex; the footnote shows its first {@link #SHORT_HASH} characters
 * @param fundName  the fund's name for titles; blank or null for none
 */
public record ChartContext(LocalDate asOf, String inputHash, String fundName) {

    /** Characters of the input hash printed on a chart. */
    public static final int SHORT_HASH = 12;

    public ChartContext {
        if (inputHash == null || !inputHash.matches("[0-9a-fA-F]{6,}")) {
            throw InputException.of("a chart needs a hexadecimal hash of its inputs (at least 6 digits)")
                    .value(inputHash).fix("hash the input files, e.g. with SHA-256").build();
        }
        inputHash = inputHash.toLowerCase(Locale.ROOT);
        fundName = fundName == null ? "" : fundName.strip();
    }

    /** The hash as printed: its first {@link #SHORT_HASH} hex digits. */
    public String shortHash() {
        return inputHash.substring(0, Math.min(SHORT_HASH, inputHash.length()));
    }

    /** The provenance line of the footnote. */
    public String provenanceLine() {
        String fund = fundName.isEmpty() ? "" : fundName + " \u00b7 ";
        String date = asOf == null ? "as-of date of the assumptions not given" : "assumptions as of " + asOf;
        return fund + date + " \u00b7 inputs #" + shortHash();
    }
}
