package org.isorisk.notebooks.chart;

import java.util.Locale;
import org.isorisk.engine.error.InputException;

/** Export formats, chosen from the file extension. */
public enum ChartFormat {
    /** Raster, written at {@link ChartSettings#pngScale()} times the logical size. */
    PNG("png"),
    /** Vector; XChart draws text as outlines, so the file has no {@code <text>} elements. */
    SVG("svg"),
    /** Vector, one page the size of the chart. */
    PDF("pdf");

    private final String extension;

    ChartFormat(String extension) {
        this.extension = extension;
    }

    /** The file extension without the dot. */
    public String extension() {
        return extension;
    }

    /**
     * The format of a file name from its extension, case-insensitive.
     *
     * @throws InputException naming the file when the extension is missing or not png, svg or pdf
     */
    public static ChartFormat fromFileName(String fileName) {
        String name = fileName == null ? "" : fileName.strip();
        int slash = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'));
        int dot = name.lastIndexOf('.');
        String ext = dot > slash ? name.substring(dot + 1).toLowerCase(Locale.ROOT) : "";
        for (ChartFormat f : values()) {
            if (f.extension.equals(ext)) {
                return f;
            }
        }
        throw InputException.of(ext.isEmpty() ? "the chart file name has no extension to tell its format"
                        : "the chart format '" + ext + "' is not supported").file(name)
                .fix("end the file name in .png, .svg or .pdf").build();
    }
}
