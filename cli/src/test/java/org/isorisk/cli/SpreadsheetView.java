package org.isorisk.cli;

import java.util.ArrayList;
import java.util.List;

/**
 * A CSV file as a spreadsheet opens it, for tests of the formula guard: every line, comment lines included (a
 * spreadsheet does not know them), split into cells by RFC 4180 (quoted cells may hold commas, quotes and line
 * breaks). A cell runs as a formula when, after leading spaces, it starts with {@code =}, {@code +}, {@code -},
 * {@code @}, a tab or a carriage return (OWASP, "CSV Injection") and is not a plain number ({@code -0.05} is a
 * number).
 */
public final class SpreadsheetView {
    private SpreadsheetView() {
    }

    /** The cells of {@code csv} a spreadsheet would run as formulas; empty for a guarded file. */
    public static List<String> formulas(String csv) {
        List<String> bad = new ArrayList<>();
        for (String cell : cells(csv)) {
            String s = cell.replaceFirst("^ +", "");
            if (!s.isEmpty() && "=+-@\t\r".indexOf(s.charAt(0)) >= 0 && !number(s)) {
                bad.add(cell);
            }
        }
        return bad;
    }

    /** Every cell of every line, in order. */
    public static List<String> cells(String csv) {
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        boolean quoted = false;
        boolean atStart = true;
        for (int i = 0; i < csv.length(); i++) {
            char c = csv.charAt(i);
            if (quoted) {
                if (c == '"' && i + 1 < csv.length() && csv.charAt(i + 1) == '"') {
                    cur.append('"');
                    i++;
                } else if (c == '"') {
                    quoted = false;
                } else {
                    cur.append(c);
                }
            } else if (c == '"' && atStart) {
                quoted = true;
                atStart = false;
            } else if (c == ',' || c == '\n') {
                out.add(cur.toString());
                cur.setLength(0);
                atStart = true;
            } else {
                cur.append(c);
                atStart = false;
            }
        }
        if (cur.length() > 0) {
            out.add(cur.toString());
        }
        return out;
    }

    private static boolean number(String s) {
        try {
            Double.parseDouble(s.strip());
            return s.strip().matches("[-+]?[0-9.]+([eE][-+]?[0-9]+)?");
        } catch (NumberFormatException e) {
            return false;
        }
    }
}
