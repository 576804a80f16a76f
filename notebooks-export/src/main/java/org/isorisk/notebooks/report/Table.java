package org.isorisk.notebooks.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.regex.Pattern;

/**
 * A small typed table of the pack: written as a CSV file next to the notebook and shown inside it as HTML and
 * plain text. The first column is the row key (asset, constraint, scenario) and is always text.
 *
 * @param name    file stem of the CSV table ({@code weights} → {@code tables/weights.csv}); lower case letters,
 *                digits, {@code -} and {@code _}
 * @param title   heading shown above the table in the notebook
 * @param columns the columns; the first is the text key column
 * @param rows    one list of cells per row, one cell per column (copied)
 */
public record Table(String name, String title, List<Column> columns, List<List<Cell>> rows) {

    private static final Pattern NAME = Pattern.compile("[a-z0-9][a-z0-9_-]{0,40}");
    private static final Pattern KEY = Pattern.compile("[a-z][a-z0-9_]{0,60}");

    public Table {
        Objects.requireNonNull(title, "title");
        if (name == null || !NAME.matcher(name).matches()) {
            throw new IllegalArgumentException("table name must be a short lower-case file stem: " + name);
        }
        columns = List.copyOf(columns);
        if (columns.isEmpty() || columns.get(0).format() != Format.TEXT) {
            throw new IllegalArgumentException("table " + name + " needs a text key column first");
        }
        List<List<Cell>> copy = new ArrayList<>(rows.size());
        for (List<Cell> r : rows) {
            if (r.size() != columns.size()) {
                throw new IllegalArgumentException("table " + name + ": a row has " + r.size() + " cells for "
                        + columns.size() + " columns");
            }
            for (int c = 0; c < r.size(); c++) {
                Cell cell = Objects.requireNonNull(r.get(c), "cell");
                boolean text = columns.get(c).format() == Format.TEXT;
                if (text != (cell instanceof Cell.Text)) {
                    throw new IllegalArgumentException("table " + name + ", column " + columns.get(c).key()
                            + ": " + (text ? "text" : "number") + " cell expected");
                }
            }
            copy.add(List.copyOf(r));
        }
        rows = List.copyOf(copy);
        java.util.Set<String> keys = new java.util.HashSet<>();
        for (Column c : columns) {
            if (!keys.add(c.key())) {
                throw new IllegalArgumentException("table " + name + " names column " + c.key() + " twice");
            }
        }
    }

    /** How a column's cells are shown (they are always stored and written to CSV at full precision). */
    public enum Format {
        /** Text, e.g. an asset name; the only kind that CSV formula-neutralising touches. */
        TEXT,
        /** A decimal shown as a percentage with two decimals: 0.065 → "6.50 %". */
        PERCENT,
        /** A number shown with two decimals, e.g. a correlation: 0.4567 → "0.46". */
        DECIMAL,
        /** A number shown with six significant digits, e.g. a shadow price or a condition number. */
        NUMBER,
        /** An amount of money shown with thousands separators and no decimals, e.g. 1,250,000. */
        AMOUNT
    }

    /**
     * One column.
     *
     * @param key    the CSV header, a Python-friendly identifier ({@code expected_return})
     * @param label  the heading shown in the notebook ({@code Expected return})
     * @param format how the cells are shown
     */
    public record Column(String key, String label, Format format) {
        public Column {
            if (key == null || !KEY.matcher(key).matches()) {
                throw new IllegalArgumentException("column key must be a lower-case identifier: " + key);
            }
            Objects.requireNonNull(label, "label");
            Objects.requireNonNull(format, "format");
        }

        public static Column text(String key, String label) {
            return new Column(key, label, Format.TEXT);
        }

        public static Column percent(String key, String label) {
            return new Column(key, label, Format.PERCENT);
        }

        public static Column decimal(String key, String label) {
            return new Column(key, label, Format.DECIMAL);
        }

        public static Column number(String key, String label) {
            return new Column(key, label, Format.NUMBER);
        }

        public static Column amount(String key, String label) {
            return new Column(key, label, Format.AMOUNT);
        }
    }

    /** A table cell: text or a number (NaN for an empty number cell). */
    public sealed interface Cell {
        /** @param value the text as given (escaped only when it is written out) */
        record Text(String value) implements Cell {
            public Text {
                Objects.requireNonNull(value, "value");
            }
        }

        /** @param value the number at full precision; NaN shows and writes as an empty cell */
        record Number(double value) implements Cell {
        }

        static Cell of(String s) {
            return new Text(s);
        }

        static Cell of(double v) {
            return new Number(v);
        }
    }

    /** Keys of the columns with the given format, in column order. */
    public List<String> keys(Format f) {
        return columns.stream().filter(c -> c.format() == f).map(Column::key).toList();
    }

    /** Builds a table row by row. */
    public static Builder builder(String name, String title) {
        return new Builder(name, title);
    }

    /** Collects columns and rows of a {@link Table}. */
    public static final class Builder {
        private final String name;
        private final String title;
        private final List<Column> columns = new ArrayList<>();
        private final List<List<Cell>> rows = new ArrayList<>();

        private Builder(String name, String title) {
            this.name = name;
            this.title = title;
        }

        public Builder column(Column c) {
            columns.add(c);
            return this;
        }

        /** Adds a row; entries are {@link String}s, {@link Double}s (or other numbers), or {@link Cell}s. */
        public Builder row(Object... cells) {
            List<Cell> r = new ArrayList<>(cells.length);
            for (Object o : cells) {
                if (o instanceof Cell c) {
                    r.add(c);
                } else if (o instanceof java.lang.Number n) {
                    r.add(new Cell.Number(n.doubleValue()));
                } else if (o instanceof String s) {
                    r.add(new Cell.Text(s));
                } else {
                    throw new IllegalArgumentException("a cell is text or a number, not " + o);
                }
            }
            rows.add(r);
            return this;
        }

        public Table build() {
            return new Table(name, title, columns, rows);
        }
    }
}
