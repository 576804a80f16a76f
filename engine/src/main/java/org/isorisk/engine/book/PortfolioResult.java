package org.isorisk.engine.book;

import java.util.List;
import org.isorisk.engine.model.Status;

/**
 * What one book row gave: its status and message, its row of {@link BookTables#RESULTS}, its rows of the weights
 * table and of the job's extra table (trades, stress), each as values and as CSV text rendered by the thread that
 * ran the job, and its JSON object when the run asked for one.
 *
 * @param index   the row's zero-based position in the book
 * @param row     its row number in the book file
 * @param id      its id as written (may be blank)
 * @param status  optimal, infeasible, invalid-input or not-solved
 * @param message the single command's one-line message when it failed; empty when optimal
 * @param values  its row of {@link BookTables#RESULTS}, one value per column
 * @param weights rows of {@link BookTables#WEIGHTS} (none when there is no solution)
 * @param extra   rows of the job's extra table ({@link BookTables#extra}); none when there is none
 * @param text    the CSV text of the results row, the weights rows and the extra rows, in that order
 * @param detail  what the engine returned, for a renderer of the single command's JSON (a {@code Solution}, a
 *                {@code RebalanceResult}, a {@code StressResult}, or the {@code IsoriskException} of a failure); null
 *                unless the job was asked to keep it
 * @param millis  the time the row took, milliseconds
 * @param json    the portfolio's JSON object on one line, set by the caller's renderer ({@link #withJson}); null
 */
public record PortfolioResult(long index, int row, String id, Status status, String message, Object[] values,
                              List<Object[]> weights, List<Object[]> extra, String[] text, Object detail, double millis,
                              String json) {
    public PortfolioResult {
        weights = List.copyOf(weights);
        extra = List.copyOf(extra);
    }

    /** The same result with its JSON line, and without the detail it was rendered from (memory stays flat). */
    public PortfolioResult withJson(String line) {
        return new PortfolioResult(index, row, id, status, message, values, weights, extra, text, null, millis, line);
    }

    /** The CSV text of its results row (with its line end). */
    public String resultLine() {
        return text[0];
    }

    /** The CSV text of its weights rows (empty when none). */
    public String weightLines() {
        return text[1];
    }

    /** The CSV text of its rows of the job's extra table (empty when none). */
    public String extraLines() {
        return text[2];
    }
}
