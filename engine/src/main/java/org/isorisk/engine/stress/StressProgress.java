package org.isorisk.engine.stress;

/** Told after each solved target, from worker threads (implementations must be thread-safe). */
@FunctionalInterface
public interface StressProgress {
    /**
     * @param done  solves finished so far
     * @param total solves in the whole run
     * @param what  what was just solved, e.g. "crisis, target 6.50 %"
     */
    void step(int done, int total, String what);

    /** Reports nothing. */
    StressProgress NONE = (d, t, w) -> { };
}
