package org.isorisk.engine.io;

import java.util.List;

/**
 * One data row of a CSV table.
 *
 * @param number one-based row number as a spreadsheet shows it (every record counts, comment and blank
 *               lines included; a quoted cell spanning lines keeps the number of the row it starts on)
 * @param cells  the cells, trimmed unless quoted; as many as the header has columns
 */
public record CsvRow(int number, List<String> cells) {
    public CsvRow {
        cells = List.copyOf(cells);
    }

    /** Cell at zero-based column {@code i}. */
    public String cell(int i) {
        return cells.get(i);
    }
}
