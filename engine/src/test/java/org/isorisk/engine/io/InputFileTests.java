package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.stress.Scenario;
import org.junit.jupiter.api.Test;

/**
 * The readers on a stream with a display name ({@link InputFile}), as the Spark job reads from Hadoop file
 * systems: the same values as from a local path, and errors that name the file by the name given.
 */
class InputFileTests {

    @Test
    void theSampleFundReadsTheSameFromMemoryAsFromItsFiles() throws IOException {
        LoadedUniverse local = UniverseLoader.load(new UniverseFiles(SampleFund.DATA.resolve("expected_returns.csv"),
                SampleFund.DATA.resolve("covariance.csv"), null, null, Units.DECIMAL, null));
        LoadedUniverse memory = UniverseLoader.load(memory("hdfs://cluster/data/expected_returns.csv",
                SampleFund.DATA.resolve("expected_returns.csv")), memory("hdfs://cluster/data/covariance.csv",
                SampleFund.DATA.resolve("covariance.csv")), null, null, Units.DECIMAL, null);
        assertEquals(local.assets(), memory.assets());
        assertArrayEquals(local.universe().expectedReturns(), memory.universe().expectedReturns(), 0.0);
        for (int i = 0; i < local.assets().size(); i++) {
            assertArrayEquals(local.universe().covariance()[i], memory.universe().covariance()[i], 0.0);
        }
        assertEquals("hdfs://cluster/data/covariance.csv", memory.provenance().inputs().get(1).path());
        assertEquals("covariance.csv", memory.provenance().inputs().get(1).name());
        assertEquals(local.provenance().inputs().get(1).sha256(), memory.provenance().inputs().get(1).sha256());

        Policy fromFile = PolicyReader.read(SampleFund.DATA.resolve("policy.yaml"), local.assets());
        Policy fromMemory = PolicyReader.read(memory("s3a://bucket/policy.yaml", SampleFund.DATA.resolve("policy.yaml")),
                local.assets());
        assertEquals(fromFile, fromMemory);

        PortfolioFile held = PortfolioReader.read(memory("gs://b/holdings.csv", SampleFund.DATA.resolve("holdings.csv")),
                "holdings", local.assets(), Units.DECIMAL);
        assertArrayEquals(PortfolioReader.read(SampleFund.DATA.resolve("holdings.csv"), "holdings", local.assets(),
                Units.DECIMAL).weights(), held.weights(), 0.0);
    }

    @Test
    void aBoundsFileIsFoundBesideAPolicyReadFromAStream() {
        Map<String, String> files = new LinkedHashMap<>();
        files.put("hdfs://c/p/policy.yaml", "budget: 1\nbounds_file: limits.csv\n");
        files.put("hdfs://c/p/limits.csv", "asset,min,max\nA,0.1,0.6\nB,0,0.7\n");
        Policy p = PolicyReader.read(InputFile.ofTexts(files), List.of("A", "B"));
        assertEquals(0.1, p.mandate().lower(0));
        assertEquals(0.7, p.mandate().upper(1));

        Map<String, String> broken = new LinkedHashMap<>();
        broken.put("hdfs://c/p/policy.yaml", "budget: 1\nbounds_file: missing.csv\n");
        assertEquals("hdfs://c/p/policy.yaml, line 2, key 'bounds_file': cannot read the bounds file 'missing.csv' "
                        + "(value 'missing.csv'); fix: give a path relative to the policy file's folder",
                assertThrows(InputException.class, () -> PolicyReader.read(InputFile.ofTexts(broken),
                        List.of("A", "B"))).getMessage());
    }

    @Test
    void aScenarioFileResolvesItsCovarianceBesideItself() {
        Map<String, String> files = new LinkedHashMap<>();
        files.put("hdfs://c/s/scenarios.yaml", "scenarios:\n  - name: swap\n    shocks:\n"
                + "      - covariance: {file: other.csv}\n");
        List<String> seen = new java.util.ArrayList<>();
        List<Scenario> s = ScenarioFile.read(InputFile.ofTexts(files), List.of("A", "B"), Map.of(), f -> {
            seen.add(f.path());
            return new double[][] {{0.04, 0}, {0, 0.09}};
        });
        assertEquals(List.of("hdfs://c/s/other.csv"), seen);
        assertEquals("swap", s.get(0).name());
    }

    @Test
    void missingFilesAreNamedAsGiven() {
        InputFile nowhere = InputFile.ofTexts(Map.of("hdfs://c/book.csv", "id\n")).resolve("policies/none.yaml");
        assertEquals("hdfs://c/policies/none.yaml: the policy file does not exist; fix: check the path; a relative "
                + "path starts from the current folder", assertThrows(InputException.class,
                () -> nowhere.readAll("policy")).getMessage());
        assertEquals("hdfs://c/policies/none.yaml: the holdings file does not exist; fix: check the path; a relative "
                + "path starts from the current folder", assertThrows(InputException.class,
                () -> Csv.read(nowhere, "holdings")).getMessage());
    }

    @Test
    void aLocalFileResolvesItsSiblingsAndKnowsItsSize(@org.junit.jupiter.api.io.TempDir Path dir)
            throws IOException {
        Path book = dir.resolve("book.csv");
        Files.writeString(book, "id\na\n", StandardCharsets.UTF_8);
        InputFile f = InputFile.of(book);
        assertEquals(dir.resolve("p/x.yaml").toString(), f.resolve("p/x.yaml").path());
        assertEquals("/abs/x.yaml", f.resolve("/abs/x.yaml").path());
        assertEquals(5, f.size().orElseThrow());
        assertEquals("book.csv", f.name());
        assertEquals("the book file is a folder, not a file", assertThrows(InputException.class,
                () -> Csv.read(InputFile.of(dir), "book")).getMessage().replace(dir + ": ", "").replaceAll(
                "; fix:.*", ""));
    }

    private static InputFile memory(String name, Path from) throws IOException {
        return InputFile.ofBytes(name, Files.readAllBytes(from));
    }
}
