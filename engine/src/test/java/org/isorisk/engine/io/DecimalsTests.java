package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Locale;
import java.util.Random;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

class DecimalsTests {

    @Test
    void theFastPathGivesExactlyWhatTheJdkParserGivesOrDeclines() {
        // Reference: java.lang.Double.parseDouble (correctly rounded, JLS §3.10.2 / IEEE 754); the fast path must
        // agree to the bit wherever it answers, in plain and exponent forms, up to 15 significant digits.
        Random rnd = new Random(5);
        int answered = 0;
        for (int k = 0; k < 200_000; k++) {
            double x = (rnd.nextDouble() - 0.5) * Math.pow(10, rnd.nextInt(12) - 8);
            int digits = 1 + rnd.nextInt(15);
            String s = switch (k % 3) {
                case 0 -> String.format(Locale.ROOT, "%." + digits + "f", x);
                case 1 -> String.format(Locale.ROOT, "%." + (digits - 1) + "e", x);
                default -> String.format(Locale.ROOT, "%." + (digits - 1) + "E", x).replace("E-0", "E-");
            };
            double fast = Decimals.fast(s);
            if (!Double.isNaN(fast)) {
                answered++;
                assertEquals(Double.doubleToRawLongBits(Double.parseDouble(s)), Double.doubleToRawLongBits(fast), s);
            }
        }
        assertTrue(answered > 150_000, "the fast path answered only " + answered);
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(Decimals.fast("-0")));
        for (String declined : List.of("0.12345678901234567890", "1e400", "1e-400", "1e", "e5", "1.2.3", "", "-", "1,5",
                "5 %", "0x10", "1e1234")) {
            assertTrue(Double.isNaN(Decimals.fast(declined)), declined);
        }
    }

    @Test
    void thePlainFormIsExactlyTheDecimalFormTheNumberCheckAccepts() {
        // The pattern NumberText uses for a plain decimal, written out here as the reference.
        Pattern decimal = Pattern.compile("[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?");
        for (String s : List.of("0.05", "-0.05", "+1", "5.", ".5", ".", "-.", "1e5", "1E-05", "1e+5", "1e", "1e+",
                "2.5e-3x", " 1", "1 ", "1,5", "1.5%", "nan", "Infinity", "0x1p3", "1d", "1f", "--1", "1.2.3", "",
                "123456789012345678901234567890", "0.12345678901234567")) {
            assertEquals(decimal.matcher(s).matches(), Decimals.plain(s), "'" + s + "'");
        }
    }
}
