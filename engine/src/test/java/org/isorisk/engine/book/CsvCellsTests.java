package org.isorisk.engine.book;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.math.BigDecimal;
import java.util.SplittableRandom;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.junit.jupiter.api.Test;

/** The shared CSV cells: exact plain numbers, quoting, and the spreadsheet formula guard (OWASP, "CSV Injection"). */
class CsvCellsTests {

    /** What the project's CSV numbers were before the fast path: the JDK's BigDecimal of the shortest decimal. */
    private static String reference(double v) {
        if (!Double.isFinite(v)) {
            return "";
        }
        if (v != 0 && Math.abs(v) < 1e-6) {
            return Double.toString(v);
        }
        return BigDecimal.valueOf(v).stripTrailingZeros().toPlainString();
    }

    @Test
    void numbersAreTheJdkBigDecimalTextAndReadBackExactly() {
        double[] fixed = {0, -0.0, 1, -1, 0.1, 0.05, 1e-6, -1e-6, 9.99e-7, 1e-3, 0.0012, 123456.789, 1e7, 1.5e7,
                12345678912345.0, 1e21, 1e22, 1.7976931348623157e308, 4.9e-324, 0.30000000000000004, 100, 1e-5,
                Double.NaN, Double.POSITIVE_INFINITY};
        for (double v : fixed) {
            assertEquals(reference(v), CsvCells.number(v), "value " + v);
        }
        SplittableRandom r = new SplittableRandom(7);
        for (int k = 0; k < 2_000_000; k++) {
            double v = switch (k % 4) {
                case 0 -> r.nextDouble();                                          // weights
                case 1 -> (r.nextDouble() - 0.5) * Math.pow(10, r.nextInt(-9, 16)); // any scale
                case 2 -> Math.round(r.nextDouble() * 1e6) / 1e6;                   // round decimals
                default -> Double.longBitsToDouble(r.nextLong());                  // any bits
            };
            String s = CsvCells.number(v);
            assertEquals(reference(v), s, "bits " + Double.doubleToLongBits(v));
            if (Double.isFinite(v)) {
                assertEquals(v == 0 ? 0 : Double.doubleToLongBits(v), v == 0 ? 0 : Double.doubleToLongBits(
                        Double.parseDouble(s)));
            }
        }
    }

    @Test
    void theGuardPrefixesRiskyTextOnceAndIsUndoneExactly() {
        String[][] cases = {
                {"=SUM(A1)", "'=SUM(A1)"}, {"+1", "'+1"}, {"-x", "'-x"}, {"@cmd", "'@cmd"}, {"\tx", "'\tx"},
                {"\rx", "'\rx"}, {"'=x", "''=x"}, {"''@x", "'''@x"}, {"Cash", "Cash"}, {"'quoted'", "'quoted'"},
                {"", ""}, {"'", "'"}, {"a=b", "a=b"}};
        for (String[] c : cases) {
            assertEquals(c[1], CsvCells.guard(c[0]), c[0]);
            assertEquals(c[0], CsvCells.unguard(c[1]), c[1]);
        }
    }

    @Test
    void quotingIsTheCsvWritersRuleOnAnyText() {
        // the rule as the one CSV writer first wrote it: a comma, quote, line break or # anywhere, or blanks around
        java.util.function.Function<String, String> rule = t -> t.indexOf(',') >= 0 || t.indexOf('"') >= 0
                || t.indexOf('\n') >= 0 || t.indexOf('\r') >= 0 || t.indexOf('#') >= 0 || !t.equals(t.strip())
                ? '"' + t.replace("\"", "\"\"") + '"' : t;
        SplittableRandom r = new SplittableRandom(11);
        String alphabet = "ab ,\"\n\r#\t\u00a0\u2003x=-";
        for (int k = 0; k < 200_000; k++) {
            StringBuilder b = new StringBuilder();
            for (int c = r.nextInt(6); c > 0; c--) {
                b.append(alphabet.charAt(r.nextInt(alphabet.length())));
            }
            assertEquals(rule.apply(b.toString()), CsvCells.quote(b.toString()), b.toString());
        }
    }

    @Test
    void textIsQuotedWhenACsvReaderWouldOtherwiseSplitOrSkipIt() {
        assertEquals("Cash", CsvCells.quote("Cash"));
        assertEquals("\"a,b\"", CsvCells.quote("a,b"));
        assertEquals("\"say \"\"hi\"\"\"", CsvCells.quote("say \"hi\""));
        assertEquals("\"#1\"", CsvCells.quote("#1"));
        assertEquals("\" x\"", CsvCells.quote(" x"));
        assertEquals("\"line\nbreak\"", CsvCells.quote("line\nbreak"));
        assertEquals("\"'=1,2\"", CsvCells.text("=1,2"));
        // read back by the project's reader: the cell as written, the guard undone
        CsvTable t = Csv.parse("t.csv", "test", "name\n" + CsvCells.text("=1,2") + "\n");
        assertEquals("=1,2", CsvCells.unguard(t.rows().get(0).cell(0)));
    }
}
