/**
 * A book of portfolios on Apache Spark: {@link org.isorisk.spark.BookOnSpark} reads the book and the assumptions
 * through Hadoop file systems ({@link org.isorisk.spark.HadoopFile}), runs the engine's own book job
 * ({@code org.isorisk.engine.book.BookJob}, the code {@code isorisk batch} runs in process) in every partition,
 * and writes the same results table, in book order, as CSV and Parquet. Launched with {@code spark-submit}; Spark
 * is a provided dependency.
 */
package org.isorisk.spark;
