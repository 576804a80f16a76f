package org.isorisk.notebooks;

/**
 * The names of the files inside a pack folder, relative to the folder, with {@code /} separators. The
 * notebook refers to its tables and charts by these names, and the folder writer writes them there; keeping
 * them in one place keeps the two in step.
 */
public final class PackLayout {
    private PackLayout() {
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
