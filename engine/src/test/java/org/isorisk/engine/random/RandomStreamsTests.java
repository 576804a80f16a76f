package org.isorisk.engine.random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;
import org.apache.commons.math3.distribution.UniformRealDistribution;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.junit.jupiter.api.Test;

/**
 * The generators against independent implementations of the same published algorithms in the JDK, and the
 * streams' independence of the thread count.
 */
class RandomStreamsTests {

    @Test
    void splitMixMatchesTheJdksSplittableRandomBitForBit() {
        // java.util.SplittableRandom implements SplitMix (Steele, Lea & Flood 2014): with a seed, its nextLong is
        // mix64(seed + kγ) for k = 1, 2, ... — an independent implementation of the same algorithm.
        for (long seed : new long[] {0L, 1L, -1L, 42L, 0x9e3779b97f4a7c15L, Long.MIN_VALUE}) {
            SplitMix64 ours = new SplitMix64(seed);
            SplittableRandom jdk = new SplittableRandom(seed);
            for (int i = 0; i < 1000; i++) {
                long expected = jdk.nextLong();
                assertEquals(expected, SplitMix64.output(seed, i), "random access, seed " + seed + " output " + i);
                assertEquals(expected, ours.nextLong(), "seed " + seed + " output " + i);
            }
        }
    }

    @Test
    void xoshiroMatchesTheJdkImplementationBitForBit() {
        // JDK 17's jdk.random.Xoshiro256PlusPlus (Blackman & Vigna 2021), reached through RandomGeneratorFactory
        // with a 32-byte seed. Its seed conversion shifts the bytes into four big-endian words without masking
        // them, so a byte of 0x80 or more would be sign-extended: states whose bytes are all below 0x80 pass
        // through unchanged, and those are the states compared here.
        SplittableRandom states = new SplittableRandom(7);
        for (int c = 0; c < 50; c++) {
            long[] s = new long[4];
            byte[] bytes = new byte[32];
            for (int w = 0; w < 4; w++) {
                s[w] = states.nextLong() & 0x7f7f7f7f7f7f7f7fL;
                for (int k = 0; k < 8; k++) {
                    bytes[8 * w + k] = (byte) (s[w] >>> (56 - 8 * k));
                }
            }
            if ((s[0] | s[1] | s[2] | s[3]) == 0) {
                continue;
            }
            Xoshiro256PlusPlus ours = new Xoshiro256PlusPlus(s[0], s[1], s[2], s[3]);
            RandomGenerator jdk = RandomGeneratorFactory.of("Xoshiro256PlusPlus").create(bytes);
            for (int i = 0; i < 10_000; i++) {
                assertEquals(jdk.nextLong(), ours.nextLong(), "state " + c + ", output " + i);
            }
        }
    }

    @Test
    void theAllZeroStateIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> new Xoshiro256PlusPlus(0, 0, 0, 0));
    }

    @Test
    void aStreamIsAPureFunctionOfSeedAndIndex() {
        RandomStreams a = new RandomStreams(20240611L);
        RandomStreams b = new RandomStreams(20240611L);
        assertArrayEquals(longs(a.stream(17), 100), longs(b.stream(17), 100));
        assertArrayEquals(longs(a.stream(17), 100), longs(a.stream(17), 100), "a new generator starts over");
        assertNotEquals(longs(a.stream(17), 1)[0], longs(a.stream(18), 1)[0], "another index, another stream");
        assertNotEquals(longs(a.stream(17), 1)[0], longs(new RandomStreams(20240612L).stream(17), 1)[0],
                "another seed, another stream");
        assertThrows(IllegalArgumentException.class, () -> a.stream(-1));
    }

    @Test
    void drawsAreTheSameBitForBitOnOneAndOnFourThreads() throws Exception {
        RandomStreams streams = new RandomStreams(99);
        int count = 200;
        int length = 2_000;
        long[][] one = drawAll(streams, count, length, 1);
        long[][] four = drawAll(streams, count, length, 4);
        for (int s = 0; s < count; s++) {
            assertArrayEquals(one[s], four[s], "stream " + s);
        }
    }

    /** Normal draws of every stream as raw bits, streams handed out to {@code threads} threads in turn. */
    private static long[][] drawAll(RandomStreams streams, int count, int length, int threads) throws Exception {
        long[][] out = new long[count][];
        ExecutorService pool = Executors.newFixedThreadPool(threads);
        try {
            List<Future<?>> done = new ArrayList<>();
            // Reverse order on several threads, so that the streams are drawn in another order than on one.
            for (int k = 0; k < count; k++) {
                int s = threads == 1 ? k : count - 1 - k;
                done.add(pool.submit(() -> {
                    Xoshiro256PlusPlus g = streams.stream(s);
                    long[] bits = new long[length];
                    for (int i = 0; i < length; i++) {
                        bits[i] = Double.doubleToRawLongBits(g.nextGaussian());
                    }
                    out[s] = bits;
                }));
            }
            for (Future<?> f : done) {
                f.get();
            }
        } finally {
            pool.shutdown();
        }
        return out;
    }

    @Test
    void uniformDoublesPassKolmogorovSmirnovAgainstCommonsMath() {
        Xoshiro256PlusPlus g = new RandomStreams(3).stream(0);
        double[] closed = new double[100_000];
        double[] open = new double[100_000];
        for (int i = 0; i < closed.length; i++) {
            closed[i] = g.nextDouble();
            open[i] = g.nextOpenDouble();
            assertTrue(closed[i] >= 0 && closed[i] < 1 && open[i] > 0 && open[i] < 1);
        }
        // Commons Math's KolmogorovSmirnovTest against its UniformRealDistribution(0, 1).
        KolmogorovSmirnovTest ks = new KolmogorovSmirnovTest();
        UniformRealDistribution u = new UniformRealDistribution(0, 1);
        assertTrue(ks.kolmogorovSmirnovTest(u, closed) > 0.01, "nextDouble");
        assertTrue(ks.kolmogorovSmirnovTest(u, open) > 0.01, "nextOpenDouble");
    }

    @Test
    void boundedIntegersAreUniformByChiSquare() {
        Xoshiro256PlusPlus g = new RandomStreams(5).stream(1);
        for (int bound : new int[] {1, 2, 7, 250, 1_000_003}) {
            int cells = Math.min(bound, 250);
            long[] counts = new long[cells];
            double[] expected = new double[cells];
            int n = 250_000;
            for (int i = 0; i < n; i++) {
                int v = g.nextInt(bound);
                assertTrue(v >= 0 && v < bound, "bound " + bound + ": " + v);
                counts[(int) ((long) v * cells / bound)]++;
            }
            if (cells < 2) {
                continue;
            }
            for (int c = 0; c < cells; c++) {
                // Cell c holds the values v with floor(v·cells/bound) = c.
                long lo = ((long) c * bound + cells - 1) / cells;
                long hi = ((long) (c + 1) * bound + cells - 1) / cells;
                expected[c] = (double) n * (hi - lo) / bound;
            }
            // Commons Math's chi-square goodness-of-fit test.
            double p = new ChiSquareTest().chiSquareTest(expected, counts);
            assertTrue(p > 0.001, "bound " + bound + ": p = " + p);
        }
        assertThrows(IllegalArgumentException.class, () -> g.nextInt(0));
    }

    private static long[] longs(Xoshiro256PlusPlus g, int count) {
        long[] out = new long[count];
        for (int i = 0; i < count; i++) {
            out[i] = g.nextLong();
        }
        return out;
    }
}
