/**
 * isorisk's engine: every computation, table I/O and validation behind the command line, the charts and
 * the committee pack. The numerical packages ({@code solve}, {@code linalg}, {@code risk}, {@code model},
 * {@code frontier}, {@code synthetic}) do no I/O; {@link org.isorisk.engine.solve.Allocator} is the one front
 * door for solving, {@link org.isorisk.engine.frontier.Frontiers} the one for frontiers.
 */
package org.isorisk.engine;
