package org.isorisk.cli.options;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.Run;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * {@link InputOptions} as every command that mixes it in sees it:
 * the message when the expected returns are missing.
 */
class InputOptionsTests {

    @TempDir
    Path dir;

    String cov;
    String holdings;

    @BeforeEach
    void sample() {
        Run.sample(dir);
        cov = dir.resolve("covariance.csv").toString();
        holdings = dir.resolve("holdings.csv").toString();
    }

    /**
     * {@code command} split into words, with the sample's files put in for H (holdings), C (a chart file), P (the pack
     * file) and O (a pack folder).
     */
    private List<String> words(String command) {
        List<String> w = new ArrayList<>();
        for (String s : command.split(" ")) {
            w.add(switch (s) {
                case "H" -> holdings;
                case "C" -> dir.resolve("chart.png").toString();
                case "P" -> Run.SAMPLE.resolve("pack.yaml").toString();
                case "O" -> dir.resolve("pack").toString();
                default -> s;
            });
        }
        return w;
    }

    @ParameterizedTest
    @ValueSource(strings = {"solve", "frontier", "rebalance --holdings H", "stress --targets 0.04:0.06:0.01",
        "pack --pack-file P --out O", "chart frontier --out C", "chart weights --out C",
        "chart marginal-risk --out C"})
    void aCommandThatNeedsTheExpectedReturnsNamesItselfWhenTheyAreMissing(String command) {
        List<String> args = words(command);
        args.addAll(List.of("--covariance", cov));
        Run r = Run.of(args.toArray(String[]::new));
        String name = command.startsWith("chart ") ? command.substring(0, command.indexOf(' ', 6))
                : command.split(" ")[0];
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: 'isorisk " + name + "' needs the expected returns; fix: give "
                + "--expected-returns FILE (columns asset,expected_return)\n", r.err());
        assertEquals("", r.out());
    }
}
