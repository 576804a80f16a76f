package org.isorisk.engine.io;

import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.isorisk.engine.error.InputException;

/**
 * Where a result came from: the input files (name, role, SHA-256) and the date the assumptions are as of.
 * Results, charts and committee packs print it so that a reader can tell which inputs produced them.
 *
 * @param inputs     the files read, in the order read
 * @param asOf       the as-of date, or null when neither {@code --as-of} nor any file gave one
 * @param asOfSource where the date came from: {@code --as-of}, a file name, or {@code none}
 * @param scenario   what the inputs describe, from the first {@code # scenario:} line of a file; null when none
 */
public record Provenance(List<SourceFile> inputs, LocalDate asOf, String asOfSource, String scenario) {

    /** The metadata key that carries a file's own as-of date: {@code # as_of: 2025-06-30} above the header. */
    public static final String AS_OF_KEY = "as_of";
    /** The metadata key that says what the inputs describe: {@code # scenario: ...} above the header. */
    public static final String SCENARIO_KEY = "scenario";

    public Provenance {
        inputs = List.copyOf(inputs);
        if (asOfSource == null) {
            asOfSource = asOf == null ? "none" : "unknown";
        }
    }

    /** The as-of date, if known. */
    public Optional<LocalDate> asOfDate() {
        return Optional.ofNullable(asOf);
    }

    /** The same provenance with one more input file (e.g. holdings read after the assumptions). */
    public Provenance withInput(SourceFile f) {
        List<SourceFile> all = new ArrayList<>(inputs);
        all.add(f);
        return new Provenance(all, asOf, asOfSource, scenario);
    }

    /** One line for people: {@code expected_returns.csv (sha256 1a2b3c4d5e6f), ...; as of 2025-06-30}. */
    public String describe() {
        List<String> parts = new ArrayList<>();
        for (SourceFile f : inputs) {
            parts.add(f.name() + " (sha256 " + f.shortHash() + ")");
        }
        String files = parts.isEmpty() ? "no input files" : String.join(", ", parts);
        return files + "; as of " + (asOf == null ? "(no date given)" : asOf + " (from " + asOfSource + ")");
    }

    /**
     * Builds the provenance of {@code tables}: the as-of date is {@code option} when given, else the first
     * file's {@code # as_of:} line; a warning is added to {@code warnings} when files disagree.
     */
    public static Provenance of(List<CsvTable> tables, LocalDate option, List<String> warnings) {
        List<SourceFile> files = new ArrayList<>();
        LocalDate date = option;
        String from = option == null ? null : "--as-of";
        List<String> seen = new ArrayList<>();
        boolean differ = false;
        String scenario = null;
        for (CsvTable t : tables) {
            files.add(t.source());
            if (scenario == null && t.meta(SCENARIO_KEY).isPresent()) {
                scenario = t.meta(SCENARIO_KEY).get().value();
            }
            Optional<CsvTable.Metadata> m = t.meta(AS_OF_KEY);
            if (m.isEmpty()) {
                continue;
            }
            LocalDate d = parseDate(m.get().value(), t, m.get().row());
            seen.add(t.source().name() + " " + d);
            if (date == null) {
                date = d;
                from = t.source().name();
            } else if (!d.equals(date) && option == null) {
                differ = true;
            }
        }
        if (differ) {
            warnings.add("the input files give different as-of dates (" + String.join(", ", seen) + "); results use "
                    + date + " from " + from + " (pass --as-of to choose)");
        }
        return new Provenance(files, date, from == null ? "none" : from, scenario);
    }

    /** Parses an ISO date (YYYY-MM-DD) given in a file or an option. */
    public static LocalDate parseDate(String text, CsvTable t, int row) {
        try {
            return LocalDate.parse(text.strip());
        } catch (DateTimeParseException e) {
            InputException.Builder b = t == null ? InputException.of("--as-of is not a date")
                    : t.error("the as_of line is not a date").row(row);
            throw b.value(text).fix("write the date as YYYY-MM-DD, e.g. 2025-06-30").build();
        }
    }
}
