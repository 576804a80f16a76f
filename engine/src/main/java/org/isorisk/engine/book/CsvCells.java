package org.isorisk.engine.book;

/**
 * The cells of the CSV files isorisk writes, as pure functions shared by every writer (the CSV writer of tables
 * for people and the results of a book of portfolios, in process and on Spark), so that they write the same text:
 * numbers locale-independent, plain and exact; text quoted when needed; and the spreadsheet formula guard on text
 * cells that people open in a spreadsheet.
 *
 * <p><b>The formula guard</b> (OWASP, "CSV Injection"): a spreadsheet that opens a CSV file runs a cell as a formula
 * when it starts with {@code =}, {@code +}, {@code -} or {@code @}, and some also after a leading tab or carriage
 * return. A text cell that starts with one of those six characters, or with apostrophes followed by one, gets one
 * more apostrophe in front, which spreadsheets show as "treat as text". Numbers are never guarded: {@code -0.05}
 * stays a negative number. {@link #unguard} undoes the guard exactly.
 */
public final class CsvCells {
    private CsvCells() {
    }

    /**
     * A number with a decimal point and enough digits to read back the same double: the shortest decimal that
     * {@link Double#toString} gives, written without an exponent from 1e-6 upwards (below it in Java's scientific
     * form, which every CSV reader takes), without trailing zeros; empty when not finite. The same text as
     * {@code BigDecimal.valueOf(v).stripTrailingZeros().toPlainString()}, built from the digits directly (a
     * results file of millions of numbers is written several times faster).
     */
    public static String number(double v) {
        if (!Double.isFinite(v)) {
            return "";
        }
        if (v == 0) {
            return "0";
        }
        String s = Double.toString(v);
        if (Math.abs(v) < 1e-6) {
            return s;
        }
        int start = s.charAt(0) == '-' ? 1 : 0;
        int e = s.indexOf('E');
        int end = e < 0 ? s.length() : e;
        int exp = e < 0 ? 0 : Integer.parseInt(s, e + 1, s.length(), 10);
        int dot = s.indexOf('.', start);
        // The significant digits and where the decimal point falls among them.
        StringBuilder digits = new StringBuilder(24);
        digits.append(s, start, dot).append(s, dot + 1, end);
        int point = dot - start + exp;
        int lead = 0;
        while (lead < digits.length() - 1 && digits.charAt(lead) == '0') {
            lead++;
        }
        int last = digits.length();
        while (last > lead + 1 && digits.charAt(last - 1) == '0') {
            last--;
        }
        String d = digits.substring(lead, last);
        point -= lead;
        StringBuilder out = new StringBuilder(d.length() + 8);
        if (start == 1) {
            out.append('-');
        }
        if (point <= 0) {
            out.append("0.");
            for (int k = point; k < 0; k++) {
                out.append('0');
            }
            out.append(d);
        } else if (point >= d.length()) {
            out.append(d);
            for (int k = d.length(); k < point; k++) {
                out.append('0');
            }
        } else {
            out.append(d, 0, point).append('.').append(d, point, d.length());
        }
        return out.toString();
    }

    /**
     * A text cell, quoted when needed: with a comma, quote or line break, leading or trailing blanks, or a
     * {@code #} anywhere (readers that take {@code #} as a comment, such as pandas' {@code comment="#"}, skip the
     * rest of an unquoted line); quotes inside are doubled.
     */
    public static String quote(String s) {
        int n = s.length();
        boolean quote = n > 0 && (Character.isWhitespace(s.charAt(0)) || Character.isWhitespace(s.charAt(n - 1)));
        for (int i = 0; i < n && !quote; i++) {
            char c = s.charAt(i);
            quote = c == ',' || c == '"' || c == '\n' || c == '\r' || c == '#';
        }
        return quote ? '"' + s.replace("\"", "\"\"") + '"' : s;
    }

    /** The formula guard on one text cell (see the class comment); other text is returned as it is. */
    public static String guard(String s) {
        return risky(s) ? "'" + s : s;
    }

    /** Undoes {@link #guard}: removes one leading apostrophe when the guard added it. */
    public static String unguard(String s) {
        return s.startsWith("'") && risky(s.substring(1)) ? s.substring(1) : s;
    }

    /** A text cell for people: guarded, then quoted when needed. */
    public static String text(String s) {
        return quote(guard(s));
    }

    private static boolean risky(String s) {
        int i = 0;
        while (i < s.length() && s.charAt(i) == '\'') {
            i++;
        }
        if (i == s.length()) {
            return false;
        }
        char c = s.charAt(i);
        return c == '=' || c == '+' || c == '-' || c == '@' || c == '\t' || c == '\r';
    }
}
