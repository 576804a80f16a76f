/**
 * Solvers behind one front door, {@link org.isorisk.engine.solve.Allocator}: the closed form from the
 * Lagrangian (KKT system through a Cholesky factor of Σ); Markowitz's critical line method for the budget,
 * per-asset bounds and fixed weights (every corner portfolio of the mandate frontier, exact targets between
 * them); and, for groups and other inequalities, the numerical QP. The parametric active-set method
 * ({@code ParametricQp}, not yet behind the front door) walks the exact frontier under any linear rows and
 * bounds, with a linear term in the objective. Every solution carries a {@link org.isorisk.engine.model.Certificate} computed by
 * {@link org.isorisk.engine.solve.Kkt}, the one certificate of the project. Multipliers follow the single
 * convention ∂V*∂limit. No I/O here.
 */
package org.isorisk.engine.solve;
