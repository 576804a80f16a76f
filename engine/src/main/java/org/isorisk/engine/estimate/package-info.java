/**
 * From a history of prices or returns to assumptions that are safe to optimise, and repair of broken matrices.
 * <p>
 * {@link org.isorisk.engine.estimate.Estimator} is the front door: returns (simple or log) from a
 * {@link org.isorisk.engine.estimate.History}, frequency detection and annualisation, covariance estimators
 * (sample, exponentially weighted, Ledoit–Wolf shrinkage towards a scaled identity or towards constant
 * correlation), expected returns (historical, supplied, or implied by a reference portfolio) and a data-quality
 * assessment returned as values ({@link org.isorisk.engine.estimate.Issue}). {@link org.isorisk.engine.estimate.Repair}
 * finds the nearest correlation matrix (Higham 2002) for a covariance or correlation matrix that is not positive
 * semi-definite, keeping the volatilities. {@link org.isorisk.engine.estimate.ReturnMoments} runs the estimators on
 * plain arrays (for re-estimating drawn samples); {@link org.isorisk.engine.estimate.Desmoothing} desmooths
 * appraisal-based returns (Geltner 1993) and {@link org.isorisk.engine.estimate.UnequalHistories} combines histories
 * that start at different dates (Stambaugh 1997). No I/O here: reading and writing tables lives in {@code engine.io}.
 */
package org.isorisk.engine.estimate;
