package org.isorisk.notebooks.folder;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryStream;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.security.DigestOutputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.UUID;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Caution;
import org.isorisk.notebooks.PackLayout;

/**
 * The one place that chooses paths and moves folders for a pack. Files are added as writers of bytes under
 * a relative name; {@link #commit} writes them into a temporary sibling of the target folder, adds
 * {@code manifest.json} (tool, version, date, parameters, and the SHA-256 of every input and output file), and
 * renames the temporary folder onto the target in one atomic step. So the target either does not change or
 * appears complete: an exception or an interrupt (Ctrl-C runs a shutdown hook that removes the temporary
 * folder) leaves nothing half-written, and inputs are only ever read.
 *
 * <p>Rules for an existing target: an empty folder is replaced; a non-empty one only with {@code force}, and
 * then only when it is an earlier pack (it holds a {@code manifest.json} written by isorisk), so that a typo in
 * {@code --out} cannot delete an unrelated folder; a target that contains one of the inputs is refused.
 * With {@code force}, the old pack is first renamed aside, the new one renamed into place, and the old one
 * deleted; if the process dies between the two renames, the old pack is left as a hidden sibling
 * ({@code .NAME.old-…}), never a half-written one.
 */
public final class PackFolder {

    /** Writes the bytes of one file of the pack. */
    @FunctionalInterface
    public interface Content {
        void writeTo(OutputStream out) throws IOException;
    }

    /** An input file of the run: what it is ("expected-returns", "policy", ...) and where it is. */
    public record Input(String role, Path path) {
        public Input {
            Objects.requireNonNull(role, "role");
            Objects.requireNonNull(path, "path");
        }
    }

    /** One file written into the pack, with its size and SHA-256 (hex). */
    public record Written(String path, long bytes, String sha256) {
    }

    /** What {@link #commit} produced. */
    public record Result(Path folder, List<Written> files, Map<String, String> inputHashes) {
        public Result {
            files = List.copyOf(files);
            inputHashes = Map.copyOf(inputHashes);
        }
    }

    private static final Pattern RELATIVE = Pattern.compile("([a-zA-Z0-9][a-zA-Z0-9._-]*/)?[a-zA-Z0-9][a-zA-Z0-9._-]*");

    private final Map<String, Content> files = new LinkedHashMap<>();
    private final List<Input> inputs = new ArrayList<>();
    private final String toolVersion;
    private final OffsetDateTime created;
    private ObjectNode parameters = JsonNodeFactory.instance.objectNode();

    /**
     * @param toolVersion the isorisk version that goes into the manifest
     * @param created     the date and time that goes into the manifest
     */
    public PackFolder(String toolVersion, OffsetDateTime created) {
        this.toolVersion = Objects.requireNonNull(toolVersion, "toolVersion");
        this.created = Objects.requireNonNull(created, "created");
    }

    /** Adds a file under {@code relative} (e.g. {@code tables/weights.csv}; at most one folder level). */
    public PackFolder add(String relative, Content content) {
        if (!RELATIVE.matcher(relative).matches() || relative.equals(PackLayout.MANIFEST)) {
            throw new IllegalArgumentException("not a pack file name: " + relative);
        }
        if (files.putIfAbsent(relative, Objects.requireNonNull(content)) != null) {
            throw new IllegalArgumentException("pack file added twice: " + relative);
        }
        return this;
    }

    /** Records an input file; its SHA-256 goes into the manifest. It is read, never written. */
    public PackFolder input(String role, Path path) {
        inputs.add(new Input(role, path));
        return this;
    }

    /** The run's parameters as they go into the manifest (copied). */
    public PackFolder parameters(ObjectNode p) {
        this.parameters = p.deepCopy();
        return this;
    }

    /**
     * Hashes the inputs and returns their SHA-256 by role, without writing anything; a missing or unreadable
     * input fails here with an {@link InputException} naming it.
     */
    public Map<String, String> inputHashes() {
        Map<String, String> h = new LinkedHashMap<>();
        for (Input in : inputs) {
            h.put(in.role(), sha256(in.path()));
        }
        return h;
    }

    /**
     * Writes every file and the manifest into a temporary sibling of {@code target}, then renames it onto
     * {@code target}.
     *
     * @param target the pack folder to create (its parent must exist)
     * @param force  replace an existing non-empty pack folder
     * @throws InputException when the target cannot be used (exists without {@code force}, is a file, is not an
     *                        earlier pack, contains an input) or an input cannot be read
     */
    public Result commit(Path target, boolean force) {
        Path abs = target.toAbsolutePath().normalize();
        Path parent = abs.getParent();
        if (parent == null || abs.getFileName() == null) {
            throw InputException.of("the pack cannot be the root folder").file(target.toString())
                    .fix("give --out a folder name such as committee-pack").build();
        }
        if (!Files.isDirectory(parent)) {
            throw InputException.of("the folder that should hold the pack does not exist").file(parent.toString())
                    .fix("create it first or choose another --out").build();
        }
        checkTarget(target, abs, force);
        Map<String, String> inputHashes = inputHashes();

        String name = abs.getFileName().toString();
        String tag = UUID.randomUUID().toString().substring(0, 8);
        Path temp = parent.resolve("." + name + ".tmp-" + tag);
        Path aside = parent.resolve("." + name + ".old-" + tag);
        Guard guard = new Guard(temp, aside, abs);
        Thread hook = new Thread(guard::interrupted, "isorisk-pack-cleanup");
        Runtime.getRuntime().addShutdownHook(hook);
        try {
            Files.createDirectory(temp);
            List<Written> written = new ArrayList<>();
            for (Map.Entry<String, Content> e : files.entrySet()) {
                guard.check();
                written.add(writeOne(temp, e.getKey(), e.getValue()));
            }
            guard.check();
            written.add(writeOne(temp, PackLayout.MANIFEST, out -> manifest(out, inputHashes, written)));
            guard.publish(force);
            return new Result(abs, written, inputHashes);
        } catch (IOException e) {
            throw InputException.of("the pack folder cannot be written: " + e.getMessage()).file(target.toString())
                    .fix("check that the folder is writable and has space, or choose another --out").build();
        } finally {
            guard.cleanUp();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                // the hook is running or has run; it has cleaned up
            }
        }
    }

    private void checkTarget(Path given, Path abs, boolean force) {
        if (Files.exists(abs, LinkOption.NOFOLLOW_LINKS) && !Files.isDirectory(abs, LinkOption.NOFOLLOW_LINKS)) {
            throw InputException.of("the pack folder exists and is not a folder").file(given.toString())
                    .fix("choose another --out").build();
        }
        for (Input in : inputs) {
            Path p = in.path().toAbsolutePath().normalize();
            if (p.startsWith(abs)) {
                throw InputException.of("the pack folder contains an input (" + in.role() + ")").file(given.toString())
                        .value(in.path()).fix("choose an --out folder that holds none of the inputs").build();
            }
        }
        if (!Files.isDirectory(abs) || isEmpty(abs)) {
            return;
        }
        if (!force) {
            throw InputException.of("the pack folder exists and is not empty").file(given.toString())
                    .fix("choose another --out, or add --force to replace the earlier pack").build();
        }
        if (!isEarlierPack(abs)) {
            throw InputException.of("the folder is not an earlier isorisk pack (it has no isorisk " + PackLayout.MANIFEST
                            + "), so it is not replaced").file(given.toString())
                    .fix("choose a new or empty --out folder").build();
        }
    }

    private static boolean isEmpty(Path dir) {
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            return !s.iterator().hasNext();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static boolean isEarlierPack(Path dir) {
        Path m = dir.resolve(PackLayout.MANIFEST);
        if (!Files.isRegularFile(m)) {
            return false;
        }
        try {
            return "isorisk".equals(new ObjectMapper().readTree(m.toFile()).path("tool").asText());
        } catch (IOException e) {
            return false;
        }
    }

    private static Written writeOne(Path root, String relative, Content content) throws IOException {
        Path file = root.resolve(relative);
        Path dir = file.getParent();
        if (!dir.equals(root) && !Files.isDirectory(dir)) {
            Files.createDirectory(dir); // one level only: never recreates a folder the cleanup removed
        }
        MessageDigest md = digest();
        long[] count = {0};
        try (OutputStream raw = Files.newOutputStream(file, StandardOpenOption.CREATE_NEW);
             OutputStream counting = new CountingStream(new BufferedOutputStream(raw), count);
             DigestOutputStream out = new DigestOutputStream(counting, md)) {
            content.writeTo(out);
        }
        return new Written(relative, count[0], HexFormat.of().formatHex(md.digest()));
    }

    private void manifest(OutputStream out, Map<String, String> inputHashes, List<Written> written) throws IOException {
        ObjectNode m = JsonNodeFactory.instance.objectNode();
        m.put("tool", "isorisk");
        m.put("tool_version", toolVersion);
        m.put("created", created.toString());
        m.put("caution", Caution.TEXT);
        m.set("parameters", parameters);
        ArrayNode ins = m.putArray("inputs");
        for (Input in : inputs) {
            ObjectNode o = ins.addObject();
            o.put("role", in.role());
            o.put("name", in.path().getFileName().toString()); // the name alone: outputs carry no machine paths
            o.put("sha256", inputHashes.get(in.role()));
        }
        ArrayNode outs = m.putArray("files");
        for (Written w : written) {
            ObjectNode o = outs.addObject();
            o.put("path", w.path());
            o.put("bytes", w.bytes());
            o.put("sha256", w.sha256());
        }
        m.put("hash_algorithm", "SHA-256");
        m.put("note", "Every file of this folder except this manifest is listed with its SHA-256.");
        new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT)
                .disable(com.fasterxml.jackson.core.JsonGenerator.Feature.AUTO_CLOSE_TARGET).writeValue(out, m);
        out.write('\n');
    }

    /** SHA-256 of a file's bytes in lower-case hex; an unreadable file is bad input naming it. */
    public static String sha256(Path p) {
        MessageDigest md = digest();
        try (InputStream in = Files.newInputStream(p)) {
            byte[] buf = new byte[1 << 16];
            for (int r; (r = in.read(buf)) > 0; ) {
                md.update(buf, 0, r);
            }
        } catch (IOException e) {
            throw InputException.of("cannot read the file").file(p.toString()).value(e.getClass().getSimpleName())
                    .fix("check the path and its permissions").build();
        }
        return HexFormat.of().formatHex(md.digest());
    }

    private static MessageDigest digest() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
    }

    static void deleteTree(Path p) {
        if (!Files.exists(p, LinkOption.NOFOLLOW_LINKS)) {
            return;
        }
        try (Stream<Path> s = Files.walk(p)) {
            for (Path q : s.sorted(Comparator.reverseOrder()).toList()) {
                Files.deleteIfExists(q);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("could not remove " + p + ": " + e.getMessage(), e);
        }
    }

    /**
     * Serialises publishing and interrupt cleanup: the shutdown hook and the rename take the same lock, so
     * either the pack is published completely or the hook removes the temporary folder and nothing is
     * published.
     */
    private static final class Guard {
        private final Path temp;
        private final Path aside;
        private final Path target;
        private boolean aborted;
        private boolean published;

        Guard(Path temp, Path aside, Path target) {
            this.temp = temp;
            this.aside = aside;
            this.target = target;
        }

        synchronized void check() throws IOException {
            if (aborted) {
                throw new IOException("interrupted");
            }
        }

        synchronized void publish(boolean force) throws IOException {
            check();
            if (Files.isDirectory(target)) {
                if (isEmpty(target)) {
                    Files.delete(target);
                } else if (force) {
                    move(target, aside);
                } else {
                    throw new FileAlreadyExistsException(target.toString(), null, "appeared while the pack was written");
                }
            }
            try {
                move(temp, target);
            } catch (IOException e) {
                if (Files.isDirectory(aside) && !Files.exists(target)) {
                    move(aside, target);
                }
                throw e;
            }
            published = true;
            deleteTree(aside);
        }

        private static void move(Path from, Path to) throws IOException {
            try {
                Files.move(from, to, StandardCopyOption.ATOMIC_MOVE);
            } catch (AtomicMoveNotSupportedException e) {
                throw new IOException("the file system cannot rename " + from + " atomically", e);
            }
        }

        /** Runs in the shutdown hook on Ctrl-C or exit while the pack is being written. */
        synchronized void interrupted() {
            aborted = true;
            cleanUp();
            if (!published && Files.isDirectory(aside) && !Files.exists(target)) {
                try {
                    Files.move(aside, target, StandardCopyOption.ATOMIC_MOVE);
                } catch (IOException e) {
                    // the old pack stays as the hidden sibling; nothing half-written is published
                }
            }
        }

        synchronized void cleanUp() {
            if (!published) {
                try {
                    deleteTree(temp);
                } catch (UncheckedIOException e) {
                    // best effort: a temporary sibling is never the target
                }
            }
        }
    }

    /** Counts the bytes written through it. */
    private static final class CountingStream extends java.io.FilterOutputStream {
        private final long[] count;

        CountingStream(OutputStream out, long[] count) {
            super(out);
            this.count = count;
        }

        @Override
        public void write(int b) throws IOException {
            out.write(b);
            count[0]++;
        }

        @Override
        public void write(byte[] b, int off, int len) throws IOException {
            out.write(b, off, len);
            count[0] += len;
        }
    }
}
