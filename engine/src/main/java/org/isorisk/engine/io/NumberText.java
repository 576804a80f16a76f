package org.isorisk.engine.io;

import java.util.Locale;
import java.util.regex.Pattern;

/**
 * Strict reading of numbers written as text, in one place for files and command-line options: a decimal
 * point, an optional exponent, nothing else. Decimal commas, thousands separators, percent signs and
 * non-finite values are refused with a problem and a fix, never guessed at.
 */
public final class NumberText {
    private NumberText() {
    }

    private static final Pattern DECIMAL = Pattern.compile("[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?");
    private static final Pattern THOUSANDS = Pattern.compile("[+-]?\\d{1,3}((,\\d{3}){2,}(\\.\\d+)?|,\\d{3}\\.\\d+)");
    private static final Pattern DECIMAL_COMMA = Pattern.compile("[+-]?(\\d{1,3}(\\.\\d{3})+|\\d*),\\d+");
    private static final Pattern PERCENT = Pattern.compile("[+-]?(\\d+(\\.\\d*)?|\\.\\d+)\\s*%");
    private static final Pattern NON_FINITE = Pattern.compile("[+-]?(nan|inf|infinity|∞)", Pattern.CASE_INSENSITIVE);

    /** The fix given for decimal commas; also used when a decimal comma split a row into extra cells. */
    public static final String DECIMAL_COMMA_FIX = "write numbers with a decimal point (0.05, not 0,05) and use commas "
            + "only between cells; in a spreadsheet, export as CSV with '.' as the decimal separator";

    /**
     * Why a text is not a number this project accepts.
     *
     * @param problem what is wrong, without a trailing period
     * @param fix     what would make it right
     */
    public record Problem(String problem, String fix) {
    }

    /**
     * The value of a plain decimal such as {@code 0.05} or {@code -1.25e-3} (at most 19 significant digits) read
     * exactly and fast, or NaN for anything else, which the caller then judges with {@link #problem} and reads with
     * {@link #parse} (large tables: a book's cells).
     */
    public static double fastOrNaN(String text) {
        return text == null ? Double.NaN : Decimals.fast(text);
    }

    /** The problem with {@code text} as a number, or null when {@link #parse(String)} will accept it. */
    public static Problem problem(String text) {
        String t = text == null ? "" : text.strip();
        if (t.isEmpty()) {
            return new Problem("the cell is empty", "enter a number, e.g. 0.05");
        }
        if (DECIMAL.matcher(t).matches()) {
            double v = Double.parseDouble(t);
            return Double.isFinite(v) ? null
                    : new Problem("the number is too large to be finite", "give a finite number");
        }
        if (THOUSANDS.matcher(t).matches()) {
            return new Problem("the number has thousands separators", "remove them (1234567.5, not 1,234,567.5)");
        }
        if (DECIMAL_COMMA.matcher(t).matches()) {
            return new Problem("the number uses a decimal comma", DECIMAL_COMMA_FIX);
        }
        if (PERCENT.matcher(t).matches()) {
            return new Problem("the number has a percent sign", "write decimals (0.05 for 5 %), or plain percent "
                    + "numbers (5) together with --units percent");
        }
        if (NON_FINITE.matcher(t).matches()) {
            return new Problem("the value is not a finite number", "give a finite number");
        }
        return new Problem("the cell is not a number", "enter a number with a decimal point, e.g. 0.05");
    }

    /**
     * Parses {@code text}.
     *
     * @throws IllegalArgumentException when {@link #problem(String)} is not null; callers turn it into an
     *                                  {@link org.isorisk.engine.error.InputException} with context
     */
    public static double parse(String text) {
        Problem p = problem(text);
        if (p != null) {
            throw new IllegalArgumentException(p.problem());
        }
        return Double.parseDouble(text.strip());
    }

    /** True when {@code a} and {@code b}, two neighbouring cells, look like one number split at a decimal comma. */
    static boolean looksSplitAtComma(String a, String b) {
        return a.strip().matches("[+-]?\\d+") && b.strip().matches("\\d+");
    }

    /**
     * Text of {@code v} for messages: six significant digits without trailing zeros, plain between 1e-4 and 1e6,
     * scientific outside; locale-independent.
     */
    public static String show(double v) {
        if (!Double.isFinite(v)) {
            return Double.toString(v);
        }
        double a = Math.abs(v);
        if (a == 0 || (a >= 1e-4 && a < 1e6)) {
            return new java.math.BigDecimal(v).round(new java.math.MathContext(6)).stripTrailingZeros()
                    .toPlainString();
        }
        return String.format(Locale.ROOT, "%.5e", v).replaceAll("\\.?0+e", "e");
    }
}
