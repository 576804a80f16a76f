package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.charset.StandardCharsets;
import java.util.List;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

class CsvTests {

    private static CsvTable parse(String text) {
        return Csv.parse("t.csv", "expected-returns", text);
    }

    private static String error(String text) {
        return assertThrows(InputException.class, () -> parse(text)).getMessage();
    }

    @Test
    void headerAndRowsKeepTheirSpreadsheetRowNumbers() {
        CsvTable t = parse("# as_of: 2025-06-30\nasset,expected_return\n\nCash,0.02\nBonds,0.03\n");
        assertEquals(List.of("asset", "expected_return"), t.header());
        assertEquals(2, t.headerRow());
        assertEquals(4, t.rows().get(0).number());
        assertEquals(5, t.rows().get(1).number());
        assertEquals("2025-06-30", t.meta("as_of").orElseThrow().value());
        assertEquals(1, t.meta("as_of").orElseThrow().row());
    }

    @Test
    void aByteOrderMarkAndCrlfLineEndsAreHandled() {
        byte[] bom = {(byte) 0xEF, (byte) 0xBB, (byte) 0xBF};
        byte[] body = "asset,expected_return\r\nCash,0.02\r\nBonds,0.03\r\n".getBytes(StandardCharsets.UTF_8);
        byte[] all = new byte[bom.length + body.length];
        System.arraycopy(bom, 0, all, 0, 3);
        System.arraycopy(body, 0, all, 3, body.length);
        CsvTable t = Csv.parse(SourceFile.ofText("expected-returns", "t.csv", "x"), all);
        assertEquals("asset", t.header().get(0));
        assertEquals(List.of("Bonds", "0.03"), t.rows().get(1).cells());
        assertEquals(3, t.rows().get(1).number());
    }

    @Test
    void quotedCellsMayHoldCommasQuotesAndLineBreaks() {
        CsvTable t = parse("asset,note\n\"Bonds, long\",\"say \"\"hi\"\"\"\n\"Multi\nline\",x\nLast,y\n");
        assertEquals("Bonds, long", t.rows().get(0).cell(0));
        assertEquals("say \"hi\"", t.rows().get(0).cell(1));
        assertEquals("Multi\nline", t.rows().get(1).cell(0));
        assertEquals(3, t.rows().get(1).number());
        assertEquals(4, t.rows().get(2).number(), "a record spanning two lines is one spreadsheet row");
    }

    @Test
    void unquotedCellsAreTrimmedAndTrailingEmptyCellsIgnored() {
        CsvTable t = parse("asset , weight,,\n  Cash , 0.5 ,,\n");
        assertEquals(List.of("asset", "weight"), t.header());
        assertEquals(List.of("Cash", "0.5"), t.rows().get(0).cells());
    }

    @Test
    void aRaggedRowIsRefusedWithItsRowNumber() {
        assertEquals("t.csv, row 3: the row has 1 cell but the header has 2 (asset, expected_return) (value 'Bonds'); "
                + "fix: give every row one cell per header column", error("asset,expected_return\nCash,0.02\nBonds\n"));
        assertEquals("t.csv, row 2: the row has 3 cells but the header has 2 (asset, expected_return) (value "
                        + "'Cash,0.02,x'); fix: give every row one cell per header column; quote cells that contain commas",
                error("asset,expected_return\nCash,0.02,x\n"));
    }

    @Test
    void aDecimalCommaThatSplitACellIsNamed() {
        assertEquals("t.csv, row 2: the row has more cells than the header: '0,05' looks like a number written with a "
                        + "decimal comma or thousands separator (value 'Cash,0,05'); fix: " + NumberText.DECIMAL_COMMA_FIX,
                error("asset,expected_return\nCash,0,05\n"));
    }

    @Test
    void aSemicolonSeparatedFileIsRefusedWithTheDecimalPointAdvice() {
        assertEquals("t.csv, row 1: the file is separated by semicolons, not commas (value 'asset;expected_return'); "
                        + "fix: save it as CSV with commas between cells and a decimal point in numbers (0.05, not 0,05)",
                error("asset;expected_return\nCash;0,05\n"));
    }

    @Test
    void blankAndDuplicateHeaderNamesAreRefused() {
        assertEquals("t.csv, row 1: column 2 has no name in the header; fix: name every column in the header row",
                error("asset,,x\nCash,1,2\n"));
        assertEquals("t.csv, row 1, column 'Asset': the header names a column twice (columns 1 and 2); fix: give each "
                + "column its own name", error("asset,Asset\nCash,1\n"));
    }

    @Test
    void emptyFilesAndFilesWithoutDataAreRefused() {
        assertEquals("t.csv: the file is empty (no header row); fix: start the file with a header row naming the "
                + "columns", error("\n# only a comment\n"));
        assertEquals("t.csv, row 1: the file has a header but no data rows; fix: add one row per asset below the "
                + "header", error("asset,expected_return\n"));
    }

    @Test
    void brokenQuotesAreRefused() {
        assertEquals("t.csv, row 2: a quoted cell opened in this row is never closed; fix: add the closing quote (\")",
                error("asset,x\n\"Cash,1\n"));
        assertEquals("t.csv, row 2: text follows a closing quote in cell 1 (value 'Cash\"x'); fix: quote the whole "
                + "cell and write a quote inside it as two quotes (\"\")", error("asset,x\n\"Cash\"x,1\n"));
    }

    @Test
    void textThatIsNotUtf8IsRefused() {
        byte[] utf16 = {(byte) 0xFF, (byte) 0xFE, 'a', 0};
        InputException e = assertThrows(InputException.class,
                () -> Csv.parse(SourceFile.ofText("r", "t.csv", "x"), utf16));
        assertEquals("t.csv: the file is UTF-16 text; fix: save it as 'CSV UTF-8' (comma delimited)", e.getMessage());
        byte[] latin1 = "asset,x\nCaf\u00e9,1\n".getBytes(StandardCharsets.ISO_8859_1);
        e = assertThrows(InputException.class, () -> Csv.parse(SourceFile.ofText("r", "t.csv", "x"), latin1));
        assertEquals("t.csv, row 2: the file is not UTF-8 text (byte 11 is not valid UTF-8); fix: save it as "
                + "'CSV UTF-8'", e.getMessage());
    }

    @Test
    void numbersAreReadStrictlyWithTheCellNamed() {
        CsvTable t = parse("asset,expected_return\nCash,abc\nBonds,\"0,05\"\nEq,NaN\nRe,5%\nX,1e400\nY,-1.5e-3\n");
        String[] expected = {
            "t.csv, row 2, column 'expected_return', asset 'Cash': the cell is not a number (value 'abc'); fix: enter "
                    + "a number with a decimal point, e.g. 0.05",
            "t.csv, row 3, column 'expected_return', asset 'Bonds': the number uses a decimal comma (value '0,05'); "
                    + "fix: " + NumberText.DECIMAL_COMMA_FIX,
            "t.csv, row 4, column 'expected_return', asset 'Eq': the value is not a finite number (value 'NaN'); fix: "
                    + "give a finite number",
            "t.csv, row 5, column 'expected_return', asset 'Re': the number has a percent sign (value '5%'); fix: "
                    + "write decimals (0.05 for 5 %), or plain percent numbers (5) together with --units percent",
            "t.csv, row 6, column 'expected_return', asset 'X': the number is too large to be finite (value '1e400'); "
                    + "fix: give a finite number"};
        for (int i = 0; i < expected.length; i++) {
            CsvRow r = t.rows().get(i);
            InputException e = assertThrows(InputException.class, () -> t.number(r, 1, r.cell(0)));
            assertEquals(expected[i], e.getMessage());
        }
        assertEquals(-1.5e-3, t.number(t.rows().get(5), 1, "Y"));
    }

    @Test
    void aMissingFileIsNamed() {
        InputException e = assertThrows(InputException.class,
                () -> Csv.read(java.nio.file.Path.of("no-such-dir", "nope.csv"), "expected-returns"));
        assertEquals("no-such-dir/nope.csv: the expected returns file does not exist; fix: check the path; a relative "
                + "path starts from the current folder", e.getMessage());
    }

    @Test
    void cellsGuardedAgainstSpreadsheetFormulasReadBackAsTheyWereGiven() {
        // The guard is the project's CSV writer's (OWASP "CSV Injection": = + - @ tab carriage-return get one
        // leading apostrophe); this reader removes exactly that apostrophe, in the header, the cells and quoted cells.
        CsvTable t = parse("asset,'-weight\n'=SUM(A1:A9),0.1\n'+Plus,-0.05\n'-Minus,0.2\n'@At,0.3\n''=x,0.4\n"
                + "'plain,0.5\n\"'-10 Minus, Start\",0.6\n\"'\tTab\",0.7\n',0.8\n");
        assertEquals(List.of("asset", "-weight"), t.header());
        List<String> names = t.rows().stream().map(r -> r.cell(0)).toList();
        assertEquals(List.of("=SUM(A1:A9)", "+Plus", "-Minus", "@At", "'=x", "'plain", "-10 Minus, Start", "\tTab",
                "'"), names);
        assertEquals(-0.05, t.number(t.rows().get(1), 1, "+Plus"), "numbers are never guarded and read as numbers");
    }

    @Test
    void commentLinesGuardedAfterTheirCommasReadBackAsTheyWereGiven() {
        CsvTable t = parse("# scenario: Crisis, '=cmd and ,\"'@x\" and , 'plain\nasset,weight\nA,1\n");
        assertEquals("Crisis, =cmd and ,\"@x\" and , 'plain", t.meta("scenario").orElseThrow().value());
    }
}
