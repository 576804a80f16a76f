package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.math.BigDecimal;
import java.math.BigInteger;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.List;
import java.util.Locale;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The full-precision path of {@link Decimals#fast} (Eisel–Lemire, Lemire 2021) against the reference
 * {@link Double#parseDouble} (correctly rounded, ties to even: JLS §3.10.2, IEEE 754): wherever it answers the bits
 * must be the reference's; it must decline where the reference overflows, beyond 19 significant digits and
 * beyond the exponent range.
 */
class EiselLemireTests {

    /** Inputs checked, and how many of them the fast path answered. */
    private long checked;
    private long answered;

    /** Compares one input with the reference; a fast answer must be bit-identical, infinity must be declined. */
    private void check(String s) {
        checked++;
        double reference = Double.parseDouble(s);
        double fast = Decimals.fast(s);
        if (Double.isNaN(fast)) {
            return;
        }
        answered++;
        if (Double.isInfinite(reference)) {
            fail("'" + s + "' overflows in the reference but the fast path answered " + fast);
        }
        if (Double.doubleToRawLongBits(reference) != Double.doubleToRawLongBits(fast)) {
            fail("'" + s + "': reference " + reference + " (" + Long.toHexString(Double.doubleToRawLongBits(reference))
                    + "), fast " + fast + " (" + Long.toHexString(Double.doubleToRawLongBits(fast)) + ")");
        }
    }

    /** Checks that every one of these was answered (all are within 19 digits, in range and finite). */
    private void checkAnswered(String s) {
        long before = answered;
        check(s);
        assertEquals(before + 1, answered, "'" + s + "' was declined");
    }

    private static double randomFinite(SplittableRandom rnd) {
        while (true) {
            double x = Double.longBitsToDouble(rnd.nextLong());
            if (Double.isFinite(x)) {
                return x;
            }
        }
    }

    @Test
    void shortestRepresentationsOfRandomDoublesReadBackBitForBit() {
        // Double.toString writes the shortest decimal that reads back to the same double (16–17 digits mostly).
        SplittableRandom rnd = new SplittableRandom(11);
        for (int k = 0; k < 800_000; k++) {
            double x = k % 2 == 0 ? randomFinite(rnd) : (rnd.nextDouble() - 0.5) * Math.pow(10, rnd.nextInt(10) - 6);
            String s = Double.toString(x);
            checkAnswered(s);
            assertEquals(Double.doubleToRawLongBits(x), Double.doubleToRawLongBits(Decimals.fast(s)), s);
        }
    }

    @Test
    void sixteenToEighteenDigitExponentFormatsAgreeWithTheReference() {
        // %.16e–%.18e: 17–19 significant digits, as numpy's savetxt default (%.18e) writes them.
        SplittableRandom rnd = new SplittableRandom(12);
        for (int k = 0; k < 300_000; k++) {
            double x = k % 3 == 0 ? randomFinite(rnd) : rnd.nextDouble() * 0.01 - 0.002;
            String s = String.format(Locale.ROOT, "%." + (16 + k % 3) + "e", x);
            checkAnswered(s);
        }
    }

    @Test
    void randomSeventeenToNineteenDigitSignificandsAgreeAcrossTheWholeExponentRange() {
        SplittableRandom rnd = new SplittableRandom(13);
        StringBuilder b = new StringBuilder();
        long inRange = 0;
        for (int k = 0; k < 1_000_000; k++) {
            int digits = 17 + k % 3;
            b.setLength(0);
            if (rnd.nextBoolean()) {
                b.append('-');
            }
            b.append((char) ('1' + rnd.nextInt(9)));
            for (int d = 1; d < digits; d++) {
                b.append((char) ('0' + rnd.nextInt(10)));
            }
            // value = significand · 10^q with q from below the smallest to above the largest power handled
            int q = rnd.nextInt(EiselLemire.SMALLEST_POWER - 10, EiselLemire.LARGEST_POWER + 11);
            int point = rnd.nextInt(digits + 1); // digits after the decimal point
            if (point > 0) {
                b.insert(b.length() - point, '.');
            }
            int e = q + point;
            if (Math.abs(e) > 999) {
                continue;
            }
            b.append(rnd.nextBoolean() ? 'e' : 'E').append(e);
            if (q >= EiselLemire.SMALLEST_POWER && q <= EiselLemire.LARGEST_POWER) {
                inRange++;
            }
            check(b.toString());
        }
        // Only the reference's overflows and the paper's rare fallback may be declined inside the range.
        assertTrue(answered > 0.95 * inRange, "answered " + answered + " of " + inRange + " in range");
    }

    @Test
    void exactHalfwayPointsRoundToEvenAndTheirNeighboursRoundAway() {
        // Ties exist within 19 digits only near q in [-4, 23] (Lemire 2021, section on round-to-even): build
        // midpoints t·2^j of neighbouring doubles with t = 5^r·s odd in [2^53, 2^54), exactly, with BigDecimal.
        SplittableRandom rnd = new SplittableRandom(14);
        BigInteger low = BigInteger.ONE.shiftLeft(53);
        int ties = 0;
        for (int k = 0; k < 200_000; k++) {
            int r = rnd.nextInt(24);
            BigInteger five = BigInteger.valueOf(5).pow(r);
            BigInteger s = low.add(BigInteger.valueOf(rnd.nextLong(1L << 53))).divide(five).setBit(0);
            BigInteger t = five.multiply(s);
            if (t.bitLength() != 54) {
                continue;
            }
            int j = rnd.nextInt(-6, 41);
            BigDecimal mid = j >= 0 ? new BigDecimal(t.shiftLeft(j))
                    : new BigDecimal(t).divide(new BigDecimal(BigInteger.ONE.shiftLeft(-j)));
            mid = mid.stripTrailingZeros();
            if (mid.precision() > 19) {
                continue;
            }
            ties++;
            String text = mid.toString();
            checkAnswered(text);
            // ties to even: the neighbour below is (t-1)/2·2^(j+1), even exactly when (t-1)/2 is even
            BigInteger below = t.subtract(BigInteger.ONE).shiftRight(1);
            BigInteger expected = below.testBit(0) ? below.add(BigInteger.ONE) : below;
            double exact = Math.scalb((double) expected.longValueExact(), j + 1);
            assertEquals(exact, Decimals.fast(text), text + " is a tie (ties to even, IEEE 754)");
            if (mid.precision() < 19) {
                // one unit in the 19th digit either side of the tie rounds away from it
                BigDecimal unit = new BigDecimal(BigInteger.ONE, mid.scale() + (19 - mid.precision()));
                checkAnswered(mid.add(unit).toString());
                checkAnswered(mid.subtract(unit).toString());
            }
        }
        assertTrue(ties > 50_000, "only " + ties + " ties built");
    }

    @Test
    void midpointsRoundedToNineteenDigitsAcrossTheRangeAgreeWithTheReference() {
        // The hardest inputs: within one unit in the 19th digit of the exact midpoint between neighbouring
        // doubles (normal and subnormal), where a truncated product is closest to a rounding boundary.
        SplittableRandom rnd = new SplittableRandom(15);
        MathContext[] contexts = {new MathContext(17, RoundingMode.FLOOR), new MathContext(17, RoundingMode.CEILING),
                new MathContext(19, RoundingMode.FLOOR), new MathContext(19, RoundingMode.CEILING)};
        for (int k = 0; k < 60_000; k++) {
            double x = Math.abs(k % 4 == 0 ? Double.longBitsToDouble(rnd.nextLong(1L << 52)) : randomFinite(rnd));
            if (x == Double.MAX_VALUE) {
                continue;
            }
            BigDecimal mid = new BigDecimal(x).add(new BigDecimal(Math.nextUp(x))).divide(BigDecimal.valueOf(2));
            for (MathContext mc : contexts) {
                check(mid.round(mc).toString());
            }
        }
    }

    @Test
    void subnormalsAndTheEdgesOfTheRangeAgreeWithTheReference() {
        SplittableRandom rnd = new SplittableRandom(16);
        for (int k = 0; k < 100_000; k++) {
            double x = Double.longBitsToDouble(rnd.nextLong(1L << 52)); // exponent field 0: subnormal
            checkAnswered(Double.toString(x));
            checkAnswered(String.format(Locale.ROOT, "%.18e", x));
        }
        // Edges (values from the IEEE 754 binary64 format: MIN_VALUE = 2^-1074, MIN_NORMAL = 2^-1022,
        // MAX_VALUE = (2 - 2^-52)·2^1023), written as Double.toString does and just beside.
        for (double x : new double[] {Double.MIN_VALUE, 2 * Double.MIN_VALUE, Double.MIN_NORMAL,
                Math.nextDown(Double.MIN_NORMAL), Math.nextUp(Double.MIN_NORMAL), Double.MAX_VALUE,
                Math.nextDown(Double.MAX_VALUE)}) {
            checkAnswered(Double.toString(x));
            checkAnswered(String.format(Locale.ROOT, "%.18e", x));
            checkAnswered(String.format(Locale.ROOT, "%.18e", -x));
        }
        // half of MIN_VALUE is 2.4703282292062327208...e-324: below it rounds to zero, above to MIN_VALUE
        for (String s : List.of("2.4703282292062327e-324", "2.4703282292062328e-324", "2.470328229206232720e-324",
                "2.470328229206232721e-324", "4.9406564584124654e-324", "1e-323", "3e-324", "2.2250738585072011e-308",
                "2.2250738585072012e-308", "2.2250738585072014e-308", "1.7976931348623157e308",
                "1.7976931348623158e308", "1.797693134862315807e308", "1.797693134862315708e308", "-1e-340",
                "1e-342", "9.99999999999999999e-325")) {
            checkAnswered(s);
        }
        // MAX_VALUE + half an ulp = 1.797693134862315807937...e308 and above overflow: declined
        for (String s : List.of("1.797693134862315808e308", "1.7976931348623159e308", "1.8e308", "9e308",
                "-1e308999")) {
            assertTrue(Double.isNaN(Decimals.fast(s)), s);
        }
    }

    @Test
    void powersOfTenAndZerosAgreeWithTheReference() {
        for (int q = EiselLemire.SMALLEST_POWER; q <= EiselLemire.LARGEST_POWER; q++) {
            // q is the power of the integer significand: 1.000000000000000000e(q+18) = 1000000000000000000·10^q
            checkAnswered("1e" + q);
            if (q + 18 <= 308) {
                checkAnswered("1.000000000000000000e" + (q + 18));
                check("-9.999999999999999999E" + (q + 18)); // overflows at E308
            } else {
                check("1.000000000000000000e" + (q + 18)); // overflow: must be declined
            }
        }
        for (int q = 0; q <= 18; q++) {
            checkAnswered("1" + "0".repeat(q));
        }
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(Decimals.fast("-0.0")));
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(Decimals.fast("-0e-500")));
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(Decimals.fast("-0.000000000000000000000")));
        assertEquals(Double.doubleToRawLongBits(0.0), Double.doubleToRawLongBits(Decimals.fast("0e400")));
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(Decimals.fast("-1e-330")),
                "-1e-330 is below half of MIN_VALUE: negative zero in the reference");
        checkAnswered("-1e-330");
    }

    @Test
    void itDeclinesBeyondNineteenDigitsOutOfRangeExponentsAndMalformedText() {
        for (String s : List.of("12345678901234567890", "0.12345678901234567890", "1.0000000000000000000",
                "1e-343", "1e309", "-1e400", "1e1000", "1.5e", "e17", "1.2.3e4", "1e4e5", "1e+-4",
                "0.12345678901234567e", "", "-", ".", "12345678901234567x", "1_000", "0x1.8p1", "Infinity", "NaN",
                " 1.2345678901234567", "1.2345678901234567 ")) {
            assertTrue(Double.isNaN(Decimals.fast(s)), "'" + s + "' should be declined");
        }
        // 19 digits and exponents at the ends of the range are taken
        checkAnswered("9999999999999999999");
        checkAnswered("1.234567890123456789e-324");
        assertTrue(Double.isNaN(Decimals.fast("1.234567890123456789e-325")), "10^-343 is below the range");
        checkAnswered("1.234567890123456789e308");
    }

    @Test
    void theTableHoldsTruncatedPowersOfFive() {
        // From the table's definition (Lemire 2021): for q ≥ 0 the leading 128 bits of 5^q, exactly; for q < 0
        // the leading 128 bits of 1/5^-q, i.e. floor(2^(z+127) / 5^-q) with z the bit length of 5^-q, or one more.
        long[] t = EiselLemire.Powers.TABLE;
        for (int q = EiselLemire.SMALLEST_POWER; q <= EiselLemire.LARGEST_POWER; q++) {
            int i = 2 * (q - EiselLemire.SMALLEST_POWER);
            BigInteger entry = new BigInteger(1, longsToBytes(t[i], t[i + 1]));
            BigInteger p = BigInteger.valueOf(5).pow(Math.abs(q));
            if (q >= 0) {
                int excess = p.bitLength() - 128;
                BigInteger leading = excess >= 0 ? p.shiftRight(excess) : p.shiftLeft(-excess);
                assertEquals(leading, entry, "q = " + q);
            } else {
                BigInteger floor = BigInteger.ONE.shiftLeft(p.bitLength() + 127).divide(p);
                assertEquals(128, floor.bitLength(), "q = " + q);
                BigInteger d = entry.subtract(floor);
                assertTrue(d.signum() >= 0 && d.compareTo(BigInteger.ONE) <= 0, "q = " + q + ": " + d);
            }
        }
    }

    private static byte[] longsToBytes(long hi, long lo) {
        byte[] b = new byte[16];
        for (int i = 0; i < 8; i++) {
            b[i] = (byte) (hi >>> (56 - 8 * i));
            b[8 + i] = (byte) (lo >>> (56 - 8 * i));
        }
        return b;
    }
}
