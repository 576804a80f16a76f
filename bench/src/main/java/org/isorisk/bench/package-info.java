/**
 * Benchmarks of isorisk, run in-process by {@code bench/run}: a registry of named cases
 * ({@link org.isorisk.bench.Cases}), shared timing and memory measurement ({@link org.isorisk.bench.Timing}),
 * generated problems (the recipes of {@link org.isorisk.engine.synthetic.FactorModels}) and the optional
 * outside references run in the same benchmark (numpy, {@link org.isorisk.bench.NumpyReference}; CVXOPT,
 * {@link org.isorisk.bench.CvxoptReference}). Figures are printed, never asserted in tests.
 */
package org.isorisk.bench;
