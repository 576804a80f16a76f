package org.isorisk.notebooks;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.util.List;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.CsvWriter;

/**
 * Writes a {@link Table} as CSV through the project's one CSV writer ({@link CsvWriter}: comma separated,
 * {@code \n} line ends, fields quoted when they hold a comma, a quote, a line break or a {@code #}, numbers at
 * full precision with a decimal point), adding spreadsheet formula neutralising.
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
     * exported table), the header and the rows; NaN as an empty field. Readers skip the comment lines: pandas
     * with {@code comment="#"}, isorisk's own CSV reader by its {@code # key: value} convention.
     */
    public static void write(Table t, Writer out) {
        try {
            CsvWriter w = new CsvWriter(out).comment("caution", Caution.TEXT).comment("table", t.title());
            List<Table.Column> cols = t.columns();
            Object[] header = new Object[cols.size()];
            for (int c = 0; c < cols.size(); c++) {
                header[c] = neutralise(cols.get(c).key());
            }
            w.row(header);
            for (List<Table.Cell> row : t.rows()) {
                Object[] cells = new Object[row.size()];
                for (int c = 0; c < row.size(); c++) {
                    cells[c] = row.get(c) instanceof Table.Cell.Text x ? neutralise(x.value())
                            : (Object) ((Table.Cell.Number) row.get(c)).value();
                }
                w.row(cells);
            }
            out.flush();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
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
}
