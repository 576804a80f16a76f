/**
 * Frontiers: the exact mandate frontier (corner portfolios by the critical line method, each a certified
 * solution, and exact points on a grid of targets), the unconstrained closed-form frontier, and the frontier of a
 * general mandate sampled by the numerical QP, behind the
 * facade {@link org.isorisk.engine.frontier.Frontiers}. Grids are {@link org.isorisk.engine.frontier.Grid}
 * values. No I/O here.
 */
package org.isorisk.engine.frontier;
