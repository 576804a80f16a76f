package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Writer;
import java.util.List;

/**
 * Writes assumption tables in the layouts {@code solve} reads: a per-asset column ({@code asset,<column>}) and
 * a square matrix (first column {@code asset}, header row of the same names). Numbers are written with
 * {@link Double#toString(double)}, the shortest text that reads back to the same double.
 */
public final class TableWriter {
    private TableWriter() {
    }

    /** Writes {@code asset,<column>} and one row per asset. The writer is not closed. */
    public static void writeColumn(Writer w, String column, List<String> assets, double[] values) throws IOException {
        w.write("asset," + quote(column) + "\n");
        for (int i = 0; i < assets.size(); i++) {
            w.write(quote(assets.get(i)));
            w.write(',');
            w.write(Double.toString(values[i]));
            w.write('\n');
        }
    }

    /** Writes a square matrix with a header row and a first column of asset names. The writer is not closed. */
    public static void writeMatrix(Writer w, List<String> assets, double[][] m) throws IOException {
        StringBuilder sb = new StringBuilder("asset");
        for (String a : assets) {
            sb.append(',').append(quote(a));
        }
        w.write(sb.append('\n').toString());
        for (int i = 0; i < assets.size(); i++) {
            sb.setLength(0);
            sb.append(quote(assets.get(i)));
            for (int j = 0; j < assets.size(); j++) {
                sb.append(',').append(m[i][j]);
            }
            w.write(sb.append('\n').toString());
        }
    }

    /** Quotes a field when it holds a comma, a quote, a line break or surrounding blanks (RFC 4180). */
    static String quote(String s) {
        boolean needs = s.indexOf(',') >= 0 || s.indexOf('"') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0
                || !s.equals(s.trim());
        return needs ? '"' + s.replace("\"", "\"\"") + '"' : s;
    }
}
