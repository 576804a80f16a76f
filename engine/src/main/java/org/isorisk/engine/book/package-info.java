/**
 * A book of portfolios: one job ({@code solve}, {@code rebalance} or {@code stress}) for each row of a book file,
 * the same code for every engine that runs it (in process through {@link org.isorisk.engine.book.BookRunner} on
 * the caller's threads, or in the Spark module's partitions). {@link org.isorisk.engine.book.Book} reads and checks
 * the book file as a stream ({@link org.isorisk.engine.book.BookColumns}: its columns and overrides),
 * {@link org.isorisk.engine.book.BookJob} runs one row through the engine's own front doors exactly as the single
 * commands do (bit for bit the same answer), and {@link org.isorisk.engine.book.BookTables} is the schema of the
 * results and the text of their CSV rows. A row with bad input or no solution is a result with its status and the
 * single command's one-line message; it never stops the others.
 */
package org.isorisk.engine.book;
