package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * Writes a set of files into one folder so that a failure leaves no partial output: every file is first written
 * to a temporary file in the same folder, and only when all are written are they moved into place (each move
 * atomic where the file system allows). Refuses to overwrite existing files unless asked, and never writes over
 * an input.
 */
public final class AtomicOutput {
    private final Path dir;
    private final Map<String, Body> files = new LinkedHashMap<>();

    /** Writes one file's content. */
    @FunctionalInterface
    public interface Body {
        void write(Writer w) throws IOException;
    }

    public AtomicOutput(Path dir) {
        this.dir = dir;
    }

    /** Adds a file by name (no folders) and the code that writes it. */
    public AtomicOutput add(String name, Body body) {
        if (name.contains("/") || name.contains("\\") || files.put(name, body) != null) {
            throw new IllegalArgumentException("one plain file name per output: " + name);
        }
        return this;
    }

    /** The paths the files will have. */
    public List<Path> targets() {
        List<Path> out = new ArrayList<>();
        for (String name : files.keySet()) {
            out.add(dir.resolve(name));
        }
        return out;
    }

    /**
     * Writes every file.
     *
     * @param overwrite replace existing files of the same names
     * @param inputs    input files that must not be overwritten
     * @return the written paths
     * @throws InputException when a target exists (without {@code overwrite}), is an input, or cannot be written
     */
    public List<Path> commit(boolean overwrite, List<Path> inputs) {
        for (Path target : targets()) {
            for (Path in : inputs) {
                if (in != null && same(in, target)) {
                    throw InputException.of("the output would overwrite an input").file(target.toString())
                            .fix("choose another --out-dir").build();
                }
            }
            if (!overwrite && Files.exists(target)) {
                throw InputException.of("the output file exists already").file(target.toString())
                        .fix("choose another --out-dir, or add --force to replace it").build();
            }
        }
        if (Files.exists(dir) && !Files.isDirectory(dir)) {
            throw InputException.of("the output folder is a file").file(dir.toString())
                    .fix("choose a folder for --out-dir").build();
        }
        Map<Path, Path> staged = new LinkedHashMap<>();
        try {
            Files.createDirectories(dir);
            for (Map.Entry<String, Body> e : files.entrySet()) {
                Path tmp = Files.createTempFile(dir, "." + e.getKey() + ".", ".tmp");
                staged.put(tmp, dir.resolve(e.getKey()));
                try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8)) {
                    e.getValue().write(w);
                }
            }
            List<Path> done = new ArrayList<>();
            for (Map.Entry<Path, Path> e : staged.entrySet()) {
                try {
                    Files.move(e.getKey(), e.getValue(), StandardCopyOption.ATOMIC_MOVE,
                            StandardCopyOption.REPLACE_EXISTING);
                } catch (AtomicMoveNotSupportedException ex) {
                    Files.move(e.getKey(), e.getValue(), StandardCopyOption.REPLACE_EXISTING);
                }
                done.add(e.getValue());
            }
            return done;
        } catch (IOException e) {
            for (Path tmp : staged.keySet()) {
                try {
                    Files.deleteIfExists(tmp);
                } catch (IOException ignored) {
                    // best effort: the temporary file is hidden and named after its target
                }
            }
            throw InputException.of("cannot write the output: " + e.getMessage()).file(dir.toString())
                    .fix("check that the folder is writable").build();
        }
    }

    private static boolean same(Path a, Path b) {
        try {
            if (Files.exists(a) && Files.exists(b)) {
                return Files.isSameFile(a, b);
            }
        } catch (IOException e) {
            // fall through to the path comparison
        }
        return a.toAbsolutePath().normalize().equals(b.toAbsolutePath().normalize());
    }
}
