package org.isorisk.engine.io;

import java.io.Closeable;
import java.io.FileNotFoundException;
import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.PushbackInputStream;
import java.io.UncheckedIOException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.Iterator;
import java.util.List;
import java.util.NoSuchElementException;
import org.isorisk.engine.error.InputException;

/**
 * A CSV file read as a stream of rows ({@link Csv#stream}): memory stays flat in the number of rows. The text is
 * read in pieces; each piece is cut after its last complete record (a line end outside quotes) and parsed by the
 * one reader's own record parser, so records, header checks, row checks, row numbers and error texts are those of
 * {@link Csv#read(InputFile, String)}. Not thread-safe; close it when done.
 */
public final class CsvStream implements Iterator<CsvRow>, Closeable {
    /** Characters read at a time. */
    private static final int PIECE = 1 << 16;

    private final InputFile file;
    private final SourceFile described;
    private final Counting counted;
    private final MessageDigest digest;
    private final InputStream in;
    private final java.nio.charset.CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);
    private final java.nio.ByteBuffer bytes;
    private final java.nio.CharBuffer chars;
    private final StringBuilder pending = new StringBuilder();
    private final ArrayDeque<Csv.Record> parsed = new ArrayDeque<>();
    private int nextRow = 1;
    private boolean eof;
    private final List<String> header;
    private final int headerRow;
    private final List<CsvTable.Metadata> metadata = new ArrayList<>();
    private long rows;
    private CsvRow next;
    private String sha256;

    private CsvStream(InputFile file, String role, InputStream raw, int piece) throws IOException {
        this.file = file;
        this.bytes = java.nio.ByteBuffer.allocate(Math.max(4, piece));
        this.chars = java.nio.CharBuffer.allocate(Math.max(4, piece));
        // The digest and the byte count see every byte, the byte-order mark included, as SourceFile.sha256 does.
        try {
            this.digest = MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java runtime provides SHA-256", e);
        }
        this.counted = new Counting(raw);
        PushbackInputStream in = new PushbackInputStream(new DigestInputStream(counted, digest), 3);
        this.in = in;
        // A placeholder digest until the end: only the path and the role are used while reading.
        this.described = new SourceFile(role, file.path(), file.name(), "0".repeat(64), 0);
        byte[] head = in.readNBytes(3);
        if (head.length >= 2 && ((head[0] == (byte) 0xFF && head[1] == (byte) 0xFE)
                || (head[0] == (byte) 0xFE && head[1] == (byte) 0xFF))) {
            throw InputException.of("the file is UTF-16 text").file(file.path())
                    .fix("save it as 'CSV UTF-8' (comma delimited)").build();
        }
        boolean bom = head.length == 3 && head[0] == (byte) 0xEF && head[1] == (byte) 0xBB && head[2] == (byte) 0xBF;
        if (!bom && head.length > 0) {
            in.unread(head);
        }
        Csv.Record h = null;
        while (h == null) {
            Csv.Record r = nextRecord();
            if (r == null) {
                throw InputException.of("the file is empty (no header row)").file(file.path())
                        .fix("start the file with a header row naming the columns").build();
            }
            if (r.comment() != null) {
                CsvTable.Metadata m = Csv.metadata(r);
                if (m != null) {
                    metadata.add(m);
                }
            } else if (!r.blank()) {
                h = r;
            }
        }
        this.header = List.copyOf(Csv.header(described, h));
        this.headerRow = h.row();
    }

    static CsvStream open(InputFile file, String role) {
        return open(file, role, PIECE);
    }

    /** As {@link #open(InputFile, String)}, reading {@code piece} characters at a time (tests cut records anywhere). */
    static CsvStream open(InputFile file, String role, int piece) {
        String what = role.replace('-', ' ') + " file";
        if (file.local().map(Files::isDirectory).orElse(false)) {
            throw InputException.of("the " + what + " is a folder, not a file").file(file.path())
                    .fix("give the path of the CSV file itself").build();
        }
        InputStream raw;
        try {
            raw = file.open();
        } catch (NoSuchFileException | FileNotFoundException e) {
            throw InputException.of("the " + what + " does not exist").file(file.path())
                    .fix("check the path; a relative path starts from the current folder").build();
        } catch (IOException e) {
            throw InputException.of("the " + what + " cannot be read: " + e.getMessage()).file(file.path())
                    .fix("check that the file exists and is readable").build();
        }
        try {
            return new CsvStream(file, role, raw, piece);
        } catch (IOException e) {
            closeQuietly(raw);
            throw unreadable(file, e, 1);
        } catch (RuntimeException e) {
            closeQuietly(raw);
            throw e;
        }
    }

    /** The file as errors name it. */
    public String path() {
        return file.path();
    }

    /** The column names, trimmed, unique ignoring case. */
    public List<String> header() {
        return header;
    }

    /** One-based row number of the header. */
    public int headerRow() {
        return headerRow;
    }

    /** The {@code # key: value} lines above the header. */
    public List<CsvTable.Metadata> metadata() {
        return List.copyOf(metadata);
    }

    /** Zero-based index of the column named {@code name} (ignoring case), or -1. */
    public int column(String name) {
        for (int i = 0; i < header.size(); i++) {
            if (header.get(i).equalsIgnoreCase(name)) {
                return i;
            }
        }
        return -1;
    }

    /** The number in a cell; an error naming file, row, column, asset and value otherwise (as {@link CsvTable}). */
    public double number(CsvRow row, int column, String asset) {
        return CsvTable.number(file.path(), header, row, column, asset);
    }

    /** An error about this file: the builder has the file name set. */
    public InputException.Builder error(String problem) {
        return InputException.of(problem).file(file.path());
    }

    /** Bytes taken from the file so far (the reader reads ahead a little), for progress. */
    public long bytesRead() {
        return counted.count;
    }

    /** Data rows handed out so far. */
    public long rowsRead() {
        return rows;
    }

    /** The file's SHA-256 (lower-case hex), known once every row has been read; empty before. */
    public java.util.Optional<String> sha256() {
        return java.util.Optional.ofNullable(sha256);
    }

    @Override
    public boolean hasNext() {
        while (next == null) {
            Csv.Record r = nextRecord();
            if (r == null) {
                if (rows == 0) {
                    throw InputException.of("the file has a header but no data rows").file(file.path())
                            .row(headerRow).fix("add one row per asset below the header").build();
                }
                return false;
            }
            if (r.comment() == null && !r.blank()) {
                next = Csv.dataRow(described, header, r);
            }
        }
        return true;
    }

    @Override
    public CsvRow next() {
        if (!hasNext()) {
            throw new NoSuchElementException();
        }
        CsvRow r = next;
        next = null;
        rows++;
        return r;
    }

    @Override
    public void close() {
        try {
            in.close();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The next record of the file (comments and blank lines included), or null at the end. */
    private Csv.Record nextRecord() {
        while (parsed.isEmpty()) {
            if (eof && pending.length() == 0) {
                return null;
            }
            fill();
        }
        return parsed.poll();
    }

    /** Reads a piece, and parses the records that are complete. */
    private void fill() {
        if (!eof) {
            int got;
            try {
                got = in.read(bytes.array(), bytes.position(), bytes.remaining());
            } catch (IOException e) {
                throw unreadable(file, e, nextRow + lineEnds(pending));
            }
            if (got < 0) {
                eof = true;
                sha256 = HexFormat.of().formatHex(digest.digest());
            } else {
                bytes.position(bytes.position() + got);
            }
            bytes.flip();
            java.nio.charset.CoderResult r = decoder.decode(bytes, chars, eof);
            if (!r.isError() && eof) {
                r = decoder.flush(chars);
            }
            chars.flip();
            pending.append(chars);
            chars.clear();
            if (r.isError()) {
                throw InputException.of("the file is not UTF-8 text").file(file.path())
                        .row(nextRow + lineEnds(pending)).fix("save it as 'CSV UTF-8'").build();
            }
            bytes.compact(); // an incomplete character at the end waits for its other bytes
        }
        int cut = eof ? pending.length() : completeRecords(pending);
        if (cut == 0) {
            return;
        }
        String piece = pending.substring(0, cut);
        pending.delete(0, cut);
        List<Csv.Record> records = Csv.records(described, piece, nextRow);
        nextRow += records.size();
        parsed.addAll(records);
    }

    /**
     * Length of the leading part of {@code s} made of complete records: each ends with a line end outside quotes
     * (a comment line with its line end). A carriage return at the very end may be followed by a line feed not yet
     * read, so it does not end a record yet. The quote state follows {@link Csv}'s record parser; text it would
     * refuse still reaches it, in a later piece at worst, so the error is the same.
     */
    static int completeRecords(CharSequence s) {
        int n = s.length();
        int done = 0;
        int i = 0;
        while (i < n) {
            int j = i;
            while (j < n && (s.charAt(j) == ' ' || s.charAt(j) == '\t')) {
                j++;
            }
            if (j == n) {
                return done;
            }
            boolean comment = s.charAt(j) == '#';
            boolean quoted = false;
            int end = -1;
            for (int k = j; k < n; k++) {
                char c = s.charAt(k);
                if (c == '"' && !comment) {
                    quoted = !quoted;
                } else if ((c == '\n' || c == '\r') && !quoted) {
                    if (c == '\r') {
                        if (k + 1 == n) {
                            return done;
                        }
                        end = s.charAt(k + 1) == '\n' ? k + 2 : k + 1;
                    } else {
                        end = k + 1;
                    }
                    break;
                }
            }
            if (end < 0) {
                return done;
            }
            i = end;
            done = end;
        }
        return done;
    }

    private static int lineEnds(CharSequence s) {
        int count = 0;
        for (int i = 0; i < s.length(); i++) {
            if (s.charAt(i) == '\n') {
                count++;
            }
        }
        return count;
    }

    private static InputException unreadable(InputFile file, IOException e, int row) {
        return InputException.of("the file cannot be read: " + e.getMessage()).file(file.path()).row(row)
                .fix("check that the file is complete and readable").build();
    }

    private static void closeQuietly(InputStream in) {
        try {
            in.close();
        } catch (IOException ignored) {
            // the error being reported matters more
        }
    }

    /** Counts the bytes read through it. */
    private static final class Counting extends FilterInputStream {
        volatile long count;

        Counting(InputStream in) {
            super(in);
        }

        @Override
        public int read() throws IOException {
            int b = super.read();
            if (b >= 0) {
                count++;
            }
            return b;
        }

        @Override
        public int read(byte[] b, int off, int len) throws IOException {
            int n = super.read(b, off, len);
            if (n > 0) {
                count += n;
            }
            return n;
        }

        @Override
        public long skip(long n) throws IOException {
            long s = super.skip(n);
            count += s;
            return s;
        }
    }
}
