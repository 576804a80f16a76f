package org.isorisk.cli;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.util.List;
import java.util.Locale;
import org.isorisk.cli.commands.ExitCode;
import org.isorisk.cli.commands.Reporting;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.cli.options.FormatOption;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.IsoriskException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.Status;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine;

/**
 * Turns every failure into a named exit code. User errors (bad input, bad usage, no solution) print one line
 * {@code isorisk: error: ...} on stderr and never a stack trace; in JSON format they also print a JSON object
 * with {@code status} and {@code error} on stdout. Anything else is a bug: exit 1 with the stack trace.
 */
final class ErrorHandler implements CommandLine.IExecutionExceptionHandler, CommandLine.IParameterExceptionHandler {

    @Override
    public int handleExecutionException(Exception ex, CommandLine cl, CommandLine.ParseResult parsed) {
        Object cmd = cl.getCommand();
        boolean json = cmd instanceof Reporting r && r.jsonOutput();
        double ms = cmd instanceof Reporting r ? r.elapsedMillis() : Double.NaN;
        if (ex instanceof NoSolutionException e) {
            ObjectNode o = errorObject(Status.INFEASIBLE.label(), e.getMessage());
            o.put("reason", e.reason().name().toLowerCase(Locale.ROOT).replace('_', '-'));
            o.set("constraints", ResultJson.strings(e.constraints()));
            e.achievableReturns().ifPresent(r -> {
                ObjectNode range = o.putObject("range");
                ResultJson.number(range, "min", r[0]);
                ResultJson.number(range, "max", r[1]);
            });
            e.endPortfolio().ifPresent(p -> {
                ObjectNode end = o.putObject("end_portfolio");
                p.forEach((k, v) -> ResultJson.number(end, k, v));
            });
            return report(cl, ExitCode.NO_SOLUTION, e.getMessage(), json ? o : null, ms);
        }
        if (ex instanceof InputException || ex instanceof IsoriskException) {
            return report(cl, ExitCode.BAD_INPUT, ex.getMessage(),
                    json ? errorObject(Status.INVALID_INPUT.label(), ex.getMessage()) : null, ms);
        }
        if (ex instanceof ParameterException e) {
            String msg = usage(e);
            return report(cl, ExitCode.BAD_INPUT, msg, json ? errorObject(Status.INVALID_INPUT.label(), msg) : null, ms);
        }
        PrintWriter err = cl.getErr();
        err.println("isorisk: internal error (a bug; please report it with the lines below): " + ex);
        ex.printStackTrace(err);
        err.flush();
        return ExitCode.INTERNAL.code();
    }

    @Override
    public int handleParseException(ParameterException ex, String[] args) {
        String msg = usage(ex);
        return report(ex.getCommandLine(), ExitCode.BAD_INPUT, msg,
                wantsJson(args) ? errorObject(Status.INVALID_INPUT.label(), msg) : null, Double.NaN);
    }

    /** Picocli's message on one line, with its suggestions and where to find help. */
    private static String usage(ParameterException ex) {
        StringBuilder m = new StringBuilder(ex.getMessage() == null ? "bad usage" : ex.getMessage().strip());
        if (ex instanceof CommandLine.UnmatchedArgumentException u && !u.getSuggestions().isEmpty()) {
            m.append(" (did you mean: ").append(String.join(", ", u.getSuggestions())).append("?)");
        }
        m.append(" (see '").append(ex.getCommandLine().getCommandSpec().qualifiedName()).append(" --help')");
        return m.toString();
    }

    private static ObjectNode errorObject(String status, String message) {
        ObjectNode o = ResultJson.object();
        o.put("status", status);
        o.put("error", oneLine(message));
        return o;
    }

    private static int report(CommandLine cl, ExitCode code, String message, ObjectNode json, double ms) {
        PrintWriter err = cl.getErr();
        err.println("isorisk: error: " + oneLine(message));
        err.flush();
        if (json != null) {
            ResultJson.finish(json, ms);
            try {
                ResultJson.write(json, cl.getOut());
            } catch (IOException e) {
                err.println("isorisk: error: the JSON error object could not be written: " + e.getMessage());
            }
        }
        return code.code();
    }

    private static String oneLine(String s) {
        return s == null ? "" : s.replaceAll("\\s*[\\r\\n]+\\s*", " ").strip();
    }

    /** True when the arguments ask for JSON, whether or not they could be parsed. */
    static boolean wantsJson(String[] args) {
        List<String> a = List.of(args);
        for (int i = 0; i < a.size(); i++) {
            String s = a.get(i);
            if (s.equalsIgnoreCase(FormatOption.NAME + "=json") || (s.equals(FormatOption.NAME) && i + 1 < a.size()
                    && a.get(i + 1).equalsIgnoreCase("json"))) {
                return true;
            }
        }
        return false;
    }
}
