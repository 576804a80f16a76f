/**
 * isorisk's engine: every computation, table I/O and validation behind the command line, the charts and
 * the committee pack. The numerical packages ({@code solve}, {@code linalg}, {@code risk}, {@code model})
 * do no I/O; {@link org.isorisk.engine.solve.Allocator} is the one front door for solving.
 */
package org.isorisk.engine;
