/**
 * Files: the one place that chooses paths and publishes results on disk. {@link org.isorisk.cli.files.AtomicWrite}
 * writes every file and folder into a temporary sibling and moves it into place (one shutdown hook cleans up after
 * Ctrl-C); the pack folder ({@link org.isorisk.cli.files.PackFolder}: the manifest with the SHA-256 of every input
 * and file; {@link org.isorisk.cli.files.PackFiles} adds what {@code notebooks.PackLayout} renders) and the
 * assumption tables and reports that {@code estimate} and {@code check --repair} write
 * ({@link org.isorisk.cli.files.AssumptionFiles}) go through it. A book run's output folder
 * ({@link org.isorisk.cli.files.BatchFolder}) is committed chunk by chunk, each chunk's journal through
 * {@code AtomicWrite}, so that a run stopped by a crash or Ctrl-C resumes after its last complete chunk. Inputs are
 * only ever read.
 */
package org.isorisk.cli.files;
