package org.isorisk.cli.options;

import picocli.CommandLine.Option;

/** {@code --format table|csv|json}. */
public final class FormatOption {

    @Option(names = "--format", paramLabel = "FORMAT", converter = Format.Converter.class,
            completionCandidates = Format.Names.class, defaultValue = "table",
            description = "Output format: ${COMPLETION-CANDIDATES} (default: ${DEFAULT-VALUE}).")
    Format format = Format.TABLE;

    /** The chosen format. */
    public Format format() {
        return format;
    }
}
