/**
 * Views of single commands' results for people (tables), spreadsheets (CSV, through
 * {@code notebooks.report.CsvWriter}) and scripts (JSON, in the shapes of {@link org.isorisk.cli.json.ResultJson}),
 * locale-independent, each ending with the caution; the reports of {@code estimate}
 * ({@link org.isorisk.cli.render.EstimateReport}) and of the repair ({@link org.isorisk.cli.render.RepairReport}).
 * No arithmetic here: every number printed comes from an engine value.
 */
package org.isorisk.cli.render;
