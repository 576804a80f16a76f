package org.isorisk.engine.model;

/**
 * Optional knobs of the solvers, with documented defaults ({@link #defaults()}).
 *
 * @param closedFormTolerance certificate threshold for closed-form solutions; default 1e-10 (relative),
 *                            what a backward-stable Cholesky solve reaches on a Σ of condition number up to ~1e5
 * @param numericalTolerance  certificate threshold for iterative/active-set solutions; default 1e-7
 * @param rankTolerance       relative pivot below which constraint rows count as linearly dependent; default
 *                            1e-12 of the largest pivot (double precision leaves ~1e-16 noise, squared norms ~1e-12)
 * @param maxIterations       iteration cap of active-set and critical-line methods; default 100 000
 * @param threads             worker threads for dense linear algebra and sweeps; default: available processors
 */
public record SolverSettings(double closedFormTolerance, double numericalTolerance, double rankTolerance,
                             int maxIterations, int threads) {

    public SolverSettings {
        if (!(closedFormTolerance > 0) || !(numericalTolerance > 0) || !(rankTolerance > 0)) {
            throw new IllegalArgumentException("tolerances must be positive");
        }
        if (maxIterations < 1 || threads < 1) {
            throw new IllegalArgumentException("maxIterations and threads must be at least 1");
        }
    }

    public static SolverSettings defaults() {
        return new SolverSettings(1e-10, 1e-7, 1e-12, 100_000, Math.max(1, Runtime.getRuntime().availableProcessors()));
    }

    public SolverSettings withThreads(int t) {
        return new SolverSettings(closedFormTolerance, numericalTolerance, rankTolerance, maxIterations, t);
    }
}
