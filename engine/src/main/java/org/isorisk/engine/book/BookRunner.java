package org.isorisk.engine.book;

import java.util.concurrent.Executor;
import org.isorisk.engine.batch.BatchRunner;
import org.isorisk.engine.batch.BatchSettings;
import org.isorisk.engine.batch.Cancellation;
import org.isorisk.engine.batch.Progress;

/**
 * The in-process engine of a book: streams the book's rows through {@link BookJob} on the caller's executor with
 * {@link BatchRunner}, delivers the results in book order in chunks (the unit a caller commits atomically), and
 * counts them by status in book order. Memory stays flat in the number of portfolios: rows are read as they are
 * needed and at most a few batches are in flight.
 */
public final class BookRunner {
    private BookRunner() {
    }

    /**
     * What a run did.
     *
     * @param done      portfolios delivered by this run (after the ones skipped)
     * @param cancelled true when it stopped on a cancellation before the end of the book
     * @param summary   the delivered portfolios counted by status
     */
    public record Outcome(long done, boolean cancelled, BookSummary summary) {
    }

    /**
     * Runs the job on the book's rows from position {@code skip} on (zero when starting afresh; the number of rows
     * already committed when resuming).
     *
     * @param job      a {@link BookJob}, or a function that wraps one (e.g. to render each result's JSON on the same
     *                 thread)
     * @param executor the caller's threads; each row runs on one of them alone (see {@link BookJob}); null to run on
     *                 the calling thread
     * @param settings batch and chunk sizes and the number of threads of {@code executor}; its total is set here
     * @param sink     receives complete chunks in book order, on the calling thread
     * @param progress told after each batch, on the calling thread; null for none
     * @param cancel   checked before each batch starts; null for none
     */
    public static Outcome run(Book book, java.util.function.Function<BookRow, PortfolioResult> job, long skip,
                              Executor executor, BatchSettings settings,
                              BatchRunner.Sink<PortfolioResult> sink, Progress.Listener progress,
                              Cancellation cancel) {
        try (Book.Rows rows = book.rows()) {
            rows.skip(skip);
            BatchRunner.Outcome<long[]> o = BatchRunner.run(rows, job, executor,
                    settings.withTotal(Math.max(0, book.size() - skip)), BookSummary.COUNT, sink, progress, cancel);
            return new Outcome(o.done(), o.cancelled(), BookSummary.of(o.total()));
        }
    }
}
