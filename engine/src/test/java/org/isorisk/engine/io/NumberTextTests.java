package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import org.junit.jupiter.api.Test;

class NumberTextTests {

    @Test
    void plainDecimalsAndExponentsAreAccepted() {
        for (String s : new String[] {"0.05", "-0.05", "+1", ".5", "5.", "1e-3", "2.5E+2", " 7 "}) {
            assertNull(NumberText.problem(s), s);
        }
        assertEquals(250.0, NumberText.parse("2.5E+2"));
    }

    @Test
    void eachKindOfNonNumberGetsItsOwnProblem() {
        assertEquals("the number uses a decimal comma", NumberText.problem("0,05").problem());
        assertEquals("the number uses a decimal comma", NumberText.problem("1.234,5").problem());
        assertEquals("the number has thousands separators", NumberText.problem("1,234,567").problem());
        assertEquals("the number has thousands separators", NumberText.problem("1,234.5").problem());
        assertEquals("the number has a percent sign", NumberText.problem("5 %").problem());
        assertEquals("the value is not a finite number", NumberText.problem("-Infinity").problem());
        assertEquals("the cell is empty", NumberText.problem("  ").problem());
        assertEquals("the cell is not a number", NumberText.problem("0x10").problem());
        assertEquals("the cell is not a number", NumberText.problem("#N/A").problem());
    }
}
