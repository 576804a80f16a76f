package org.isorisk.cli.files;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;
import org.isorisk.notebooks.chart.ChartFormat;

/**
 * The files of one command run and the rule that keeps them apart: <b>an output never replaces an input of the
 * same run</b>. Every file the run reads is registered as an input where it is read (the command's {@code Path}
 * options by {@link OptionPaths} before the work starts; files named inside other files, such as a policy's
 * bounds table or a pack file's scenarios, by {@link #reading} as they are read); every place it writes is
 * declared as an output before the work starts ({@link OutputPath} options). Each declaration is checked at once
 * against everything registered so far, and each registration against every declared output, so a clash is
 * refused (exit 2, naming both files) as soon as it is known, before any result is computed; publication
 * ({@link #file}, {@link #bytes}, {@link #folder}, the only way results reach the disk, through
 * {@link AtomicWrite}) checks its target again and refuses a target that was not declared.
 *
 * <p>"The same file" is decided by the file system, not by the spelling: {@code ./} and {@code ../} spellings,
 * symbolic links (to the file or to a folder on its path) and hard links (the same file key, i.e. device and
 * inode) all count. A folder output must not hold an input (by real path) nor, when it is an earlier isorisk
 * output about to be replaced, a hard link to one. An input given as a folder (the demo's {@code --data})
 * registers every regular file directly inside it.
 *
 * <p>Also checked when an output is declared: a chart file's extension (.png, .svg, .pdf), that the output's
 * folder exists and can be written, that a file output is not a folder and a folder output not a file, and for
 * an existing folder the replacement rules: a folder isorisk did not write (no {@link AtomicWrite#MARKER}) is
 * never replaced, an earlier isorisk output only where the option allows it ({@link OutputPath#force}).
 */
public final class RunFiles implements AutoCloseable {

    /** What an output option names. */
    public enum Kind {
        /** A result file ({@code --out FILE}), replaced as a whole. */
        FILE("result.json"),
        /** A chart file; its extension gives the format. */
        CHART("chart.png"),
        /** A folder written and replaced as a whole (pack, demo, estimate, check --repair). */
        FOLDER(null);

        private final String example;

        Kind(String example) {
            this.example = example;
        }
    }

    /** The rule every refusal quotes. */
    public static final String RULE = "an output never replaces an input of the same run";

    private static final ThreadLocal<RunFiles> CURRENT = new ThreadLocal<>();

    /** A file the run reads: how it was named (e.g. {@code --holdings file}), the path as given, and where it is. */
    private record Input(String what, Path given, Path abs, Path real) {
    }

    /** A place the run writes: its option, the path as given, the kind, and whether an earlier output is replaced. */
    private record Output(String option, Path given, Path abs, Kind kind, boolean replaceEarlier, String force) {
    }

    private final RunFiles outer;
    private final List<Input> inputs = new ArrayList<>();
    private final List<Output> outputs = new ArrayList<>();

    private RunFiles(RunFiles outer) {
        this.outer = outer;
    }

    /**
     * Starts the files of a run on this thread ({@code BaseCommand} does it for every command); {@link #reading}
     * registers with it until {@link #close}.
     */
    public static RunFiles begin() {
        RunFiles f = new RunFiles(CURRENT.get());
        CURRENT.set(f);
        return f;
    }

    /** Ends the run on this thread. */
    @Override
    public void close() {
        if (CURRENT.get() == this) {
            if (outer == null) {
                CURRENT.remove();
            } else {
                CURRENT.set(outer);
            }
        }
    }

    /**
     * Registers {@code file} as an input of the run in progress on this thread (if any), where it is read: for
     * files that are not a command's own option, e.g. {@code reading("bounds file named in --policy", path)}.
     *
     * @param what how the file is named in a refusal, e.g. {@code scenarios file named in --pack-file}
     * @return {@code file}, so that the call can wrap the path handed to a reader
     * @throws InputException when a declared output would replace it
     */
    public static Path reading(String what, Path file) {
        RunFiles f = CURRENT.get();
        if (f != null) {
            f.input(what, file);
        }
        return file;
    }

    /**
     * Registers {@code file} (or, for a folder, every regular file directly inside it) as an input of this run.
     *
     * @param what how the file is named in a refusal, e.g. {@code --holdings file}
     * @throws InputException when a declared output would replace it
     */
    public RunFiles input(String what, Path file) {
        if (Files.isDirectory(file)) {
            try (Stream<Path> s = Files.list(file)) {
                for (Path p : s.filter(x -> Files.isRegularFile(x)).sorted().toList()) {
                    add(what, p);
                }
            } catch (IOException e) {
                // reading the folder's files reports the problem, naming them
            }
            return this;
        }
        add(what, file);
        return this;
    }

    private void add(String what, Path file) {
        Path real = realPath(file);
        Input in = new Input(what, file, abs(file), real);
        for (Input i : inputs) {
            if (i.abs().equals(in.abs()) || (real != null && real.equals(i.real()))) {
                return; // already registered, under its first name
            }
        }
        inputs.add(in);
        for (Output o : outputs) {
            refuseIfReplaces(o, in);
        }
    }

    /**
     * Declares a place this run writes to and checks it now: against every input registered so far (and every
     * later one as it is registered), against the other outputs, and for its kind (see the class comment).
     *
     * @param option         the option that names it, e.g. {@code --out}; named in refusals
     * @param replaceEarlier for a folder: replace a non-empty earlier isorisk output
     * @throws InputException when the output cannot be used (named, with a fix)
     */
    public RunFiles output(String option, Path target, Kind kind, boolean replaceEarlier) {
        return output(option, target, kind, replaceEarlier, "--force");
    }

    /** {@link #output(String, Path, Kind, boolean)}, naming the option that allows replacing an earlier output. */
    RunFiles output(String option, Path target, Kind kind, boolean replaceEarlier, String force) {
        Output o = new Output(option, target, abs(target), kind, replaceEarlier, force);
        for (Input in : inputs) {
            refuseIfReplaces(o, in);
        }
        for (Output other : outputs) {
            if (other.abs().equals(o.abs()) || sameExisting(other.given(), o.given())) {
                throw InputException.of(other.option() + " and " + option + " name the same "
                        + (kind == Kind.FOLDER ? "folder" : "file")).file(target.toString())
                        .fix("give " + option + " another name").build();
            }
        }
        checkUsable(o);
        outputs.add(o);
        return this;
    }

    /**
     * Writes the declared file {@code target} (UTF-8) atomically, after checking it against every input again.
     *
     * @throws InputException when the file cannot be written or would replace an input
     * @throws IllegalStateException when {@code target} was not declared as an output (a bug)
     */
    public void file(Path target, AtomicWrite.TextBody body) {
        checked(target);
        AtomicWrite.file(target, body);
    }

    /** Writes the declared binary file {@code target} (a chart) atomically; see {@link #file}. */
    public void bytes(Path target, AtomicWrite.BinaryBody body) {
        checked(target);
        AtomicWrite.bytes(target, body);
    }

    /**
     * Writes the declared folder {@code target} atomically ({@code body} fills a temporary sibling that then
     * replaces it), after checking it against every input again; an earlier isorisk output is replaced only as its
     * declaration allows.
     *
     * @throws InputException when the folder cannot be used or written, or would replace an input
     * @throws IllegalStateException when {@code target} was not declared as an output (a bug)
     */
    public void folder(Path target, AtomicWrite.FolderBody body) {
        Output o = checked(target);
        AtomicWrite.folder(target, o.replaceEarlier(), body);
    }

    private Output checked(Path target) {
        Path abs = abs(target);
        Output o = outputs.stream().filter(x -> x.abs().equals(abs)).findFirst().orElseThrow(() ->
                new IllegalStateException("isorisk writes only to outputs declared before the work starts; " + target
                        + " was not declared (mark its option with @OutputPath, or call RunFiles.output)"));
        for (Input in : inputs) {
            refuseIfReplaces(o, in);
        }
        return o;
    }

    /** Refuses {@code o} when writing it would replace {@code in}: the same file, or a folder that holds it. */
    private static void refuseIfReplaces(Output o, Input in) {
        String how = sameFile(o.given(), o.abs(), in);
        if (how != null) {
            throw InputException.of(o.option() + " names the " + in.what() + " " + in.given() + how + "; " + RULE)
                    .file(o.given().toString()).fix("choose another " + o.option()).build();
        }
        if (o.kind() != Kind.FOLDER) {
            return;
        }
        if (holds(o, in)) {
            throw InputException.of("the " + o.option() + " folder holds the " + in.what() + " " + in.given()
                            + ", and would be replaced as a whole; " + RULE).file(o.given().toString())
                    .fix("choose another " + o.option() + " folder that holds none of the inputs").build();
        }
        hardLinkInside(o, in).ifPresent(link -> {
            throw InputException.of("the " + o.option() + " folder holds " + link + ", a hard link to the " + in.what()
                            + " " + in.given() + ", and would be replaced as a whole; " + RULE)
                    .file(o.given().toString())
                    .fix("choose another " + o.option() + " folder that holds none of the inputs").build();
        });
    }

    /**
     * How {@code target} is the input's file: {@code ""} spelled the same (after {@code ./} and {@code ../}),
     * a parenthesis saying how otherwise; null when it is another file.
     */
    private static String sameFile(Path target, Path targetAbs, Input in) {
        if (targetAbs.equals(in.abs())) {
            return "";
        }
        if (in.real() == null) {
            return null;
        }
        Path real = realPath(target);
        if (real == null) {
            return null;
        }
        if (real.equals(in.real())) {
            return Files.isSymbolicLink(target) ? " (through a symbolic link)" : " (the same file by another path)";
        }
        return sameExisting(real, in.real()) ? " (a hard link to it)" : null;
    }

    /** True when the folder output {@code o} holds the input (by path, and by real path when both exist). */
    private static boolean holds(Output o, Input in) {
        if (in.abs().startsWith(o.abs())) {
            return true;
        }
        Path folder = realPath(o.given());
        return folder != null && in.real() != null && in.real().startsWith(folder);
    }

    /**
     * A file inside an earlier isorisk output folder (which would be replaced) that is a hard link to the input.
     * Other folders are never replaced, so they are not searched.
     */
    private static Optional<Path> hardLinkInside(Output o, Input in) {
        Path dir = o.given();
        if (in.real() == null || !Files.isDirectory(dir) || !Files.exists(dir.resolve(AtomicWrite.MARKER))) {
            return Optional.empty();
        }
        try (Stream<Path> s = Files.walk(dir)) {
            return s.filter(p -> Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS))
                    .filter(p -> sameExisting(p, in.real())).findFirst();
        } catch (IOException | java.io.UncheckedIOException e) {
            return Optional.empty();
        }
    }

    /** The checks of an output that do not depend on the inputs (see the class comment). */
    private static void checkUsable(Output o) {
        String option = o.option();
        Path target = o.given();
        Path parent = o.abs().getParent();
        if (parent == null || o.abs().getFileName() == null) {
            throw InputException.of(o.kind() == Kind.FOLDER ? "the output folder cannot be the root folder"
                    : "the output path has no file name").file(target.toString())
                    .fix("give " + option + " a " + (o.kind() == Kind.FOLDER ? "folder" : "file") + " name").build();
        }
        if (o.kind() == Kind.CHART) {
            ChartFormat.fromFileName(target.toString());
        }
        if (o.kind() != Kind.FOLDER && Files.isDirectory(target)) {
            throw InputException.of("the output path is a folder").file(target.toString())
                    .fix("give a file name, e.g. " + target.resolve(o.kind().example)).build();
        }
        if (o.kind() == Kind.FOLDER && Files.exists(target) && !Files.isDirectory(target)) {
            throw InputException.of("the output folder is an existing file").file(target.toString())
                    .fix("choose another " + option).build();
        }
        String shown = target.getParent() == null ? parent.toString() : target.getParent().toString();
        if (!Files.exists(parent)) {
            throw InputException.of("the folder of " + option + " does not exist").file(shown)
                    .fix("create it first, or choose another " + option).build();
        }
        if (!Files.isDirectory(parent)) {
            throw InputException.of("the folder of " + option + " is a file").file(shown)
                    .fix("choose another " + option).build();
        }
        if (!Files.isWritable(parent)) {
            throw InputException.of("the folder of " + option + " cannot be written (permission denied)").file(shown)
                    .fix("choose a folder you can write to, or change its permissions").build();
        }
        if (o.kind() == Kind.FOLDER && Files.isDirectory(target) && !AtomicWrite.isEmpty(target)) {
            if (!Files.exists(target.resolve(AtomicWrite.MARKER))) {
                throw InputException.of(AtomicWrite.NOT_OURS).file(target.toString())
                        .fix("choose another " + option + ", or empty the folder").build();
            }
            if (!o.replaceEarlier()) {
                throw InputException.of(AtomicWrite.NOT_EMPTY).file(target.toString())
                        .fix("choose another " + option + ", or add " + o.force() + " to replace the earlier output")
                        .build();
            }
        }
    }

    private static Path abs(Path p) {
        return p.toAbsolutePath().normalize();
    }

    private static Path realPath(Path p) {
        try {
            return p.toRealPath();
        } catch (IOException | SecurityException e) {
            return null;
        }
    }

    /** True when both exist and are the same file (the same file key: device and inode). */
    private static boolean sameExisting(Path a, Path b) {
        try {
            return Files.exists(a) && Files.exists(b) && Files.isSameFile(a, b);
        } catch (IOException e) {
            return false;
        }
    }
}
