package org.isorisk.engine.batch;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.Executor;
import java.util.function.Function;

/**
 * Runs one job per input on a caller's executor and hands the results back in input order. The inputs are read
 * on the calling thread (a reader of a file need not be thread-safe), cut into batches of
 * {@link BatchSettings#batchSize()} that run on the executor, and delivered on the calling thread, in input order,
 * in chunks of {@link BatchSettings#chunkSize()}: to the {@link Reduction}, whose total is therefore the same on any
 * number of threads and in any order of completion, and to the {@link Sink}, which may commit each chunk (a file
 * written atomically) so that a later run can resume after the last one. The runner creates no threads: with no
 * executor it runs every job on the calling thread.
 *
 * <p>A job should turn the failures of its input into results (a portfolio with bad input is a row with its
 * message); an exception it throws anyway stops the run: no new batch starts, the batches under way finish, the
 * chunks before the failing batch are delivered, and the exception is rethrown. Cancellation stops the run the same
 * way, without an exception, and every result computed is delivered.
 */
public final class BatchRunner {
    private BatchRunner() {
    }

    /** A complete run of consecutive results: the first's position among the inputs (zero-based) and the results. */
    public record Chunk<O>(long first, List<O> results) {
        public Chunk {
            results = List.copyOf(results);
        }
    }

    /** Receives chunks on the calling thread, in input order. */
    @FunctionalInterface
    public interface Sink<O> {
        void accept(Chunk<O> chunk);

        /** A sink that keeps nothing. */
        static <O> Sink<O> none() {
            return c -> { };
        }
    }

    /**
     * A total folded over the results in input order, on the calling thread: the same value whatever the number of
     * threads (e.g. counts by status, a sum in floating point).
     */
    public interface Reduction<O, A> {
        A identity();

        A add(A total, O result);
    }

    /**
     * What a run did.
     *
     * @param done      results delivered
     * @param cancelled true when it stopped on a {@link Cancellation} before the inputs ran out
     * @param total     the reduction over every delivered result
     */
    public record Outcome<A>(long done, boolean cancelled, A total) {
    }

    /**
     * Runs {@code job} on every input.
     *
     * @param inputs   read on the calling thread, one at a time
     * @param job      thread-safe; run on the executor's threads
     * @param executor the caller's threads; null to run every job on the calling thread
     * @param progress told after each delivered batch, on the calling thread; null for none
     * @param cancel   checked before each batch starts; null for none
     */
    public static <I, O, A> Outcome<A> run(Iterator<? extends I> inputs, Function<? super I, ? extends O> job,
                                           Executor executor, BatchSettings settings, Reduction<? super O, A> reduction,
                                           Sink<? super O> sink, Progress.Listener progress, Cancellation cancel) {
        Progress.Listener listener = progress == null ? Progress.Listener.NONE : progress;
        Delivery<O, A> out = new Delivery<>(settings, reduction, sink, listener);
        int inFlight = executor == null ? 1 : 2 * settings.parallelism() + 1;
        ArrayDeque<CompletableFuture<List<O>>> window = new ArrayDeque<>();
        RuntimeException failure = null;
        boolean cancelled = false;
        try {
            while (true) {
                if (cancel != null && cancel.isCancelled()) {
                    cancelled = inputs.hasNext();
                    break;
                }
                List<I> batch = new ArrayList<>(settings.batchSize());
                while (batch.size() < settings.batchSize() && inputs.hasNext()) {
                    batch.add(inputs.next());
                }
                if (batch.isEmpty()) {
                    break;
                }
                window.add(executor == null ? CompletableFuture.completedFuture(apply(job, batch))
                        : CompletableFuture.supplyAsync(() -> apply(job, batch), executor));
                while (!window.isEmpty() && (window.size() >= inFlight || window.peek().isDone())) {
                    out.deliver(join(window.poll()));
                }
            }
        } catch (RuntimeException e) {
            failure = e;
        }
        while (!window.isEmpty()) {
            CompletableFuture<List<O>> f = window.poll();
            if (failure == null) {
                try {
                    out.deliver(join(f));
                } catch (RuntimeException e) {
                    failure = e;
                }
            } else {
                try {
                    f.join(); // let it finish: nothing keeps running behind the caller's back
                } catch (RuntimeException ignored) {
                    // the first failure is the one reported
                }
            }
        }
        if (failure != null) {
            if (!out.sinkFailed) {
                try {
                    out.emit(); // the complete results before the failure
                } catch (RuntimeException e) {
                    failure.addSuppressed(e);
                }
            }
            throw failure;
        }
        out.finish();
        return new Outcome<>(out.done, cancelled, out.total);
    }

    private static <I, O> List<O> apply(Function<? super I, ? extends O> job, List<I> batch) {
        List<O> results = new ArrayList<>(batch.size());
        for (I in : batch) {
            results.add(job.apply(in));
        }
        return results;
    }

    private static <O> List<O> join(CompletableFuture<List<O>> f) {
        try {
            return f.join();
        } catch (CompletionException e) {
            if (e.getCause() instanceof RuntimeException re) {
                throw re;
            }
            if (e.getCause() instanceof Error err) {
                throw err;
            }
            throw e;
        }
    }

    /** The calling thread's side: the reduction, the current chunk, progress. */
    private static final class Delivery<O, A> {
        final BatchSettings settings;
        final Reduction<? super O, A> reduction;
        final Sink<? super O> sink;
        final Progress.Listener progress;
        final long started = System.nanoTime();
        A total;
        long done;
        long chunkFirst;
        List<O> chunk;
        boolean sinkFailed;

        Delivery(BatchSettings settings, Reduction<? super O, A> reduction, Sink<? super O> sink,
                 Progress.Listener progress) {
            this.settings = settings;
            this.reduction = reduction;
            this.sink = sink;
            this.progress = progress;
            this.total = reduction == null ? null : reduction.identity();
            this.chunk = new ArrayList<>(Math.min(settings.chunkSize(), 1 << 16));
        }

        void deliver(List<O> results) {
            for (O r : results) {
                if (reduction != null) {
                    total = reduction.add(total, r);
                }
                chunk.add(r);
                done++;
                if (chunk.size() == settings.chunkSize()) {
                    emit();
                }
            }
            progress.update(Progress.of(done, settings.total(), started, System.nanoTime()));
        }

        @SuppressWarnings("unchecked")
        void emit() {
            if (!chunk.isEmpty() && sink != null) {
                try {
                    ((Sink<O>) sink).accept(new Chunk<>(chunkFirst, chunk));
                } catch (RuntimeException e) {
                    sinkFailed = true;
                    throw e;
                }
            }
            chunkFirst += chunk.size();
            chunk = new ArrayList<>(Math.min(settings.chunkSize(), 1 << 16));
        }

        void finish() {
            emit();
            progress.update(Progress.of(done, settings.total(), started, System.nanoTime()));
        }
    }
}
