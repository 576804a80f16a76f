package org.isorisk.notebooks.report;

import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.util.List;
import org.isorisk.engine.book.CsvCells;
import org.isorisk.engine.explain.Caution;

/**
 * The project's one CSV writer. It writes CSV that the engine's reader ({@code engine.io.Csv}) reads back:
 * {@code # key: value} lines above the header (the caution, the as-of date), comma separated, {@code \n} line
 * ends, cells quoted when they hold a comma, quote, line break or {@code #}, numbers locale-independent with a
 * decimal point and full precision. Writes to the {@link Writer} it is given and never closes it.
 *
 * <p><b>The spreadsheet formula guard</b> ({@link #write(Table, Writer)}, {@link #neutralise}). A spreadsheet
 * that opens a CSV file runs a cell as a formula when it starts with {@code =}, {@code +}, {@code -} or
 * {@code @}, and some also after a leading tab or carriage return (OWASP, "CSV Injection"). So every
 * <em>text</em> cell of a table for people (asset, group, constraint and scenario names, and the header) that
 * starts with one of those six characters, or with one or more apostrophes followed by one of them, gets one more
 * apostrophe in front; spreadsheets show a leading apostrophe as "treat as text". <em>Number</em> cells are never
 * touched: they are written as plain numbers, so {@code -0.05} stays a negative number that spreadsheets and
 * pandas read as such. The rule is reversible ({@link #restore}); the notebook's Python helper undoes it the same
 * way when it reloads the tables, so names read as they were given. The rows of {@link #row} are written as given:
 * they are the command line's CSV results and the assumption tables that later runs read back as inputs. The cells
 * themselves (numbers, quoting, the guard) are the engine's {@link CsvCells}, which the tables of a book of
 * portfolios are written with too, in process and on Spark.
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

    /** A {@code # key: value} line; line breaks in the value become spaces. */
    public CsvWriter comment(String key, String value) throws IOException {
        out.write("# " + key + ": " + value.replace('\n', ' ').replace('\r', ' ') + "\n");
        return this;
    }

    /** One row; {@link Double} cells become numbers (empty when not finite), null an empty cell. */
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
                b.append(cell(c.toString()));
            }
        }
        b.append('\n');
        out.write(b.toString());
        return this;
    }

    /**
     * A text cell, quoted when needed: with a comma, quote or line break, leading or trailing blanks, or a
     * {@code #} anywhere (readers that take {@code #} as a comment, such as pandas' {@code comment="#"}, skip
     * the rest of an unquoted line).
     */
    public static String cell(String s) {
        return CsvCells.quote(s);
    }

    /** A number with a decimal point and enough digits to read back the same double; empty when not finite. */
    public static String number(double v) {
        return CsvCells.number(v);
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

    /** Applies the formula guard to one text cell (see the class comment; the rule is {@link CsvCells#guard}). */
    public static String neutralise(String s) {
        return CsvCells.guard(s);
    }

    /** Undoes {@link #neutralise}: removes one leading apostrophe when the guard added it. */
    public static String restore(String s) {
        return CsvCells.unguard(s);
    }
}
