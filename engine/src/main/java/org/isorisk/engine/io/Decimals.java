package org.isorisk.engine.io;

/**
 * Exact fast reading of the commonest numeric cell, for large tables: {@code [-]digits[.digits]} with at most 15
 * significant digits. The digits form an integer m below 2^53 and 10^k (k ≤ 22) is exact, so {@code m / 10^k} is
 * one correctly rounded operation and equals what {@link Double#parseDouble} returns (Clinger 1990, "How to read
 * floating point numbers accurately", PLDI). Anything else goes to {@link NumberText}, which judges it.
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

    /** The value of {@code s}, or NaN when it is not of the fast form (the caller then reads it the usual way). */
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
        for (; i < n; i++) {
            char c = s.charAt(i);
            if (c >= '0' && c <= '9') {
                any = true;
                if (m != 0 || c != '0') {
                    digits++;
                }
                if (digits > 15) {
                    return Double.NaN;
                }
                m = m * 10 + (c - '0');
                if (point) {
                    decimals++;
                }
            } else if (c == '.' && !point) {
                point = true;
            } else {
                return Double.NaN;
            }
        }
        if (!any || decimals > 22) {
            return Double.NaN;
        }
        double v = m / POW10[decimals];
        return negative ? -v : v;
    }
}
