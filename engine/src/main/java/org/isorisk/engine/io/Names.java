package org.isorisk.engine.io;

import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;

/** Matching asset names given by people (files, options) to the universe's names, with "did you mean" hints. */
public final class Names {
    private Names() {
    }

    /** A name of {@code known} equal to {@code name} ignoring case and spaces, or null. */
    public static String closest(String name, List<String> known) {
        String key = squash(name);
        for (String k : known) {
            if (squash(k).equals(key)) {
                return k;
            }
        }
        return null;
    }

    /** Sets the fix of {@code b}: "did you mean ..." when a near match exists, else {@code otherwise}. */
    public static InputException.Builder hint(InputException.Builder b, String name, List<String> known,
                                              String otherwise) {
        String c = closest(name, known);
        return b.fix(c != null ? "did you mean '" + c + "'? Names must match exactly" : otherwise);
    }

    private static String squash(String s) {
        return s.replaceAll("\\s+", "").toLowerCase(Locale.ROOT);
    }
}
