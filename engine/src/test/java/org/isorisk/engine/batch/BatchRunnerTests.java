package org.isorisk.engine.batch;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.LongStream;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Test;

/** {@link BatchRunner}: input order, a fixed-order reduction, bounded work in flight, failures and cancellation. */
class BatchRunnerTests {

    private static final ExecutorService FOUR = Executors.newFixedThreadPool(4);

    @AfterAll
    static void stop() {
        FOUR.shutdownNow();
    }

    /** A floating-point sum, whose value depends on the order of the additions. */
    private static final BatchRunner.Reduction<Double, Double> SUM = new BatchRunner.Reduction<>() {
        @Override
        public Double identity() {
            return 0.0;
        }

        @Override
        public Double add(Double total, Double x) {
            return total + x;
        }
    };

    /** Values of wildly different scale (so that a sum in another order differs), with a random pause each. */
    private static double job(long i) {
        SplittableRandom r = new SplittableRandom(i);
        if (r.nextInt(50) == 0) {
            try {
                Thread.sleep(1);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
        return Math.pow(10, r.nextInt(-12, 12)) * (r.nextDouble() - 0.5);
    }

    @Test
    void resultsArriveInInputOrderAndTheTotalIsTheSameOnAnyNumberOfThreads() {
        int n = 5000;
        double sequential = 0;
        for (long i = 0; i < n; i++) {
            sequential += job(i);
        }
        for (ExecutorService ex : new ExecutorService[] {null, FOUR}) {
            for (int batch : new int[] {1, 7, 64}) {
                List<Long> order = new ArrayList<>();
                List<Long> firsts = new ArrayList<>();
                BatchRunner.Outcome<Double> o = BatchRunner.run(LongStream.range(0, n).boxed().iterator(),
                        i -> job(i), ex, new BatchSettings(4, batch, 1000, n), SUM, c -> {
                            firsts.add(c.first());
                            for (int k = 0; k < c.results().size(); k++) {
                                assertEquals(job(c.first() + k), c.results().get(k));
                                order.add(c.first() + k);
                            }
                        }, null, null);
                assertEquals(LongStream.range(0, n).boxed().toList(), order);
                assertEquals(List.of(0L, 1000L, 2000L, 3000L, 4000L), firsts);
                assertEquals(Double.doubleToLongBits(sequential), Double.doubleToLongBits(o.total()),
                        "the same bits on " + (ex == null ? 1 : 4) + " threads, batch " + batch);
                assertEquals(n, o.done());
                assertFalse(o.cancelled());
            }
        }
    }

    @Test
    void workInFlightStaysBoundedWhateverTheNumberOfInputs() {
        AtomicInteger read = new AtomicInteger();
        AtomicInteger delivered = new AtomicInteger();
        int[] most = {0};
        java.util.Iterator<Integer> inputs = new java.util.Iterator<>() {
            @Override
            public boolean hasNext() {
                return read.get() < 100_000;
            }

            @Override
            public Integer next() {
                most[0] = Math.max(most[0], read.incrementAndGet() - delivered.get());
                return read.get();
            }
        };
        BatchRunner.run(inputs, i -> i, FOUR, new BatchSettings(4, 10, 50, -1), null,
                c -> delivered.addAndGet(c.results().size()), null, null);
        assertEquals(100_000, delivered.get());
        // at most 2·4 + 1 batches in flight, the one being read, and a chunk being filled
        assertTrue(most[0] <= (2 * 4 + 2) * 10 + 50, "most jobs read but not delivered: " + most[0]);
    }

    @Test
    void aFailingJobStopsTheRunAfterDeliveringWhatCameBeforeIt() {
        List<Long> got = new ArrayList<>();
        IllegalStateException boom = new IllegalStateException("bug in job 777");
        IllegalStateException e = assertThrows(IllegalStateException.class, () -> BatchRunner.run(
                LongStream.range(0, 10_000).boxed().iterator(), i -> {
                    if (i == 777) {
                        throw boom;
                    }
                    return i;
                }, FOUR, new BatchSettings(4, 10, 100, -1), null, c -> got.addAll(c.results()), null, null));
        assertSame(boom, e);
        assertEquals(LongStream.range(0, 770).boxed().toList(), got);
    }

    @Test
    void cancellingDeliversEveryStartedBatchAndSaysSo() {
        Cancellation cancel = new Cancellation();
        List<Long> got = new ArrayList<>();
        BatchRunner.Outcome<Double> o = BatchRunner.run(LongStream.range(0, 1_000_000).boxed().iterator(), i -> i,
                FOUR, new BatchSettings(2, 100, 1000, 1_000_000), null, c -> {
                    got.addAll(c.results());
                    if (c.first() >= 5000) {
                        cancel.cancel();
                    }
                }, null, cancel);
        assertTrue(o.cancelled());
        assertEquals(got.size(), o.done());
        assertEquals(LongStream.range(0, got.size()).boxed().toList(), got);
        assertTrue(got.size() >= 6000 && got.size() < 1_000_000, "stopped early: " + got.size());
    }

    @Test
    void progressCountsRateAndTimeLeft() {
        List<Progress> seen = new ArrayList<>();
        BatchRunner.run(LongStream.range(0, 1000).boxed().iterator(), i -> i, null,
                new BatchSettings(1, 100, 250, 1000), null, null, seen::add, null);
        Progress last = seen.get(seen.size() - 1);
        assertEquals(1000, last.done());
        assertEquals(1000, last.total());
        assertEquals(0.0, last.secondsLeft());
        Progress mid = seen.get(4);
        assertEquals(500, mid.done());
        assertTrue(mid.perSecond() > 0 && mid.secondsLeft() >= 0, mid.toString());
        assertEquals(mid.elapsedSeconds() * (1000 - 500) / 500, mid.secondsLeft(), 1e-9 * mid.secondsLeft() + 1e-12);
    }
}
