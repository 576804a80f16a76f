package org.isorisk.cli.options;

import java.nio.file.Path;
import java.util.Optional;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import picocli.CommandLine.Option;

/** {@code --out FILE}: the result goes to a file, written atomically, instead of standard output. */
public final class OutOption {

    @OutputPath(RunFiles.Kind.FILE)
    @Option(names = "--out", paramLabel = "FILE",
            description = "Write the result to FILE instead of standard output (atomically: written to a temporary "
                    + "file beside it and moved into place, so a failed run leaves no partial file). FILE must not be "
                    + "one of the inputs, and its folder must exist.")
    Path out;

    /** The output file, if one was given. */
    public Optional<Path> out() {
        return Optional.ofNullable(out);
    }
}
