package org.isorisk.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.isorisk.cli.commands.BaseCommand;
import org.isorisk.cli.commands.ExitCode;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

class RootCommandTests {

    @Test
    void withoutACommandItExitsTwoNamingTheCommands() {
        Run r = Run.of();
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: name a command: check, solve, frontier, estimate, risk, rebalance, stress, "
                + "batch, chart, pack, demo (see 'isorisk --help')\n", r.err());
        assertEquals("", r.out());
    }

    @Test
    void helpListsEveryCommandTheExitCodesAndTheCaution() {
        Run r = Run.of("--help");
        assertEquals(0, r.code());
        for (String c : new String[] {"check", "solve", "frontier", "estimate", "risk", "rebalance", "stress", "chart", "pack", "demo"}) {
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
        for (String c : new String[] {"check", "solve", "frontier", "estimate", "risk", "rebalance", "stress", "chart", "pack", "demo"}) {
            Run r = Run.of(c, "--help");
            assertEquals(0, r.code(), c);
            assertTrue(r.out().contains("\nUsage: isorisk " + c + " "), r.out());
        }
    }

    /** A command with a bug, to see how an internal error is reported. */
    @CommandLine.Command(name = "boom")
    static final class Boom extends BaseCommand {
        @Override
        protected ExitCode execute() {
            throw new IllegalStateException("a bug");
        }
    }

    @Test
    void anInternalErrorExitsOneWithItsStackTrace() {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = Cli.commandLine(new PrintWriter(out, true), new PrintWriter(err, true), true);
        cl.addSubcommand("boom", new Boom());
        cl.setOut(new PrintWriter(out, true)).setErr(new PrintWriter(err, true)); // reach the command added late
        assertEquals(1, cl.execute("boom"));
        assertTrue(err.toString().startsWith("isorisk: internal error (a bug; please report it with the lines below): "
                + "java.lang.IllegalStateException: a bug\n"), err.toString());
        assertTrue(err.toString().contains("at org.isorisk.cli.RootCommandTests$Boom.execute"), err.toString());
        assertEquals("", out.toString());
    }
}
