package org.isorisk.engine.batch;

/**
 * A request to stop a run, shared between the code that asks (a Ctrl-C handler, a user interface) and the runner,
 * which checks it before each batch it starts: batches already started finish and are delivered, so whatever was
 * delivered is complete. Thread-safe.
 */
public final class Cancellation {
    private volatile boolean cancelled;

    /** Asks the run to stop after the batches already started. */
    public void cancel() {
        cancelled = true;
    }

    /** True once {@link #cancel()} was called. */
    public boolean isCancelled() {
        return cancelled;
    }
}
