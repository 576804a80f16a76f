/**
 * The small unchecked exception hierarchy: {@link org.isorisk.engine.error.IsoriskException} with two
 * branches, bad input ({@link org.isorisk.engine.error.InputException}, carrying file, row, column, asset,
 * value and a fix) and no solution ({@link org.isorisk.engine.error.NoSolutionException}, carrying the
 * constraints involved). The command line maps them to exit codes 2 and 3.
 */
package org.isorisk.engine.error;
