/**
 * Benchmarks of isorisk, run in-process by {@code bench/run}: a registry of named cases
 * ({@link org.isorisk.bench.Cases}), shared timing and memory measurement ({@link org.isorisk.bench.Timing}),
 * generated problems ({@link org.isorisk.bench.FactorModel}) and the optional numpy reference
 * ({@link org.isorisk.bench.NumpyReference}). Figures are printed, never asserted in tests.
 */
package org.isorisk.bench;
