package org.isorisk.engine.rebalance;

/** Solves a lifted rebalance problem; throws {@code NoSolutionException} when it is infeasible. */
interface LiftedSolver {
    /**
     * @param p    the problem
     * @param warm a previous solution of a nearby problem (same shape), or null
     */
    QpPoint solve(Lifted p, QpPoint warm);
}
