package org.isorisk.engine.io;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * A square table with asset names down the first column ({@code asset}) and across the header, in any order;
 * the layout of covariance and correlation files.
 *
 * @param table  the table it was read from
 * @param names  row names in file order (the same set as the column names)
 * @param values {@code values[i][j]} is the entry in the row of {@code names[i]} and the column of {@code names[j]}
 *               (reordered to row order), as written
 * @param rows   one-based row number of each name
 * @param column zero-based column index of each name
 */
record NamedMatrix(CsvTable table, List<String> names, double[][] values, int[] rows, int[] column) {

    static NamedMatrix read(CsvTable t, String layout) {
        String corner = t.header().get(0);
        if (!corner.isEmpty() && !corner.equalsIgnoreCase("asset")) {
            throw t.error("the top-left cell must be 'asset' (asset names down the first column and across the header)")
                    .row(t.headerRow()).column(corner).value(corner).fix("the layout is " + layout).build();
        }
        List<String> names = NamedValues.names(t, 0);
        Map<String, Integer> columns = new HashMap<>();
        for (int c = 1; c < t.header().size(); c++) {
            columns.put(t.header().get(c), c);
        }
        List<String> columnNames = t.header().subList(1, t.header().size());
        for (int i = 0; i < names.size(); i++) {
            if (!columns.containsKey(names.get(i))) {
                InputException.Builder b = t.error("the row's asset has no column of the same name in the header")
                        .row(t.rows().get(i).number()).asset(names.get(i));
                throw Names.hint(b, names.get(i), columnNames,
                        "the matrix needs one row and one column per asset, with the same names").build();
            }
        }
        for (String c : columnNames) {
            if (!names.contains(c)) {
                InputException.Builder b = t.error("the column's asset has no row of the same name")
                        .row(t.headerRow()).column(c).asset(c);
                throw Names.hint(b, c, names,
                        "the matrix needs one row and one column per asset, with the same names").build();
            }
        }
        int n = names.size();
        double[][] v = new double[n][n];
        int[] rows = new int[n];
        int[] col = new int[n];
        for (int j = 0; j < n; j++) {
            col[j] = columns.get(names.get(j));
        }
        for (int i = 0; i < n; i++) {
            CsvRow r = t.rows().get(i);
            rows[i] = r.number();
            for (int j = 0; j < n; j++) {
                v[i][j] = t.number(r, col[j], names.get(i));
            }
        }
        return new NamedMatrix(t, names, v, rows, col);
    }

    /** Position of {@code name} in {@link #names()}, or -1. */
    int indexOf(String name) {
        return names.indexOf(name);
    }

    /** Cell text of entry (i, j), as written. */
    String text(int i, int j) {
        return table.rows().get(i).cell(column[j]);
    }
}
