package org.isorisk.engine.book;

import java.util.List;

/**
 * One portfolio of a book as written in the book file.
 *
 * @param index       zero-based position among the book's data rows (the order of every result table)
 * @param row         one-based row number as a spreadsheet shows it, for messages
 * @param cells       the cells, one per column of the header
 * @param duplicateOf the row number where the same id first appears, or 0 when the id is new
 */
public record BookRow(long index, int row, List<String> cells, int duplicateOf) {
    public BookRow {
        cells = List.copyOf(cells);
    }

    /** The cell of zero-based column {@code c}, stripped; empty when the column is absent ({@code c < 0}). */
    public String cell(int c) {
        return c < 0 ? "" : cells.get(c).strip();
    }
}
