/**
 * Table I/O: reading histories and assumption tables from CSV, writing the estimated tables and the
 * data-quality and repair reports (text and JSON), and writing a set of output files atomically. Readers turn
 * every problem into an {@link org.isorisk.engine.error.InputException} naming file, row, column and what would
 * fix it; writers write to a {@link java.io.Writer} they are given, and {@link org.isorisk.engine.io.AtomicOutput}
 * is the one place that chooses paths and moves files.
 */
package org.isorisk.engine.io;
