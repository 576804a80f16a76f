/**
 * Files: the one place that checks paths and publishes results on disk. {@link org.isorisk.cli.files.RunFiles} holds
 * a run's inputs and outputs and the rule between them (an output never replaces an input of the same run: same
 * path, symbolic or hard link, or a folder holding an input; exit 2 naming both): {@code BaseCommand} registers every
 * {@code Path} option as an input and declares every {@link org.isorisk.cli.files.OutputPath} option as an output
 * before the work ({@link org.isorisk.cli.files.OptionPaths}), and files named inside inputs are registered where
 * they are read ({@link org.isorisk.cli.files.RunFiles#reading}). Publication goes through {@code RunFiles} to
 * {@link org.isorisk.cli.files.AtomicWrite}, which writes every file and folder into a temporary sibling and moves
 * it into place (one shutdown hook cleans up after Ctrl-C); the pack folder ({@link org.isorisk.cli.files.PackFolder}:
 * the manifest with the SHA-256 of every input and file; {@link org.isorisk.cli.files.PackFiles} adds what
 * {@code notebooks.PackLayout} renders) and the assumption tables and reports that {@code estimate} and
 * {@code check --repair} write ({@link org.isorisk.cli.files.AssumptionFiles}) go through it. Inputs are only ever
 * read. No other package of the command line writes a file ({@code DependencyRulesTests}).
 */
package org.isorisk.cli.files;
