package org.isorisk.engine.io;

import java.time.format.DateTimeFormatter;
import java.time.format.ResolverStyle;

/**
 * The date formats a history may use. ISO {@code yyyy-MM-dd} is the default; day/month/year must be asked for
 * explicitly, because {@code 03/04/2020} is ambiguous and is never guessed.
 */
public enum DateFormat {
    /** ISO 8601 calendar date, e.g. 2020-04-03. */
    ISO("yyyy-MM-dd", DateTimeFormatter.ofPattern("uuuu-MM-dd").withResolverStyle(ResolverStyle.STRICT)),
    /** Day, month, year with slashes, e.g. 03/04/2020 for 3 April 2020. */
    DAY_MONTH_YEAR("dd/MM/yyyy", DateTimeFormatter.ofPattern("dd/MM/uuuu").withResolverStyle(ResolverStyle.STRICT));

    private final String label;
    private final DateTimeFormatter formatter;

    DateFormat(String label, DateTimeFormatter formatter) {
        this.label = label;
        this.formatter = formatter;
    }

    /** The pattern as users write it ({@code yyyy-MM-dd}, {@code dd/MM/yyyy}). */
    public String label() {
        return label;
    }

    DateTimeFormatter formatter() {
        return formatter;
    }

    /** Parses a label such as {@code dd/MM/yyyy}; null when unknown. */
    public static DateFormat fromLabel(String s) {
        for (DateFormat f : values()) {
            if (f.label.equals(s)) {
                return f;
            }
        }
        return null;
    }
}
