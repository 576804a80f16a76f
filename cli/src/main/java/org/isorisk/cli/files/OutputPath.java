package org.isorisk.cli.files;

import java.lang.annotation.Documented;
import java.lang.annotation.ElementType;
import java.lang.annotation.Retention;
import java.lang.annotation.RetentionPolicy;
import java.lang.annotation.Target;

/**
 * Marks a {@code Path} option as a place the command writes to ({@code --out}, {@code --out-dir}, {@code --chart}).
 * Every other {@code Path} option of a command is one of its inputs: {@link OptionPaths} registers both with the
 * run's {@link RunFiles} before the command starts its work, so an output that would replace an input, an unknown
 * chart extension, a missing or read-only folder or an existing folder that may not be replaced is refused before
 * anything is read or computed, and a command can publish only to a target declared this way.
 */
@Documented
@Retention(RetentionPolicy.RUNTIME)
@Target(ElementType.FIELD)
public @interface OutputPath {

    /** What the option names: a result file, a chart file or a folder written as a whole. */
    RunFiles.Kind value();

    /**
     * For a folder: the name of the boolean option (e.g. {@code --force}) that allows replacing a non-empty earlier
     * isorisk output; empty (the default) when an earlier isorisk output is always replaced. A folder that isorisk
     * did not write is never replaced.
     */
    String force() default "";
}
