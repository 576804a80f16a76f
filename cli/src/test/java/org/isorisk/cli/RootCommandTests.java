package org.isorisk.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;

class RootCommandTests {

    @Test
    void withoutACommandItExitsTwoNamingTheCommands() {
        Run r = Run.of();
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: name a command: check, solve, estimate, risk, demo (see 'isorisk --help')\n", r.err());
        assertEquals("", r.out());
    }

    @Test
    void helpListsEveryCommandTheExitCodesAndTheCaution() {
        Run r = Run.of("--help");
        assertEquals(0, r.code());
        for (String c : new String[] {"check", "solve", "risk", "demo"}) {
            assertTrue(r.out().contains("  " + c + " "), r.out());
        }
        assertTrue(r.out().contains("Exit codes: 0 ok, 1 internal error, 2 bad input or usage, 3 no solution."));
        assertTrue(r.out().replaceAll("\\s+", " ").contains(Caution.TEXT), r.out());
    }

    @Test
    void theVersionComesFromTheBuild() {
        Run r = Run.of("--version");
        assertEquals(0, r.code());
        assertTrue(r.out().matches("isorisk \\d+\\.\\d+\\.\\d+(-SNAPSHOT)?\\n"), r.out());
    }

    @Test
    void anUnknownCommandIsOneLineWithASuggestion() {
        Run r = Run.of("solv");
        assertEquals(2, r.code());
        assertEquals("isorisk: error: Unmatched argument at index 0: 'solv' (did you mean: solve?) (see 'isorisk "
                + "--help')\n", r.err());
    }

    @Test
    void everyCommandHasHelp() {
        for (String c : new String[] {"check", "solve", "risk", "demo"}) {
            Run r = Run.of(c, "--help");
            assertEquals(0, r.code(), c);
            assertTrue(r.out().contains("\nUsage: isorisk " + c + " "), r.out());
        }
    }
}
