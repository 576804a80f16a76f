package org.isorisk.cli.files;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;
import org.isorisk.notebooks.ExternalTools;
import org.isorisk.notebooks.Fixtures;
import org.isorisk.notebooks.PackLayout;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class PackFolderTests {

    private static PackFolder folder(Path input) {
        PackFolder f = new PackFolder("0.1.0-test", OffsetDateTime.parse("2025-06-30T12:00:00Z"));
        f.input("expected-returns", input);
        return PackFiles.addTo(f, Fixtures.content(Fixtures.PLAIN));
    }

    /** Commits {@code f} as a command run does: {@code target} declared as the run's {@code --out} folder. */
    static PackFolder.Result commit(PackFolder f, Path target, boolean force) {
        try (RunFiles run = RunFiles.begin()) {
            run.output("--out", target, RunFiles.Kind.FOLDER, force);
            return f.commit(run, target);
        }
    }

    private static Path input(Path dir) throws IOException {
        Path in = dir.resolve("inputs");
        Files.createDirectories(in);
        Path f = in.resolve("mu.csv");
        Files.writeString(f, "asset,expected_return\nCash,0.02\n");
        return f;
    }

    private static List<String> listing(Path dir) throws IOException {
        try (Stream<Path> s = Files.walk(dir)) {
            return s.map(p -> dir.relativize(p).toString()).sorted().toList();
        }
    }

    @Test
    void theManifestListsEveryFileWithItsSha256(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        Path target = dir.resolve("pack");
        PackFolder.Result r = commit(folder(in), target, false);
        JsonNode m = new ObjectMapper().readTree(target.resolve(PackLayout.MANIFEST).toFile());
        assertEquals("isorisk", m.get("tool").asText());
        assertEquals("0.1.0-test", m.get("tool_version").asText());
        assertEquals("2025-06-30T12:00Z", m.get("created").asText());
        assertTrue(m.get("caution").asText().startsWith("Illustrative"));
        // every file on disk but the manifest is listed, and nothing else
        List<String> onDisk;
        try (Stream<Path> s = Files.walk(target)) {
            onDisk = s.filter(Files::isRegularFile).map(p -> target.relativize(p).toString())
                    .filter(p -> !p.equals(PackLayout.MANIFEST)).sorted().toList();
        }
        List<String> listed = new java.util.ArrayList<>();
        m.get("files").forEach(f -> listed.add(f.get("path").asText()));
        assertEquals(onDisk, listed.stream().sorted().toList());
        assertEquals(r.files().size() - 1, listed.size(), "the result also reports the manifest");
        // Outside reference: coreutils sha256sum over the same files and the input.
        StringBuilder cmd = new StringBuilder();
        for (JsonNode f : m.get("files")) {
            Path p = target.resolve(f.get("path").asText());
            assertEquals(Files.size(p), f.get("bytes").asLong());
            assertEquals(sha256sum(p), f.get("sha256").asText(), f.get("path").asText());
        }
        assertEquals(sha256sum(in), m.get("inputs").get(0).get("sha256").asText());
        assertEquals("mu.csv", m.get("inputs").get(0).get("name").asText(), "the name alone, no machine path");
        assertTrue(cmd.length() == 0);
    }

    private static String sha256sum(Path p) {
        ExternalTools.Run r = ExternalTools.run(p.getParent(), 30, "sha256sum", p.toString());
        assertEquals(0, r.exit(), r.err());
        return r.out().substring(0, 64);
    }

    @Test
    void anEarlierPackIsLeftAloneWithoutForce(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        Path target = dir.resolve("pack");
        commit(folder(in), target, false);
        List<String> before = listing(dir);
        String manifest = Files.readString(target.resolve(PackLayout.MANIFEST));
        InputException e = assertThrows(InputException.class, () -> commit(folder(in), target, false));
        assertTrue(e.getMessage().contains("the output folder exists and is not empty"), e.getMessage());
        assertTrue(e.getMessage().contains("add --force"), e.getMessage());
        assertEquals(manifest, Files.readString(target.resolve(PackLayout.MANIFEST)));
        assertEquals(before, listing(dir), "nothing changed and nothing added beside it");
    }

    @Test
    void forceReplacesAnEarlierPackButNotAnUnrelatedFolder(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        Path target = dir.resolve("pack");
        commit(folder(in), target, false);
        Files.writeString(target.resolve("stale.txt"), "old");
        commit(folder(in), target, true);
        assertFalse(Files.exists(target.resolve("stale.txt")), "the old pack is replaced whole");
        assertTrue(Files.exists(target.resolve(PackLayout.NOTEBOOK)));

        Path other = dir.resolve("other");
        Files.createDirectories(other);
        Files.writeString(other.resolve("precious.txt"), "keep");
        InputException e = assertThrows(InputException.class, () -> commit(folder(in), other, true));
        assertTrue(e.getMessage().contains("was not written by isorisk, so it is left alone"), e.getMessage());
        assertEquals("keep", Files.readString(other.resolve("precious.txt")));
        try (Stream<Path> s = Files.list(dir)) {
            assertEquals(List.of("inputs", "other", "pack"), s.map(p -> p.getFileName().toString()).sorted().toList(),
                    "no temporary or old sibling is left behind");
        }
    }

    @Test
    void anEmptyFolderIsFilled(@TempDir Path dir) throws IOException {
        Path target = dir.resolve("pack");
        Files.createDirectories(target);
        commit(folder(input(dir)), target, false);
        assertTrue(Files.exists(target.resolve(PackLayout.MANIFEST)));
    }

    @Test
    void aFailureMidwayLeavesNoTargetAndNoTemporaryFolder(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        PackFolder f = folder(in);
        f.add("tables/zz-broken.csv", out -> {
            out.write("half a line".getBytes(StandardCharsets.UTF_8));
            throw new IllegalStateException("simulated failure while writing");
        });
        Path target = dir.resolve("pack");
        assertThrows(IllegalStateException.class, () -> commit(f, target, false));
        assertFalse(Files.exists(target));
        try (Stream<Path> s = Files.list(dir)) {
            assertEquals(List.of("inputs"), s.map(p -> p.getFileName().toString()).toList());
        }
    }

    @Test
    void anInterruptedRunLeavesNothingBehind(@TempDir Path dir) throws Exception {
        // The child JVM hangs while writing; an interrupt must leave neither the target nor the temporary sibling.
        Path target = dir.resolve("pack");
        String javaBin = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Process p = new ProcessBuilder(javaBin, "-cp", System.getProperty("java.class.path"),
                SlowPackMain.class.getName(), target.toString()).redirectErrorStream(true).start();
        long deadline = System.nanoTime() + 30_000_000_000L;
        Path temp = null;
        while (temp == null && System.nanoTime() < deadline) {
            try (Stream<Path> s = Files.list(dir)) {
                temp = s.filter(q -> q.getFileName().toString().startsWith(".pack.tmp-"))
                        .filter(q -> Files.exists(q.resolve("second.txt"))).findFirst().orElse(null);
            }
            Thread.sleep(50);
        }
        assertTrue(temp != null, "the child started writing");
        // Ctrl-C is SIGINT; the JVM runs its shutdown hooks for it as for SIGTERM.
        Process kill = new ProcessBuilder("kill", "-INT", Long.toString(p.pid())).start();
        assertEquals(0, kill.waitFor(), "kill -INT");
        assertTrue(p.waitFor(30, java.util.concurrent.TimeUnit.SECONDS), "the child stopped on SIGINT");
        try (Stream<Path> s = Files.list(dir)) {
            assertEquals(List.of(), s.toList(), "no target and no temporary folder remain");
        }
    }

    @Test
    void aFailureWhileReplacingKeepsTheEarlierPack(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        Path target = dir.resolve("pack");
        commit(folder(in), target, false);
        String manifest = Files.readString(target.resolve(PackLayout.MANIFEST));
        PackFolder f = folder(in);
        f.add("zz-broken.txt", out -> {
            throw new IOException("disk full (simulated)");
        });
        InputException e = assertThrows(InputException.class, () -> commit(f, target, true));
        assertTrue(e.getMessage().contains("cannot be written") && e.getMessage().contains("disk full (simulated)"), e.getMessage());
        assertEquals(manifest, Files.readString(target.resolve(PackLayout.MANIFEST)));
    }

    @Test
    void inputsAreReadButNeverChanged(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        Files.setLastModifiedTime(in, FileTime.fromMillis(1_000_000_000_000L));
        byte[] before = Files.readAllBytes(in);
        commit(folder(in), dir.resolve("pack"), false);
        assertEquals(new String(before, StandardCharsets.UTF_8), Files.readString(in));
        assertEquals(1_000_000_000_000L, Files.getLastModifiedTime(in).toMillis());
    }

    @Test
    void aTargetThatHoldsAnInputIsRefused(@TempDir Path dir) throws IOException {
        Path in = input(dir);
        Path target = in.getParent();
        // as in a command run: the inputs of the options are registered before the outputs are declared
        InputException e = assertThrows(InputException.class, () -> {
            try (RunFiles run = RunFiles.begin()) {
                run.input("expected-returns file", in).output("--out", target, RunFiles.Kind.FOLDER, true);
            }
        });
        assertEquals(target + ": the --out folder holds the expected-returns file " + in + ", and would be "
                + "replaced as a whole; an output never replaces an input of the same run; fix: choose another --out "
                + "folder that holds none of the inputs", e.getMessage());
        assertTrue(Files.exists(in));
    }

    @Test
    void aMissingInputIsReportedByNameBeforeAnythingIsWritten(@TempDir Path dir) {
        PackFolder f = folder(dir.resolve("nope.csv"));
        InputException e = assertThrows(InputException.class, () -> commit(f, dir.resolve("pack"), false));
        assertTrue(e.getMessage().contains("nope.csv"), e.getMessage());
        assertFalse(Files.exists(dir.resolve("pack")));
    }
}
