package org.isorisk.cli.files;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.OffsetDateTime;

/**
 * A child process for {@link PackFolderTests}: starts writing a pack into {@code args[0]} and hangs midway in
 * one file, so that the test can interrupt it the way Ctrl-C or a kill does.
 */
public final class SlowPackMain {
    private SlowPackMain() {
    }

    public static void main(String[] args) {
        PackFolder f = new PackFolder("0.1.0-test", OffsetDateTime.now());
        f.add("first.txt", out -> out.write("complete\n".getBytes(StandardCharsets.UTF_8)));
        f.add("second.txt", out -> {
            out.write("half".getBytes(StandardCharsets.UTF_8));
            out.flush();
            try {
                Thread.sleep(120_000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
        PackFolderTests.commit(f, Path.of(args[0]), false);
    }
}
