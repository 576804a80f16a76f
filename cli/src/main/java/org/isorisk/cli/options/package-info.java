/**
 * Options shared by several commands, as picocli {@code @Mixin}s: the input files and their units
 * ({@link org.isorisk.cli.options.InputOptions}), the mandate policy ({@link org.isorisk.cli.options.PolicyOption}),
 * the output format and file ({@link org.isorisk.cli.options.OutputOptions}, made of
 * {@link org.isorisk.cli.options.FormatOption} and {@link org.isorisk.cli.options.OutOption}) and the chart file of
 * the chart subcommands ({@link org.isorisk.cli.options.ChartFileOptions}), plus the strict number converter used by
 * every numeric option.
 */
package org.isorisk.cli.options;
