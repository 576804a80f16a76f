package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Writer;
import java.math.BigDecimal;

/**
 * Writes CSV that {@link Csv} reads back: {@code # key: value} lines above the header (the caution, the
 * as-of date), cells quoted when they contain a comma, quote or line break, numbers locale-independent with
 * a decimal point and full precision. Writes to the {@link Writer} it is given and never closes it.
 */
public final class CsvWriter {
    private final Writer out;

    public CsvWriter(Writer out) {
        this.out = out;
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

    /** A text cell, quoted when needed. */
    public static String cell(String s) {
        if (s.indexOf(',') >= 0 || s.indexOf('"') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0
                || s.startsWith("#") || !s.equals(s.strip())) {
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
}
