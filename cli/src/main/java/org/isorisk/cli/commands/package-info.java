/**
 * One class per command, each a picocli {@code @Command} implementing {@code Callable<Integer>} through
 * {@link org.isorisk.cli.commands.BaseCommand}: parse the options, build the engine's request (or hand it to a use
 * case in {@code cli.usecase}), call the engine, hand the result to a view in {@code cli.render} and any file to
 * {@code cli.files}. The named {@link org.isorisk.cli.commands.ExitCode}s a command returns and what the error
 * handler asks of it ({@link org.isorisk.cli.commands.Reporting}) live here too. Register a new command in the root
 * command's {@code COMMANDS} list ({@code org.isorisk.cli.IsoriskCommand}); nothing here refers back to the root.
 */
package org.isorisk.cli.commands;
