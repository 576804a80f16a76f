package org.isorisk.cli.files;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.batch.BatchRunner;
import org.isorisk.engine.book.BookSummary;
import org.isorisk.engine.book.BookTables;
import org.isorisk.engine.book.PortfolioResult;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Status;

/**
 * The output folder of a book run, written chunk by chunk so that nothing is lost. While the run goes on, each
 * table grows as {@code .run/NAME.partial}; after each chunk the new bytes are forced to disk and then the journal
 * {@code .run/journal.json} (written atomically: a temporary file renamed over the old one) records how many book
 * rows are complete, the length of each table and the counts by status. A run stopped anywhere (a crash, Ctrl-C)
 * is resumed by the next run with the same book and options: each table is cut back to the length the journal
 * recorded and the run goes on after the last complete chunk. At the end each table is renamed into place
 * ({@code results.csv}, {@code weights.csv}, ...), so a finished folder has exactly one results row per book row.
 * A folder holding an unfinished run of another book or other options is refused (its journal's fingerprint
 * differs) unless the caller restarts it; a folder that isorisk did not write is never touched.
 */
public final class BatchFolder {
    /** The folder of an unfinished run. */
    public static final String RUN = ".run";
    /** The journal of an unfinished run. */
    public static final String JOURNAL = "journal.json";
    /** The per-portfolio JSON objects, one per line (JSON Lines), when asked for. */
    public static final String JSON_LINES = "portfolios.jsonl";

    private final Path dir;
    private final String fingerprint;
    private final List<String> files;
    private final Map<String, FileChannel> open = new LinkedHashMap<>();
    private final Map<String, Long> lengths = new LinkedHashMap<>();
    private long committed;
    private long[] counts = new long[Status.values().length];
    private final boolean resumed;

    private BatchFolder(Path dir, String fingerprint, List<String> files, boolean resumed) {
        this.dir = dir;
        this.fingerprint = fingerprint;
        this.files = files;
        this.resumed = resumed;
    }

    /**
     * Opens the folder for a run: resumes an unfinished run with the same fingerprint, else starts afresh.
     *
     * @param dir         the output folder (created when missing)
     * @param fingerprint what the run depends on (the book's and inputs' SHA-256s, the job and options)
     * @param tables      the CSV tables the run writes, in the order of {@link PortfolioResult#text()}
     * @param json        true when the run writes {@link #JSON_LINES} too
     * @param restart     true to drop an unfinished run of other inputs instead of refusing
     * @param inputs      the run's input files: none may lie inside the folder
     * @throws InputException when the folder cannot be used (not ours, holds an input, another run's journal)
     */
    public static BatchFolder open(Path dir, String fingerprint, List<BookTables.Table> tables, boolean json,
                                   boolean restart, List<Path> inputs) {
        for (Path in : inputs) {
            if (in.toAbsolutePath().normalize().startsWith(dir.toAbsolutePath().normalize())) {
                throw InputException.of("the output folder holds an input of this run").file(dir.toString())
                        .value(in.toString()).fix("write the results to another folder (--out-dir)").build();
            }
        }
        List<String> files = new ArrayList<>();
        for (BookTables.Table t : tables) {
            files.add(t.file());
        }
        if (json) {
            files.add(JSON_LINES);
        }
        try {
            if (Files.exists(dir) && !Files.isDirectory(dir)) {
                throw InputException.of("the output folder is a file").file(dir.toString())
                        .fix("give a folder for --out-dir").build();
            }
            boolean ours = !Files.exists(dir) || isEmpty(dir) || Files.exists(dir.resolve(AtomicWrite.MARKER));
            if (!ours) {
                throw InputException.of("the output folder has files that isorisk did not write").file(dir.toString())
                        .fix("give an empty or new folder for --out-dir").build();
            }
            Files.createDirectories(dir.resolve(RUN));
            Files.writeString(dir.resolve(AtomicWrite.MARKER), "written by isorisk batch\n", StandardCharsets.UTF_8);
            Path journal = dir.resolve(RUN).resolve(JOURNAL);
            if (Files.exists(journal)) {
                JsonNode j = new com.fasterxml.jackson.databind.ObjectMapper().readTree(journal.toFile());
                if (j.path("fingerprint").asText().equals(fingerprint)) {
                    BatchFolder f = new BatchFolder(dir, fingerprint, files, true);
                    f.resume(j, tables);
                    return f;
                }
                if (!restart) {
                    throw InputException.of("the output folder holds an unfinished run of another book or other "
                            + "options").file(dir.toString()).fix("give --restart to drop it and start afresh, or "
                            + "another --out-dir").build();
                }
            }
            BatchFolder f = new BatchFolder(dir, fingerprint, files, false);
            f.start(tables);
            return f;
        } catch (IOException e) {
            throw InputException.of("cannot write the output folder: " + e.getMessage()).file(dir.toString())
                    .fix("check that the folder can be written").build();
        }
    }

    private static boolean isEmpty(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.findAny().isEmpty();
        }
    }

    /** Book rows already complete in the folder (0 for a fresh run): the run goes on after them. */
    public long committed() {
        return committed;
    }

    /** True when this run resumes an unfinished one. */
    public boolean resumed() {
        return resumed;
    }

    /** The counts by status of every row in the folder: those of earlier runs and this run's so far. */
    public BookSummary counts() {
        return summary(counts);
    }

    private void start(List<BookTables.Table> tables) throws IOException {
        for (String name : files) {
            Path p = partial(name);
            FileChannel c = FileChannel.open(p, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.TRUNCATE_EXISTING);
            open.put(name, c);
            lengths.put(name, 0L);
        }
        for (int k = 0; k < tables.size(); k++) {
            write(tables.get(k).file(), tables.get(k).header());
        }
        journal();
    }

    private void resume(JsonNode j, List<BookTables.Table> tables) throws IOException {
        committed = j.path("rows").asLong();
        for (Status s : Status.values()) {
            counts[s.ordinal()] = j.path("counts").path(s.label()).asLong();
        }
        for (String name : files) {
            long length = j.path("files").path(name).asLong(-1);
            Path p = partial(name);
            if (length < 0 || !Files.exists(p) || Files.size(p) < length) {
                throw InputException.of("the unfinished run in the output folder is incomplete (" + name + ")")
                        .file(dir.toString()).fix("give --restart to start afresh").build();
            }
            FileChannel c = FileChannel.open(p, StandardOpenOption.WRITE);
            c.truncate(length); // what was written after the last complete chunk
            c.position(length);
            open.put(name, c);
            lengths.put(name, length);
        }
    }

    /**
     * Appends a chunk of results (in book order, right after the rows already committed), forces it to disk and
     * records it in the journal; a chunk is thus either wholly in the folder or, after a stop, cut away.
     */
    public void commit(BatchRunner.Chunk<PortfolioResult> chunk) {
        try {
            List<StringBuilder> text = new ArrayList<>();
            for (int k = 0; k < files.size(); k++) {
                text.add(new StringBuilder());
            }
            for (PortfolioResult r : chunk.results()) {
                for (int k = 0; k < 3 && k < files.size(); k++) {
                    if (k < r.text().length && !files.get(k).equals(JSON_LINES)) {
                        text.get(k).append(r.text()[k]);
                    }
                }
                if (r.json() != null) {
                    text.get(files.size() - 1).append(r.json()).append('\n');
                }
                counts[r.status().ordinal()]++;
            }
            for (int k = 0; k < files.size(); k++) {
                write(files.get(k), text.get(k));
            }
            for (FileChannel c : open.values()) {
                c.force(false);
            }
            committed += chunk.results().size();
            journal();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the output folder " + dir, e);
        }
    }

    /**
     * Renames every table into place and writes {@code summary.json} and {@code README.txt}; the folder is then a
     * finished run's.
     */
    public void finish(ObjectNode summary, String readme) {
        try {
            for (FileChannel c : open.values()) {
                c.close();
            }
            for (String name : files) {
                Files.move(partial(name), dir.resolve(name), StandardCopyOption.REPLACE_EXISTING,
                        StandardCopyOption.ATOMIC_MOVE);
            }
            AtomicWrite.file(dir.resolve("summary.json"), w -> ResultJson.write(summary, w));
            AtomicWrite.file(dir.resolve("README.txt"), w -> w.write(readme));
            Files.deleteIfExists(dir.resolve(RUN).resolve(JOURNAL));
            Files.deleteIfExists(dir.resolve(RUN));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot finish the output folder " + dir, e);
        }
    }

    /** Closes the open tables without finishing (a cancelled run): the journal stays for the next run. */
    public void close() {
        for (FileChannel c : open.values()) {
            try {
                c.close();
            } catch (IOException ignored) {
                // the journal decides what counts; nothing more to keep
            }
        }
    }

    /** The files a finished run has, in order. */
    public List<String> files() {
        return List.copyOf(files);
    }

    private Path partial(String name) {
        return dir.resolve(RUN).resolve(name + ".partial");
    }

    private void write(String name, CharSequence text) throws IOException {
        if (text.length() == 0) {
            return;
        }
        ByteBuffer b = StandardCharsets.UTF_8.encode(java.nio.CharBuffer.wrap(text));
        FileChannel c = open.get(name);
        long n = 0;
        while (b.hasRemaining()) {
            n += c.write(b);
        }
        lengths.merge(name, n, Long::sum);
    }

    private void journal() {
        ObjectNode j = ResultJson.object();
        j.put("fingerprint", fingerprint);
        j.put("rows", committed);
        ObjectNode f = j.putObject("files");
        lengths.forEach(f::put);
        ObjectNode c = j.putObject("counts");
        for (Status s : Status.values()) {
            c.put(s.label(), counts[s.ordinal()]);
        }
        AtomicWrite.file(dir.resolve(RUN).resolve(JOURNAL), w -> ResultJson.write(j, w));
    }

    static BookSummary summary(long[] counts) {
        EnumMap<Status, Long> m = new EnumMap<>(Status.class);
        for (Status s : Status.values()) {
            m.put(s, counts[s.ordinal()]);
        }
        return new BookSummary(m);
    }
}
