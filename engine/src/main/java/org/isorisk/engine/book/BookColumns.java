package org.isorisk.engine.book;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;

/**
 * The columns of a book file and what each means. Required: {@code id}, {@code policy} (a path relative to the book
 * file, or absolute; blank for the run's shared policy) and {@code target_return} (decimal; blank for the policy's
 * own target). Optional: {@code holdings} (a path), {@code holding:ASSET} (today's weights in the row itself),
 * {@code fund_size}, {@code assumptions} (a set's name), {@code exclude} (asset names separated by {@code ;}),
 * {@code min:ASSET} and {@code max:ASSET} (one asset's bounds), {@code group_min:GROUP} and {@code group_max:GROUP}
 * (a group's limits; the policy must have the group), {@code max_turnover} and {@code objective}. Names are matched
 * ignoring case; the asset or group after the colon exactly. Any other column is ignored with a warning.
 */
public final class BookColumns {

    /** Required columns. */
    public static final List<String> REQUIRED = List.of("id", "policy", "target_return");
    /** Optional columns with a fixed name. */
    public static final List<String> OPTIONAL = List.of("holdings", "fund_size", "assumptions", "exclude",
            "max_turnover", "objective");
    /** Prefixes of the optional columns that name an asset or a group. */
    public static final List<String> PREFIXES = List.of("min:", "max:", "holding:", "group_min:", "group_max:");

    /** A column that names an asset or a group after its prefix. */
    public record Named(int column, String header, String prefix, String name) {
    }

    private final String file;
    private final List<String> header;
    final int id;
    final int policy;
    final int target;
    final int holdings;
    final int fundSize;
    final int assumptions;
    final int exclude;
    final int maxTurnover;
    final int objective;
    final List<Named> bounds = new ArrayList<>();
    final List<Named> holdingWeights = new ArrayList<>();
    final List<Named> groupLimits = new ArrayList<>();
    private final List<String> warnings = new ArrayList<>();

    /**
     * Reads the layout of a header.
     *
     * @param file      the book file as errors name it
     * @param header    the column names (as the CSV reader gives them: trimmed, unique ignoring case)
     * @param headerRow the header's row number, for errors
     * @throws InputException when a required column is missing or a prefixed column names nothing
     */
    public BookColumns(String file, List<String> header, int headerRow) {
        this.file = file;
        this.header = List.copyOf(header);
        for (String r : REQUIRED) {
            if (index(r) < 0) {
                InputException.Builder b = InputException.of("no column named '" + r + "' in the header (row "
                        + headerRow + ")").file(file).value(String.join(",", header));
                String near = nearest(r, header);
                throw b.fix(near != null ? "did you mean '" + near + "'? Name the column " + r
                        : "a book needs the columns id, policy and target_return (see the README, section Book file)")
                        .build();
            }
        }
        id = index("id");
        policy = index("policy");
        target = index("target_return");
        holdings = index("holdings");
        fundSize = index("fund_size");
        assumptions = index("assumptions");
        exclude = index("exclude");
        maxTurnover = index("max_turnover");
        objective = index("objective");
        List<String> known = new ArrayList<>(REQUIRED);
        known.addAll(OPTIONAL);
        for (int c = 0; c < header.size(); c++) {
            String h = header.get(c);
            String lower = h.toLowerCase(Locale.ROOT);
            if (known.contains(lower)) {
                continue;
            }
            String prefix = null;
            for (String p : PREFIXES) {
                if (lower.startsWith(p)) {
                    prefix = p;
                }
            }
            if (prefix == null) {
                String near = nearest(h, known);
                warnings.add(file + ": column '" + h + "' is not a book column and is ignored"
                        + (near != null ? " (did you mean '" + near + "'?)" : ""));
                continue;
            }
            String name = h.substring(prefix.length()).strip();
            if (name.isEmpty()) {
                throw InputException.of("the column names no " + (prefix.startsWith("group") ? "group" : "asset")
                        + " after '" + prefix + "'").file(file).row(headerRow).column(h)
                        .fix("write the name after the colon, e.g. " + prefix
                                + (prefix.startsWith("group") ? "Equity" : "Cash")).build();
            }
            Named n = new Named(c, h, prefix, name);
            switch (prefix) {
                case "holding:" -> holdingWeights.add(n);
                case "group_min:", "group_max:" -> groupLimits.add(n);
                default -> bounds.add(n);
            }
        }
    }

    /** The column names, in file order. */
    public List<String> header() {
        return header;
    }

    /** The book file as errors name it. */
    public String file() {
        return file;
    }

    /** One warning per column that is not a book column (ignored). */
    public List<String> warnings() {
        return List.copyOf(warnings);
    }

    /** Zero-based index of the column {@code name} (ignoring case), or -1. */
    public int index(String name) {
        for (int i = 0; i < header.size(); i++) {
            if (header.get(i).equalsIgnoreCase(name)) {
                return i;
            }
        }
        return -1;
    }

    /** The name of {@code among} within two edits of {@code name} (ignoring case), or null. */
    static String nearest(String name, List<String> among) {
        String best = null;
        int bestDistance = 3;
        for (String a : among) {
            int d = distance(name.toLowerCase(Locale.ROOT), a.toLowerCase(Locale.ROOT));
            if (d < bestDistance) {
                best = a;
                bestDistance = d;
            }
        }
        return best;
    }

    /** Levenshtein distance (insertions, deletions, substitutions). */
    private static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int sub = prev[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                cur[j] = Math.min(sub, Math.min(prev[j] + 1, cur[j - 1] + 1));
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }
}
