package org.isorisk.notebooks.chart;

import java.time.LocalDate;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.SourceFile;

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

    /**
     * The context of results read from files: the as-of date of the provenance and a SHA-256 over the input files'
     * own SHA-256 digests in the order read, so that the printed hash changes when any input does.
     *
     * @param fundName the fund's name; null to take it from the inputs' {@code # scenario:} line (up to its first
     *                 comma), or none
     */
    public static ChartContext of(Provenance p, String fundName) {
        StringBuilder all = new StringBuilder();
        for (SourceFile f : p.inputs()) {
            all.append(f.sha256()).append('\n');
        }
        String hash = SourceFile.sha256(all.toString().getBytes(
                java.nio.charset.StandardCharsets.UTF_8));
        String name = fundName;
        if (name == null && p.scenario() != null) {
            int comma = p.scenario().indexOf(',');
            name = comma < 0 ? p.scenario() : p.scenario().substring(0, comma);
        }
        return new ChartContext(p.asOf(), hash, name);
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
