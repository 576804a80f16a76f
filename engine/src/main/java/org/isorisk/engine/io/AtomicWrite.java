package org.isorisk.engine.io;

import java.io.IOException;
import java.io.OutputStream;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.Comparator;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;

/**
 * The one place where results become files: everything is written to a temporary file (or folder) beside the
 * target and moved into place at the end, so that a reader never sees a half-written result and a failure
 * leaves the previous version untouched.
 */
public final class AtomicWrite {
    private AtomicWrite() {
    }

    /**
     * Temporary files and folders being written right now; a shutdown hook deletes whatever is left in it, so that
     * an interrupted run (Ctrl-C) leaves no partial output beside the target.
     */
    private static final java.util.Set<Path> PENDING = java.util.concurrent.ConcurrentHashMap.newKeySet();

    static {
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            for (Path p : PENDING) {
                deleteTree(p);
            }
        }, "isorisk-cleanup"));
    }

    /** Marker file inside every output folder this class writes; only such folders are replaced. */
    public static final String MARKER = ".isorisk-output";

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
     * Writes {@code target} (UTF-8) atomically; parent folders are created.
     *
     * @throws InputException when the target cannot be written (named, with a fix)
     */
    public static void file(Path target, TextBody body) {
        Path abs = target.toAbsolutePath();
        Path parent = parentOf(abs, target);
        if (Files.isDirectory(abs)) {
            throw InputException.of("the output path is a folder").file(target.toString())
                    .fix("give a file name, e.g. " + target.resolve("result.json")).build();
        }
        Path tmp = null;
        try {
            tmp = parent.resolve("." + abs.getFileName() + "." + unique() + ".tmp");
            PENDING.add(tmp);
            try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8, StandardOpenOption.CREATE_NEW,
                    StandardOpenOption.WRITE)) {
                body.write(w);
            }
            move(tmp, abs);
            PENDING.remove(tmp);
            tmp = null;
        } catch (IOException e) {
            throw InputException.of("the output file cannot be written (" + reason(e) + ")").file(target.toString())
                    .fix("check that the folder is writable, or choose another --out").build();
        } finally {
            deleteQuietly(tmp);
            if (tmp != null) {
                PENDING.remove(tmp);
            }
        }
    }

    /**
     * Writes the binary file {@code target} atomically (a chart, an image); parent folders are created.
     *
     * @throws InputException when the target cannot be written (named, with a fix)
     */
    public static void bytes(Path target, BinaryBody body) {
        Path abs = target.toAbsolutePath();
        Path parent = parentOf(abs, target);
        if (Files.isDirectory(abs)) {
            throw InputException.of("the output path is a folder").file(target.toString())
                    .fix("give a file name, e.g. " + target.resolve("chart.png")).build();
        }
        Path tmp = null;
        try {
            tmp = parent.resolve("." + abs.getFileName() + "." + unique() + ".tmp");
            PENDING.add(tmp);
            try (OutputStream out = new java.io.BufferedOutputStream(Files.newOutputStream(tmp,
                    StandardOpenOption.CREATE_NEW, StandardOpenOption.WRITE))) {
                body.write(out);
            }
            move(tmp, abs);
            PENDING.remove(tmp);
            tmp = null;
        } catch (IOException e) {
            throw InputException.of("the output file cannot be written: " + e.getMessage()).file(target.toString())
                    .fix("check that the folder is writable, or choose another --out").build();
        } finally {
            deleteQuietly(tmp);
            if (tmp != null) {
                PENDING.remove(tmp);
            }
        }
    }

    /** Text of a {@link TextBody}, for writing to a terminal the same bytes as to a file. */
    public static String text(TextBody body) {
        java.io.StringWriter w = new java.io.StringWriter();
        try {
            body.write(w);
        } catch (IOException e) {
            throw new IllegalStateException("a StringWriter does not fail", e);
        }
        return w.toString();
    }

    /**
     * Writes the folder {@code target} atomically: {@code body} fills a temporary folder beside it, which then
     * replaces {@code target}. An existing target is replaced only when it is empty or was written by this class
     * (it holds {@link #MARKER}); any other existing folder is refused, so that nothing of the user's is deleted.
     * Same as {@code folder(target, true, body)}.
     */
    public static void folder(Path target, FolderBody body) {
        folder(target, true, body);
    }

    /**
     * Writes the folder {@code target} atomically: {@code body} fills a temporary sibling
     * ({@code .NAME.tmp-…}, holding {@link #MARKER}), which is then renamed onto {@code target}. An empty target
     * is replaced; a non-empty one only when {@code replaceEarlier} is set and it holds {@link #MARKER} (an
     * earlier isorisk output), never a folder of the user's. The earlier output is renamed aside, the new one
     * renamed in, and the old one deleted; if the second rename fails the earlier output is put back. A shutdown
     * hook (Ctrl-C, kill) and the renames share a lock: an interrupted run removes its temporary folder and puts
     * back an earlier output it had moved aside, so nothing half-written is ever left at {@code target}.
     *
     * @param replaceEarlier replace an earlier isorisk output (the command line's {@code --force})
     * @throws InputException when the target cannot be used or written (named, with a fix)
     */
    public static void folder(Path target, boolean replaceEarlier, FolderBody body) {
        Path abs = target.toAbsolutePath();
        Path parent = parentOf(abs, target);
        boolean exists = Files.exists(abs);
        if (exists && !Files.isDirectory(abs)) {
            throw InputException.of("the output folder is an existing file").file(target.toString())
                    .fix("choose another --out").build();
        }
        boolean nonEmpty = exists && !isEmpty(abs);
        if (nonEmpty && !Files.exists(abs.resolve(MARKER))) {
            throw InputException.of("the output folder exists and was not written by isorisk, so it is left alone")
                    .file(target.toString()).fix("choose another --out, or empty the folder").build();
        }
        if (nonEmpty && !replaceEarlier) {
            throw InputException.of("the output folder exists and is not empty").file(target.toString())
                    .fix("choose another --out, or add --force to replace the earlier output").build();
        }
        Publication pub = new Publication(abs, parent.resolve("." + abs.getFileName() + ".tmp-" + unique()),
                parent.resolve("." + abs.getFileName() + ".old-" + unique()));
        Thread hook = new Thread(pub::interrupted, "isorisk-output-cleanup");
        Runtime.getRuntime().addShutdownHook(hook);
        try {
            Files.createDirectory(pub.staging);
            Files.writeString(pub.staging.resolve(MARKER), "written by isorisk; this folder is replaced as a whole\n",
                    StandardCharsets.UTF_8);
            body.fill(pub.staging);
            pub.publish();
        } catch (IOException e) {
            throw InputException.of("the output folder cannot be written (" + reason(e) + ")").file(target.toString())
                    .fix("check that the folder is writable and has space, or choose another --out").build();
        } finally {
            pub.cleanUp();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                // the hook is running or has run, and has cleaned up
            }
        }
    }

    /** The renames of one {@link #folder} call and their undoing, serialised with the shutdown hook. */
    private static final class Publication {
        private final Path target;
        private final Path staging;
        private final Path aside;
        private boolean aborted;
        private boolean published;

        Publication(Path target, Path staging, Path aside) {
            this.target = target;
            this.staging = staging;
            this.aside = aside;
        }

        synchronized void publish() throws IOException {
            if (aborted) {
                throw new IOException("interrupted");
            }
            if (Files.isDirectory(target)) {
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

        /** Runs in the shutdown hook. */
        synchronized void interrupted() {
            aborted = true;
            cleanUp();
        }

        synchronized void cleanUp() {
            if (!published) {
                deleteTree(staging);
                restore();
            }
        }

        private void restore() {
            if (Files.isDirectory(aside) && !Files.exists(target)) {
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

    private static Path parentOf(Path abs, Path target) {
        Path parent = abs.getParent();
        if (parent == null) {
            throw InputException.of("the output path has no parent folder").file(target.toString()).build();
        }
        try {
            Files.createDirectories(parent);
        } catch (FileAlreadyExistsException e) {
            throw InputException.of("a file stands where the output's folder should be").file(parent.toString())
                    .fix("choose another --out").build();
        } catch (IOException e) {
            throw InputException.of("the output's folder cannot be created (" + reason(e) + ")").file(parent.toString())
                    .fix("check the path and permissions, or choose another --out").build();
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

    private static boolean isEmpty(Path dir) {
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
