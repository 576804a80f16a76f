package org.isorisk.engine.random;

/**
 * The xoshiro256++ generator of Blackman &amp; Vigna ("Scrambled linear pseudorandom number generators", ACM
 * Transactions on Mathematical Software 47(4), 2021): 256 bits of state, period 2^256 − 1, output
 * {@code rotl(s0 + s3, 23) + s0}. Written out here, integer arithmetic only, so that its numbers are the same on
 * every JDK; the tests compare it bit for bit with the JDK 17 implementation of the same algorithm.
 *
 * <p>It deliberately does not implement {@code java.util.random.RandomGenerator}: that interface's default
 * methods (Gaussian, exponential, bounded draws) are the JDK's algorithms and would make results depend on the
 * JDK. Its normal draws are {@link Gaussian}'s. Not thread-safe: one instance per stream and thread; get
 * instances from {@link RandomStreams}.
 */
public final class Xoshiro256PlusPlus {
    /** 2^-53: turns the top 53 bits of a draw into a double in [0, 1). */
    private static final double UNIT = 0x1.0p-53;
    /** 2^-52: the cell width of {@link #nextOpenDouble()}. */
    private static final double OPEN_UNIT = 0x1.0p-52;

    private long s0;
    private long s1;
    private long s2;
    private long s3;

    /**
     * A generator with the given state (not all zero; the all-zero state is the one fixed point).
     *
     * @throws IllegalArgumentException when every word is zero
     */
    Xoshiro256PlusPlus(long s0, long s1, long s2, long s3) {
        if ((s0 | s1 | s2 | s3) == 0) {
            throw new IllegalArgumentException("the all-zero state is not a valid xoshiro256++ state");
        }
        this.s0 = s0;
        this.s1 = s1;
        this.s2 = s2;
        this.s3 = s3;
    }

    /** A generator whose state is four successive SplitMix64 outputs from {@code key} (the authors' seeding). */
    static Xoshiro256PlusPlus seededBy(long key) {
        SplitMix64 sm = new SplitMix64(key);
        // mix64 is a bijection and the four inputs differ, so at most one of the four words can be zero.
        return new Xoshiro256PlusPlus(sm.nextLong(), sm.nextLong(), sm.nextLong(), sm.nextLong());
    }

    /** The next 64 random bits. */
    public long nextLong() {
        long result = Long.rotateLeft(s0 + s3, 23) + s0;
        long t = s1 << 17;
        s2 ^= s0;
        s3 ^= s1;
        s1 ^= s2;
        s0 ^= s3;
        s2 ^= t;
        s3 = Long.rotateLeft(s3, 45);
        return result;
    }

    /** A uniform double in [0, 1): the top 53 bits of {@link #nextLong()} times 2^-53. */
    public double nextDouble() {
        return (nextLong() >>> 11) * UNIT;
    }

    /**
     * A uniform double strictly inside (0, 1): {@code (k + ½)·2^-52} for the top 52 bits k, the midpoints of
     * 2^52 equal cells, so that an inverse distribution function never sees 0 or 1. (With 53 bits, {@code k + ½}
     * would need 54 significant bits and the largest cell would round to 1; with 52 every midpoint is exact,
     * from 2^-53 to 1 − 2^-53, and the normal draws reach about ±8.2.)
     */
    public double nextOpenDouble() {
        return ((nextLong() >>> 12) + 0.5) * OPEN_UNIT;
    }

    /**
     * A uniform integer in [0, bound), exactly unbiased: Lemire's multiply-and-reject method (D. Lemire, "Fast
     * random integer generation in an interval", ACM Transactions on Modeling and Computer Simulation 29(1),
     * 2019), on the top 32 bits of each draw.
     *
     * @param bound exclusive upper limit, 1 ≤ bound ≤ 2^31 − 1
     */
    public int nextInt(int bound) {
        if (bound <= 0) {
            throw new IllegalArgumentException("bound must be positive: " + bound);
        }
        long m = (nextLong() >>> 32) * bound;
        long low = m & 0xffffffffL;
        if (low < bound) {
            long threshold = (0x100000000L - bound) % bound; // 2^32 mod bound
            while (low < threshold) {
                m = (nextLong() >>> 32) * bound;
                low = m & 0xffffffffL;
            }
        }
        return (int) (m >>> 32);
    }

    /** A standard normal draw by {@link Gaussian#inverseCdf(double)} of {@link #nextOpenDouble()}: one draw each. */
    public double nextGaussian() {
        return Gaussian.inverseCdf(nextOpenDouble());
    }

    /** Fills {@code out} with standard normal draws, in order. */
    public void nextGaussians(double[] out) {
        for (int i = 0; i < out.length; i++) {
            out[i] = Gaussian.inverseCdf(nextOpenDouble());
        }
    }
}
