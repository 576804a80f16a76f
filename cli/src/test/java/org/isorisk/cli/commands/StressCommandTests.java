package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class StressCommandTests {

    @TempDir
    Path dir;

    String mu;
    String cov;
    String policy;
    String scenarios;

    @BeforeEach
    void sample() throws Exception {
        Run.sample(dir);
        mu = dir.resolve("expected_returns.csv").toString();
        cov = dir.resolve("covariance.csv").toString();
        Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        Files.copy(Run.SAMPLE.resolve("scenarios.yaml"), dir.resolve("scenarios.yaml"));
        policy = dir.resolve("policy.yaml").toString();
        scenarios = dir.resolve("scenarios.yaml").toString();
    }

    @Test
    void aScenarioCovarianceFilesWarningsAreShownOnceWithTheOthers() throws Exception {
        // the sample covariance typed in percent squared (every entry times 10 000): UniverseLoader warns that the
        // variances look like percent squared; the scenario still runs with the numbers as given
        StringBuilder b = new StringBuilder();
        for (String line : Files.readAllLines(Path.of(cov))) {
            if (line.startsWith("#") || line.startsWith("asset,")) {
                b.append(line).append('\n');
                continue;
            }
            String[] cells = line.split(",");
            b.append(cells[0]);
            for (int k = 1; k < cells.length; k++) {
                b.append(',').append(new java.math.BigDecimal(cells[k]).scaleByPowerOfTen(4).toPlainString());
            }
            b.append('\n');
        }
        Path crisis = Path.of(Run.file(dir, "crisis.csv", b.toString()));
        String file = Run.file(dir, "crisis.yaml", "scenarios:\n  - name: typed-in-percent\n    shocks:\n"
                + "      - covariance: {file: crisis.csv}\n");
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--targets",
                "0.045:0.05:0.005", "--scenarios", file, "--quiet", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        String warning = crisis + ": variances look like percent squared ('Emerging Equity' has variance 462.25, a "
                + "volatility above 100 %); if they are, add --units percent (divides covariances by 10 000)";
        assertEquals("isorisk: warning: " + warning + "\n", r.err());
        assertEquals(1, r.json().get("warnings").size(), r.out());
        assertEquals(warning, r.json().get("warnings").get(0).asText());
    }

    @Test
    void theSampleScenariosRunOverTheGridWithRepairAndProgressOnStderrOnly() {
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--targets",
                "0.045:0.06:0.005", "--scenarios", scenarios, "--vol-multiplier", "1.5", "--return-shift",
                "Equity=-0.02", "--format", "json");
        assertEquals(0, r.code(), r.toString());
        JsonNode j = r.json();
        assertEquals(4, j.get("base").get("points").size());
        assertEquals(7, j.get("scenarios").size());
        JsonNode together = j.get("scenarios").get(2);
        assertEquals("risk-assets-move-together", together.get("name").asText());
        assertTrue(together.get("repair").get("repaired").booleanValue(), together.toString());
        assertTrue(together.get("repair").get("frobenius_distance").doubleValue() > 0);
        // a volatility multiplier of 1.5 scales every minimum volatility by 1.5 and needs no turnover
        JsonNode vol = j.get("scenarios").get(5);
        for (int k = 0; k < 4; k++) {
            JsonNode b = j.get("base").get("points").get(k);
            JsonNode s = vol.get("points").get(k);
            assertEquals(1.5 * b.get("volatility").doubleValue(), s.get("volatility").doubleValue(), 1e-7);
            assertEquals(0, s.get("turnover_to_reoptimise").doubleValue(), 1e-6);
        }
        assertEquals(Caution.TEXT, j.get("caution").asText());
        assertTrue(r.err().contains("stress: 32 of 32 solves done (100 %)"), r.err());
        assertFalse(r.out().contains("solves done"));
        // 4 targets × (base + 7 scenarios) = 32 solves, reported at every tenth: a short log
    }

    @Test
    void theStressOverlayChartIsWrittenBesideTheTable() throws Exception {
        Path png = dir.resolve("stress.png");
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--targets",
                "0.045:0.06:0.0025", "--vol-multiplier", "1.3", "--correlation-shift", "0.4", "--quiet", "--chart",
                png.toString());
        assertEquals(0, r.code(), r.toString());
        byte[] b = Files.readAllBytes(png);
        assertTrue(b.length > 1000 && (b[0] & 0xff) == 0x89 && b[1] == 'P' && b[2] == 'N' && b[3] == 'G',
                "a PNG file (magic bytes)");
        assertTrue(r.err().contains("isorisk: wrote " + png), r.err());
        assertTrue(r.out().contains("Caution: "), r.out());
    }

    @Test
    void anUnknownChartFormatIsRefusedBeforeAnyWork() {
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--targets", "0.04:0.05:0.01",
                "--chart", dir.resolve("stress.bmp").toString());
        assertEquals(2, r.code(), r.toString());
        assertEquals("", r.out());
    }

    @Test
    void aBadTargetGridIsBadInput() {
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--targets", "0.06:0.04:0.01");
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: the targets' end is below their start (value '0.06:0.04:0.01'); fix: write "
                + "from:to:step with from at most to\n", r.err());
        assertEquals("", r.out());
    }

    @Test
    void aScenarioFileErrorNamesTheLineAndTheKey() {
        String bad = Run.file(dir, "bad.yaml", "scenarios:\n  - name: a\n    shocks:\n      - volatility: {scope: all, "
                + "multiplier: 0}\n");
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--targets", "0.04:0.05:0.01",
                "--scenarios", bad, "--quiet");
        assertEquals(2, r.code(), r.toString());
        assertTrue(r.err().startsWith("isorisk: error: " + bad + ": line 4, key 'volatility (scenario a)': a "
                + "volatility multiplier must be a positive number"), r.err());
    }

    @Test
    void theTableShowsTheSweepTheScenariosAndTheCaution() {
        Run r = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--policy", policy, "--targets",
                "0.045:0.06:0.005", "--correlation-shift", "0.4", "--quiet");
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("Base assumptions: achievable targets"), r.out());
        assertTrue(r.out().contains("Scenario correlation+0.4"), r.out());
        assertTrue(r.out().contains("Caution: "), r.out());
        assertEquals("", r.err());
    }
}
