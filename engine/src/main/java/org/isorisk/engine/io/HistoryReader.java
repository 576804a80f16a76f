package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
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
 * Reads a history table: a header row with a date column first and one column per asset, then one row per date
 * with prices or returns (decimals). Empty cells and NA, N/A, NaN, null, #N/A are missing values. Dates are ISO
 * {@code yyyy-MM-dd} unless {@link DateFormat#DAY_MONTH_YEAR} is asked for.
 */
public final class HistoryReader {
    private HistoryReader() {
    }

    /** Reads {@code file} (UTF-8); the file name is used in messages. */
    public static History read(Path file, ValueKind kind, DateFormat dates) {
        String source = file.getFileName() == null ? file.toString() : file.getFileName().toString();
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            return read(r, source, kind, dates);
        } catch (NoSuchFileException e) {
            throw InputException.of("file not found").file(file.toString()).fix("check the path of --history").build();
        } catch (IOException e) {
            throw InputException.of("cannot read the file: " + e.getMessage()).file(file.toString()).build();
        }
    }

    /** Reads a history from {@code reader}; {@code source} names it in messages. */
    public static History read(Reader reader, String source, ValueKind kind, DateFormat dates) {
        DateFormat format = dates == null ? DateFormat.ISO : dates;
        CsvRecords csv = new CsvRecords(reader, source);
        CsvRecords.Record header = csv.next();
        if (header == null) {
            throw InputException.of("the file is empty").file(source)
                    .fix("give a header row: a date column, then one column per asset").build();
        }
        List<String> h = header.fields();
        if (h.size() < 2) {
            String only = h.get(0);
            throw InputException.of("the header has a single column").file(source).row(header.row())
                    .fix(only.contains(";") ? "the file seems to use ';' between columns: save it comma-separated"
                            : "give a date column, then one column per asset, separated by commas").build();
        }
        List<String> assets = new ArrayList<>(h.subList(1, h.size()));
        String dateColumn = h.get(0).isEmpty() ? "date" : h.get(0);
        int n = assets.size();
        List<CsvRecords.Record> records = new ArrayList<>();
        for (CsvRecords.Record rec = csv.next(); rec != null; rec = csv.next()) {
            records.add(rec);
        }
        int count = records.size();
        LocalDate[] ds = new LocalDate[count];
        int[] rows = new int[count];
        double[][] values = new double[count][];
        // Lines are independent: parse them on every core; the first error in table order is reported.
        InputException[] errors = new InputException[count];
        IntStream.range(0, count).parallel().forEach(t -> {
            CsvRecords.Record rec = records.get(t);
            rows[t] = rec.row();
            try {
                if (rec.raw() != null) {
                    parseLine(rec.raw(), rec.row(), n, assets, source, format, dateColumn, ds, values, t);
                } else {
                    parseFields(rec.fields(), rec.row(), n, assets, source, format, dateColumn, ds, values, t);
                }
            } catch (InputException e) {
                errors[t] = e;
            }
        });
        for (InputException e : errors) {
            if (e != null) {
                throw e;
            }
        }
        return new History(source, assets, ds, rows, values, kind);
    }

    private static InputException ragged(int fields, int n, String source, int row) {
        return InputException.of("the row has " + fields + " fields but the header has " + (n + 1))
                .file(source).row(row)
                .fix("give one value per column (a decimal comma splits a number in two: write 0.05, not 0,05)")
                .build();
    }

    private static void parseFields(List<String> f, int row, int n, List<String> assets, String source,
                                    DateFormat format, String dateColumn, LocalDate[] ds, double[][] values, int t) {
        if (f.size() != n + 1) {
            throw ragged(f.size(), n, source, row);
        }
        ds[t] = date(f.get(0), format, source, row, dateColumn);
        double[] v = new double[n];
        for (int j = 0; j < n; j++) {
            v[j] = CsvRecords.number(f.get(j + 1), true, source, row, assets.get(j));
        }
        values[t] = v;
    }

    /** A line without quotes: numbers are read straight from the line, without a string per cell. */
    private static void parseLine(String line, int row, int n, List<String> assets, String source,
                                  DateFormat format, String dateColumn, LocalDate[] ds, double[][] values, int t) {
        int comma = line.indexOf(',');
        if (comma < 0) {
            throw ragged(1, n, source, row);
        }
        ds[t] = date(line.substring(0, comma).trim(), format, source, row, dateColumn);
        double[] v = new double[n];
        int start = comma + 1;
        for (int j = 0; j < n; j++) {
            int end = line.indexOf(',', start);
            if ((end < 0) != (j == n - 1)) {
                throw ragged(CsvRecords.split(line).size(), n, source, row);
            }
            if (end < 0) {
                end = line.length();
            }
            int a = start;
            int b = end;
            while (a < b && line.charAt(a) <= ' ') {
                a++;
            }
            while (b > a && line.charAt(b - 1) <= ' ') {
                b--;
            }
            double x = a == b ? Double.NaN : CsvRecords.fastDecimal(line, a, b);
            if (Double.isNaN(x) && a < b) {
                x = CsvRecords.number(line.substring(a, b), true, source, row, assets.get(j));
            }
            v[j] = x;
            start = end + 1;
        }
        values[t] = v;
    }

    private static LocalDate date(String s, DateFormat format, String source, int row, String column) {
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
            throw InputException.of("the date is not in the format " + format.label()).file(source).row(row)
                    .column(column).value(s).fix(fix).build();
        }
    }
}
