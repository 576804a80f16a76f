package org.isorisk.engine;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/** Classes that break the engine's dependency rules on purpose, to show that the rules catch them. Never run. */
final class ArchitectureFixtures {
    private ArchitectureFixtures() {
    }

    /** Draws: depends on java.awt. */
    static final class DrawsWithAwt {
        java.awt.Color colour() {
            return java.awt.Color.BLACK;
        }
    }

    /** Writes a file. */
    static final class WritesAFile {
        void write(Path p) throws IOException {
            Files.writeString(p, "x");
        }
    }

    /** Prints. */
    static final class Prints {
        void print() {
            System.out.println("x");
        }
    }
}
