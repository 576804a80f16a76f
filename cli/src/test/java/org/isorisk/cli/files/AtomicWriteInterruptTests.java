package org.isorisk.cli.files;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.function.Predicate;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Ctrl-C (SIGINT, for which the JVM runs its shutdown hooks as for SIGTERM) during each kind of write: a child
 * JVM ({@link SlowWriteMain}) hangs with its temporary half written, is interrupted, and must leave the earlier
 * version exactly as it was and no temporary file or folder beside it.
 */
class AtomicWriteInterruptTests {

    @TempDir
    Path dir;

    @Test
    void anInterruptedTextFileLeavesTheEarlierFileAndNoTemporary() throws Exception {
        Path target = dir.resolve("result.json");
        Files.writeString(target, "earlier");
        interrupt("text", target, p -> p.getFileName().toString().matches("\\.result\\.json\\..*\\.tmp")
                && size(p) > 0);
        assertEquals(List.of("result.json"), names());
        assertEquals("earlier", Files.readString(target));
    }

    @Test
    void anInterruptedBinaryFileLeavesNothingWhenThereWasNoEarlierFile() throws Exception {
        Path target = dir.resolve("chart.png");
        interrupt("bytes", target, p -> p.getFileName().toString().matches("\\.chart\\.png\\..*\\.tmp")
                && size(p) > 0);
        assertEquals(List.of(), names());
    }

    @Test
    void anInterruptedReplacementOfAnEarlierOutputFolderKeepsItWhole() throws Exception {
        Path target = dir.resolve("out");
        AtomicWrite.folder(target, d -> Files.writeString(d.resolve("earlier.txt"), "earlier"));
        interrupt("folder", target, p -> p.getFileName().toString().startsWith(".out.tmp-")
                && Files.exists(p.resolve("second.txt")));
        assertEquals(List.of("out"), names());
        try (Stream<Path> s = Files.list(target)) {
            assertEquals(List.of(AtomicWrite.MARKER, "earlier.txt"),
                    s.map(p -> p.getFileName().toString()).sorted().toList());
        }
        assertEquals("earlier", Files.readString(target.resolve("earlier.txt")));
    }

    /** Starts the child, waits until its temporary matches {@code started}, sends SIGINT and waits for the end. */
    private void interrupt(String mode, Path target, Predicate<Path> started) throws Exception {
        String javaBin = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Process p = new ProcessBuilder(javaBin, "-cp", System.getProperty("java.class.path"),
                SlowWriteMain.class.getName(), mode, target.toString()).redirectErrorStream(true).start();
        try {
            long deadline = System.nanoTime() + 30_000_000_000L;
            Path temp = null;
            while (temp == null && System.nanoTime() < deadline && p.isAlive()) {
                try (Stream<Path> s = Files.list(dir)) {
                    temp = s.filter(started).findFirst().orElse(null);
                }
                Thread.sleep(20);
            }
            assertNotNull(temp, "the child started writing");
            Process kill = new ProcessBuilder("kill", "-INT", Long.toString(p.pid())).start();
            assertEquals(0, kill.waitFor(), "kill -INT");
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "the child stopped on SIGINT");
            // 128 + SIGINT (2): the JVM ran its shutdown hooks and exited on the signal.
            assertEquals(130, p.exitValue());
        } finally {
            p.destroyForcibly();
        }
    }

    private List<String> names() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }

    private static long size(Path p) {
        try {
            return Files.size(p);
        } catch (IOException e) {
            return -1;
        }
    }
}
