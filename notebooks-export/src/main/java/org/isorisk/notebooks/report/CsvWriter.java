package org.isorisk.notebooks.report;

import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.math.BigDecimal;
import java.util.List;
import org.isorisk.engine.explain.Caution;

/**
 * The project's one CSV writer: every CSV file and every {@code --format csv} output of the tool is written here.
 * It writes CSV that the engine's reader ({@code engine.io.Csv}) reads back: {@code # key: value} lines above the
 * header (the caution, the as-of date), comma separated, {@code \n} line ends, cells quoted when they hold a comma,
 * quote, line break or {@code #}, numbers locale-independent with a decimal point and full precision. Writes to the
 * {@link Writer} it is given and never closes it.
 *
 * <p><b>The spreadsheet formula guard</b>, applied to every text cell this class writes ({@link #row},
 * {@link #write(Table, Writer)}, {@link #nameRow}) and to the text after each comma of a comment line
 * ({@link #comment}). A spreadsheet that opens a CSV file runs a cell as a formula when it starts with {@code =},
 * {@code +}, {@code -} or {@code @}, and some also after a leading tab or carriage return (OWASP, "CSV
 * Injection"). So every <em>text</em> cell (asset, group, constraint and scenario names, headers, labels) that
 * starts with one of those six characters, or with one or more apostrophes followed by one of them, gets one more
 * apostrophe in front ({@link #neutralise}); spreadsheets show a leading apostrophe as "treat as text".
 * <em>Number</em> cells ({@link Double}, other {@link Number}s, {@code double[]} values) are never touched: they
 * are written as plain numbers, so {@code -0.05} stays a negative number that spreadsheets and pandas read as
 * such. The rule is reversible ({@link #restore}): the engine's CSV reader undoes it on every cell, so a
 * {@code solve} CSV is a valid {@code risk --weights} input and an {@code estimate} table a valid {@code solve}
 * input whatever the asset names; the notebook's Python helper undoes it the same way when it reloads the tables.
 */
public final class CsvWriter {
    private final Writer out;

    public CsvWriter(Writer out) {
        this.out = out;
    }

    /** Writes CSV rows; see {@link #text}. */
    @FunctionalInterface
    public interface Rows {
        void write(CsvWriter w) throws IOException;
    }

    /** The CSV text {@code rows} write, for printing to a terminal the same bytes as to a file. */
    public static String text(Rows rows) {
        StringWriter s = new StringWriter();
        try {
            rows.write(new CsvWriter(s));
        } catch (IOException e) {
            throw new IllegalStateException("a StringWriter does not fail", e);
        }
        return s.toString();
    }

    /**
     * A {@code # key: value} line; line breaks in the value become spaces. A spreadsheet does not know comment
     * lines and splits this one at its commas, so the text after each comma is guarded like a text cell (after
     * blanks and an opening quote, where the spreadsheet's cell starts): {@code "A, =B"} is written
     * {@code "A, '=B"}. The engine's reader undoes that on the metadata it keeps.
     */
    public CsvWriter comment(String key, String value) throws IOException {
        out.write("# " + key + ": " + guardPieces(value.replace('\n', ' ').replace('\r', ' ')) + "\n");
        return this;
    }

    /**
     * One row: {@link Double} cells become numbers (empty when not finite), other {@link Number}s and
     * {@link Boolean}s their plain text, null an empty cell, anything else a text cell with the formula guard.
     */
    public CsvWriter row(Object... cells) throws IOException {
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < cells.length; i++) {
            if (i > 0) {
                b.append(',');
            }
            Object c = cells[i];
            if (c instanceof Double d) {
                b.append(number(d));
            } else if (c instanceof Number || c instanceof Boolean) {
                b.append(c);
            } else if (c != null) {
                b.append(text(c.toString()));
            }
        }
        b.append('\n');
        out.write(b.toString());
        return this;
    }

    /** One row of a list of cells, as {@link #row(Object...)}. */
    public CsvWriter row(List<?> cells) throws IOException {
        return row(cells.toArray());
    }

    /**
     * A row of a named table: a text cell (the formula guard applies) and then numbers, e.g. one row of a square
     * matrix with its asset name first; without boxing, for large matrices.
     */
    public CsvWriter nameRow(String name, double[] values) throws IOException {
        StringBuilder b = new StringBuilder(16 + 24 * values.length).append(text(name));
        for (double v : values) {
            b.append(',').append(number(v));
        }
        out.write(b.append('\n').toString());
        return this;
    }

    /** A text cell as written: the formula guard ({@link #neutralise}), then quoting ({@link #cell}). */
    public static String text(String s) {
        return cell(neutralise(s));
    }

    /**
     * A cell quoted when needed, without the formula guard (use {@link #text} for text): with a comma, quote or line
     * break, leading or trailing blanks, or a {@code #} anywhere (readers that take {@code #} as a comment, such as
     * pandas' {@code comment="#"}, skip the rest of an unquoted line).
     */
    static String cell(String s) {
        if (s.indexOf(',') >= 0 || s.indexOf('"') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0
                || s.indexOf('#') >= 0 || !s.equals(s.strip())) {
            return '"' + s.replace("\"", "\"\"") + '"';
        }
        return s;
    }

    /** A number with a decimal point and enough digits to read back the same double; empty when not finite. */
    public static String number(double v) {
        if (!Double.isFinite(v)) {
            return "";
        }
        if (v != 0 && Math.abs(v) < 1e-6) {
            return Double.toString(v);
        }
        return BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
    }

    /**
     * Writes a {@link Table} for people, with the formula guard on every text cell and the header: two comment
     * lines ({@code # caution: …}, {@code # table: …}: the caution travels with every exported table), the header
     * and the rows; NaN as an empty field. Readers skip the comment lines: pandas with {@code comment="#"},
     * isorisk's own CSV reader by its {@code # key: value} convention. The writer is flushed, not closed.
     */
    public static void write(Table t, Writer out) {
        try {
            CsvWriter w = new CsvWriter(out).comment("caution", Caution.TEXT).comment("table", t.title());
            List<Table.Column> cols = t.columns();
            Object[] header = new Object[cols.size()];
            for (int c = 0; c < cols.size(); c++) {
                header[c] = cols.get(c).key();
            }
            w.row(header);
            for (List<Table.Cell> row : t.rows()) {
                Object[] cells = new Object[row.size()];
                for (int c = 0; c < row.size(); c++) {
                    cells[c] = row.get(c) instanceof Table.Cell.Text x ? x.value()
                            : (Object) ((Table.Cell.Number) row.get(c)).value(); // row() guards the text
                }
                w.row(cells);
            }
            out.flush();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Applies the formula guard to one text cell (see the class comment); {@link #row} does it for every text cell. */
    public static String neutralise(String s) {
        return risky(s) ? "'" + s : s;
    }

    /** Undoes {@link #neutralise}: removes one leading apostrophe when the guard added it. */
    public static String restore(String s) {
        return s.startsWith("'") && risky(s.substring(1)) ? s.substring(1) : s;
    }

    /**
     * The formula guard on the text after each comma of a comment line: one apostrophe where the spreadsheet's cell
     * would start (after blanks and an opening quote) with a trigger, or with apostrophes and a trigger.
     */
    static String guardPieces(String s) {
        if (s.indexOf(',') < 0) {
            return s;
        }
        StringBuilder b = new StringBuilder(s.length() + 4);
        int from = 0;
        for (int comma = s.indexOf(','); comma >= 0; comma = s.indexOf(',', comma + 1)) {
            int start = comma + 1;
            while (start < s.length() && s.charAt(start) == ' ') {
                start++;
            }
            if (start < s.length() && s.charAt(start) == '"') {
                start++;
            }
            if (risky(s.substring(start))) {
                b.append(s, from, start).append('\'');
                from = start;
            }
        }
        return b.append(s, from, s.length()).toString();
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
