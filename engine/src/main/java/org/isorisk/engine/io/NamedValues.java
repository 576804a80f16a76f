package org.isorisk.engine.io;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * One number per asset, read from a table with a column {@code asset} and a value column, in file order.
 *
 * @param table  the table it was read from (for messages)
 * @param names  asset names, unique, not blank
 * @param values the numbers as written (not yet converted from percent)
 * @param rows   one-based row number of each asset
 * @param column zero-based index of the value column
 */
record NamedValues(CsvTable table, List<String> names, double[] values, int[] rows, int column) {

    /** Reads {@code asset} and {@code valueColumn} from {@code t}, checking names and numbers. */
    static NamedValues read(CsvTable t, String valueColumn, String layout) {
        int a = t.requireColumn("asset", "the layout is " + layout);
        int v = t.requireColumn(valueColumn, "the layout is " + layout);
        List<String> names = names(t, a);
        double[] values = new double[names.size()];
        int[] rows = new int[names.size()];
        for (int i = 0; i < names.size(); i++) {
            CsvRow r = t.rows().get(i);
            values[i] = t.number(r, v, names.get(i));
            rows[i] = r.number();
        }
        return new NamedValues(t, names, values, rows, v);
    }

    /** The names in column {@code a}: not blank, each once. */
    static List<String> names(CsvTable t, int a) {
        List<String> names = new ArrayList<>();
        Map<String, Integer> seen = new HashMap<>();
        for (CsvRow r : t.rows()) {
            String name = r.cell(a).strip();
            if (name.isEmpty()) {
                throw t.error("the asset name is blank").row(r.number()).column(t.header().get(a))
                        .fix("name the asset, or delete the row").build();
            }
            Integer before = seen.put(name, r.number());
            if (before != null) {
                throw t.error("the asset is named twice (rows " + before + " and " + r.number() + ")")
                        .row(r.number()).column(t.header().get(a)).asset(name)
                        .fix("give each asset one row; merge or rename the duplicates").build();
            }
            names.add(name);
        }
        return names;
    }

    /** Row number of {@code name}, or -1. */
    int rowOf(String name) {
        int i = names.indexOf(name);
        return i < 0 ? -1 : rows[i];
    }

    /** The column's header name. */
    String columnName() {
        return table.header().get(column);
    }
}
