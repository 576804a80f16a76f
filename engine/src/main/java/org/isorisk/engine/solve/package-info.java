/**
 * Solvers behind one front door, {@link org.isorisk.engine.solve.Allocator}: the closed form from the
 * Lagrangian (KKT system through a Cholesky factor of Σ) and, for mandates with bounds and inequalities, the
 * bounded methods. Every solution carries a {@link org.isorisk.engine.model.Certificate} computed by
 * {@link org.isorisk.engine.solve.Kkt}, the one certificate of the project. Multipliers follow the single
 * convention ∂V*∂limit. No I/O here.
 */
package org.isorisk.engine.solve;
