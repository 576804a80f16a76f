package org.isorisk.engine.linalg;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The small shared pool of daemon threads behind the parallel kernels: created on first use, idle threads
 * retire after a minute, and the calling thread always does one part itself.
 */
public final class Workers {
    private Workers() {
    }

    private static final AtomicInteger THREAD_NUMBER = new AtomicInteger();
    private static volatile ExecutorService pool;

    /** One part of a split piece of work. */
    public interface Part {
        /** Does part number {@code part}. */
        void run(int part);
    }

    /** True on a thread inside {@link #onCallingThread}: every split runs there, part after part. */
    private static final ThreadLocal<Boolean> CALLER_ONLY = ThreadLocal.withInitial(() -> Boolean.FALSE);

    /**
     * Runs {@code work} with every split of this class done on the calling thread, part after part: for a caller
     * that already runs many independent jobs on its own threads (a book of portfolios) and must not have each
     * job fork again. The results are the same to the last bit, since a split never changes the order of any
     * floating-point operation, only which thread does it.
     */
    public static <T> T onCallingThread(java.util.function.Supplier<T> work) {
        if (CALLER_ONLY.get()) {
            return work.get();
        }
        CALLER_ONLY.set(Boolean.TRUE);
        try {
            return work.get();
        } finally {
            CALLER_ONLY.set(Boolean.FALSE);
        }
    }

    /**
     * Runs parts 1..parts−1 on the pool and part 0 on the calling thread; returns when all are done. Inside
     * {@link #onCallingThread} every part runs on the calling thread, in order.
     */
    public static void run(int parts, Part body) {
        if (parts <= 1 || CALLER_ONLY.get()) {
            for (int p = 0; p < Math.max(1, parts); p++) {
                body.run(p);
            }
            return;
        }
        ExecutorService ex = pool();
        List<Future<?>> futures = new ArrayList<>(parts - 1);
        for (int p = 1; p < parts; p++) {
            int part = p;
            futures.add(ex.submit(() -> body.run(part)));
        }
        body.run(0);
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted during a parallel computation", e);
            } catch (ExecutionException e) {
                throw new IllegalStateException("a worker of a parallel computation failed", e.getCause());
            }
        }
    }

    /**
     * Splits {@code [from, to)} into {@code parts} ranges: equal lengths, or (triangular) equal areas of the
     * lower triangle, where row i costs ∝ (i − from + 1).
     */
    static int[] split(int from, int to, int parts, boolean triangular) {
        int[] b = new int[parts + 1];
        int m = to - from;
        for (int p = 0; p <= parts; p++) {
            double f = (double) p / parts;
            int off = (int) Math.round(triangular ? m * Math.sqrt(f) : m * f);
            b[p] = from + Math.min(m, off);
        }
        b[parts] = to;
        return b;
    }

    private static ExecutorService pool() {
        ExecutorService p = pool;
        if (p == null) {
            synchronized (Workers.class) {
                p = pool;
                if (p == null) {
                    p = Executors.newCachedThreadPool(r -> {
                        Thread th = new Thread(r, "isorisk-linalg-" + THREAD_NUMBER.incrementAndGet());
                        th.setDaemon(true);
                        return th;
                    });
                    pool = p;
                }
            }
        }
        return p;
    }
}
