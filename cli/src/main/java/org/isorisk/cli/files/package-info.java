/**
 * Files: the one place that chooses paths and publishes results on disk. The pack folder
 * ({@link org.isorisk.cli.files.PackFolder}: files written into a temporary sibling, the manifest with the SHA-256
 * of every input and file, an atomic rename into place; {@link org.isorisk.cli.files.PackFiles} adds what
 * {@code notebooks.PackLayout} renders) and the assumption tables and reports that {@code estimate} and
 * {@code check --repair} write ({@link org.isorisk.cli.files.AssumptionFiles}).
 */
package org.isorisk.cli.files;
