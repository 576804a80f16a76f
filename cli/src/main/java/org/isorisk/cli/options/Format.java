package org.isorisk.cli.options;

import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import picocli.CommandLine;

/** Output formats of {@code --format}. */
public enum Format {
    /** Human-readable text. */
    TABLE,
    /** CSV tables that the project's CSV reader reads back. */
    CSV,
    /** One JSON object (the machine-readable contract). */
    JSON;

    /** The name on the command line. */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Reads {@code table}, {@code csv} or {@code json}, ignoring case. */
    public static final class Converter implements CommandLine.ITypeConverter<Format> {
        @Override
        public Format convert(String value) {
            for (Format f : values()) {
                if (f.label().equalsIgnoreCase(value.strip())) {
                    return f;
                }
            }
            throw new CommandLine.TypeConversionException("'" + value + "' is not a format; use table, csv or json");
        }
    }

    /** The names shown in help. */
    public static final class Names implements Iterable<String> {
        @Override
        public Iterator<String> iterator() {
            return List.of("table", "csv", "json").iterator();
        }
    }
}
