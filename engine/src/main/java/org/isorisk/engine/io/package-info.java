/**
 * Input: the one CSV reader ({@link org.isorisk.engine.io.Csv}) that keeps spreadsheet row numbers and header
 * names, the readers of the project's own layouts (expected returns, covariance or volatilities + correlation,
 * weights and holdings, histories of prices or returns, the assumption tables {@code estimate} and the repair take)
 * with their validation ({@link org.isorisk.engine.io.UniverseLoader}, {@link org.isorisk.engine.io.PortfolioReader},
 * {@link org.isorisk.engine.io.HistoryReader}, {@link org.isorisk.engine.io.AssumptionTables}), the YAML mandate
 * policy ({@link org.isorisk.engine.io.PolicyReader}) and stress scenarios
 * ({@link org.isorisk.engine.io.ScenarioFile}) that name the line and key of every error, and the
 * {@link org.isorisk.engine.io.Provenance} of inputs (files with their SHA-256, the as-of date). Every error is an
 * {@link org.isorisk.engine.error.InputException} naming file, row, column, asset, value and a fix. Values leave
 * this package in decimals, whatever {@link org.isorisk.engine.io.Units} they arrived in. Nothing here writes:
 * results are rendered in notebooks-export and the command line, and written by the command line.
 */
package org.isorisk.engine.io;
