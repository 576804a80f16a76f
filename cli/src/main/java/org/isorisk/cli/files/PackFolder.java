package org.isorisk.cli.files;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.security.DigestOutputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.regex.Pattern;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Caution;
import org.isorisk.notebooks.PackLayout;

/**
 * A pack folder: its files are added as writers of bytes under relative names; {@link #commit} writes them
 * through {@link RunFiles#folder} and {@code AtomicWrite} (the project's one place for atomic
 * folder moves: a temporary sibling renamed into place, a shutdown hook for Ctrl-C) and adds
 * {@code manifest.json}: tool, version, date, parameters, and the SHA-256 of every input and of every file of
 * the folder, hashed as it is written. So the target either does not change or appears complete, and inputs are
 * only ever read; {@link RunFiles} refuses a target that holds one.
 *
 * <p>Rules for an existing target: an empty folder is replaced; a non-empty one only with {@code force}, and
 * then only when it is an earlier isorisk output (it holds {@link AtomicWrite#MARKER}), so that a typo in
 * {@code --out} cannot delete an unrelated folder; a target that holds one of the inputs is refused.
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
     * {@code target}, through the run's files: the inputs recorded here are registered with them first, so the
     * target may hold none of them, and an existing earlier pack is replaced only as the target's declaration
     * allows ({@code --force}).
     *
     * @param run    the run's files, in which {@code target} is a declared folder output
     * @param target the pack folder to create (its parent must exist)
     * @throws InputException when the target cannot be used (exists and may not be replaced, is a file, is not an
     *                        earlier pack, holds an input) or an input cannot be read
     */
    public Result commit(RunFiles run, Path target) {
        for (Input in : inputs) {
            run.input(in.role() + " file", in.path());
        }
        Map<String, String> inputHashes = inputHashes();
        List<Written> written = new ArrayList<>();
        run.folder(target, staging -> {
            // the marker that makes this folder an isorisk output (AtomicWrite writes it) is listed too
            Path marker = staging.resolve(AtomicWrite.MARKER);
            written.add(new Written(AtomicWrite.MARKER, Files.size(marker), sha256(marker)));
            for (Map.Entry<String, Content> e : files.entrySet()) {
                written.add(writeOne(staging, e.getKey(), e.getValue()));
            }
            written.add(writeOne(staging, PackLayout.MANIFEST, out -> manifest(out, inputHashes, written)));
        });
        return new Result(target.toAbsolutePath().normalize(), written, inputHashes);
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
