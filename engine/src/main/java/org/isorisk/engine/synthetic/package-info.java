/**
 * Generated, fully synthetic test problems with fixed seeds (dense factor-model covariances and the mandates
 * the benchmarks use), shared by the engine's tests and the benchmark module so that both measure the same
 * problems. Nothing here is real data. No I/O.
 */
package org.isorisk.engine.synthetic;
