package org.isorisk.engine.io;

/**
 * Exact fast reading of the commonest numeric cell, for large tables: {@code [+-]digits[.digits][(e|E)[+-]digits]}
 * with at most 19 significant digits. Up to 15 digits the digits form an integer m below 2^53 and 10^k (k ≤ 22)
 * is exact, so {@code m / 10^k} is one correctly rounded operation and equals what {@link Double#parseDouble}
 * returns (Clinger 1990, "How to read floating point numbers accurately", PLDI). Beyond that (full-precision
 * exports: {@code Double.toString}'s 16–17 digits, {@code %.18e}'s 19) {@link EiselLemire} answers exactly or
 * declines. Anything declined goes to {@link NumberText}, which judges it.
 */
final class Decimals {
    private Decimals() {
    }

    private static final double[] POW10 = new double[23];

    static {
        POW10[0] = 1;
        for (int i = 1; i < POW10.length; i++) {
            POW10[i] = POW10[i - 1] * 10;
        }
    }

    /**
     * The value of {@code s}, or NaN when it is not of the fast form (the caller then reads it the usual way). The
     * fast form also takes an exponent ({@code 1.25e-3}) when the digits' integer m stays below 2^53 and the net
     * power of ten is at most 22 either way: then {@code m·10^p} or {@code m/10^p} is one correctly rounded
     * operation too. Other cases of up to 19 significant digits go to {@link EiselLemire#toDouble}.
     */
    static double fast(String s) {
        int n = s.length();
        int i = 0;
        boolean negative = false;
        if (n > 0 && (s.charAt(0) == '-' || s.charAt(0) == '+')) {
            negative = s.charAt(0) == '-';
            i = 1;
        }
        long m = 0;
        int digits = 0;
        int decimals = 0;
        boolean point = false;
        boolean any = false;
        int exponent = 0;
        for (; i < n; i++) {
            char c = s.charAt(i);
            if (c >= '0' && c <= '9') {
                any = true;
                if (m != 0 || c != '0') {
                    digits++;
                }
                if (digits > 19) {
                    return Double.NaN;
                }
                m = m * 10 + (c - '0');
                if (point) {
                    decimals++;
                }
            } else if (c == '.' && !point) {
                point = true;
            } else if ((c == 'e' || c == 'E') && any) {
                exponent = exponent(s, i + 1);
                if (exponent == Integer.MIN_VALUE) {
                    return Double.NaN;
                }
                break;
            } else {
                return Double.NaN;
            }
        }
        if (!any) {
            return Double.NaN;
        }
        int p = exponent - decimals;
        if (digits > 15 || p >= POW10.length || -p >= POW10.length) {
            return EiselLemire.toDouble(m, p, negative);
        }
        double v = p >= 0 ? m * POW10[p] : m / POW10[-p];
        return negative ? -v : v;
    }

    /** The exponent written from {@code s[from]} on ([+-]digits, at most three), or MIN_VALUE when malformed. */
    private static int exponent(String s, int from) {
        int n = s.length();
        int i = from;
        boolean negative = false;
        if (i < n && (s.charAt(i) == '-' || s.charAt(i) == '+')) {
            negative = s.charAt(i) == '-';
            i++;
        }
        if (i == n || n - i > 3) {
            return Integer.MIN_VALUE;
        }
        int e = 0;
        for (; i < n; i++) {
            char c = s.charAt(i);
            if (c < '0' || c > '9') {
                return Integer.MIN_VALUE;
            }
            e = e * 10 + (c - '0');
        }
        return negative ? -e : e;
    }

    /**
     * True when {@code s} is a plain decimal {@code [+-](digits[.digits]|.digits)[(e|E)[+-]digits]} with nothing
     * around it, the one form {@link Double#parseDouble} is asked to read (a hand-written scan instead of a
     * pattern match per cell).
     */
    static boolean plain(String s) {
        int n = s.length();
        int i = 0;
        if (i < n && (s.charAt(i) == '-' || s.charAt(i) == '+')) {
            i++;
        }
        int intDigits = 0;
        while (i < n && isDigit(s.charAt(i))) {
            i++;
            intDigits++;
        }
        int fracDigits = 0;
        if (i < n && s.charAt(i) == '.') {
            i++;
            while (i < n && isDigit(s.charAt(i))) {
                i++;
                fracDigits++;
            }
        }
        if (intDigits == 0 && fracDigits == 0) {
            return false;
        }
        if (i < n && (s.charAt(i) == 'e' || s.charAt(i) == 'E')) {
            i++;
            if (i < n && (s.charAt(i) == '-' || s.charAt(i) == '+')) {
                i++;
            }
            int expDigits = 0;
            while (i < n && isDigit(s.charAt(i))) {
                i++;
                expDigits++;
            }
            if (expDigits == 0) {
                return false;
            }
        }
        return i == n;
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }
}
