package org.isorisk.engine.random;

/**
 * SplitMix64 (Steele, Lea &amp; Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014): a
 * Weyl sequence {@code s += γ} with the golden-ratio increment γ, each state passed through the bijective
 * finaliser {@link #mix64(long)}. Used here only to turn 64-bit seeds into generator states, as the authors of
 * xoshiro recommend (Blackman &amp; Vigna 2021, section 4). The same algorithm is behind
 * {@code java.util.SplittableRandom}, which the tests use as an independent implementation.
 *
 * <p>Not thread-safe: one instance per thread.
 */
public final class SplitMix64 {
    /** The increment γ: the odd integer nearest 2^64/φ, φ the golden ratio. */
    static final long GOLDEN_GAMMA = 0x9e3779b97f4a7c15L;

    private long state;

    /** A generator whose first output is {@code mix64(seed + γ)}. */
    public SplitMix64(long seed) {
        this.state = seed;
    }

    /** The next 64 random bits. */
    public long nextLong() {
        state += GOLDEN_GAMMA;
        return mix64(state);
    }

    /**
     * The output number {@code index} (zero-based) of a generator seeded with {@code seed}, without stepping
     * through the ones before it: {@code mix64(seed + (index + 1)γ)}.
     */
    public static long output(long seed, long index) {
        return mix64(seed + (index + 1) * GOLDEN_GAMMA);
    }

    /**
     * The finaliser: Stafford's "variant 13" of the 64-bit MurmurHash3 mix, a bijection of the 64-bit
     * integers, so distinct inputs always give distinct outputs.
     */
    public static long mix64(long z) {
        z = (z ^ (z >>> 30)) * 0xbf58476d1ce4e5b9L;
        z = (z ^ (z >>> 27)) * 0x94d049bb133111ebL;
        return z ^ (z >>> 31);
    }
}
