package org.isorisk.notebooks.pack;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Path;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.isorisk.notebooks.ExternalTools;
import org.isorisk.notebooks.PackLayout;
import org.isorisk.notebooks.folder.PackFiles;
import org.isorisk.notebooks.folder.PackFolder;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A pack made by the runner from engine results, checked by the outside tools as a reader would use them. */
class PackEndToEndTests {

    private static Path pack(Path dir) {
        PackSpec spec = PackRunnerTests.spec("");
        PackRunner.Outcome o = PackRunnerTests.run(spec, Optional.of(new double[]{0.2, 0.5, 0.3}));
        PackFolder f = new PackFolder("0.1.0-test", OffsetDateTime.parse("2025-06-30T12:00:00Z"))
                .parameters(spec.toJson());
        return PackFiles.addTo(f, o.content()).commit(dir.resolve("pack"), false).folder();
    }

    @Test
    void theRunnersNotebookValidatesStrictlyAndCarriesEveryTable(@TempDir Path dir) throws IOException {
        Path folder = pack(dir);
        Path nb = folder.resolve(PackLayout.NOTEBOOK);
        ExternalTools.Run v = ExternalTools.validate(nb);
        assertEquals(0, v.exit(), v.both());
        // Rendering and running are checked on the hostile-named fixture (NotebookWriterTests), which goes
        // through the same writer; here: the runner's notebook carries every table it should.
        JsonNode nbJson = new ObjectMapper().readTree(nb.toFile());
        List<String> tables = new ArrayList<>();
        for (JsonNode cell : nbJson.get("cells")) {
            if (cell.get("id").asText().startsWith("table-")) {
                tables.add(cell.get("id").asText().substring(6));
            }
        }
        assertEquals(List.of("assumptions", "portfolios", "weights", "risk", "trades", "correlation", "frontier",
                "constraints"), tables);
    }

    @Test
    void theManifestRecordsThePackFilesParameters(@TempDir Path dir) throws IOException {
        JsonNode m = new ObjectMapper().readTree(pack(dir).resolve(PackLayout.MANIFEST).toFile());
        assertEquals("Test Fund", m.at("/parameters/fund").asText());
        assertEquals(0.05, m.at("/parameters/proposed").asDouble());
        assertEquals(2, m.at("/parameters/targets").size());
    }
}
