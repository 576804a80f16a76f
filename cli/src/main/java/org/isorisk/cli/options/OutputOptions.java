package org.isorisk.cli.options;

import java.nio.file.Path;
import java.util.Optional;
import picocli.CommandLine.Mixin;

/**
 * {@code --format FORMAT} and {@code --out FILE}, in that order: the output of every command that prints one result
 * view. A command mixes it in as {@code @Mixin OutputOptions output;} and ends with
 * {@code emit(view, output.out())}; {@code BaseCommand} finds the format by {@link FormatOption#NAME}.
 */
public final class OutputOptions {

    @Mixin
    FormatOption format;

    @Mixin
    OutOption out;

    /** The chosen format. */
    public Format format() {
        return format.format();
    }

    /** The output file, if one was given. */
    public Optional<Path> out() {
        return out.out();
    }
}
