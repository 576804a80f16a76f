package org.isorisk.cli;

import java.io.PrintWriter;
import picocli.CommandLine;
import picocli.CommandLine.Help;

/** Builds the configured command line; {@link Main} runs it for real, tests run it in-process. */
public final class Cli {
    private Cli() {
    }

    /**
     * The {@code isorisk} command line writing to {@code out} and {@code err}.
     *
     * @param plain true to switch colours off whatever the terminal (tests); false follows picocli's rules
     *              ({@code NO_COLOR}, the console)
     */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err, boolean plain) {
        CommandLine cl = new CommandLine(new IsoriskCommand());
        cl.setOut(out);
        cl.setErr(err);
        if (plain) {
            cl.setColorScheme(Help.defaultColorScheme(Help.Ansi.OFF));
        }
        ErrorHandler handler = new ErrorHandler();
        cl.setExecutionExceptionHandler(handler);
        cl.setParameterExceptionHandler(handler);
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        return cl;
    }
}
