package org.isorisk.engine.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.Reader;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.error.InputException;

/**
 * Splits comma-separated text into records (RFC 4180: fields may be quoted with {@code "}, a quote inside a
 * quoted field is doubled, a quoted field may span lines). Strips a UTF-8 byte-order mark, trims unquoted
 * fields, skips blank lines, and counts rows as a spreadsheet shows them (the first line is row 1).
 */
final class CsvRecords implements AutoCloseable {
    private final BufferedReader in;
    private final String source;
    private int line;
    private boolean first = true;

    CsvRecords(Reader reader, String source) {
        this.in = reader instanceof BufferedReader b ? b : new BufferedReader(reader, 1 << 16);
        this.source = source;
    }

    /**
     * One record.
     *
     * @param row    spreadsheet row number of the record's first line
     * @param parsed the fields, unquoted and trimmed, or null when the line had no quote (then see {@code raw})
     * @param raw    the line when it had no quote, so that every comma separates fields; null otherwise
     */
    record Record(int row, List<String> parsed, String raw) {
        Record(int row, List<String> fields) {
            this(row, fields, null);
        }

        /** The fields (split on demand for a line without quotes). */
        List<String> fields() {
            return parsed != null ? parsed : split(raw);
        }
    }

    /** Splits a line without quotes at every comma, trimming each field. */
    static List<String> split(String text) {
        List<String> fields = new ArrayList<>();
        int start = 0;
        while (true) {
            int comma = text.indexOf(',', start);
            String f = comma < 0 ? text.substring(start) : text.substring(start, comma);
            fields.add(needsTrim(f) ? f.trim() : f);
            if (comma < 0) {
                return fields;
            }
            start = comma + 1;
        }
    }

    /** The next non-blank record, or null at the end. */
    Record next() {
        String text;
        try {
            do {
                text = in.readLine();
                if (text == null) {
                    return null;
                }
                line++;
                if (first) {
                    first = false;
                    if (!text.isEmpty() && text.charAt(0) == '\uFEFF') {
                        text = text.substring(1);
                    }
                }
            } while (text.isBlank());
        } catch (IOException e) {
            throw InputException.of("cannot read the file: " + e.getMessage()).file(source).build();
        }
        int row = line;
        if (text.indexOf('"') < 0) {
            return new Record(row, null, text); // no quoting: the caller splits at commas, possibly in parallel
        }
        List<String> fields = new ArrayList<>();
        StringBuilder field = new StringBuilder();
        int i = 0;
        boolean quoted = false;
        boolean wasQuoted = false;
        while (true) {
            if (i >= text.length()) {
                if (quoted) {
                    try {
                        String more = in.readLine();
                        if (more == null) {
                            throw InputException.of("a quoted field is not closed").file(source).row(row)
                                    .fix("close the quote with \"").build();
                        }
                        line++;
                        field.append('\n');
                        text = more;
                        i = 0;
                        continue;
                    } catch (IOException e) {
                        throw InputException.of("cannot read the file: " + e.getMessage()).file(source).build();
                    }
                }
                fields.add(wasQuoted ? field.toString() : field.toString().trim());
                return new Record(row, fields);
            }
            char c = text.charAt(i++);
            if (quoted) {
                if (c == '"') {
                    if (i < text.length() && text.charAt(i) == '"') {
                        field.append('"');
                        i++;
                    } else {
                        quoted = false;
                    }
                } else {
                    field.append(c);
                }
            } else if (c == ',') {
                fields.add(wasQuoted ? field.toString() : field.toString().trim());
                field.setLength(0);
                wasQuoted = false;
            } else if (c == '"' && field.toString().isBlank()) {
                field.setLength(0);
                quoted = true;
                wasQuoted = true;
            } else {
                field.append(c);
            }
        }
    }

    @Override
    public void close() {
        try {
            in.close();
        } catch (IOException e) {
            // nothing was written; closing a reader that failed is harmless
        }
    }

    private static boolean needsTrim(String f) {
        return !f.isEmpty() && (f.charAt(0) <= ' ' || f.charAt(f.length() - 1) <= ' ');
    }

    /** Cells that mean "no value": empty, NA, N/A, NaN, null, #N/A (any case). */
    static boolean isMissing(String s) {
        return s.isEmpty() || s.equalsIgnoreCase("NA") || s.equalsIgnoreCase("N/A") || s.equalsIgnoreCase("NaN")
                || s.equalsIgnoreCase("null") || s.equalsIgnoreCase("#N/A");
    }

    /** True for a plain decimal number: optional sign, digits with an optional point, optional exponent. */
    static boolean isDecimal(String s) {
        int i = 0;
        int n = s.length();
        if (i < n && (s.charAt(i) == '+' || s.charAt(i) == '-')) {
            i++;
        }
        int digits = 0;
        while (i < n && Character.isDigit(s.charAt(i))) {
            i++;
            digits++;
        }
        if (i < n && s.charAt(i) == '.') {
            i++;
            while (i < n && Character.isDigit(s.charAt(i))) {
                i++;
                digits++;
            }
        }
        if (digits == 0) {
            return false;
        }
        if (i < n && (s.charAt(i) == 'e' || s.charAt(i) == 'E')) {
            i++;
            if (i < n && (s.charAt(i) == '+' || s.charAt(i) == '-')) {
                i++;
            }
            int exp = 0;
            while (i < n && Character.isDigit(s.charAt(i))) {
                i++;
                exp++;
            }
            if (exp == 0) {
                return false;
            }
        }
        return i == n;
    }

    private static final double[] POW10 = new double[23];

    static {
        POW10[0] = 1;
        for (int i = 1; i < POW10.length; i++) {
            POW10[i] = POW10[i - 1] * 10;
        }
    }

    /**
     * Exact fast path for the common cell {@code [-]digits[.digits]} with at most 15 significant digits: the
     * digits form an integer m below 2^53 and 10^k (k ≤ 22) is exact, so {@code m / 10^k} is a single correctly
     * rounded operation and equals what {@link Double#parseDouble} returns (Clinger 1990, "How to read floating
     * point numbers accurately", PLDI). NaN when the cell is not of that form (the caller then falls back).
     */
    static double fastDecimal(String s) {
        return fastDecimal(s, 0, s.length());
    }

    /** {@link #fastDecimal(String)} on the characters {@code [from, to)} of {@code s}. */
    static double fastDecimal(CharSequence s, int from, int to) {
        int n = to;
        int i = from;
        boolean negative = false;
        if (n > i && (s.charAt(i) == '-' || s.charAt(i) == '+')) {
            negative = s.charAt(i) == '-';
            i++;
        }
        long m = 0;
        int digits = 0;
        int decimals = 0;
        boolean point = false;
        boolean any = false;
        for (; i < n; i++) {
            char c = s.charAt(i);
            if (c >= '0' && c <= '9') {
                any = true;
                if (m != 0 || c != '0') {
                    digits++;
                }
                if (digits > 15) {
                    return Double.NaN;
                }
                m = m * 10 + (c - '0');
                if (point) {
                    decimals++;
                }
            } else if (c == '.' && !point) {
                point = true;
            } else {
                return Double.NaN;
            }
        }
        if (!any || decimals > 22) {
            return Double.NaN;
        }
        double v = m / POW10[decimals];
        return negative ? -v : v;
    }

    /**
     * Parses a number cell.
     *
     * @return the value, or NaN for a missing cell when {@code allowMissing}
     * @throws InputException naming the cell, with a fix for percent signs and decimal commas
     */
    static double number(String s, boolean allowMissing, String source, int row, String column) {
        if (isMissing(s)) {
            if (allowMissing) {
                return Double.NaN;
            }
            throw InputException.of("the cell is empty").file(source).row(row).column(column)
                    .fix("give a number").build();
        }
        double fast = fastDecimal(s);
        if (!Double.isNaN(fast)) {
            return fast;
        }
        if (isDecimal(s)) {
            return Double.parseDouble(s);
        }
        String fix;
        if (s.endsWith("%")) {
            fix = "write decimals: 0.05, not 5%";
        } else if (s.matches("[+-]?\\d+,\\d+")) {
            fix = "write a decimal point: 0.05, not 0,05";
        } else {
            fix = "write a decimal number such as 101.25" + (allowMissing ? ", or leave the cell empty for a "
                    + "missing value" : "");
        }
        throw InputException.of("the cell is not a number").file(source).row(row).column(column).value(s).fix(fix)
                .build();
    }
}
