package org.isorisk.spark;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.book.Book;
import org.isorisk.engine.book.BookJob;
import org.isorisk.engine.book.BookRunner;
import org.isorisk.engine.book.BookSpec;
import org.isorisk.engine.book.BookTables;
import org.isorisk.engine.book.PortfolioResult;
import org.isorisk.engine.batch.BatchSettings;
import org.isorisk.engine.io.InputFile;

/** The in-process engine's tables for a spec, as {@code isorisk batch} writes them (the reference of the Spark tests). */
final class InProcess {
    private InProcess() {
    }

    /** The tables' text by file name, and the JSON lines. */
    record Tables(String results, String weights, String extra, List<String> json) {
    }

    static Tables run(BookSpec spec) {
        Book book = Book.scan(InputFile.of(Path.of(spec.book())));
        BookJob job = BookJob.open(spec, book.columns(), p -> InputFile.of(Path.of(p)), false);
        StringBuilder r = new StringBuilder(BookTables.RESULTS.header());
        StringBuilder w = new StringBuilder(BookTables.WEIGHTS.header());
        StringBuilder x = new StringBuilder(BookTables.extra(spec.job()).isEmpty() ? ""
                : BookTables.extra(spec.job()).get(0).header());
        List<String> json = new ArrayList<>();
        BookRunner.run(book, job, 0, null, BatchSettings.of(1), c -> {
            for (PortfolioResult p : c.results()) {
                r.append(p.resultLine());
                w.append(p.weightLines());
                x.append(p.extraLines());
            }
        }, null, null);
        return new Tables(r.toString(), w.toString(), x.toString(), json);
    }
}
