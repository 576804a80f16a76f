package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SourceFileTests {

    @TempDir
    Path dir;

    @Test
    void shaTwoFiftySixMatchesThePublishedTestVectors() throws IOException {
        // FIPS 180-2, Appendix B.1: SHA-256("abc"); the empty message's digest is the well-known e3b0c442... (from memory).
        assertEquals("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
                SourceFile.sha256("abc".getBytes(StandardCharsets.US_ASCII)));
        assertEquals("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855", SourceFile.sha256(new byte[0]));
        Path f = dir.resolve("w.csv");
        Files.writeString(f, "asset,weight\nA,1\n");
        CsvTable t = Csv.read(f, "weights");
        assertEquals(SourceFile.sha256(Files.readAllBytes(f)), t.source().sha256());
        assertEquals("w.csv", t.source().name());
        assertEquals(12, t.source().shortHash().length());
    }
}
