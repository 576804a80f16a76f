/**
 * isorisk's engine: it reads the inputs (with their validation, in {@code io}) and does every computation behind
 * the command line, the charts and the committee pack; it renders nothing and writes no files (notebooks-export
 * and the command line do). The numerical packages ({@code solve}, {@code linalg}, {@code risk}, {@code model},
 * {@code frontier}, {@code synthetic}, {@code estimate}, {@code stress}, {@code rebalance}) do no I/O;
 * {@link org.isorisk.engine.solve.Allocator} is the one front door for solving,
 * {@link org.isorisk.engine.frontier.Frontiers} the one for frontiers.
 */
package org.isorisk.engine;
