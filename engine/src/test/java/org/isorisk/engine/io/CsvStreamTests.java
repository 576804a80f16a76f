package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

/**
 * {@link Csv#stream} against {@link Csv#read(InputFile, String)}: the same header, metadata, rows, row numbers and
 * error texts, whatever piece size cuts the text (down to one character, so that records, quoted line breaks and
 * CRLF pairs are split at every position).
 */
class CsvStreamTests {

    private static final int[] PIECES = {1, 2, 3, 5, 7, 16, 64, 1 << 16};

    @Test
    void theStreamReadsWhatTheWholeFileReaderReadsWhereverAPieceEnds() {
        List<String> texts = List.of(
                "# as_of: 2025-06-30\n# note, with \"quotes\nid,policy,target_return\n\na,p.yaml,0.05\nb,q.yaml,\n",
                "id,x\r\n\"multi\r\nline\",\"say \"\"hi\"\"\"\r\n  # a comment between rows\r\nlast,1\r\n",
                "id,x\rcr,1\rend,2",
                "\uFEFFid,x\n\"a,b\",2\n  plain  ,  3  \nno newline at the end,4",
                "id,x,\na,1,\nb,2,\n"); // a trailing empty column a spreadsheet may leave
        for (String text : texts) {
            CsvTable whole = Csv.parse(SourceFile.ofText("book", "b.csv", text), bytes(text));
            for (int piece : PIECES) {
                try (CsvStream s = CsvStream.open(InputFile.ofBytes("b.csv", bytes(text)), "book", piece)) {
                    assertEquals(whole.header(), s.header(), text);
                    assertEquals(whole.headerRow(), s.headerRow());
                    assertEquals(whole.metadata(), s.metadata());
                    List<CsvRow> rows = new ArrayList<>();
                    s.forEachRemaining(rows::add);
                    assertEquals(whole.rows(), rows, "piece " + piece + ": " + text);
                    assertEquals(whole.source().sha256(), SourceFile.sha256(bytes(text)));
                    assertEquals(SourceFile.sha256(bytes(text)), s.sha256().orElseThrow());
                    assertEquals(bytes(text).length, s.bytesRead());
                }
            }
        }
    }

    @Test
    void randomTablesReadTheSameInEveryPieceSize() {
        SplittableRandom r = new SplittableRandom(42);
        String alphabet = "ab ,\"\n\r#x1";
        for (int t = 0; t < 200; t++) {
            StringBuilder b = new StringBuilder("id,v\n");
            int rows = 1 + r.nextInt(8);
            for (int k = 0; k < rows; k++) {
                b.append('"');
                int len = r.nextInt(6);
                for (int c = 0; c < len; c++) {
                    char ch = alphabet.charAt(r.nextInt(alphabet.length()));
                    b.append(ch == '"' ? "\"\"" : String.valueOf(ch));
                }
                b.append("\",").append(k).append(r.nextBoolean() ? "\r\n" : "\n");
            }
            String text = b.toString();
            CsvTable whole = Csv.parse(SourceFile.ofText("book", "b.csv", text), bytes(text));
            for (int piece : PIECES) {
                try (CsvStream s = CsvStream.open(InputFile.ofBytes("b.csv", bytes(text)), "book", piece)) {
                    List<CsvRow> got = new ArrayList<>();
                    s.forEachRemaining(got::add);
                    assertEquals(whole.rows(), got, text);
                }
            }
        }
    }

    @Test
    void errorsAreTheWholeFileReadersErrors() {
        List<String> bad = List.of(
                "",
                "# only a comment\n",
                "id,x\n",
                "id;x\na;1\n",
                "id,x\na\n",
                "id,x\na,1,2\n",
                "id,x\na,0,05\n",
                "id,x\n\"never closed,1\n",
                "id,x\na\"b,1\n",
                "id,id\na,1\n");
        for (String text : bad) {
            String expected = assertThrows(InputException.class,
                    () -> Csv.parse(SourceFile.ofText("book", "b.csv", text), bytes(text))).getMessage();
            for (int piece : PIECES) {
                String got = assertThrows(InputException.class, () -> {
                    try (CsvStream s = CsvStream.open(InputFile.ofBytes("b.csv", bytes(text)), "book", piece)) {
                        s.forEachRemaining(row -> { });
                    }
                }).getMessage();
                assertEquals(expected, got, "piece " + piece + ": " + text);
            }
        }
    }

    @Test
    void aMissingFileAndUtf16AreNamed() {
        InputFile missing = InputFile.ofTexts(java.util.Map.of("b.csv", "id\n")).resolve("nope.csv");
        assertEquals("nope.csv: the book file does not exist; fix: check the path; a relative path starts from the "
                + "current folder", assertThrows(InputException.class, () -> Csv.stream(missing, "book")).getMessage());
        byte[] utf16 = "id,x\na,1\n".getBytes(StandardCharsets.UTF_16);
        assertEquals("b.csv: the file is UTF-16 text; fix: save it as 'CSV UTF-8' (comma delimited)",
                assertThrows(InputException.class, () -> Csv.stream(InputFile.ofBytes("b.csv", utf16), "book"))
                        .getMessage());
    }

    @Test
    void textThatIsNotUtf8IsRefusedWithItsRow() {
        byte[] b = "id,x\na,1\nb,\u00e9\n".getBytes(StandardCharsets.ISO_8859_1);
        String msg = assertThrows(InputException.class, () -> {
            try (CsvStream s = CsvStream.open(InputFile.ofBytes("b.csv", b), "book", 4)) {
                s.forEachRemaining(row -> { });
            }
        }).getMessage();
        assertTrue(msg.startsWith("b.csv, row 3: the file is not UTF-8 text"), msg);
    }

    @Test
    void cutsFallOnlyAfterCompleteRecords() {
        assertEquals(0, CsvStream.completeRecords("a,b"));
        assertEquals(4, CsvStream.completeRecords("a,b\nc"));
        assertEquals(0, CsvStream.completeRecords("a,b\r")); // a line feed may follow
        assertEquals(5, CsvStream.completeRecords("a,b\r\nc"));
        assertEquals(0, CsvStream.completeRecords("\"a\nb"));
        assertEquals(6, CsvStream.completeRecords("\"a\nb\"\nc"));
        assertEquals(7, CsvStream.completeRecords("# \"odd\nx"));
        assertFalse(CsvStream.completeRecords("  ") > 0);
    }

    private static byte[] bytes(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
