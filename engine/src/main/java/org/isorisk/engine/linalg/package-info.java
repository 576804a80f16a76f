/**
 * Dense symmetric linear algebra the solvers need: Cholesky factorisation with triangular solves, a Cholesky
 * factor that grows and shrinks one row/column at a time (the critical line method's free block), and extreme
 * eigenvalues for condition numbers. No I/O.
 */
package org.isorisk.engine.linalg;
