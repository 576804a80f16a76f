/**
 * Draws of plausible assumption sets, for how far an allocation moves under estimation error (Jorion 1992,
 * "Portfolio Optimization in Practice", FAJ 48(1), resamples the assumptions this way): parametric draws
 * ({@link org.isorisk.engine.resampling.ParametricDraws}: T periods simulated from N(μ, Σ) and re-estimated with
 * the same estimator) and the bootstrap of a history's rows
 * ({@link org.isorisk.engine.resampling.BootstrapDraws}: whole dates resampled together, optionally in moving
 * blocks), both behind {@link org.isorisk.engine.resampling.AssumptionDraws}; and exact quantiles of the results
 * ({@link org.isorisk.engine.resampling.Quantiles}, linear interpolation as numpy's default).
 * <p>
 * Each draw is a pure function of (seed, draw index, inputs): its random numbers come from its own stream of
 * {@link org.isorisk.engine.random.RandomStreams}, so draws can be computed on any number of threads, in any order,
 * or one alone, with the same bits. No I/O.
 */
package org.isorisk.engine.resampling;
