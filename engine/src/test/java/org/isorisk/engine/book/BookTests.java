package org.isorisk.engine.book;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.InputFile;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The book file as a stream: the scan's counts, duplicate ids found exactly, skipping, and a book that changes. */
class BookTests {

    @TempDir
    Path dir;

    @Test
    void theIdIndexFindsEveryRepeatExactlyAsAMapDoes() {
        IdIndex index = new IdIndex();
        Map<String, Integer> first = new HashMap<>();
        SplittableRandom r = new SplittableRandom(3);
        for (int row = 2; row < 300_000; row++) {
            String id = "acct-" + r.nextInt(200_000) + (r.nextInt(10) == 0 ? "-ü" : "");
            Integer expected = first.putIfAbsent(id, row);
            assertEquals(expected == null ? 0 : expected, index.firstRow(id, row), id);
        }
        assertEquals(first.size(), index.size());
        // ids whose hashes collide in the table's slots still differ: a long run of near-identical ids
        IdIndex small = new IdIndex();
        for (int k = 0; k < 5000; k++) {
            assertEquals(0, small.firstRow("x".repeat(k % 7) + k, k + 2));
        }
    }

    @Test
    void theScanCountsRowsAndFindsRepeatedIdsAndTheStreamMarksThem() throws IOException {
        Path book = BookFixture.write(dir, "book.csv", "# a comment\nid,policy,target_return\na,p,0.05\nb,p,0.05\n"
                + "\na,p,0.05\nc,p,0.05\nb,p,0.05\n");
        Book b = Book.scan(InputFile.of(book));
        assertEquals(5, b.size());
        assertEquals(2, b.duplicates());
        List<BookRow> rows = b.readAll();
        assertEquals(List.of(3, 4, 6, 7, 8), rows.stream().map(BookRow::row).toList());
        assertEquals(List.of(0, 0, 3, 0, 4), rows.stream().map(BookRow::duplicateOf).toList());
        assertEquals(List.of(0L, 1L, 2L, 3L, 4L), rows.stream().map(BookRow::index).toList());
        try (Book.Rows it = b.rows()) {
            it.skip(3);
            BookRow next = it.next();
            assertEquals(3, next.index());
            assertEquals("c", next.cell(0));
        }
        assertEquals(org.isorisk.engine.io.SourceFile.sha256(Files.readAllBytes(book)), b.sha256());
    }

    @Test
    void aBookChangedBetweenTheScanAndTheRunIsRefused() throws IOException {
        Path book = BookFixture.write(dir, "book.csv", "id,policy,target_return\na,p,0.05\nb,p,0.05\n");
        Book b = Book.scan(InputFile.of(book));
        Files.writeString(book, "id,policy,target_return\na,p,0.05\nb,p,0.06\n");
        assertEquals(book + ": the book file changed while it was being read; fix: leave the book unchanged during a "
                + "run, then run again", assertThrows(InputException.class, b::readAll).getMessage());
        Files.writeString(book, "id,policy,target_return\na,p,0.05\nb,p,0.05\nc,p,0.05\n");
        assertThrows(InputException.class, b::readAll);
    }
}
