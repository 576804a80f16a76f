package org.isorisk.cli.options;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.SourceFile;

/**
 * The one place the CLI fingerprints a file that an engine reader has read without returning its
 * {@link SourceFile} (the policy, the stress scenarios): its role, name and SHA-256, to be recorded among the
 * result's inputs with {@code Provenance.withInput}. The CSV inputs carry their own fingerprint from {@code Csv}.
 */
public final class Fingerprint {
    private Fingerprint() {
    }

    /**
     * The fingerprint of {@code file}.
     *
     * @param role   what the file was read as, e.g. {@code policy}; shown in outputs and in the error
     * @param file   the path as given on the command line
     * @param option the option that named the file, e.g. {@code --policy}; the error's fix names it
     * @throws InputException naming the file when it cannot be read
     */
    public static SourceFile of(String role, Path file, String option) {
        try {
            return SourceFile.of(role, file, Files.readAllBytes(file));
        } catch (IOException e) {
            throw InputException.of("cannot read the " + role + " file: " + e.getMessage()).file(file.toString())
                    .fix("check the path given to " + option).build();
        }
    }
}
