package org.isorisk.engine.estimate;

import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * A history of prices or returns: one row per date, one column per asset, as read from a table.
 *
 * @param source name of the table (usually the file name), used in messages
 * @param assets asset names, unique, in column order
 * @param dates  observation dates in table order (not necessarily sorted: the assessment reports disorder);
 *               copied
 * @param rows   for each date the one-based row number in the table (the header is row 1), for messages; copied
 * @param values {@code values[t][j]}: value of asset j on date t; {@link Double#NaN} for a missing cell; copied
 * @param kind   prices or returns
 */
public record History(String source, List<String> assets, LocalDate[] dates, int[] rows, double[][] values,
                      ValueKind kind) {

    public History {
        if (source == null || source.isBlank()) {
            source = "history";
        }
        if (assets == null || assets.isEmpty()) {
            throw InputException.of("the history has no asset columns").file(source)
                    .fix("give a date column followed by one column per asset").build();
        }
        assets = List.copyOf(assets);
        Map<String, Integer> seen = new HashMap<>();
        for (int j = 0; j < assets.size(); j++) {
            String a = assets.get(j);
            if (a == null || a.isBlank()) {
                throw InputException.of("asset column " + (j + 2) + " has no name").file(source).row(1)
                        .fix("name every asset column in the header").build();
            }
            if (seen.put(a, j) != null) {
                throw InputException.of("asset named twice in the header").file(source).row(1).asset(a)
                        .fix("give each asset one column").build();
            }
        }
        if (kind == null) {
            throw new IllegalArgumentException("kind is required");
        }
        if (dates == null || values == null || dates.length != values.length) {
            throw new IllegalArgumentException("one row of values per date");
        }
        dates = dates.clone();
        if (rows == null) {
            rows = new int[dates.length];
            for (int t = 0; t < rows.length; t++) {
                rows[t] = t + 2;
            }
        } else if (rows.length != dates.length) {
            throw new IllegalArgumentException("one row number per date");
        } else {
            rows = rows.clone();
        }
        int n = assets.size();
        double[][] copy = new double[values.length][];
        for (int t = 0; t < values.length; t++) {
            if (dates[t] == null) {
                throw new IllegalArgumentException("date of row " + rows[t] + " is missing");
            }
            if (values[t] == null || values[t].length != n) {
                throw InputException.of("row has " + (values[t] == null ? 0 : values[t].length) + " values for "
                        + n + " assets").file(source).row(rows[t]).fix("give one value per asset column").build();
            }
            copy[t] = values[t].clone();
            for (int j = 0; j < n; j++) {
                if (Double.isInfinite(copy[t][j])) {
                    throw InputException.of("value is infinite").file(source).row(rows[t]).column(assets.get(j))
                            .fix("give a finite number or leave the cell empty").build();
                }
            }
        }
        values = copy;
    }

    /** Number of dates (rows). */
    public int length() {
        return dates.length;
    }

    /** Number of assets (columns). */
    public int size() {
        return assets.size();
    }

    @Override
    public LocalDate[] dates() {
        return dates.clone();
    }

    @Override
    public int[] rows() {
        return rows.clone();
    }

    @Override
    public double[][] values() {
        double[][] c = new double[values.length][];
        for (int t = 0; t < values.length; t++) {
            c[t] = values[t].clone();
        }
        return c;
    }

    /** Date of row t without copying. */
    public LocalDate date(int t) {
        return dates[t];
    }

    /** Table row number of row t. */
    public int row(int t) {
        return rows[t];
    }

    /** Value of asset j on row t without copying ({@link Double#NaN} when missing). */
    public double value(int t, int j) {
        return values[t][j];
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof History h && h.source.equals(source) && h.assets.equals(assets)
                && java.util.Arrays.equals(h.dates, dates) && java.util.Arrays.equals(h.rows, rows)
                && java.util.Arrays.deepEquals(h.values, values) && h.kind == kind;
    }

    @Override
    public int hashCode() {
        return assets.hashCode() * 31 + java.util.Arrays.hashCode(dates);
    }

    @Override
    public String toString() {
        return "History[" + source + ", " + assets.size() + " assets, " + dates.length + " rows, " + kind.label() + "]";
    }
}
