package org.isorisk.engine.io;

import java.io.ByteArrayInputStream;
import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalLong;
import org.isorisk.engine.error.InputException;

/**
 * A file to read, wherever it lives: a local path ({@link #of(Path)}), bytes in memory with a name
 * ({@link #ofBytes}), or a path on a Hadoop file system (the Spark module's implementation). The readers take it,
 * so that the same reading and validation serve every engine and their errors still name the file as the user
 * wrote it. Implementations are immutable.
 */
public interface InputFile {

    /**
     * The name errors give: the path as the user wrote it, or as resolved against the file that named it (a
     * policy named in a book row, relative to the book).
     */
    String path();

    /** The file name alone, without folders, as results record it. */
    String name();

    /**
     * Opens the bytes; the caller closes the stream.
     *
     * @throws FileNotFoundException or {@link NoSuchFileException} when there is no such file
     */
    InputStream open() throws IOException;

    /** The file that {@code relative} names from this file's folder; an absolute path stays as it is. */
    InputFile resolve(String relative);

    /** The size in bytes, when the file system knows it without reading (for progress). */
    default OptionalLong size() {
        return OptionalLong.empty();
    }

    /** The local path, when the file is one (for the readers that still take paths, e.g. scenario covariances). */
    default Optional<Path> local() {
        return Optional.empty();
    }

    /**
     * All bytes; a missing or unreadable file is an {@link InputException} naming it, worded as
     * {@link Csv#read(Path, String)} words it.
     *
     * @param role what the file is read as, e.g. {@code policy}; named in the message
     */
    default byte[] readAll(String role) {
        String what = role.replace('-', ' ') + " file";
        try (InputStream in = open()) {
            return in.readAllBytes();
        } catch (NoSuchFileException | FileNotFoundException e) {
            throw InputException.of("the " + what + " does not exist").file(path())
                    .fix("check the path; a relative path starts from the current folder").build();
        } catch (IOException e) {
            throw InputException.of("the " + what + " cannot be read: " + e.getMessage()).file(path())
                    .fix("check that the file exists and is readable").build();
        }
    }

    /** A local file; {@link #path()} is the path as given. */
    static InputFile of(Path path) {
        return new Local(path);
    }

    /** Content held in memory under a name (tests; content produced by an earlier step). */
    static InputFile ofBytes(String path, byte[] bytes) {
        return new Memory(path, bytes.clone(), Map.of());
    }

    /**
     * Several files held in memory, each under its path; {@link #resolve} finds the others by their path
     * relative to the first one's folder (tests of readers that follow references).
     *
     * @param files path → UTF-8 text; the first entry is the file returned
     */
    static InputFile ofTexts(Map<String, String> files) {
        String first = files.keySet().iterator().next();
        return new Memory(first, files.get(first).getBytes(StandardCharsets.UTF_8), Map.copyOf(files));
    }

    /** The last segment of a slash-separated path. */
    private static String lastSegment(String p) {
        int s = Math.max(p.lastIndexOf('/'), p.lastIndexOf('\\'));
        return s < 0 ? p : p.substring(s + 1);
    }

    /** A file on the local file system. */
    record Local(Path file) implements InputFile {
        @Override
        public String path() {
            return file.toString();
        }

        @Override
        public String name() {
            Path n = file.getFileName();
            return n == null ? file.toString() : n.toString();
        }

        @Override
        public InputStream open() throws IOException {
            if (Files.isDirectory(file)) {
                throw new IOException("it is a folder, not a file");
            }
            return Files.newInputStream(file);
        }

        @Override
        public InputFile resolve(String relative) {
            return new Local(file.resolveSibling(relative));
        }

        @Override
        public OptionalLong size() {
            try {
                return OptionalLong.of(Files.size(file));
            } catch (IOException e) {
                return OptionalLong.empty();
            }
        }

        @Override
        public Optional<Path> local() {
            return Optional.of(file);
        }
    }

    /** Bytes in memory; siblings by path (see {@link #ofTexts}). */
    final class Memory implements InputFile {
        private final String path;
        private final byte[] bytes;
        private final Map<String, String> siblings;

        private Memory(String path, byte[] bytes, Map<String, String> siblings) {
            this.path = path;
            this.bytes = bytes;
            this.siblings = siblings;
        }

        @Override
        public String path() {
            return path;
        }

        @Override
        public String name() {
            return lastSegment(path);
        }

        @Override
        public InputStream open() throws IOException {
            if (bytes == null) {
                throw new FileNotFoundException(path);
            }
            return new ByteArrayInputStream(bytes);
        }

        @Override
        public InputFile resolve(String relative) {
            String p = relative.startsWith("/") ? relative : folderOf(path) + relative;
            String text = siblings.get(p);
            return new Memory(p, text == null ? null : text.getBytes(StandardCharsets.UTF_8), siblings);
        }

        @Override
        public OptionalLong size() {
            return bytes == null ? OptionalLong.empty() : OptionalLong.of(bytes.length);
        }

        private static String folderOf(String p) {
            int s = p.lastIndexOf('/');
            return s < 0 ? "" : p.substring(0, s + 1);
        }

        @Override
        public String toString() {
            return path;
        }
    }
}
