/**
 * Table input and result output: the one CSV reader ({@link org.isorisk.engine.io.Csv}) that keeps
 * spreadsheet row numbers and header names, the readers of the project's own layouts (expected returns,
 * covariance or volatilities + correlation, weights and holdings, histories of prices or returns) with their
 * validation ({@link org.isorisk.engine.io.UniverseLoader}, {@link org.isorisk.engine.io.PortfolioReader},
 * {@link org.isorisk.engine.io.HistoryReader}), the {@link org.isorisk.engine.io.Provenance} of inputs, the JSON
 * and CSV renderings of results (including the data-quality and repair reports, {@link
 * org.isorisk.engine.io.EstimateReport}, {@link org.isorisk.engine.io.RepairReport}), and atomic file writes. Every
 * error is an {@link org.isorisk.engine.error.InputException} naming file, row, column, asset, value and a fix.
 * Values leave this package in decimals, whatever {@link org.isorisk.engine.io.Units} they arrived in.
 * The YAML mandate policy ({@link org.isorisk.engine.io.PolicyReader}) with its per-asset limits table names
 * the line and key of every error.
 */
package org.isorisk.engine.io;
