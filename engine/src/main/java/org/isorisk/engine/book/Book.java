package org.isorisk.engine.book;

import java.io.Closeable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import java.util.NoSuchElementException;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvRow;
import org.isorisk.engine.io.CsvStream;
import org.isorisk.engine.io.InputFile;

/**
 * A book file, checked in one streaming pass before any work ({@link #scan}): readable CSV with the required
 * columns, every row well formed, the number of portfolios, the file's SHA-256, and the rows whose id repeats an
 * earlier one. A book that fails the scan cannot be run at all; a row that is merely wrong (a duplicate id, a
 * missing policy) becomes a result of its own. {@link #rows()} then streams the rows again: memory stays flat in the
 * number of portfolios (the duplicate check keeps each id once, about 32 bytes plus its characters).
 */
public final class Book {
    private final InputFile file;
    private final BookColumns columns;
    private final long size;
    private final String sha256;
    /** Indices of the rows whose id repeats an earlier row's, increasing, with that earlier row's number. */
    private final long[] duplicateIndex;
    private final int[] duplicateOf;

    private Book(InputFile file, BookColumns columns, long size, String sha256, long[] duplicateIndex,
                 int[] duplicateOf) {
        this.file = file;
        this.columns = columns;
        this.size = size;
        this.sha256 = sha256;
        this.duplicateIndex = duplicateIndex;
        this.duplicateOf = duplicateOf;
    }

    /**
     * Reads the whole book once and checks it.
     *
     * @throws InputException naming the file (and row, column) when the book cannot be run at all: not readable,
     *                        not CSV, a required column missing, a malformed row, no rows
     */
    public static Book scan(InputFile file) {
        try (CsvStream s = Csv.stream(file, "book")) {
            BookColumns columns = new BookColumns(file.path(), s.header(), s.headerRow());
            IdIndex ids = new IdIndex();
            long[] dupIndex = new long[16];
            int[] dupOf = new int[16];
            int dups = 0;
            long index = 0;
            while (s.hasNext()) {
                CsvRow r = s.next();
                String id = r.cell(columns.id).strip();
                if (!id.isEmpty()) {
                    int first = ids.firstRow(id, r.number());
                    if (first > 0) {
                        if (dups == dupIndex.length) {
                            dupIndex = Arrays.copyOf(dupIndex, dups * 2);
                            dupOf = Arrays.copyOf(dupOf, dups * 2);
                        }
                        dupIndex[dups] = index;
                        dupOf[dups] = first;
                        dups++;
                    }
                }
                index++;
            }
            return new Book(file, columns, index, s.sha256().orElseThrow(), Arrays.copyOf(dupIndex, dups),
                    Arrays.copyOf(dupOf, dups));
        }
    }

    /** The book file. */
    public InputFile file() {
        return file;
    }

    /** Its columns. */
    public BookColumns columns() {
        return columns;
    }

    /** The number of portfolios (data rows). */
    public long size() {
        return size;
    }

    /** The file's SHA-256 (lower-case hex), as read by the scan. */
    public String sha256() {
        return sha256;
    }

    /** The warnings of the scan (columns that are not book columns). */
    public List<String> warnings() {
        return columns.warnings();
    }

    /** The rows whose id repeats an earlier row's. */
    public long duplicates() {
        return duplicateIndex.length;
    }

    /** Streams the rows in file order; close it when done. */
    public Rows rows() {
        return new Rows(Csv.stream(file, "book"));
    }

    /**
     * The rows of a book, read again from the file; at the end it checks that the file still has the rows and the
     * SHA-256 the scan found (a book changed between the scan and the run is refused, not half used).
     */
    public final class Rows implements Iterator<BookRow>, Closeable {
        private final CsvStream stream;
        private long index;
        private int dup;

        private Rows(CsvStream stream) {
            this.stream = stream;
        }

        @Override
        public boolean hasNext() {
            if (stream.hasNext()) {
                if (index >= size) {
                    throw changed();
                }
                return true;
            }
            if (index != size || !sha256.equals(stream.sha256().orElse(""))) {
                throw changed();
            }
            return false;
        }

        @Override
        public BookRow next() {
            if (!hasNext()) {
                throw new NoSuchElementException();
            }
            CsvRow r = stream.next();
            int first = 0;
            if (dup < duplicateIndex.length && duplicateIndex[dup] == index) {
                first = duplicateOf[dup++];
            }
            return new BookRow(index++, r.number(), r.cells(), first);
        }

        /** Skips {@code n} rows without making them (a run that resumes after its committed chunks). */
        public void skip(long n) {
            for (long k = 0; k < n && hasNext(); k++) {
                next();
            }
        }

        @Override
        public void close() {
            stream.close();
        }

        private InputException changed() {
            return InputException.of("the book file changed while it was being read").file(file.path())
                    .fix("leave the book unchanged during a run, then run again").build();
        }
    }

    /** Every row, read into memory (tests and small books). */
    public List<BookRow> readAll() {
        List<BookRow> out = new ArrayList<>();
        try (Rows r = rows()) {
            r.forEachRemaining(out::add);
        }
        return out;
    }
}
