package org.isorisk.engine.error;

import java.util.Optional;

/**
 * Bad input: a file, cell, asset or option value that cannot be used as given. The message names where the
 * problem is (file, row, column, asset), the offending value, and what would fix it, in one line.
 */
public final class InputException extends IsoriskException {
    private static final long serialVersionUID = 1L;

    private final String file;
    private final Integer row;
    private final Integer line;
    private final String key;
    private final String column;
    private final String asset;
    private final String value;
    private final String problem;
    private final String fix;

    private InputException(Builder b) {
        super(compose(b));
        this.file = b.file;
        this.row = b.row;
        this.line = b.line;
        this.key = b.key;
        this.column = b.column;
        this.asset = b.asset;
        this.value = b.value;
        this.problem = b.problem;
        this.fix = b.fix;
    }

    /** Starts an error whose one-line problem statement is {@code problem} (no trailing period). */
    public static Builder of(String problem) {
        return new Builder(problem);
    }

    private static String compose(Builder b) {
        StringBuilder where = new StringBuilder();
        if (b.file != null) {
            where.append(b.file);
        }
        if (b.row != null) {
            where.append(where.length() > 0 ? ", " : "").append("row ").append(b.row);
        }
        if (b.line != null) {
            where.append(where.length() > 0 ? ", " : "").append("line ").append(b.line);
        }
        if (b.key != null) {
            where.append(where.length() > 0 ? ", " : "").append("key '").append(b.key).append('\'');
        }
        if (b.column != null) {
            where.append(where.length() > 0 ? ", " : "").append("column '").append(b.column).append('\'');
        }
        if (b.asset != null) {
            where.append(where.length() > 0 ? ", " : "").append("asset '").append(b.asset).append('\'');
        }
        StringBuilder m = new StringBuilder();
        if (where.length() > 0) {
            m.append(where).append(": ");
        }
        m.append(b.problem);
        if (b.value != null) {
            m.append(" (value '").append(b.value).append("')");
        }
        if (b.fix != null) {
            m.append("; fix: ").append(b.fix);
        }
        return m.toString();
    }

    public Optional<String> file() { return Optional.ofNullable(file); }
    public Optional<Integer> row() { return Optional.ofNullable(row); }
    public Optional<String> column() { return Optional.ofNullable(column); }
    /** One-based line of a text file such as the YAML policy. */
    public Optional<Integer> line() { return Optional.ofNullable(line); }
    /** Dotted key path inside a structured file, e.g. {@code bounds.assets.Cash.max}. */
    public Optional<String> key() { return Optional.ofNullable(key); }
    public Optional<String> asset() { return Optional.ofNullable(asset); }
    public Optional<String> value() { return Optional.ofNullable(value); }
    public String problem() { return problem; }
    public Optional<String> fix() { return Optional.ofNullable(fix); }

    /** Collects the context of an {@link InputException}; every field but the problem is optional. */
    public static final class Builder {
        private final String problem;
        private String file;
        private Integer row;
        private Integer line;
        private String key;
        private String column;
        private String asset;
        private String value;
        private String fix;

        private Builder(String problem) {
            this.problem = problem;
        }

        public Builder file(String f) { this.file = f; return this; }
        /** One-based row number as a spreadsheet shows it (the header is row 1). */
        public Builder row(int r) { this.row = r; return this; }
        public Builder column(String c) { this.column = c; return this; }
        /** One-based line number of a text file (YAML). */
        public Builder line(int l) { this.line = l; return this; }
        /** Dotted key path inside a structured file. */
        public Builder key(String k) { this.key = k; return this; }
        public Builder asset(String a) { this.asset = a; return this; }
        public Builder value(Object v) { this.value = String.valueOf(v); return this; }
        public Builder fix(String f) { this.fix = f; return this; }

        public InputException build() {
            return new InputException(this);
        }
    }
}
