package org.isorisk.cli.files;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AtomicWriteTests {

    @TempDir
    Path dir;

    private List<String> names() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }

    @Test
    void aFileIsReplacedWholeAndNoTemporaryFileIsLeft() throws IOException {
        Path f = dir.resolve("r.json");
        Files.writeString(f, "old");
        AtomicWrite.file(f, w -> w.write("new"));
        assertEquals("new", Files.readString(f));
        assertEquals(List.of("r.json"), names());
    }

    @Test
    void aFailingWriteLeavesThePreviousFileUntouched() throws IOException {
        Path f = dir.resolve("r.json");
        Files.writeString(f, "old");
        assertThrows(IllegalStateException.class, () -> AtomicWrite.file(f, w -> {
            w.write("half");
            throw new IllegalStateException("stopped half way");
        }));
        assertEquals("old", Files.readString(f));
        assertEquals(List.of("r.json"), names());
    }

    @Test
    void aFolderIsReplacedOnlyWhenThisProjectWroteIt() throws IOException {
        Path out = dir.resolve("demo");
        AtomicWrite.folder(out, d -> Files.writeString(d.resolve("a.txt"), "1"));
        assertTrue(Files.exists(out.resolve(AtomicWrite.MARKER)));
        AtomicWrite.folder(out, d -> Files.writeString(d.resolve("b.txt"), "2"));
        assertFalse(Files.exists(out.resolve("a.txt")), "the folder is replaced as a whole");
        assertEquals("2", Files.readString(out.resolve("b.txt")));
        assertEquals(List.of("demo"), names());

        Path mine = dir.resolve("mine");
        Files.createDirectories(mine);
        Files.writeString(mine.resolve("precious.txt"), "keep");
        InputException e = assertThrows(InputException.class,
                () -> AtomicWrite.folder(mine, d -> Files.writeString(d.resolve("x"), "y")));
        assertTrue(e.getMessage().endsWith("the output folder exists and was not written by isorisk, so it is left "
                + "alone; fix: choose another --out, or empty the folder"), e.getMessage());
        assertEquals("keep", Files.readString(mine.resolve("precious.txt")));
        assertEquals(List.of("demo", "mine"), names());
    }

    @Test
    void withoutReplaceAnEarlierOutputIsKeptAndAFailedBodyLeavesItUntouched() throws IOException {
        Path out = dir.resolve("pack");
        AtomicWrite.folder(out, false, d -> Files.writeString(d.resolve("a.txt"), "1"));
        InputException e = assertThrows(InputException.class,
                () -> AtomicWrite.folder(out, false, d -> Files.writeString(d.resolve("b.txt"), "2")));
        assertTrue(e.getMessage().endsWith("the output folder exists and is not empty; fix: choose another --out, or "
                + "add --force to replace the earlier output"), e.getMessage());
        assertThrows(IllegalStateException.class, () -> AtomicWrite.folder(out, true, d -> {
            Files.writeString(d.resolve("c.txt"), "3");
            throw new IllegalStateException("stopped half way");
        }));
        assertEquals("1", Files.readString(out.resolve("a.txt")), "the earlier output is untouched");
        assertFalse(Files.exists(out.resolve("c.txt")));
        assertEquals(List.of("pack"), names(), "no temporary or old folder is left beside it");
    }
}
