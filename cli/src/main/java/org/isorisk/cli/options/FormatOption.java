package org.isorisk.cli.options;

import picocli.CommandLine.Option;

/** {@code --format table|csv|json}. */
public final class FormatOption {

    /** The option's name; {@code BaseCommand} finds the chosen format by it, the error handler looks for it. */
    public static final String NAME = "--format";

    @Option(names = NAME, paramLabel = "FORMAT", converter = Format.Converter.class,
            completionCandidates = Format.Names.class, defaultValue = "table",
            description = "Output format: ${COMPLETION-CANDIDATES} (default: ${DEFAULT-VALUE}).")
    Format format = Format.TABLE;

    /** The chosen format. */
    public Format format() {
        return format;
    }
}
