package org.isorisk.engine.io;

import java.nio.file.Path;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.IntStream;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.ValueKind;

/**
 * Reads a history table with the project's CSV reader ({@link Csv}): a header row with a date column first and
 * one column per asset, then one row per date with prices or returns (decimals). Empty cells and NA, N/A, NaN,
 * null, #N/A are missing values. Dates are ISO {@code yyyy-MM-dd} unless {@link DateFormat#DAY_MONTH_YEAR} is asked
 * for; slashed dates are never guessed.
 */
public final class HistoryReader {
    private HistoryReader() {
    }

    /** The role named in messages and provenance. */
    public static final String ROLE = "history";

    /** Reads {@code file} (not modified). */
    public static History read(Path file, ValueKind kind, DateFormat dates) {
        return read(Csv.read(file, ROLE), kind, dates);
    }

    /** Reads a history given as text; {@code name} stands for the file in messages. */
    public static History parse(String name, String text, ValueKind kind, DateFormat dates) {
        return read(Csv.parse(name, ROLE, text), kind, dates);
    }

    /** Reads a history from a parsed table. */
    public static History read(CsvTable t, ValueKind kind, DateFormat dates) {
        DateFormat format = dates == null ? DateFormat.ISO : dates;
        List<String> h = t.header();
        if (h.size() < 2) {
            String only = h.isEmpty() ? "" : h.get(0);
            throw t.error("the header has a single column").row(t.headerRow())
                    .fix(only.contains(";") ? "the file seems to use ';' between columns: save it comma-separated"
                            : "give a date column, then one column per asset, separated by commas").build();
        }
        List<String> assets = new ArrayList<>(h.subList(1, h.size()));
        String dateColumn = h.get(0).isEmpty() ? "date" : h.get(0);
        int n = assets.size();
        List<CsvRow> rows = t.rows();
        int count = rows.size();
        LocalDate[] ds = new LocalDate[count];
        int[] rowNumbers = new int[count];
        double[][] values = new double[count][];
        // Rows are independent: parse them on every core; the first error in table order is reported.
        InputException[] errors = new InputException[count];
        IntStream.range(0, count).parallel().forEach(k -> {
            CsvRow r = rows.get(k);
            rowNumbers[k] = r.number();
            try {
                ds[k] = date(t, r.cell(0).strip(), format, r.number(), dateColumn);
                double[] v = new double[n];
                for (int j = 0; j < n; j++) {
                    v[j] = cell(t, r, j + 1, assets.get(j));
                }
                values[k] = v;
            } catch (InputException e) {
                errors[k] = e;
            }
        });
        for (InputException e : errors) {
            if (e != null) {
                throw e;
            }
        }
        return new History(t.source().path(), assets, ds, rowNumbers, values, kind);
    }

    /** A number, or NaN for a missing value; other text is an error naming the cell. */
    private static double cell(CsvTable t, CsvRow r, int column, String asset) {
        String s = r.cell(column);
        double fast = Decimals.fast(s);
        if (!Double.isNaN(fast)) {
            return fast;
        }
        String x = s.strip();
        if (isMissing(x)) {
            return Double.NaN;
        }
        return t.number(r, column, asset);
    }

    /** Cells that mean "no value": empty, NA, N/A, NaN, null, #N/A (any case). */
    static boolean isMissing(String s) {
        return s.isEmpty() || s.equalsIgnoreCase("NA") || s.equalsIgnoreCase("N/A") || s.equalsIgnoreCase("NaN")
                || s.equalsIgnoreCase("null") || s.equalsIgnoreCase("#N/A");
    }

    private static LocalDate date(CsvTable t, String s, DateFormat format, int row, String column) {
        try {
            return LocalDate.parse(s, format.formatter());
        } catch (DateTimeParseException e) {
            String fix;
            if (format == DateFormat.ISO && s.matches("\\d{1,2}/\\d{1,2}/\\d{4}")) {
                fix = "write ISO dates (yyyy-MM-dd), or give --date-format dd/MM/yyyy if the file uses "
                        + "day/month/year (slashed dates are not guessed: 03/04/2020 could be March or April)";
            } else if (s.isEmpty()) {
                fix = "give a date on every row";
            } else {
                fix = "write dates as " + format.label();
            }
            throw t.error("the date is not in the format " + format.label()).row(row).column(column).value(s)
                    .fix(fix).build();
        }
    }
}
