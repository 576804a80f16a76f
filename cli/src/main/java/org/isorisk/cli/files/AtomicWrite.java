package org.isorisk.cli.files;

import java.io.IOException;
import java.io.OutputStream;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;

/**
 * The one place where results become files, reached only through {@link RunFiles} (which first checks that the
 * target is a declared output that replaces no input of the run): everything is written to a temporary file (or
 * folder) beside the target and moved into place at the end, so that a reader never sees a half-written result and
 * a failure leaves the previous version untouched. Files and folders share one mechanism for that
 * ({@code Publication}): each write registers its temporary sibling, and the one shutdown hook (Ctrl-C, kill)
 * removes every temporary still being written and puts back an earlier output folder moved aside, while a rename
 * already under way finishes first.
 */
public final class AtomicWrite {
    private AtomicWrite() {
    }

    /**
     * Every write in progress, file or folder. One shutdown hook (Ctrl-C, kill) aborts each of them under its
     * lock, so that an interrupted run leaves no temporary file or folder and nothing half-written at a target;
     * once it has started, no new write begins.
     */
    private static final java.util.Set<Publication> PENDING = new java.util.LinkedHashSet<>();
    /** Set by the shutdown hook, under the lock of {@link #PENDING}. */
    private static boolean stopping;

    static {
        Runtime.getRuntime().addShutdownHook(new Thread(AtomicWrite::abortAll, "isorisk-cleanup"));
    }

    /** The shutdown hook: refuses new writes, then aborts each one in progress. */
    private static void abortAll() {
        List<Publication> all;
        synchronized (PENDING) {
            stopping = true;
            all = new ArrayList<>(PENDING);
        }
        for (Publication p : all) {
            p.abort();
        }
    }

    /** Marker file inside every output folder this class writes; only such folders are replaced. */
    public static final String MARKER = ".isorisk-output";
    /** The refusal of an existing folder that isorisk did not write. */
    static final String NOT_OURS = "the output folder exists and was not written by isorisk, so it is left alone";
    /** The refusal of an existing earlier output that may not be replaced. */
    static final String NOT_EMPTY = "the output folder exists and is not empty";

    /** Writes text to a {@link Writer}. */
    @FunctionalInterface
    public interface TextBody {
        void write(Writer w) throws IOException;
    }

    /** Writes bytes to an {@link OutputStream} (charts, images). */
    @FunctionalInterface
    public interface BinaryBody {
        void write(OutputStream out) throws IOException;
    }

    /** Fills a (temporary) folder. */
    @FunctionalInterface
    public interface FolderBody {
        void fill(Path folder) throws IOException;
    }

    /**
     * Writes {@code target} (UTF-8) atomically; its folder must exist.
     *
     * @throws InputException when the target cannot be written (named, with a fix)
     */
    static void file(Path target, TextBody body) {
        writeFile(target, "result.json", tmp -> {
            try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8, StandardOpenOption.WRITE)) {
                body.write(w);
            }
        }, e -> "the output file cannot be written (" + reason(e) + ")");
    }

    /**
     * Writes the binary file {@code target} atomically (a chart, an image); its folder must exist.
     *
     * @throws InputException when the target cannot be written (named, with a fix)
     */
    static void bytes(Path target, BinaryBody body) {
        writeFile(target, "chart.png", tmp -> {
            try (OutputStream out = new java.io.BufferedOutputStream(Files.newOutputStream(tmp,
                    StandardOpenOption.WRITE))) {
                body.write(out);
            }
        }, e -> "the output file cannot be written: " + e.getMessage());
    }

    /** Writes an existing (just created, empty) temporary file. */
    @FunctionalInterface
    private interface FileBody {
        void write(Path tmp) throws IOException;
    }

    /**
     * The single-file write: a temporary sibling {@code .NAME.PID-….tmp}, created empty under the publication's
     * lock (so that the shutdown hook either sees it or stops it being created), written by {@code body}
     * (which opens it without creating it: a file the hook deleted is not brought back), then moved onto the
     * target.
     */
    private static void writeFile(Path target, String example, FileBody body,
                                  java.util.function.Function<IOException, String> message) {
        Path abs = target.toAbsolutePath();
        Path parent = parentOf(abs, target);
        if (Files.isDirectory(abs)) {
            throw InputException.of("the output path is a folder").file(target.toString())
                    .fix("give a file name, e.g. " + target.resolve(example)).build();
        }
        Path tmp = parent.resolve("." + abs.getFileName() + "." + unique() + ".tmp");
        Publication pub = null;
        try {
            pub = Publication.begin(abs, tmp, null);
            pub.stage(() -> Files.createFile(tmp));
            body.write(tmp);
            pub.publish();
        } catch (IOException e) {
            throw InputException.of(message.apply(e)).file(target.toString())
                    .fix("check that the folder is writable, or choose another --out").build();
        } finally {
            if (pub != null) {
                pub.finish();
            }
        }
    }

    /**
     * Writes the folder {@code target} atomically: {@code body} fills a temporary folder beside it, which then
     * replaces {@code target}. An existing target is replaced only when it is empty or was written by this class
     * (it holds {@link #MARKER}); any other existing folder is refused, so that nothing of the user's is deleted.
     * Same as {@code folder(target, true, body)}.
     */
    static void folder(Path target, FolderBody body) {
        folder(target, true, body);
    }

    /**
     * Writes the folder {@code target} atomically: {@code body} fills a temporary sibling
     * ({@code .NAME.tmp-…}, holding {@link #MARKER}), which is then renamed onto {@code target}. An empty target
     * is replaced; a non-empty one only when {@code replaceEarlier} is set and it holds {@link #MARKER} (an
     * earlier isorisk output), never a folder of the user's. The earlier output is renamed aside, the new one
     * renamed in, and the old one deleted; if the second rename fails the earlier output is put back. The shutdown
     * hook (Ctrl-C, kill) and the renames share a lock: an interrupted run removes its temporary folder and puts
     * back an earlier output it had moved aside, so nothing half-written is ever left at {@code target}.
     *
     * @param replaceEarlier replace an earlier isorisk output (the command line's {@code --force})
     * @throws InputException when the target cannot be used or written (named, with a fix)
     */
    static void folder(Path target, boolean replaceEarlier, FolderBody body) {
        Path abs = target.toAbsolutePath();
        Path parent = parentOf(abs, target);
        boolean exists = Files.exists(abs);
        if (exists && !Files.isDirectory(abs)) {
            throw InputException.of("the output folder is an existing file").file(target.toString())
                    .fix("choose another --out").build();
        }
        boolean nonEmpty = exists && !isEmpty(abs);
        if (nonEmpty && !Files.exists(abs.resolve(MARKER))) {
            throw InputException.of(NOT_OURS)
                    .file(target.toString()).fix("choose another --out, or empty the folder").build();
        }
        if (nonEmpty && !replaceEarlier) {
            throw InputException.of(NOT_EMPTY).file(target.toString())
                    .fix("choose another --out, or add --force to replace the earlier output").build();
        }
        Path staging = parent.resolve("." + abs.getFileName() + ".tmp-" + unique());
        Path aside = parent.resolve("." + abs.getFileName() + ".old-" + unique());
        Publication pub = null;
        try {
            pub = Publication.begin(abs, staging, aside);
            pub.stage(() -> {
                Files.createDirectory(staging);
                Files.writeString(staging.resolve(MARKER), "written by isorisk; this folder is replaced as a whole\n",
                        StandardCharsets.UTF_8);
            });
            body.fill(staging);
            pub.publish();
        } catch (IOException e) {
            throw InputException.of("the output folder cannot be written (" + reason(e) + ")").file(target.toString())
                    .fix("check that the folder is writable and has space, or choose another --out").build();
        } finally {
            if (pub != null) {
                pub.finish();
            }
        }
    }

    /** Creates a write's temporary file or folder. */
    @FunctionalInterface
    private interface Staging {
        void create() throws IOException;
    }

    /**
     * One write in progress (a file or a folder) and its undoing: the temporary sibling it is written to, the
     * target it is moved onto and, for a folder, the name an earlier output is moved aside to while the new one
     * moves in. Creating the temporary, publishing and aborting are serialised on this object, so that the
     * shutdown hook either lets a rename finish or stops it from starting.
     */
    private static final class Publication {
        private final Path target;
        private final Path staging;
        /** Where an earlier output folder waits while the new one moves in; null for a file. */
        private final Path aside;
        private boolean aborted;
        private boolean published;

        private Publication(Path target, Path staging, Path aside) {
            this.target = target;
            this.staging = staging;
            this.aside = aside;
        }

        /** Registers a write with the shutdown hook; refused once the hook has started. */
        static Publication begin(Path target, Path staging, Path aside) throws IOException {
            Publication p = new Publication(target, staging, aside);
            synchronized (PENDING) {
                if (stopping) {
                    throw new IOException("interrupted: the program is stopping");
                }
                PENDING.add(p);
            }
            return p;
        }

        /** Creates the temporary file or folder, unless the write was aborted. */
        synchronized void stage(Staging create) throws IOException {
            if (aborted) {
                throw new IOException("interrupted");
            }
            create.create();
        }

        /**
         * Moves the temporary onto the target. A folder first moves an earlier output aside (an empty target
         * is deleted instead), and puts it back if the second move fails; the earlier output is deleted once the
         * new one is in place.
         */
        synchronized void publish() throws IOException {
            if (aborted) {
                throw new IOException("interrupted");
            }
            if (aside != null && Files.isDirectory(target)) {
                if (isEmpty(target)) {
                    Files.delete(target);
                } else {
                    move(target, aside);
                }
            }
            try {
                move(staging, target);
            } catch (IOException e) {
                restore();
                throw e;
            }
            published = true;
            deleteTree(aside);
        }

        /** Runs in the shutdown hook: no further step of this write, and its temporary removed. */
        synchronized void abort() {
            aborted = true;
            cleanUp();
        }

        /** Ends the write, published or not: the temporary removed and the write no longer pending. */
        void finish() {
            cleanUp();
            synchronized (PENDING) {
                PENDING.remove(this);
            }
        }

        private synchronized void cleanUp() {
            if (!published) {
                deleteTree(staging);
                restore();
            }
        }

        private void restore() {
            if (aside != null && Files.isDirectory(aside) && !Files.exists(target)) {
                try {
                    move(aside, target);
                } catch (IOException e) {
                    // the earlier output stays beside the target under its .old- name; nothing half-written
                }
            }
        }
    }

    /**
     * A name part no other run uses at the same time. Temporary files are created by name rather than with
     * {@code Files.createTemp*}, so that results get the user's usual permissions (umask), not owner-only.
     */
    private static String unique() {
        return ProcessHandle.current().pid() + "-" + Long.toHexString(System.nanoTime());
    }

    /** The target's folder, which must exist (the command line checks it before the work starts). */
    private static Path parentOf(Path abs, Path target) {
        Path parent = abs.getParent();
        if (parent == null) {
            throw InputException.of("the output path has no parent folder").file(target.toString()).build();
        }
        if (!Files.isDirectory(parent)) {
            throw InputException.of("the output's folder does not exist").file(parent.toString())
                    .fix("create it first, or choose another --out").build();
        }
        return parent;
    }

    /** Why a file operation failed, in words, without repeating the path the message already names. */
    private static String reason(IOException e) {
        if (e instanceof java.nio.file.AccessDeniedException) {
            return "permission denied";
        }
        if (e instanceof java.nio.file.NoSuchFileException) {
            return "no such file or folder";
        }
        if (e instanceof java.nio.file.FileSystemException f && f.getReason() != null) {
            return f.getReason();
        }
        return e.getClass().getSimpleName() + (e.getMessage() == null ? "" : ": " + e.getMessage());
    }

    private static void move(Path from, Path to) throws IOException {
        try {
            Files.move(from, to, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(from, to, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    static boolean isEmpty(Path dir) {
        try (Stream<Path> s = Files.list(dir)) {
            return s.findAny().isEmpty();
        } catch (IOException e) {
            return false;
        }
    }

    private static void deleteQuietly(Path p) {
        if (p == null) {
            return;
        }
        try {
            Files.deleteIfExists(p);
        } catch (IOException e) {
            // best effort: a leftover temporary file is harmless and named as one
        }
    }

    private static void deleteTree(Path p) {
        if (p == null || !Files.exists(p)) {
            return;
        }
        try (Stream<Path> s = Files.walk(p)) {
            s.sorted(Comparator.reverseOrder()).forEach(AtomicWrite::deleteQuietly);
        } catch (IOException e) {
            // best effort, as above
        }
    }
}
