/**
 * The {@code isorisk} command line's entry: {@link org.isorisk.cli.Main} (the only place that exits the process),
 * {@link org.isorisk.cli.Cli} (the configured {@code CommandLine}), the root command
 * {@link org.isorisk.cli.IsoriskCommand} where every command is registered, and the
 * {@link org.isorisk.cli.ErrorHandler} that turns errors into one line on stderr (and a JSON object in JSON
 * format) with a named exit code. The command line holds no mathematics: it parses, calls the engine, and formats
 * what the engine returns. Sub-packages: {@code commands}, {@code options}, {@code usecase} (which analyses, in which
 * order), {@code render} (terminal and CSV views), {@code json} (the JSON contract's shapes), {@code files}
 * (atomic publication, the pack folder and its manifest). Dependencies point from here down, never back.
 */
package org.isorisk.cli;
