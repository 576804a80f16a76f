package org.isorisk.cli.files;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeFalse;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The run's files: inputs registered where they are read, outputs declared before the work, one rule between them. */
class RunFilesTests {

    @TempDir
    Path dir;

    private Path file(String name) throws IOException {
        return Files.writeString(dir.resolve(name), "asset,weight\nA,1\n");
    }

    @Test
    void aCommandPublishesOnlyToATargetItDeclaredBeforeTheWork() throws IOException {
        try (RunFiles run = RunFiles.begin()) {
            IllegalStateException e = assertThrows(IllegalStateException.class,
                    () -> run.file(dir.resolve("r.json"), w -> w.write("x")));
            assertTrue(e.getMessage().startsWith("isorisk writes only to outputs declared before the work starts"),
                    e.getMessage());
            run.output("--out", dir.resolve("r.json"), RunFiles.Kind.FILE, false).file(dir.resolve("./r.json"),
                    w -> w.write("x"));
        }
        assertEquals("x", Files.readString(dir.resolve("r.json")));
    }

    @Test
    void anInputReadAfterTheOutputWasDeclaredIsRefusedWhereItIsRead() throws IOException {
        Path in = file("bounds.csv");
        try (RunFiles run = RunFiles.begin()) {
            run.output("--out", in, RunFiles.Kind.FILE, false);
            InputException e = assertThrows(InputException.class, () -> RunFiles.reading("bounds file", in));
            assertEquals(in + ": --out names the bounds file " + in + "; an output never replaces an input of the same "
                    + "run; fix: choose another --out", e.getMessage());
            // and publication checks again, whatever was registered since
            assertThrows(InputException.class, () -> run.file(in, w -> w.write("x")));
        }
        assertEquals("asset,weight\nA,1\n", Files.readString(in));
    }

    @Test
    void readingOutsideARunRegistersNothingAndRunsNestOnTheirThread() throws IOException {
        Path in = file("a.csv");
        assertEquals(in, RunFiles.reading("a file", in));
        try (RunFiles outer = RunFiles.begin()) {
            try (RunFiles inner = RunFiles.begin()) {
                inner.output("--out", in, RunFiles.Kind.FILE, false);
            }
            outer.output("--out", in, RunFiles.Kind.FILE, false);
            assertThrows(InputException.class, () -> RunFiles.reading("a file", in), "the outer run is current again");
        }
        RunFiles.reading("a file", in);
    }

    @Test
    void aFolderGivenAsAnInputRegistersEveryFileInIt() throws IOException {
        Path data = Files.createDirectories(dir.resolve("data"));
        Path b = Files.writeString(data.resolve("b.csv"), "x");
        Files.writeString(data.resolve("a.csv"), "x");
        try (RunFiles run = RunFiles.begin()) {
            run.input("--data file", data);
            InputException e = assertThrows(InputException.class,
                    () -> run.output("--out", b, RunFiles.Kind.FOLDER, true));
            assertEquals(b + ": --out names the --data file " + b + "; " + RunFiles.RULE
                    + "; fix: choose another --out", e.getMessage());
            e = assertThrows(InputException.class, () -> run.output("--out", dir, RunFiles.Kind.FOLDER, true));
            assertTrue(e.getMessage().startsWith(dir + ": the --out folder holds the --data file "
                    + data.resolve("a.csv") + ", and would be replaced as a whole"), e.getMessage());
            run.output("--out", data.resolve("pack"), RunFiles.Kind.FOLDER, true); // beside the inputs is fine
        }
    }

    @Test
    void aFileRegisteredTwiceKeepsItsFirstName() throws IOException {
        Path in = file("mu.csv");
        try (RunFiles run = RunFiles.begin()) {
            run.input("--expected-returns file", in).input("expected-returns file", dir.resolve("x/../mu.csv"));
            InputException e = assertThrows(InputException.class,
                    () -> run.output("--out", in, RunFiles.Kind.FILE, false));
            assertTrue(e.getMessage().contains("--out names the --expected-returns file " + in + ";"), e.getMessage());
        }
    }

    @Test
    void anOutputsFolderMustExistAndBeWritable() throws IOException {
        try (RunFiles run = RunFiles.begin()) {
            InputException e = assertThrows(InputException.class,
                    () -> run.output("--out-dir", dir.resolve("a/b"), RunFiles.Kind.FOLDER, true));
            assertEquals(dir.resolve("a") + ": the folder of --out-dir does not exist; fix: create it first, or choose "
                    + "another --out-dir", e.getMessage());
            Path f = file("f.csv");
            e = assertThrows(InputException.class, () -> run.output("--out", f.resolve("r.json"), RunFiles.Kind.FILE,
                    false));
            assertEquals(f + ": the folder of --out is a file; fix: choose another --out", e.getMessage());
            e = assertThrows(InputException.class, () -> run.output("--out", Path.of("/"), RunFiles.Kind.FOLDER, true));
            assertEquals("/: the output folder cannot be the root folder; fix: give --out a folder name",
                    e.getMessage());
        }
        assumeFalse("root".equals(System.getProperty("user.name")), "root may write into any folder");
        Path locked = Files.createDirectories(dir.resolve("locked"));
        Files.setPosixFilePermissions(locked, PosixFilePermissions.fromString("r-xr-xr-x"));
        try (RunFiles run = RunFiles.begin()) {
            InputException e = assertThrows(InputException.class,
                    () -> run.output("--out", locked.resolve("r.json"), RunFiles.Kind.FILE, false));
            assertEquals(locked + ": the folder of --out cannot be written (permission denied); fix: choose a folder "
                    + "you can write to, or change its permissions", e.getMessage());
        } finally {
            Files.setPosixFilePermissions(locked, PosixFilePermissions.fromString("rwxr-xr-x"));
        }
    }

    @Test
    void anEarlierOutputIsReplacedOnlyAsItsOptionAllows() throws IOException {
        Path earlier = Files.createDirectories(dir.resolve("earlier"));
        Files.writeString(earlier.resolve(AtomicWrite.MARKER), "written by isorisk\n");
        Files.writeString(earlier.resolve("old.txt"), "old");
        try (RunFiles run = RunFiles.begin()) {
            InputException e = assertThrows(InputException.class,
                    () -> run.output("--out", earlier, RunFiles.Kind.FOLDER, false, "--force"));
            assertEquals(earlier + ": the output folder exists and is not empty; fix: choose another --out, or add "
                    + "--force to replace the earlier output", e.getMessage());
            run.output("--out-dir", earlier, RunFiles.Kind.FOLDER, true)
                    .folder(earlier, d -> Files.writeString(d.resolve("new.txt"), "new"));
        }
        assertFalse(Files.exists(earlier.resolve("old.txt")));
        assertEquals("new", Files.readString(earlier.resolve("new.txt")));
    }
}
