package org.isorisk.engine.random;

/**
 * A family of random streams addressed by (seed, stream index): one stream per draw, so that a draw's numbers
 * depend only on the seed and its index, whatever thread computes it and however many threads there are.
 *
 * <p>Construction: the key of stream s is the SplitMix64 output number s of a generator seeded with the seed,
 * {@code key_s = mix64(seed + (s + 1)γ)} ({@link SplitMix64#output(long, long)}), and the stream is an
 * xoshiro256++ generator whose state is four SplitMix64 outputs from that key (the seeding Blackman &amp; Vigna
 * 2021 recommend). Because {@code mix64} is a bijection, distinct streams of one seed (indices below 2^64) have
 * distinct keys, hence distinct starting states; an overlap of two streams' sequences within the lengths used
 * here (at most ~10^9 numbers each out of a period of 2^256 − 1) has negligible probability.
 *
 * <p>Immutable and safe to share; each call of {@link #stream(long)} returns a new generator positioned at the
 * start of that stream.
 *
 * @param seed the user's seed, recorded with every result so that a run can be repeated
 */
public record RandomStreams(long seed) {

    /** The generator of stream {@code index} (e.g. the draw number), at its start. */
    public Xoshiro256PlusPlus stream(long index) {
        if (index < 0) {
            throw new IllegalArgumentException("stream index must not be negative: " + index);
        }
        return Xoshiro256PlusPlus.seededBy(SplitMix64.output(seed, index));
    }
}
