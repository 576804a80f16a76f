package org.isorisk.cli.render;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class TextTests {

    @Test
    void wrappingKeepsEveryLineWithinTheWidthAndNeverSplitsANumberFromItsPercentSign() {
        // Common practice, no source: a unit stays with its number when text is wrapped.
        String sentence = "Raising the lower limit of Inflation-Linked Bonds by 1.00 % raises volatility by less than 0.01 %.";
        String wrapped = Text.wrap(sentence, "  - ", "    ");
        for (String line : wrapped.split("\n")) {
            assertTrue(line.length() <= Text.WIDTH, line);
            assertTrue(!line.strip().startsWith("%"), "a line starts with a percent sign: '" + line + "'");
        }
        assertEquals("  - Raising the lower limit of Inflation-Linked Bonds by 1.00 % raises volatility by less than\n"
                + "    0.01 %.\n", wrapped);
        assertEquals("  - short text\n", Text.wrap("short   text ", "  - ", "    "));
    }
}
