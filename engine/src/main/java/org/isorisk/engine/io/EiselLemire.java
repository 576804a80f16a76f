package org.isorisk.engine.io;

import java.math.BigInteger;

/**
 * The correctly rounded double nearest to {@code w·10^q} for a decimal significand w of up to 19 digits, by the
 * Eisel–Lemire algorithm (D. Lemire, "Number Parsing at a Gigabyte per Second", Software: Practice and Experience
 * 51(8), 2021, Algorithm 1 and its section on the fallback): w, normalised to 64 bits, is multiplied by a 128-bit
 * truncation of 5^q; the top 54 bits of the product give the 53-bit significand and a rounding bit, and the
 * exponent comes from {@code floor(q·log2 10)}. Where a truncated product cannot decide the rounding (the paper's
 * fallback cases) the answer is NaN and the caller reads the text the usual way; so is an exponent outside
 * [{@link #SMALLEST_POWER}, {@link #LARGEST_POWER}] and a result that would overflow to infinity.
 *
 * <p>The table of truncated powers of five is computed with {@link BigInteger} on first use (a holder class), by
 * the paper's construction, so that runs which never need it do not pay for it at start-up.
 */
final class EiselLemire {
    private EiselLemire() {
    }

    /** Below 10^-342 every 19-digit significand rounds to zero (the paper's bound for binary64). */
    static final int SMALLEST_POWER = -342;
    /** Above 10^308 every non-zero significand overflows (the paper's bound for binary64). */
    static final int LARGEST_POWER = 308;

    private static final int EXPLICIT_BITS = 52;
    private static final int MINIMUM_EXPONENT = -1023;
    private static final int INFINITE_POWER = 0x7FF;
    /** The nine bits below the 55 the rounding needs: all ones means the truncated product may be too small. */
    private static final long PRECISION_MASK = -1L >>> (EXPLICIT_BITS + 3);

    /**
     * The double nearest {@code w·10^q} (ties to even), negated when {@code negative}; NaN when the algorithm
     * cannot decide, when q is out of range or when the value overflows.
     *
     * @param w the decimal significand, read as unsigned (at most 19 digits, so below 2^64)
     */
    static double toDouble(long w, int q, boolean negative) {
        if (w == 0) {
            return negative ? -0.0 : 0.0;
        }
        if (q < SMALLEST_POWER || q > LARGEST_POWER) {
            return Double.NaN;
        }
        int lz = Long.numberOfLeadingZeros(w);
        w <<= lz;
        int index = 2 * (q - SMALLEST_POWER);
        long[] table = Powers.TABLE;
        long t1 = table[index];
        long high = unsignedMultiplyHigh(w, t1);
        long low = w * t1;
        if ((high & PRECISION_MASK) == PRECISION_MASK) {
            // The lower bits are all ones: a carry from the truncated half of 5^q may still reach them.
            long second = unsignedMultiplyHigh(w, table[index + 1]);
            low += second;
            if (Long.compareUnsigned(second, low) > 0) {
                high++;
            }
        }
        if (low == -1L && (q < -27 || q > 55)) {
            // The paper's fallback: the product is too close to a boundary to decide. For q in [-27, 55] the
            // table entry is exact (q ≥ 0, 5^q < 2^128) or the reciprocal is exact enough (5^-q < 2^64).
            return Double.NaN;
        }
        int upperBit = (int) (high >>> 63);
        int shift = upperBit + 64 - EXPLICIT_BITS - 3;
        long mantissa = high >>> shift;
        int power2 = power(q) + upperBit - lz - MINIMUM_EXPONENT;
        long bits;
        if (power2 <= 0) {
            // Subnormal (or rounds up to the smallest normal); ties cannot occur this far from q = 0.
            if (-power2 + 1 >= 64) {
                return negative ? -0.0 : 0.0;
            }
            mantissa >>>= -power2 + 1;
            mantissa += mantissa & 1;
            mantissa >>>= 1;
            power2 = mantissa < (1L << EXPLICIT_BITS) ? 0 : 1;
            bits = mantissa | ((long) power2 << EXPLICIT_BITS);
        } else {
            // Round half up, except on an exact tie with an even significand (possible only for q in [-4, 23]).
            if (Long.compareUnsigned(low, 1) <= 0 && q >= -4 && q <= 23 && (mantissa & 3) == 1
                    && (mantissa << shift) == high) {
                mantissa &= ~1L;
            }
            mantissa += mantissa & 1;
            mantissa >>>= 1;
            if (mantissa >= (2L << EXPLICIT_BITS)) {
                mantissa = 1L << EXPLICIT_BITS;
                power2++;
            }
            mantissa &= ~(1L << EXPLICIT_BITS);
            if (power2 >= INFINITE_POWER) {
                return Double.NaN;
            }
            bits = mantissa | ((long) power2 << EXPLICIT_BITS);
        }
        if (negative) {
            bits |= 1L << 63;
        }
        return Double.longBitsToDouble(bits);
    }

    /**
     * {@code floor(q·log2 10) + 63} in the paper's fixed-point form (217706 = 152170 + 65536); exact for q in
     * [-642, 642] (checked against integer bit lengths of 10^q), which holds the table's range.
     */
    private static int power(int q) {
        return ((217706 * q) >> 16) + 63;
    }

    /** The high 64 bits of the unsigned 128-bit product (Java 17 has only the signed one). */
    private static long unsignedMultiplyHigh(long a, long b) {
        return Math.multiplyHigh(a, b) + ((a >> 63) & b) + ((b >> 63) & a);
    }

    /** The table, built when first needed. */
    static final class Powers {
        private Powers() {
        }

        /** For each q from SMALLEST_POWER on: the high then the low 64 bits of the 128-bit entry for 5^q. */
        static final long[] TABLE = build();

        /**
         * The paper's construction: for q ≥ 0, 5^q shifted so that its leading bit is bit 127, lower bits
         * truncated; for q < 0, the reciprocal {@code floor(2^b / 5^-q) + 1} with {@code b = z + 127} when
         * q ≥ -27 and {@code b = 2z + 128} otherwise (z the bit length of 5^-q), then truncated to 128 bits.
         */
        static long[] build() {
            long[] t = new long[2 * (LARGEST_POWER - SMALLEST_POWER + 1)];
            BigInteger five = BigInteger.valueOf(5);
            BigInteger p = BigInteger.ONE;
            for (int q = 0; q <= LARGEST_POWER; q++) {
                put(t, q, truncate(p));
                p = p.multiply(five);
            }
            p = five;
            for (int q = -1; q >= SMALLEST_POWER; q--) {
                int z = p.bitLength();
                int b = q >= -27 ? z + 127 : 2 * z + 128;
                put(t, q, truncate(BigInteger.ONE.shiftLeft(b).divide(p).add(BigInteger.ONE)));
                p = p.multiply(five);
            }
            return t;
        }

        /** {@code v} shifted left or right so that it has exactly 128 bits (bits shifted out are dropped). */
        private static BigInteger truncate(BigInteger v) {
            int excess = v.bitLength() - 128;
            return excess >= 0 ? v.shiftRight(excess) : v.shiftLeft(-excess);
        }

        private static void put(long[] t, int q, BigInteger v) {
            int i = 2 * (q - SMALLEST_POWER);
            t[i] = v.shiftRight(64).longValue();
            t[i + 1] = v.longValue();
        }
    }
}
