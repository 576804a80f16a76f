/**
 * One class per command, each a picocli {@code @Command} implementing {@code Callable<Integer>} through
 * {@link org.isorisk.cli.commands.BaseCommand}: parse the options, build the engine's request, call the engine,
 * hand the result to a view in {@code org.isorisk.cli.render}. Register a new command in
 * {@link org.isorisk.cli.IsoriskCommand}.
 */
package org.isorisk.cli.commands;
