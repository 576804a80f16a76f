/**
 * Frontiers: the exact mandate frontier (corner portfolios by the critical line method, each a certified
 * solution, and exact points on a grid of targets) and the unconstrained closed-form frontier, behind the
 * facade {@link org.isorisk.engine.frontier.Frontiers}. Grids are {@link org.isorisk.engine.frontier.Grid}
 * values. No I/O here.
 */
package org.isorisk.engine.frontier;
