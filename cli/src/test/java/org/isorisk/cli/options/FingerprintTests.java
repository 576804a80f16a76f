package org.isorisk.cli.options;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.SourceFile;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@link Fingerprint}: the one way the policy and scenario files get into a result's inputs. */
class FingerprintTests {

    @TempDir
    Path dir;

    @Test
    void aFilesFingerprintIsItsRoleNameSizeAndSha256() throws IOException {
        Path f = Files.writeString(dir.resolve("abc.yaml"), "abc", StandardCharsets.US_ASCII);
        SourceFile s = Fingerprint.of("policy", f, "--policy");
        assertEquals("policy", s.role());
        assertEquals("abc.yaml", s.name());
        assertEquals(f.toString(), s.path());
        assertEquals(3, s.bytes());
        // SHA-256 of "abc": FIPS 180-2, appendix B.1 (one-block message)
        assertEquals("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", s.sha256());
    }

    @Test
    void anUnreadableFileIsAnInputErrorNamingTheFileAndTheOption() {
        // a folder cannot be read as a file
        InputException e = assertThrows(InputException.class, () -> Fingerprint.of("scenarios", dir, "--scenarios"));
        assertEquals(dir.toString(), e.file().orElseThrow());
        assertTrue(e.getMessage().startsWith(dir + ": cannot read the scenarios file: "), e.getMessage());
        assertTrue(e.getMessage().endsWith("; fix: check the path given to --scenarios"), e.getMessage());
    }

    @Test
    void solveAndStressListThePolicyAndTheScenarioFileAmongTheirInputs() throws IOException {
        Run.sample(dir);
        Path policy = Files.copy(Run.SAMPLE.resolve("policy.yaml"), dir.resolve("policy.yaml"));
        Path scenarios = Files.copy(Run.SAMPLE.resolve("scenarios.yaml"), dir.resolve("scenarios.yaml"));
        String mu = dir.resolve("expected_returns.csv").toString();
        String cov = dir.resolve("covariance.csv").toString();
        Run solve = Run.of("solve", "--expected-returns", mu, "--covariance", cov, "--policy", policy.toString(),
                "--format", "json");
        assertEquals(0, solve.code(), solve.toString());
        assertListed(solve.json(), "policy", policy);
        Run stress = Run.of("stress", "--expected-returns", mu, "--covariance", cov, "--policy", policy.toString(),
                "--targets", "0.045:0.05:0.005", "--scenarios", scenarios.toString(), "--quiet", "--format", "json");
        assertEquals(0, stress.code(), stress.toString());
        assertListed(stress.json(), "policy", policy);
        assertListed(stress.json(), "scenarios", scenarios);
    }

    private static void assertListed(JsonNode result, String role, Path file) throws IOException {
        for (JsonNode f : result.get("inputs").get("files")) {
            if (f.get("role").asText().equals(role)) {
                assertEquals(file.getFileName().toString(), f.get("name").asText());
                assertEquals(SourceFile.sha256(Files.readAllBytes(file)), f.get("sha256").asText());
                assertEquals(Files.size(file), f.get("bytes").asLong());
                return;
            }
        }
        throw new AssertionError("no " + role + " among the inputs: " + result.get("inputs"));
    }
}
