package org.isorisk.notebooks;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.util.List;
import org.isorisk.engine.explain.Caution;

/**
 * Writes a {@link Table} as CSV (RFC 4180: comma separated, CRLF-free {@code \n} line ends, fields quoted when
 * they hold a comma, a quote or a line break) with spreadsheet formula neutralising.
 *
 * <p><b>The neutralising rule.</b> A spreadsheet that opens a CSV file runs a cell as a formula when it starts
 * with {@code =}, {@code +}, {@code -} or {@code @}, and some also after a leading tab or carriage return (OWASP,
 * "CSV Injection"). So every <em>text</em> cell (asset, group, constraint and scenario names, and the header)
 * that starts with one of those six characters, or with one or more apostrophes followed by one of them, gets
 * one more apostrophe in front; spreadsheets show a leading apostrophe as "treat as text". <em>Number</em> cells
 * are never touched: they are written as plain numbers, so {@code -0.05} stays a negative number that
 * spreadsheets and pandas read as such. The rule is reversible ({@link #restore}); the notebook's Python helper
 * undoes it the same way when it reloads the tables, so names read as they were given.
 */
public final class Csv {
    private Csv() {
    }

    /**
     * Writes two comment lines ({@code # caution: …}, {@code # table: …}: the caution travels with every
     * exported table), the header and the rows; numbers at full precision ({@link Double#toString}), NaN as an
     * empty field. Readers skip the comment lines: pandas with {@code comment="#"} (so every text field holding a
     * {@code #} is quoted), isorisk's own CSV reader by its {@code # key: value} convention.
     */
    public static void write(Table t, Writer out) {
        try {
            out.write("# caution: " + Caution.TEXT + "\n");
            out.write("# table: " + t.title().replaceAll("[\\r\\n]+", " ") + "\n");
            List<Table.Column> cols = t.columns();
            for (int c = 0; c < cols.size(); c++) {
                if (c > 0) {
                    out.write(',');
                }
                out.write(field(neutralise(cols.get(c).key())));
            }
            out.write('\n');
            for (List<Table.Cell> row : t.rows()) {
                for (int c = 0; c < row.size(); c++) {
                    if (c > 0) {
                        out.write(',');
                    }
                    out.write(cell(row.get(c)));
                }
                out.write('\n');
            }
            out.flush();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The CSV field of one cell: text neutralised and quoted as needed, numbers plain. */
    public static String cell(Table.Cell cell) {
        if (cell instanceof Table.Cell.Text t) {
            return field(neutralise(t.value()));
        }
        double v = ((Table.Cell.Number) cell).value();
        if (Double.isNaN(v)) {
            return "";
        }
        return Double.toString(v);
    }

    /** Applies the neutralising rule to one text cell (see the class comment). */
    public static String neutralise(String s) {
        return risky(s) ? "'" + s : s;
    }

    /** Undoes {@link #neutralise}: removes one leading apostrophe when the rule added it. */
    public static String restore(String s) {
        return s.startsWith("'") && risky(s.substring(1)) ? s.substring(1) : s;
    }

    private static boolean risky(String s) {
        int i = 0;
        while (i < s.length() && s.charAt(i) == '\'') {
            i++;
        }
        if (i == s.length()) {
            return false;
        }
        char c = s.charAt(i);
        return c == '=' || c == '+' || c == '-' || c == '@' || c == '\t' || c == '\r';
    }

    private static String field(String s) {
        boolean quote = s.indexOf(',') >= 0 || s.indexOf('#') >= 0 || s.indexOf('"') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0
                || (!s.isEmpty() && (Character.isWhitespace(s.charAt(0)) || Character.isWhitespace(s.charAt(s.length() - 1))));
        return quote ? '"' + s.replace("\"", "\"\"") + '"' : s;
    }
}
