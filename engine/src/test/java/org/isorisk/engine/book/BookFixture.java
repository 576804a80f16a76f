package org.isorisk.engine.book;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Executor;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.batch.BatchSettings;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.io.InputFile;
import org.isorisk.engine.io.Units;

/** Runs books in tests: the shipped sample book, or a book written to a folder beside the sample assumptions. */
final class BookFixture {
    private BookFixture() {
    }

    /** The invented sample book shipped in sample-data/book. */
    static final Path SAMPLE = SampleFund.DATA.resolve("book");

    /** A spec for the sample book's layout: its sets file, no assumptions of the run's own. */
    static BookSpec sample(Job job, String scenarios) {
        return new BookSpec(job, SAMPLE.resolve("book.csv").toString(), null, null, null, null,
                SAMPLE.resolve("assumption_sets.csv").toString(), null, scenarios, Units.DECIMAL, false);
    }

    /** A spec with the sample fund's files as the run's own assumptions and {@code policy} shared. */
    static BookSpec own(Job job, Path book, String policy) {
        return new BookSpec(job, book.toString(), SampleFund.DATA.resolve("expected_returns.csv").toString(),
                SampleFund.DATA.resolve("covariance.csv").toString(), null, null,
                SAMPLE.resolve("assumption_sets.csv").toString(), policy, null, Units.DECIMAL, false);
    }

    /** What a run wrote: the tables' text and the results. */
    record Ran(BookRunner.Outcome outcome, String results, String weights, String extra, List<PortfolioResult> rows) {
        /** The results table read back with the project's reader. */
        CsvTable table() {
            return Csv.parse("results.csv", "results", results);
        }

        /** The results row of the book row at {@code index}. */
        PortfolioResult row(int index) {
            return rows.get(index);
        }
    }

    static Ran run(BookSpec spec, Executor executor, int threads) {
        Book book = Book.scan(InputFile.of(Path.of(spec.book())));
        BookJob job = BookJob.open(spec, book.columns(), p -> InputFile.of(Path.of(p)), true);
        StringBuilder results = new StringBuilder(BookTables.RESULTS.header());
        StringBuilder weights = new StringBuilder(BookTables.WEIGHTS.header());
        StringBuilder extra = new StringBuilder();
        List<PortfolioResult> rows = new ArrayList<>();
        BookRunner.Outcome o = BookRunner.run(book, job, 0, executor,
                new BatchSettings(threads, 3, 5, -1), c -> {
                    for (PortfolioResult r : c.results()) {
                        results.append(r.resultLine());
                        weights.append(r.weightLines());
                        extra.append(r.extraLines());
                        rows.add(r);
                    }
                }, null, null);
        return new Ran(o, results.toString(), weights.toString(), extra.toString(), rows);
    }

    /** Writes {@code text} to {@code dir/name} (folders created). */
    static Path write(Path dir, String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.createDirectories(p.getParent());
        Files.writeString(p, text, StandardCharsets.UTF_8);
        return p;
    }
}
