/**
 * Options shared by several commands, as picocli {@code @Mixin}s: the input files and their units
 * ({@link org.isorisk.cli.options.InputOptions}), the output format ({@link org.isorisk.cli.options.FormatOption})
 * and the output file ({@link org.isorisk.cli.options.OutOption}), plus the strict number converter used by
 * every numeric option.
 */
package org.isorisk.cli.options;
