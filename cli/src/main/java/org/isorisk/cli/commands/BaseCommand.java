package org.isorisk.cli.commands;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;
import org.isorisk.cli.files.OptionPaths;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.cli.options.Format;
import org.isorisk.cli.options.FormatOption;
import org.isorisk.cli.render.Rendered;
import picocli.CommandLine.IVersionProvider;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.Spec;

/**
 * What every command shares: the timer behind {@code timing_ms.total}, the format of its {@code --format} option
 * (mixed in with {@code OutputOptions} or {@code FormatOption}), the run's files ({@link #files}: every
 * {@code Path} option registered as an input, every {@code @OutputPath} option declared and checked as an output,
 * before {@link #execute} starts), and {@link #emit} which prints a result in that format to standard output or
 * writes it atomically to {@code --out}.
 */
public abstract class BaseCommand implements Callable<Integer>, Reporting {

    @Spec
    CommandSpec spec;

    private long started;

    private RunFiles files;

    /**
     * Runs the command: registers its input files and checks its outputs (an output never replaces an input; see
     * {@link RunFiles}) before {@link #execute} does any work.
     */
    @Override
    public final Integer call() throws Exception {
        started = System.nanoTime();
        try (RunFiles f = RunFiles.begin()) {
            files = f;
            OptionPaths.declare(spec, f);
            return execute().code();
        } finally {
            files = null;
        }
    }

    /** The files of the run in progress: register inputs read along the way, publish results. */
    protected final RunFiles files() {
        if (files == null) {
            throw new IllegalStateException("no run in progress");
        }
        return files;
    }

    /** The command's work; user errors are thrown as engine exceptions and mapped by the error handler. */
    protected abstract ExitCode execute() throws Exception;

    /** The format the command was asked for; {@link Format#TABLE} for commands without {@code --format}. */
    protected final Format format() {
        OptionSpec option = spec == null ? null : spec.findOption(FormatOption.NAME);
        return option != null && option.getValue() instanceof Format f ? f : Format.TABLE;
    }

    /**
     * isorisk's version as the root command's version provider gives it (without the leading "isorisk "), for
     * records of a run; {@code (unknown version)} when there is none.
     */
    protected String toolVersion() {
        IVersionProvider provider = spec == null ? null : spec.root().versionProvider();
        try {
            String[] v = provider == null ? new String[0] : provider.getVersion();
            return v.length == 0 ? "(unknown version)" : v[0].replaceFirst("^isorisk ", "");
        } catch (Exception e) {
            return "(unknown version)";
        }
    }

    @Override
    public boolean jsonOutput() {
        return format() == Format.JSON;
    }

    @Override
    public double elapsedMillis() {
        return started == 0 ? Double.NaN : (System.nanoTime() - started) / 1e6;
    }

    /** Standard output of this command line. */
    protected PrintWriter out() {
        return spec.commandLine().getOut();
    }

    /** Standard error of this command line. */
    protected PrintWriter err() {
        return spec.commandLine().getErr();
    }

    /**
     * Prints {@code r} in the chosen format, or writes it to {@code file} atomically. Warnings are part of every
     * rendering; they are also repeated on stderr when the output is not a table on the terminal.
     */
    protected void emit(Rendered r, Optional<Path> file) {
        Format f = format();
        String text = switch (f) {
            case JSON -> ResultJson.text(ResultJson.finish(r.json(), elapsedMillis()));
            case CSV -> r.csv();
            case TABLE -> r.table();
        };
        if (f != Format.TABLE || file.isPresent()) {
            warn(r.warnings());
        }
        if (file.isPresent()) {
            files().file(file.get(), w -> w.write(text));
            wrote(file.get());
        } else {
            out().print(text);
            out().flush();
        }
        err().flush();
    }

    /** Prints each warning on stderr as {@code isorisk: warning: ...}. */
    protected void warn(List<String> warnings) {
        for (String w : warnings) {
            err().println("isorisk: warning: " + w);
        }
    }

    /** Says on stderr that {@code file} was written. */
    protected void wrote(Path file) {
        err().println("isorisk: wrote " + file);
    }
}
