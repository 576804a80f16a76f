package org.isorisk.notebooks;

import java.io.IOException;
import java.io.OutputStream;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.isorisk.notebooks.report.CsvWriter;
import org.isorisk.notebooks.report.Table;

/**
 * The files of a pack folder: their names, relative to the folder, with {@code /} separators, and what goes into
 * each ({@link #files}). The notebook refers to its tables and charts by these names, and the folder writer
 * writes them there; keeping them in one place keeps the two in step. Choosing the folder and writing it is the
 * command line's job.
 */
public final class PackLayout {
    private PackLayout() {
    }

    /** Writes the bytes of one file of the pack to the stream it is given (not closed). */
    @FunctionalInterface
    public interface Body {
        void writeTo(OutputStream out) throws IOException;
    }

    /**
     * One file of the pack.
     *
     * @param path relative path inside the pack folder, {@code /} separated
     * @param body writes its bytes
     */
    public record Entry(String path, Body body) {
        public Entry {
            Objects.requireNonNull(path, "path");
            Objects.requireNonNull(body, "body");
        }
    }

    /**
     * The files of {@code content}, in the order they are written: the notebook, its Python helper and table
     * schema, the CSV tables and the chart files (PNG, SVG and, when made, PDF). The manifest and copies of the
     * inputs are the folder writer's.
     */
    public static List<Entry> files(PackContent content) {
        List<Entry> out = new ArrayList<>();
        out.add(new Entry(NOTEBOOK, o -> NotebookWriter.write(content, o)));
        out.add(new Entry(HELPER, TableSchema::writeHelper));
        out.add(new Entry(SCHEMA, o -> TableSchema.write(content.tables(), o)));
        for (Table t : content.tables()) {
            out.add(new Entry(table(t.name()), o -> {
                Writer w = new OutputStreamWriter(o, StandardCharsets.UTF_8);
                CsvWriter.write(t, w);
                w.flush();
            }));
        }
        for (PackContent.Chart c : content.charts()) {
            out.add(new Entry(chart(c.name(), "png"), o -> o.write(c.png())));
            out.add(new Entry(chart(c.name(), "svg"), o -> o.write(c.svg().getBytes(StandardCharsets.UTF_8))));
            byte[] pdf = c.pdf();
            if (pdf.length > 0) {
                out.add(new Entry(chart(c.name(), "pdf"), o -> o.write(pdf)));
            }
        }
        return out;
    }

    /** The notebook's file name. */
    public static final String NOTEBOOK = "committee-pack.ipynb";
    /** The manifest's file name. */
    public static final String MANIFEST = "manifest.json";
    /** Folder of the CSV tables. */
    public static final String TABLES = "tables";
    /** The Python module next to the notebook that reloads the tables ({@code load}, {@code show}, {@code chart}). */
    public static final String HELPER = "pack_tables.py";
    /** The description of every table (columns, headings, formats) that the helper module reads. */
    public static final String SCHEMA = "tables/schema.json";
    /** Folder of the chart files. */
    public static final String CHARTS = "charts";

    /** Relative path of a table's CSV file: {@code tables/<name>.csv}. */
    public static String table(String name) {
        return TABLES + "/" + name + ".csv";
    }

    /** Relative path of a chart file: {@code charts/<name>.<extension>} (png, svg, pdf). */
    public static String chart(String name, String extension) {
        return CHARTS + "/" + name + "." + extension;
    }
}
