/**
 * Dense symmetric linear algebra the solvers need: Cholesky factorisation with triangular solves, and
 * extreme eigenvalues for condition numbers. No I/O.
 */
package org.isorisk.engine.linalg;
