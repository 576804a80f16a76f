/**
 * Tables and their CSV form: typed tables for people ({@link org.isorisk.notebooks.report.Table}: text, percent,
 * decimal and amount columns) and the project's one CSV writer ({@link org.isorisk.notebooks.report.CsvWriter}:
 * {@code # key: value} lines, quoting, full-precision numbers, and the spreadsheet formula guard for the tables
 * people open). Everything here writes to a {@link java.io.Writer} it is given; nothing reads or chooses files.
 */
package org.isorisk.notebooks.report;
