/**
 * Immutable values that flow through the engine: the asset universe (names, expected returns, covariance),
 * the mandate (budget, bounds, groups, general linear constraints, fixed weights), objectives, solutions with
 * their multipliers and certificate, and frontiers. Arrays are copied in and out; every value validates in its
 * constructor. Units everywhere: decimals (0.065 is 6.5 %), annualised.
 */
package org.isorisk.engine.model;
