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
        return commandLine(out, err, plain, null);
    }

    /**
     * The command line prepared for {@code args}: when the first argument names a command, only that command is
     * registered. Building picocli's model of every command costs start-up time (picocli's classes predate class
     * data sharing and are loaded and verified afresh on each run); help and unknown names still see them all.
     */
    public static CommandLine commandLine(PrintWriter out, PrintWriter err, boolean plain, String[] args) {
        CommandLine cl = new CommandLine(new IsoriskCommand());
        String first = args != null && args.length > 0 ? args[0] : null;
        Class<?> only = null;
        for (Class<?> c : IsoriskCommand.COMMANDS) {
            if (c.getAnnotation(CommandLine.Command.class).name().equals(first)) {
                only = c;
            }
        }
        for (Class<?> c : IsoriskCommand.COMMANDS) {
            if (only == null || c == only) {
                cl.addSubcommand(c.getAnnotation(CommandLine.Command.class).name(), c);
            }
        }
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
