/**
 * Risk of a given portfolio: volatility, marginal and component contributions (which add up to the volatility,
 * Euler's theorem for a function homogeneous of degree one), each asset's share of risk, tracking error against
 * a benchmark with the same decomposition of active risk, and a summary of the assumptions' risk and
 * conditioning. No I/O.
 */
package org.isorisk.engine.risk;
