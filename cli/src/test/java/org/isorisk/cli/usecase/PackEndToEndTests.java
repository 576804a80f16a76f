package org.isorisk.cli.usecase;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.isorisk.cli.files.PackFiles;
import org.isorisk.cli.files.PackFolder;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.notebooks.ExternalTools;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.PackLayout;
import org.isorisk.notebooks.Text;
import org.isorisk.notebooks.pack.PackSpec;
import org.isorisk.notebooks.report.Table;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A pack made by the runner from engine results, checked by the outside tools as a reader would use them. */
class PackEndToEndTests {

    private static Path pack(Path dir) {
        PackSpec spec = PackAnalysisTests.spec("");
        return write(dir, spec, PackAnalysisTests.run(spec, Optional.of(new double[]{0.2, 0.5, 0.3})));
    }

    private static Path write(Path dir, PackSpec spec, PackAnalysisTests.Outcome o) {
        PackFolder f = new PackFolder("0.1.0-test", OffsetDateTime.parse("2025-06-30T12:00:00Z"))
                .parameters(spec.toJson());
        Path target = dir.resolve("pack");
        try (RunFiles run = RunFiles.begin()) {
            run.output("--out", target, RunFiles.Kind.FOLDER, false);
            return PackFiles.addTo(f, o.content()).commit(run, target).folder();
        }
    }

    /** Ids of the notebook's table cells, in order. */
    private static List<String> tableCells(Path nb) throws IOException {
        List<String> tables = new ArrayList<>();
        for (JsonNode cell : new ObjectMapper().readTree(nb.toFile()).get("cells")) {
            if (cell.get("id").asText().startsWith("table-")) {
                tables.add(cell.get("id").asText().substring(6));
            }
        }
        return tables;
    }

    /** All Markdown of the notebook as one string. */
    private static String markdown(Path nb) throws IOException {
        StringBuilder b = new StringBuilder();
        for (JsonNode cell : new ObjectMapper().readTree(nb.toFile()).get("cells")) {
            if (cell.get("cell_type").asText().equals("markdown")) {
                cell.get("source").forEach(l -> b.append(l.asText()));
                b.append('\n');
            }
        }
        return b.toString();
    }

    @Test
    void aPackUnderATurnoverLimitValidatesAndItsTablesFilesAndManifestAgree(@TempDir Path dir) throws IOException {
        PackAnalysisTests.Outcome o = PackAnalysisTests.make(PackAnalysisTests.limited(PackAnalysisTests.longOnly(),
                PackAnalysisTests.turnover(0.70)));
        Path folder = write(dir, PackAnalysisTests.spec(""), o);
        Path nb = folder.resolve(PackLayout.NOTEBOOK);
        ExternalTools.Run v = ExternalTools.validate(nb);
        assertEquals(0, v.exit(), v.both());
        assertEquals(List.of("assumptions", "portfolios", "weights", "risk", "trade_summary", "trades", "correlation",
                "frontier", "constraints"), tableCells(nb));
        String text = markdown(nb);
        PackContent.Trading t = o.content().trading().orElseThrow();
        assertTrue(text.contains("**Trades:** " + Text.markdown(t.headline())), "the summary says which trade list");
        assertTrue(text.contains(Text.markdown(t.sentences().get(0))), "the turnover limit's shadow price");
        assertTrue(text.contains(Text.markdown(Caution.SHORT)), "the caution beside the trades");
        assertFalse(text.contains("moves the current holdings fully to the proposal"),
                "the old claim that the trades are always the full move is gone");
        // each CSV table holds the content's numbers at full precision, and the manifest hashes the file
        JsonNode m = new ObjectMapper().readTree(folder.resolve(PackLayout.MANIFEST).toFile());
        for (String name : List.of("trades", "trade_summary")) {
            Path csv = folder.resolve(PackLayout.table(name));
            List<String> lines = Files.readAllLines(csv);
            assertEquals("# caution: " + Caution.TEXT, lines.get(0));
            Table table = o.content().tables().stream().filter(x -> x.name().equals(name)).findFirst().orElseThrow();
            assertEquals(table.rows().size() + 3, lines.size(), name);
            String listed = null;
            for (JsonNode f : m.get("files")) {
                if (f.get("path").asText().equals(PackLayout.table(name))) {
                    listed = f.get("sha256").asText();
                }
            }
            assertEquals(PackFolder.sha256(csv), listed, name + " in the manifest");
        }
        // turnover column of the trade list: Σ|change| within the limit (the CSV's own numbers)
        List<String> trades = Files.readAllLines(folder.resolve(PackLayout.table("trades")));
        List<String> head = List.of(trades.get(2).split(","));
        double turnover = 0;
        for (String row : trades.subList(3, trades.size())) {
            turnover += Math.abs(Double.parseDouble(row.split(",")[head.indexOf("change")]));
        }
        assertTrue(turnover <= 0.70 + SolverSettings.defaults().numericalTolerance(), "turnover " + turnover);
    }

    @Test
    void aPackWhoseTargetIsOutOfReachWithinTheLimitsValidatesAndSaysSo(@TempDir Path dir) throws IOException {
        PackAnalysisTests.Outcome o = PackAnalysisTests.make(PackAnalysisTests.limited(PackAnalysisTests.longOnly(),
                PackAnalysisTests.turnover(0.01)));
        Path folder = write(dir, PackAnalysisTests.spec(""), o);
        Path nb = folder.resolve(PackLayout.NOTEBOOK);
        ExternalTools.Run v = ExternalTools.validate(nb);
        assertEquals(0, v.exit(), v.both());
        assertEquals(List.of("assumptions", "portfolios", "weights", "risk", "trade_summary", "correlation",
                "frontier", "constraints"), tableCells(nb));
        assertTrue(markdown(nb).contains(Text.markdown(o.content().trading().orElseThrow().headline())));
        assertFalse(Files.exists(folder.resolve(PackLayout.table("trades"))), "no trade list is proposed");
    }

    @Test
    void theRunnersNotebookValidatesStrictlyAndCarriesEveryTable(@TempDir Path dir) throws IOException {
        Path folder = pack(dir);
        Path nb = folder.resolve(PackLayout.NOTEBOOK);
        ExternalTools.Run v = ExternalTools.validate(nb);
        assertEquals(0, v.exit(), v.both());
        // Rendering and running are checked on the hostile-named fixture (NotebookWriterTests), which goes
        // through the same writer; here: the runner's notebook carries every table it should.
        assertEquals(List.of("assumptions", "portfolios", "weights", "risk", "trade_summary", "trades", "correlation",
                "frontier", "constraints"), tableCells(nb));
    }

    @Test
    void theManifestRecordsThePackFilesParameters(@TempDir Path dir) throws IOException {
        JsonNode m = new ObjectMapper().readTree(pack(dir).resolve(PackLayout.MANIFEST).toFile());
        assertEquals("Test Fund", m.at("/parameters/fund").asText());
        assertEquals(0.05, m.at("/parameters/proposed").asDouble());
        assertEquals(2, m.at("/parameters/targets").size());
    }
}
