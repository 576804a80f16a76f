package org.isorisk.cli.files;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * A child process for {@link AtomicWriteInterruptTests}: starts one write through {@link AtomicWrite} into
 * {@code args[1]} and hangs midway, so that the test can interrupt it the way Ctrl-C or a kill does.
 * {@code args[0]} is {@code text} ({@link AtomicWrite#file}), {@code bytes} ({@link AtomicWrite#bytes}) or
 * {@code folder} ({@link AtomicWrite#folder(Path, boolean, AtomicWrite.FolderBody)}, replacing an earlier output).
 */
public final class SlowWriteMain {
    private SlowWriteMain() {
    }

    public static void main(String[] args) {
        Path target = Path.of(args[1]);
        switch (args[0]) {
            case "text" -> AtomicWrite.file(target, w -> {
                w.write("half");
                w.flush();
                hang();
            });
            case "bytes" -> AtomicWrite.bytes(target, out -> {
                out.write("half".getBytes(StandardCharsets.UTF_8));
                out.flush();
                hang();
            });
            case "folder" -> AtomicWrite.folder(target, true, d -> {
                Files.writeString(d.resolve("first.txt"), "complete\n");
                Files.writeString(d.resolve("second.txt"), "half");
                hang();
            });
            default -> throw new IllegalArgumentException(args[0]);
        }
    }

    private static void hang() throws IOException {
        try {
            Thread.sleep(120_000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted", e);
        }
    }
}
