package org.isorisk.engine.batch;

/**
 * How far a run is, as its progress callback sees it.
 *
 * @param done        jobs finished and delivered
 * @param total       jobs in the run when known (a book scanned beforehand), else -1
 * @param elapsedSeconds time since the run started
 * @param perSecond   jobs delivered per second so far (NaN before the first)
 * @param secondsLeft estimated time to the end: the jobs left at the rate so far; NaN when the total is unknown
 */
public record Progress(long done, long total, double elapsedSeconds, double perSecond, double secondsLeft) {

    /** Told on the calling thread after each delivered chunk and at the end. */
    @FunctionalInterface
    public interface Listener {
        void update(Progress p);

        /** A listener that ignores every update. */
        Listener NONE = p -> { };
    }

    static Progress of(long done, long total, long startNanos, long nowNanos) {
        double elapsed = (nowNanos - startNanos) / 1e9;
        double rate = done > 0 && elapsed > 0 ? done / elapsed : Double.NaN;
        double left = total >= 0 && rate > 0 ? (total - done) / rate : Double.NaN;
        return new Progress(done, total, elapsed, rate, left);
    }
}
