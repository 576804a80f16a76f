package org.isorisk.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * Runs the command line in-process with captured output, as the tests see it.
 *
 * @param code exit code
 * @param out  standard output
 * @param err  standard error
 */
public record Run(int code, String out, String err) {

    private static final ObjectMapper JSON = new ObjectMapper();

    /** The repository's sample fund (tests run in the {@code cli} folder). */
    public static final Path SAMPLE = Path.of("..", "sample-data");

    /** Runs {@code isorisk args...}. */
    public static Run of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Cli.commandLine(new PrintWriter(out, true), new PrintWriter(err, true), true, args).execute(args);
        return new Run(code, out.toString(), err.toString());
    }

    /** Standard output parsed as JSON. */
    public JsonNode json() {
        try {
            return JSON.readTree(out);
        } catch (IOException e) {
            throw new UncheckedIOException("not JSON: " + out, e);
        }
    }

    /** Parses a JSON file. */
    public static JsonNode json(Path file) {
        try {
            return JSON.readTree(file.toFile());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Copies the sample fund's files into {@code dir} and returns {@code dir}. */
    public static Path sample(Path dir) {
        try {
            for (String f : List.of("expected_returns.csv", "covariance.csv", "volatilities.csv", "correlation.csv",
                    "holdings.csv")) {
                Files.copy(SAMPLE.resolve(f), dir.resolve(f));
            }
            return dir;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Writes {@code text} to {@code dir/name} and returns the path as a string. */
    public static String file(Path dir, String name, String text) {
        try {
            Path p = dir.resolve(name);
            Files.writeString(p, text);
            return p.toString();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @Override
    public String toString() {
        return "exit " + code + "\n--- out\n" + out + "--- err\n" + err;
    }
}
