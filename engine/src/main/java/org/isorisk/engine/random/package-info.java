/**
 * Reproducible random numbers for draws of assumption sets: a family of independent streams addressed by
 * (seed, stream index) ({@link org.isorisk.engine.random.RandomStreams}), the xoshiro256++ generator written out
 * ({@link org.isorisk.engine.random.Xoshiro256PlusPlus}) seeded through SplitMix64
 * ({@link org.isorisk.engine.random.SplitMix64}), and a Gaussian transform of our own, the inverse normal
 * distribution function of Wichura's AS241 ({@link org.isorisk.engine.random.Gaussian}).
 * <p>
 * Everything here is integer arithmetic and {@link java.lang.StrictMath}, so a seed gives the same numbers bit
 * for bit on any JDK, and a stream's numbers depend only on its seed and index, never on the thread that draws
 * them or on how many threads there are. Nothing here uses {@code java.util.Random} or the JDK's
 * {@code RandomGenerator} implementations, whose algorithms (e.g. of {@code nextGaussian}) may change between
 * releases. No I/O.
 */
package org.isorisk.engine.random;
