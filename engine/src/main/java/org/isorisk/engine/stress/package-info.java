/**
 * Stress tests of the return target and of the assumptions: a sweep of return targets under the mandate
 * (minimum volatility, marginal risk of the target, binding constraints, feasibility, the highest achievable
 * target, where the binding set changes), and scenarios that shock volatilities, correlations, expected returns
 * or replace the covariance, each repaired to a valid correlation matrix when the shock breaks positive
 * semi-definiteness. Work is spread over a bounded pool of threads. No I/O here.
 */
package org.isorisk.engine.stress;
