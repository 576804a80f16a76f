package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import java.util.List;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.ValueKind;
import org.junit.jupiter.api.Test;

class HistoryReaderTests {

    private static History read(String text, DateFormat f) {
        return HistoryReader.parse("h.csv", text, ValueKind.PRICES, f);
    }

    private static String error(String text, DateFormat f) {
        return assertThrows(InputException.class, () -> read(text, f)).getMessage();
    }

    @Test
    void readsIsoDatesAssetColumnsAndMissingMarkers() {
        History h = read("\uFEFFdate,Alpha Fund,\"Beta, Inc\"\n2020-01-06,100.5,NA\n\n2020-01-07, 101 ,\n"
                + "2020-01-08,#N/A,1e2\n", null);
        assertEquals(List.of("Alpha Fund", "Beta, Inc"), h.assets());
        assertEquals(LocalDate.of(2020, 1, 7), h.date(1));
        assertEquals(100.5, h.value(0, 0), 0);
        assertEquals(101, h.value(1, 0), 0);
        assertTrue(Double.isNaN(h.value(0, 1)));
        assertTrue(Double.isNaN(h.value(1, 1)));
        assertTrue(Double.isNaN(h.value(2, 0)));
        assertEquals(100, h.value(2, 1), 0);
        assertEquals(4, h.row(1), "the blank line still counts as a row of the file");
    }

    @Test
    void dayMonthYearIsReadOnlyWhenAskedFor() {
        String text = "date,A\n03/04/2020,1\n06/04/2020,2\n";
        assertEquals(LocalDate.of(2020, 4, 3), read(text, DateFormat.DAY_MONTH_YEAR).date(0));
        assertEquals("h.csv, row 2, column 'date': the date is not in the format yyyy-MM-dd (value '03/04/2020'); "
                + "fix: write ISO dates (yyyy-MM-dd), or give --date-format dd/MM/yyyy if the file uses day/month/year "
                + "(slashed dates are not guessed: 03/04/2020 could be March or April)", error(text, null));
        assertEquals("h.csv, row 2, column 'date': the date is not in the format dd/MM/yyyy (value '2020-04-03'); fix: "
                + "write dates as dd/MM/yyyy", error("date,A\n2020-04-03,1\n", DateFormat.DAY_MONTH_YEAR));
        assertTrue(error("date,A\n2020-02-30,1\n", null).contains("(value '2020-02-30')"), "no 30 February");
    }

    @Test
    void badCellsNameRowColumnAndFix() {
        // The messages come from the project's one CSV reader; the history reader adds the date and missing rules.
        assertEquals("h.csv, row 3, column 'B', asset 'B': the number has a percent sign (value '5%'); fix: write "
                + "decimals (0.05 for 5 %), or plain percent numbers (5) together with --units percent",
                error("date,A,B\n2020-01-06,1,2\n2020-01-07,1,5%\n", null));
        assertEquals("h.csv, row 2, column 'A', asset 'A': the cell is not a number (value 'abc'); fix: enter a "
                + "number with a decimal point, e.g. 0.05", error("date,A\n2020-01-06,abc\n", null));
        assertTrue(error("date,A,B\n2020-01-06,0,05,1\n", null).contains("'0,05' looks like a number written with a "
                + "decimal comma"));
        assertTrue(error("date;A;B\n2020-01-06;1;2\n", null).contains("the file is separated by semicolons"));
        assertEquals("h.csv, row 1, column 'A': the header names a column twice (columns 2 and 3); fix: give each "
                + "column its own name", error("date,A,A\n2020-01-06,1,2\n", null));
        assertTrue(error("date,A\n2020-01-06,Infinity\n", null).contains("not a finite number"));
        assertTrue(error("date,A\n2020-01-06,1d\n", null).contains("not a number"), "Java's 1d suffix is not a number");
        assertEquals("h.csv, row 1: the header has a single column; fix: give a date column, then one column per "
                + "asset, separated by commas", error("date\n2020-01-06\n", null));
    }

    @Test
    void theFastNumberPathGivesExactlyTheDoubleThatParseDoubleGives() {
        java.util.Random rnd = new java.util.Random(7);
        int fast = 0;
        for (int k = 0; k < 40_000; k++) {
            String s = switch (k % 4) {
                case 0 -> String.format(java.util.Locale.ROOT, "%.4f", rnd.nextDouble() * Math.pow(10, rnd.nextInt(9)));
                case 1 -> Long.toString(rnd.nextLong() % 1_000_000_000_000_000L);
                case 2 -> "-0." + Math.abs(rnd.nextLong() % 100_000_000_000_000L);
                default -> Double.toString(rnd.nextGaussian() * 0.01);
            };
            double v = Decimals.fast(s);
            if (!Double.isNaN(v)) {
                fast++;
                assertEquals(Double.parseDouble(s), v, 0, s);
            }
            assertEquals(Double.parseDouble(s), NumberText.parse(s), 0, s);
        }
        assertTrue(fast > 20_000, "most cells take the fast path: " + fast);
    }
}
