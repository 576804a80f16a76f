package org.isorisk.engine.io;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.isorisk.engine.error.InputException;

/**
 * A CSV file as read by {@link Csv}: header names, data rows with their spreadsheet row numbers, and the
 * {@code # key: value} lines that stood above the header.
 *
 * @param source    the file (name, role, SHA-256)
 * @param header    column names, trimmed, unique ignoring case
 * @param headerRow one-based row number of the header
 * @param rows      data rows, each with exactly {@code header.size()} cells; blank and comment rows left out
 * @param metadata  {@code # key: value} lines above the header, keys in lower case
 */
public record CsvTable(SourceFile source, List<String> header, int headerRow, List<CsvRow> rows,
                       List<Metadata> metadata) {

    /**
     * One {@code # key: value} line above the header, e.g. {@code # as_of: 2025-06-30}.
     *
     * @param key   lower-case key
     * @param value trimmed value
     * @param row   one-based row number of the line
     */
    public record Metadata(String key, String value, int row) {
    }

    public CsvTable {
        header = List.copyOf(header);
        rows = List.copyOf(rows);
        metadata = List.copyOf(metadata);
    }

    /** Zero-based index of the column named {@code name} (ignoring case), or -1. */
    public int column(String name) {
        for (int i = 0; i < header.size(); i++) {
            if (header.get(i).equalsIgnoreCase(name)) {
                return i;
            }
        }
        return -1;
    }

    /** Zero-based index of the column named {@code name}, or an error saying which columns the file has. */
    public int requireColumn(String name, String fix) {
        int i = column(name);
        if (i < 0) {
            throw error("no column named '" + name + "' in the header (row " + headerRow + ")")
                    .value(String.join(",", header)).fix(fix).build();
        }
        return i;
    }

    /** The value of a metadata key, if present. */
    public Optional<Metadata> meta(String key) {
        String k = key.toLowerCase(Locale.ROOT);
        return metadata.stream().filter(m -> m.key().equals(k)).findFirst();
    }

    /**
     * The number in a cell, in the units given; an error naming file, row, column, asset and value otherwise.
     *
     * @param asset asset the row is about, for the message; null when unknown
     */
    public double number(CsvRow row, int column, String asset) {
        return number(source.path(), header, row, column, asset);
    }

    /**
     * The number in a cell of a file read as a table or as a stream ({@link CsvStream}); an error naming file, row,
     * column, asset and value otherwise.
     *
     * @param file   the file's path as errors give it
     * @param header the file's column names
     */
    static double number(String file, List<String> header, CsvRow row, int column, String asset) {
        String text = row.cell(column);
        double fast = Decimals.fast(text);
        if (!Double.isNaN(fast)) {
            return fast;
        }
        String t = text == null ? "" : text.strip();
        if (Decimals.plain(t)) {
            double v = Double.parseDouble(t);
            if (Double.isFinite(v)) {
                return v;
            }
        }
        NumberText.Problem p = NumberText.problem(text);
        if (p != null) {
            InputException.Builder b = InputException.of(p.problem()).file(file).row(row.number())
                    .column(header.get(column)).value(text).fix(p.fix());
            if (asset != null && !asset.isBlank()) {
                b.asset(asset);
            }
            throw b.build();
        }
        return Double.parseDouble(text.strip());
    }

    /** An error about this file: the builder has the file name set. */
    public InputException.Builder error(String problem) {
        return InputException.of(problem).file(source.path());
    }

    /** The header as one comma-separated line, for messages. */
    public String headerLine() {
        return String.join(",", header);
    }

    /** Names in column {@code column}, in row order (for messages listing what a file contains). */
    public List<String> columnValues(int column) {
        List<String> out = new ArrayList<>();
        for (CsvRow r : rows) {
            out.add(r.cell(column));
        }
        return out;
    }
}
