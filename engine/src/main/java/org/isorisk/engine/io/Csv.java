package org.isorisk.engine.io;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;

/**
 * The project's one CSV reader. Reads UTF-8 (a byte-order mark is skipped), cells separated by commas,
 * quoted cells with {@code ""} for a quote inside (they may span lines), and any of LF, CRLF or CR line
 * ends. Lines starting with {@code #} are comments; those above the header of the form {@code # key: value}
 * are kept as metadata (e.g. {@code # as_of: 2025-06-30}). Blank lines are skipped. Row numbers are one-based
 * and count every record, as a spreadsheet shows them.
 *
 * <p>Refused, with the row and a fix: semicolon- or tab-separated files (usually a decimal-comma export),
 * UTF-16 and other non-UTF-8 text, blank or duplicate header names, rows with fewer cells than the header or
 * with extra non-empty cells (a decimal comma such as {@code 0,05} splits a cell in two and is named as such),
 * unterminated quotes and text after a closing quote.
 *
 * <p>Read back as written: the project's CSV writer guards text cells that a spreadsheet would run as a formula
 * with one leading apostrophe (a cell starting with {@code =}, {@code +}, {@code -}, {@code @}, a tab or a carriage
 * return, possibly after apostrophes); this reader removes that one apostrophe from every cell ({@link #unguard})
 * and from the text after each comma of a {@code # key: value} line, so names come back as they were given.
 */
public final class Csv {
    private Csv() {
    }

    /**
     * Reads a file.
     *
     * @param path the file, as the user gave it (not modified)
     * @param role what the file is read as, e.g. {@code expected-returns}; named in messages and provenance
     */
    public static CsvTable read(Path path, String role) {
        String what = role.replace('-', ' ') + " file";
        byte[] bytes;
        try {
            if (Files.isDirectory(path)) {
                throw InputException.of("the " + what + " is a folder, not a file").file(path.toString())
                        .fix("give the path of the CSV file itself").build();
            }
            bytes = Files.readAllBytes(path);
        } catch (NoSuchFileException e) {
            throw InputException.of("the " + what + " does not exist").file(path.toString())
                    .fix("check the path; a relative path starts from the current folder").build();
        } catch (IOException e) {
            throw InputException.of("the " + what + " cannot be read: " + e.getMessage()).file(path.toString())
                    .fix("check that the file exists and is readable").build();
        }
        Path fileName = path.getFileName();
        SourceFile source = new SourceFile(role, path.toString(), fileName == null ? path.toString() : fileName.toString(),
                SourceFile.sha256(bytes), bytes.length);
        return parse(source, bytes);
    }

    /** Parses text given in memory (tests, content produced by another step); {@code name} stands for the file. */
    public static CsvTable parse(String name, String role, String text) {
        SourceFile source = SourceFile.ofText(role, name, text);
        return parse(source, text.getBytes(StandardCharsets.UTF_8));
    }

    /** Parses the bytes of {@code source}. */
    public static CsvTable parse(SourceFile source, byte[] bytes) {
        String text = decode(source, bytes);
        List<Record> records = records(source, text);
        return table(source, records);
    }

    private static String decode(SourceFile source, byte[] bytes) {
        int start = 0;
        if (bytes.length >= 2 && ((bytes[0] == (byte) 0xFF && bytes[1] == (byte) 0xFE)
                || (bytes[0] == (byte) 0xFE && bytes[1] == (byte) 0xFF))) {
            throw InputException.of("the file is UTF-16 text").file(source.path())
                    .fix("save it as 'CSV UTF-8' (comma delimited)").build();
        }
        if (bytes.length >= 3 && bytes[0] == (byte) 0xEF && bytes[1] == (byte) 0xBB && bytes[2] == (byte) 0xBF) {
            start = 3;
        }
        CharsetDecoder d = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(bytes, start, bytes.length - start);
        CharBuffer out = CharBuffer.allocate(bytes.length);
        CoderResult r = d.decode(in, out, true);
        if (r.isError()) {
            int at = in.position();
            int row = 1;
            for (int i = start; i < at; i++) {
                if (bytes[i] == '\n') {
                    row++;
                }
            }
            throw InputException.of("the file is not UTF-8 text (byte " + at + " is not valid UTF-8)")
                    .file(source.path()).row(row).fix("save it as 'CSV UTF-8'").build();
        }
        try {
            r = d.flush(out);
            if (r.isError()) {
                r.throwException();
            }
        } catch (CharacterCodingException e) {
            throw InputException.of("the file is not UTF-8 text").file(source.path()).fix("save it as 'CSV UTF-8'")
                    .build();
        }
        out.flip();
        return out.toString();
    }

    /** One record: its row number, its cells, and whether it was a comment or blank line. */
    private record Record(int row, List<String> cells, List<Boolean> quoted, String comment) {
        boolean blank() {
            return comment == null && cells.size() == 1 && !quoted.get(0) && cells.get(0).isEmpty();
        }
    }

    private static List<Record> records(SourceFile source, String s) {
        List<Record> out = new ArrayList<>();
        int n = s.length();
        int i = 0;
        int row = 0;
        while (i < n) {
            row++;
            // A comment line: '#' as the first non-blank character of a record.
            int j = i;
            while (j < n && (s.charAt(j) == ' ' || s.charAt(j) == '\t')) {
                j++;
            }
            if (j < n && s.charAt(j) == '#') {
                int end = j;
                while (end < n && s.charAt(end) != '\n' && s.charAt(end) != '\r') {
                    end++;
                }
                out.add(new Record(row, List.of(), List.of(), s.substring(j + 1, end)));
                i = skipLineEnd(s, end);
                continue;
            }
            List<String> cells = new ArrayList<>();
            List<Boolean> quoted = new ArrayList<>();
            StringBuilder cur = new StringBuilder();
            boolean inQuotes = false;
            boolean wasQuoted = false;
            boolean afterQuote = false;
            boolean endOfRecord = false;
            while (i < n && !endOfRecord) {
                char c = s.charAt(i);
                if (inQuotes) {
                    if (c == '"') {
                        if (i + 1 < n && s.charAt(i + 1) == '"') {
                            cur.append('"');
                            i += 2;
                            continue;
                        }
                        inQuotes = false;
                        afterQuote = true;
                        i++;
                        continue;
                    }
                    if (c == '\r') {
                        cur.append('\n');
                        i = (i + 1 < n && s.charAt(i + 1) == '\n') ? i + 2 : i + 1;
                        continue;
                    }
                    cur.append(c);
                    i++;
                    continue;
                }
                if (c == ',') {
                    cells.add(unguard(wasQuoted ? cur.toString() : cur.toString().strip()));
                    quoted.add(wasQuoted);
                    cur.setLength(0);
                    wasQuoted = false;
                    afterQuote = false;
                    i++;
                    continue;
                }
                if (c == '\n' || c == '\r') {
                    i = skipLineEnd(s, i);
                    endOfRecord = true;
                    continue;
                }
                if (afterQuote) {
                    if (c == ' ' || c == '\t') {
                        i++;
                        continue;
                    }
                    throw InputException.of("text follows a closing quote in cell " + (cells.size() + 1))
                            .file(source.path()).row(row).value(cur + "\"" + c)
                            .fix("quote the whole cell and write a quote inside it as two quotes (\"\")").build();
                }
                if (c == '"') {
                    if (!cur.toString().isBlank()) {
                        throw InputException.of("a quote stands inside unquoted cell " + (cells.size() + 1))
                                .file(source.path()).row(row).value(cur.toString().strip() + "\"")
                                .fix("quote the whole cell and write a quote inside it as two quotes (\"\")").build();
                    }
                    cur.setLength(0);
                    inQuotes = true;
                    wasQuoted = true;
                    i++;
                    continue;
                }
                cur.append(c);
                i++;
            }
            if (inQuotes) {
                throw InputException.of("a quoted cell opened in this row is never closed").file(source.path()).row(row)
                        .fix("add the closing quote (\")").build();
            }
            cells.add(unguard(wasQuoted ? cur.toString() : cur.toString().strip()));
            quoted.add(wasQuoted);
            out.add(new Record(row, cells, quoted, null));
        }
        return out;
    }

    /**
     * Undoes the CSV writer's spreadsheet formula guard on one cell: {@code '=SUM(A1)} reads as {@code =SUM(A1)},
     * {@code ''=x} as {@code '=x}; an apostrophe before anything else ({@code 'plain}) is kept.
     */
    static String unguard(String cell) {
        return cell.startsWith("'") && formulaStart(cell, 1) ? cell.substring(1) : cell;
    }

    /** {@link #unguard} for the text after each comma of a comment line (after blanks and an opening quote). */
    static String unguardPieces(String s) {
        StringBuilder b = null;
        int from = 0;
        for (int comma = s.indexOf(','); comma >= 0; comma = s.indexOf(',', comma + 1)) {
            int start = comma + 1;
            while (start < s.length() && s.charAt(start) == ' ') {
                start++;
            }
            if (start < s.length() && s.charAt(start) == '"') {
                start++;
            }
            if (start < s.length() && s.charAt(start) == '\'' && formulaStart(s, start + 1)) {
                b = b == null ? new StringBuilder(s.length()) : b;
                b.append(s, from, start);
                from = start + 1;
            }
        }
        return b == null ? s : b.append(s, from, s.length()).toString();
    }

    /** True when {@code s} from {@code i} is apostrophes followed by a character a spreadsheet runs as a formula. */
    private static boolean formulaStart(String s, int i) {
        while (i < s.length() && s.charAt(i) == '\'') {
            i++;
        }
        if (i == s.length()) {
            return false;
        }
        char c = s.charAt(i);
        return c == '=' || c == '+' || c == '-' || c == '@' || c == '\t' || c == '\r';
    }

    private static int skipLineEnd(String s, int i) {
        if (i >= s.length()) {
            return i;
        }
        if (s.charAt(i) == '\r') {
            return (i + 1 < s.length() && s.charAt(i + 1) == '\n') ? i + 2 : i + 1;
        }
        return s.charAt(i) == '\n' ? i + 1 : i;
    }

    private static CsvTable table(SourceFile source, List<Record> records) {
        List<CsvTable.Metadata> meta = new ArrayList<>();
        int k = 0;
        for (; k < records.size(); k++) {
            Record r = records.get(k);
            if (r.comment() != null) {
                int colon = r.comment().indexOf(':');
                if (colon > 0) {
                    String key = r.comment().substring(0, colon).strip().toLowerCase(Locale.ROOT);
                    if (key.matches("[a-z0-9_\\-]+")) {
                        meta.add(new CsvTable.Metadata(key, unguardPieces(r.comment().substring(colon + 1).strip()),
                                r.row()));
                    }
                }
                continue;
            }
            if (!r.blank()) {
                break;
            }
        }
        if (k == records.size()) {
            throw InputException.of("the file is empty (no header row)").file(source.path())
                    .fix("start the file with a header row naming the columns").build();
        }
        Record h = records.get(k);
        List<String> header = new ArrayList<>(h.cells());
        while (header.size() > 1 && header.get(header.size() - 1).isEmpty() && !h.quoted().get(header.size() - 1)) {
            header.remove(header.size() - 1); // trailing empty cells a spreadsheet export may leave
        }
        if (header.size() == 1) {
            String only = header.get(0);
            if (only.contains(";")) {
                throw InputException.of("the file is separated by semicolons, not commas").file(source.path())
                        .row(h.row()).value(only).fix("save it as CSV with commas between cells and a decimal point "
                                + "in numbers (0.05, not 0,05)").build();
            }
            if (only.contains("\t")) {
                throw InputException.of("the file is separated by tabs, not commas").file(source.path())
                        .row(h.row()).fix("save it as CSV with commas between cells").build();
            }
        }
        Map<String, Integer> seen = new HashMap<>();
        for (int c = 0; c < header.size(); c++) {
            String name = header.get(c);
            if (name.isBlank() && c > 0) {
                throw InputException.of("column " + (c + 1) + " has no name in the header").file(source.path())
                        .row(h.row()).fix("name every column in the header row").build();
            }
            Integer before = seen.put(name.toLowerCase(Locale.ROOT), c);
            if (before != null) {
                throw InputException.of("the header names a column twice (columns " + (before + 1) + " and "
                                + (c + 1) + ")").file(source.path()).row(h.row()).column(name)
                        .fix("give each column its own name").build();
            }
        }
        List<CsvRow> rows = new ArrayList<>();
        for (int r = k + 1; r < records.size(); r++) {
            Record rec = records.get(r);
            if (rec.comment() != null || rec.blank()) {
                continue;
            }
            List<String> cells = rec.cells();
            if (cells.size() < header.size()) {
                throw InputException.of("the row has " + cells.size() + " cell" + (cells.size() == 1 ? "" : "s")
                                + " but the header has " + header.size() + " (" + String.join(", ", header) + ")")
                        .file(source.path()).row(rec.row()).value(String.join(",", cells))
                        .fix("give every row one cell per header column").build();
            }
            if (cells.size() > header.size()) {
                boolean extraBlank = true;
                for (int c = header.size(); c < cells.size(); c++) {
                    extraBlank &= cells.get(c).isEmpty() && !rec.quoted().get(c);
                }
                if (!extraBlank) {
                    for (int c = 1; c < cells.size(); c++) {
                        if (!rec.quoted().get(c - 1) && !rec.quoted().get(c)
                                && NumberText.looksSplitAtComma(cells.get(c - 1), cells.get(c))) {
                            throw InputException.of("the row has more cells than the header: '" + cells.get(c - 1)
                                            + "," + cells.get(c) + "' looks like a number written with a decimal "
                                            + "comma or thousands separator").file(source.path()).row(rec.row())
                                    .value(String.join(",", cells)).fix(NumberText.DECIMAL_COMMA_FIX).build();
                        }
                    }
                    throw InputException.of("the row has " + cells.size() + " cells but the header has "
                                    + header.size() + " (" + String.join(", ", header) + ")").file(source.path())
                            .row(rec.row()).value(String.join(",", cells))
                            .fix("give every row one cell per header column; quote cells that contain commas").build();
                }
                cells = cells.subList(0, header.size());
            }
            rows.add(new CsvRow(rec.row(), cells));
        }
        if (rows.isEmpty()) {
            throw InputException.of("the file has a header but no data rows").file(source.path()).row(h.row())
                    .fix("add one row per asset below the header").build();
        }
        return new CsvTable(source, header, h.row(), rows, meta);
    }
}
