/**
 * The {@code isorisk} command line: {@link org.isorisk.cli.Main} (the only place that exits the process),
 * the root command {@link org.isorisk.cli.IsoriskCommand} where every command is registered, the named
 * {@link org.isorisk.cli.ExitCode}s and the {@link org.isorisk.cli.ErrorHandler} that turns errors into one
 * line on stderr (and a JSON object in JSON format). The command line holds no mathematics: it parses, calls
 * the engine, and formats what the engine returns.
 */
package org.isorisk.cli;
