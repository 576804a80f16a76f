package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.cli.Run;
import org.isorisk.engine.explain.Caution;
import org.isorisk.notebooks.PackLayout;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DemoCommandTests {

    @TempDir
    Path dir;

    @Test
    void theDemoWritesTheSampleFundsWholePackAndSaysWhereTheNotebookIs() throws IOException {
        Path out = dir.resolve("demo");
        Run r = Run.of("demo", "--out", out.toString(), "--quiet");
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.err());
        for (String f : new String[]{PackLayout.NOTEBOOK, PackLayout.MANIFEST, PackLayout.HELPER, PackLayout.SCHEMA,
                "tables/weights.csv", "tables/trades.csv", "summary.txt"}) {
            assertTrue(Files.isRegularFile(out.resolve(f)), f);
        }
        for (String f : DemoCommand.SAMPLE_FILES) {
            assertTrue(Files.isRegularFile(out.resolve("inputs").resolve(f)), "copy of " + f);
        }
        assertEquals(r.out(), Files.readString(out.resolve("summary.txt")));
        assertTrue(r.out().startsWith("Committee pack: Fernhollow Regional Pension Scheme, as of 2025-06-30\n"), r.out());
        assertTrue(r.out().contains("  Notebook: " + out.resolve(PackLayout.NOTEBOOK) + "\n"), r.out());
        assertTrue(r.out().endsWith("Caution: " + Caution.TEXT + "\n"), r.out());
        JsonNode nb = Run.json(out.resolve(PackLayout.NOTEBOOK));
        assertEquals("Fernhollow Regional Pension Scheme", nb.at("/metadata/isorisk/fund").asText());
        // the sample pack file asks for all five charts in PNG, SVG and PDF; the notebook embeds each PNG
        int embedded = 0;
        for (JsonNode cell : nb.get("cells")) {
            for (JsonNode o : cell.path("outputs")) {
                embedded += o.path("data").has("image/png") ? 1 : 0;
            }
        }
        assertEquals(5, embedded);
        for (String chart : new String[]{"frontier", "weights", "marginal-risk", "risk-contributions", "stress"}) {
            for (String ext : new String[]{"png", "svg", "pdf"}) {
                assertTrue(Files.size(out.resolve(PackLayout.chart(chart, ext))) > 0, chart + "." + ext);
            }
        }
        JsonNode m = Run.json(out.resolve(PackLayout.MANIFEST));
        assertEquals("isorisk", m.get("tool").asText());
        assertEquals(Caution.TEXT, m.get("caution").asText());
    }

    @Test
    void aSecondRunReplacesItsEarlierPackButAForeignFolderIsLeftAlone() throws IOException {
        Path out = dir.resolve("demo");
        assertEquals(0, Run.of("demo", "--out", out.toString(), "--quiet").code());
        Files.writeString(out.resolve("stale.txt"), "old");
        assertEquals(0, Run.of("demo", "--out", out.toString(), "--quiet").code());
        assertFalse(Files.exists(out.resolve("stale.txt")));
        Path mine = Files.createDirectory(dir.resolve("mine"));
        Files.writeString(mine.resolve("notes.txt"), "keep");
        Run r = Run.of("demo", "--out", mine.toString(), "--quiet");
        assertEquals(2, r.code());
        assertEquals("isorisk: error: " + mine + ": the output folder exists and was not written by isorisk, so it is "
                + "left alone; fix: choose another --out, or empty the folder\n", r.err());
        assertEquals("", r.out());
        assertEquals("keep", Files.readString(mine.resolve("notes.txt")));
    }

    @Test
    void errorsAndWarningsInADataFolderWithoutAPackFileNameTheUsersFiles() throws IOException {
        Path data = Files.createDirectory(dir.resolve("data"));
        Files.copy(Run.SAMPLE.resolve("expected_returns.csv"), data.resolve("expected_returns.csv"));
        Files.copy(Run.SAMPLE.resolve("covariance.csv"), data.resolve("covariance.csv"));
        Path holdings = Files.writeString(data.resolve("holdings.csv"), "asset,market_value\nCash,5\nGold,1\n");
        Path out = dir.resolve("out");
        Run r = Run.of("demo", "--data", data.toString(), "--out", out.toString());
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: " + holdings + ", row 3, column 'asset', asset 'Gold': the asset is not in the "
                + "asset universe (the expected-returns and covariance files); fix: use the names of the "
                + "expected-returns file, or delete the row\n", r.err());
        assertFalse(Files.exists(out), "no partial output");
        // without its Commodities row the sample holdings still make a pack, with PortfolioReader's warning
        List<String> lines = new java.util.ArrayList<>(Files.readAllLines(Run.SAMPLE.resolve("holdings.csv")));
        assertTrue(lines.remove(lines.size() - 1).startsWith("Commodities,"));
        Files.writeString(holdings, String.join("\n", lines) + "\n");
        // (the bundled pack file's fund size is the sample's total: for the folder's holdings it is left out, so
        // their own total makes the amounts instead of being refused as a contradiction)
        Run ok = Run.of("demo", "--data", data.toString(), "--out", out.toString(), "--quiet");
        assertEquals(0, ok.code(), ok.toString());
        assertEquals("isorisk: warning: " + holdings + ": 1 asset is not listed and counts as weight 0: Commodities\n",
                ok.err());
        assertTrue(Files.isRegularFile(out.resolve(PackLayout.NOTEBOOK)));
        assertTrue(Files.readAllLines(out.resolve(PackLayout.table("trades"))).get(2).contains(",amount,"),
                "amounts from the folder's own holdings");
    }

    @Test
    void aScenarioFolderWithoutHoldingsIsRefused() throws IOException {
        Path data = Files.createDirectory(dir.resolve("data"));
        Files.copy(Run.SAMPLE.resolve("expected_returns.csv"), data.resolve("expected_returns.csv"));
        Files.copy(Run.SAMPLE.resolve("covariance.csv"), data.resolve("covariance.csv"));
        Run r = Run.of("demo", "--data", data.toString(), "--out", dir.resolve("out").toString());
        assertEquals(2, r.code());
        assertEquals("isorisk: error: " + data + ": the demo data folder has no holdings.csv; fix: put "
                + "expected_returns.csv, covariance.csv, holdings.csv in the folder, or leave out --data\n", r.err());
        assertFalse(Files.exists(dir.resolve("out")), "no partial output");
    }
}
