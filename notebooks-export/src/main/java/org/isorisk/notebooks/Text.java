package org.isorisk.notebooks;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.Locale;
import org.isorisk.notebooks.report.Table;

/**
 * Escaping of text that comes from inputs (asset, group and fund names) before it goes into HTML, Markdown or
 * Python source, and the one way numbers are shown in the pack. The number formats are the ones the notebook's
 * own Python helper {@code show()} produces, so that the outputs stored in the notebook and the outputs of
 * running it again read the same.
 */
public final class Text {
    private Text() {
    }

    /** Escapes the five HTML-significant characters: {@code & < > " '}. */
    public static String html(String s) {
        StringBuilder b = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&' -> b.append("&amp;");
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&#39;");
                default -> b.append(c);
            }
        }
        return b.toString();
    }

    /**
     * Makes text from an input safe to place inside a line of Markdown, so that it reads literally: characters
     * that start emphasis, code, links, tables, maths (Jupyter renders {@code $…$} as LaTeX) or raw HTML are
     * backslash-escaped or written as HTML entities, characters that start a block (heading, list, quote) are
     * escaped at the start, text that would become a link by itself ({@code http://}, {@code www.}, e-mail
     * addresses) is broken up with entities, and line breaks become spaces. Only the backslash escapes that
     * both CommonMark (spec 0.30, section 2.4) and the Markdown renderer of Debian's nbconvert honour are used;
     * there a {@code \\:} or {@code \\^} would show its backslash. {@code \\$} keeps Jupyter's MathJax (set to
     * process escapes) from reading a name as LaTeX.
     */
    public static String markdown(String s) {
        String flat = s.replace("\r\n", " ").replace('\r', ' ').replace('\n', ' ');
        StringBuilder b = new StringBuilder(flat.length() + 16);
        for (int i = 0; i < flat.length(); i++) {
            char c = flat.charAt(i);
            switch (c) {
                case '&' -> b.append("&amp;");
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                // e-mail autolinks (GFM extension); entities are decoded only after parsing
                case '@' -> b.append("&#64;");
                case '\\', '`', '*', '_', '[', ']', '|', '~', '$', '{', '}', '!' -> b.append('\\').append(c);
                case '#', '+', '-' -> {
                    if (i == 0) {
                        b.append('\\');
                    }
                    b.append(c);
                }
                case ':' -> b.append(flat.startsWith("//", i + 1) ? "&#58;" : ":"); // URL autolinks
                case '.' -> {
                    // "1." at the start would open an ordered list; "www." would become a link
                    if (allDigits(flat, i)) {
                        b.append("\\.");
                    } else if (i >= 3 && flat.regionMatches(true, i - 3, "www", 0, 3)) {
                        b.append("&#46;");
                    } else {
                        b.append('.');
                    }
                }
                case ')' -> {
                    if (allDigits(flat, i)) {
                        b.append('\\');
                    }
                    b.append(c);
                }
                default -> b.append(c);
            }
        }
        return b.toString();
    }

    private static boolean allDigits(String s, int end) {
        if (end == 0) {
            return false;
        }
        for (int i = 0; i < end; i++) {
            if (!Character.isDigit(s.charAt(i))) {
                return false;
            }
        }
        return true;
    }

    /**
     * A Python 3 string literal for {@code s}, in double quotes, with backslashes, quotes and control characters
     * escaped and every non-ASCII character written as a {@code \\uXXXX} or {@code \\UXXXXXXXX} escape (so the source stays ASCII).
     */
    public static String python(String s) {
        StringBuilder b = new StringBuilder(s.length() + 2).append('"');
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == '\\' || c == '"') {
                b.append('\\').append(c);
            } else if (c == '\n') {
                b.append("\\n");
            } else if (c == '\r') {
                b.append("\\r");
            } else if (c == '\t') {
                b.append("\\t");
            } else if (Character.isHighSurrogate(c) && i + 1 < s.length() && Character.isLowSurrogate(s.charAt(i + 1))) {
                // Python reads "\ud83d\ude00" as two lone surrogates: write the code point whole
                b.append(String.format(Locale.ROOT, "\\U%08x", s.codePointAt(i)));
                i++;
            } else if (c < 0x20 || c > 0x7e) {
                b.append(String.format(Locale.ROOT, "\\u%04x", (int) c));
            } else {
                b.append(c);
            }
        }
        return b.append('"').toString();
    }

    /**
     * How a cell is shown in the notebook. Percent: {@code f"{v * 100:.2f} %"}; decimal: {@code f"{v:.2f}"};
     * number: {@code f"{v:.6g}"}; amount: {@code f"{v:,.0f}"}; NaN: empty; a percent, decimal or amount that
     * rounds to zero shows without a minus sign. These are the Python format specifications of the notebook's
     * {@code show()} helper, reproduced exactly: Python rounds the exact binary value half to even, and so does
     * {@link BigDecimal} here ({@code String.format} would round the shortest decimal form half up and differ,
     * e.g. on 1.005).
     */
    public static String display(Table.Cell cell, Table.Format format) {
        if (cell instanceof Table.Cell.Text t) {
            return t.value();
        }
        double v = ((Table.Cell.Number) cell).value();
        if (Double.isNaN(v)) {
            return "";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        return switch (format) {
            case PERCENT -> noNegativeZero(fixed(v * 100, 2)) + " %";
            case DECIMAL -> noNegativeZero(fixed(v, 2));
            case NUMBER -> general(v, 6);
            case AMOUNT -> noNegativeZero(String.format(Locale.ROOT, "%,d",
                    new BigDecimal(v).setScale(0, RoundingMode.HALF_EVEN).toBigIntegerExact()));
            case TEXT -> throw new IllegalArgumentException("a number in a text column");
        };
    }

    /** {@code f"{v:.{d}f}"} in Python: the exact binary value rounded half to even to {@code d} decimals. */
    static String fixed(double v, int d) {
        String s = new BigDecimal(v).setScale(d, RoundingMode.HALF_EVEN).toPlainString();
        return (v < 0 || (v == 0 && 1 / v < 0)) && !s.startsWith("-") ? "-" + s : s;
    }

    /** A value that rounds to zero reads "0.00", not "-0.00". */
    private static String noNegativeZero(String s) {
        return s.startsWith("-") && s.chars().noneMatch(ch -> ch >= '1' && ch <= '9') ? s.substring(1) : s;
    }

    /**
     * Python's {@code format(v, ".{p}g")}: {@code p} significant digits, trailing zeros removed, scientific
     * notation when the decimal exponent is below −4 or at least {@code p} (Python Language Reference,
     * "Format Specification Mini-Language").
     */
    public static String general(double v, int p) {
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        if (v == 0) {
            return (1 / v < 0) ? "-0" : "0";
        }
        BigDecimal r = new BigDecimal(v).round(new MathContext(p, RoundingMode.HALF_EVEN));
        int exp = r.precision() - r.scale() - 1;
        if (exp < -4 || exp >= p) {
            BigDecimal mantissa = r.movePointLeft(exp);
            String m = strip(mantissa.toPlainString());
            return String.format(Locale.ROOT, "%se%s%02d", m, exp < 0 ? "-" : "+", Math.abs(exp));
        }
        return strip(r.toPlainString());
    }

    private static String strip(String s) {
        if (s.indexOf('.') < 0) {
            return s;
        }
        int end = s.length();
        while (s.charAt(end - 1) == '0') {
            end--;
        }
        if (s.charAt(end - 1) == '.') {
            end--;
        }
        return s.substring(0, end);
    }
}
