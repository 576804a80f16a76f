package org.isorisk.cli.options;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.Run;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * {@link OutputOptions} as every command that mixes it in sees it: its {@code --format} decides whether an error found
 * while running is also printed as a JSON object, and {@code --out} is not written on an error.
 */
class OutputOptionsTests {

    @TempDir
    Path dir;

    String holdings;
    String out;

    @BeforeEach
    void sample() {
        Run.sample(dir);
        holdings = dir.resolve("holdings.csv").toString();
        out = dir.resolve("result.txt").toString();
    }

    @ParameterizedTest
    @ValueSource(strings = {"check", "solve", "frontier", "risk --weights %s", "rebalance --holdings %s",
        "stress --targets 0.04:0.06:0.01"})
    void anErrorWhileRunningIsAlsoAJsonObjectInJsonFormatAndNoOutputFileIsWritten(String command) {
        // a covariance file that does not exist: every one of these commands fails on reading it (exit 2)
        List<String> args = new ArrayList<>(List.of(String.format(command, holdings).split(" ")));
        args.addAll(List.of("--expected-returns", dir.resolve("expected_returns.csv").toString(), "--covariance",
                dir.resolve("missing.csv").toString(), "--out", out));
        List<String> json = new ArrayList<>(args);
        json.addAll(List.of("--format", "json"));

        Run table = Run.of(args.toArray(String[]::new));
        Run j = Run.of(json.toArray(String[]::new));

        assertEquals(2, table.code(), table.toString());
        assertEquals("", table.out(), "table format: the error goes to stderr only");
        assertEquals(2, j.code(), j.toString());
        assertEquals(table.err(), j.err(), "the same one error line whatever the format");
        assertTrue(j.err().startsWith("isorisk: error: ") && j.err().contains("missing.csv"), j.err());
        JsonNode o = j.json();
        assertEquals("invalid-input", o.get("status").asText());
        assertEquals(j.err().substring("isorisk: error: ".length()).strip(), o.get("error").asText());
        assertFalse(Files.exists(Path.of(out)), "no output file on an error");
    }
}
