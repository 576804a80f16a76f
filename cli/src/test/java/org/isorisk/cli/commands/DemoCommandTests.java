package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.isorisk.cli.Run;
import org.isorisk.cli.render.DemoSummary;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.solve.Allocator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DemoCommandTests {

    @TempDir
    Path dir;

    @Test
    void theDemoRunsEverythingOnTheSampleFundAndWritesItAll() throws IOException {
        Path out = dir.resolve("demo");
        Run r = Run.of("demo", "--out", out.toString());
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.err());
        for (String f : DemoSummary.FILES) {
            assertTrue(Files.isRegularFile(out.resolve(f)), f);
        }
        for (String f : DemoCommand.SAMPLE_FILES) {
            assertTrue(Files.isRegularFile(out.resolve("inputs").resolve(f)), f);
        }
        // every chart in every format, each a real file of its kind (the chart tests check their content)
        for (String kind : DemoCharts.KINDS) {
            for (String ext : new String[] {"png", "svg", "pdf"}) {
                Path c = out.resolve("charts").resolve(kind + "." + ext);
                assertTrue(Files.size(c) > 10_000, c.toString());
            }
            assertEquals("%PDF-", new String(Files.readAllBytes(out.resolve("charts").resolve(kind + ".pdf")), 0, 5,
                    java.nio.charset.StandardCharsets.US_ASCII));
        }
        assertTrue(r.out().replaceAll("\\s+", " ").contains("Charts in charts/ (PNG at print resolution, SVG, PDF): "
                + "frontier, weights, marginal-risk, risk-contributions."), r.out());
        assertEquals(r.out(), Files.readString(out.resolve("summary.txt")));
        String flat = r.out().replaceAll("\\s+", " ");
        assertTrue(flat.contains("Fernhollow Regional Pension Scheme (fictional)"), r.out());
        assertTrue(flat.contains("Raising the return target by 0.10 % raises volatility by"), r.out());
        assertTrue(flat.contains("(the marginal risk of tightening the return target)"), r.out());
        assertTrue(flat.contains(Allocator.SHORTS_NOTE), r.out());
        assertTrue(flat.contains("Caution: " + Caution.TEXT), r.out());
        assertTrue(flat.contains("Tracking error of the proposal against the current holdings:"), r.out());

        for (String f : new String[] {"check.json", "minimum-variance.json", "target-return.json", "tangency.json",
            "risk-current.json", "risk-proposal.json"}) {
            JsonNode j = Run.json(out.resolve(f));
            assertEquals(Caution.TEXT, j.get("caution").asText(), f);
            assertTrue(j.get("timing_ms").get("total").isNumber(), f);
        }
        JsonNode target = Run.json(out.resolve("target-return.json"));
        assertEquals("optimal", target.get("status").asText());
        assertEquals(0.05, target.get("expected_return").doubleValue(), 1e-12);
        assertTrue(target.get("certificate").get("passes").asBoolean());
        assertEquals("tangency", Run.json(out.resolve("tangency.json")).get("objective").get("kind").asText());

        assertTrue(flat.contains("5. Under the mandate of policy.yaml"), r.out());
        assertTrue(flat.contains("Frontier under the mandate (11 points"), r.out());
        JsonNode mandated = Run.json(out.resolve("mandate-target-return.json"));
        assertEquals("numerical", mandated.get("method").asText());
        assertEquals("policy.yaml", mandated.get("policy").asText());
        assertEquals(0.05, mandated.get("expected_return").doubleValue(), 1e-12);
        for (JsonNode m : mandated.get("multipliers")) {
            if (m.get("binding").asBoolean()) {
                assertTrue(flat.contains(m.get("sentence").asText()), m.get("constraint").asText());
            }
        }
        JsonNode frontier = Run.json(out.resolve("frontier.json"));
        assertEquals(11, frontier.get("points").size());
        assertEquals(Caution.TEXT, frontier.get("caution").asText());
        assertEquals(11, Csv.read(out.resolve("frontier.csv"), "frontier").rows().size());

        CsvTable weights = Csv.read(out.resolve("weights.csv"), "weights");
        assertEquals(12, weights.rows().size());
        assertEquals(Caution.TEXT, weights.meta("caution").orElseThrow().value());
        JsonNode proposal = Run.json(out.resolve("risk-proposal.json"));
        assertEquals(target.get("volatility").doubleValue(), proposal.get("portfolio").get("volatility").doubleValue());
        assertTrue(proposal.get("tracking_error").get("value").doubleValue() > 0);
    }

    @Test
    void aSecondRunReplacesTheFolderButAForeignFolderIsLeftAlone() throws IOException {
        Path out = dir.resolve("demo");
        assertEquals(0, Run.of("demo", "--no-charts", "--out", out.toString()).code());
        Files.writeString(out.resolve("stale.txt"), "from an earlier run");
        assertEquals(0, Run.of("demo", "--no-charts", "--out", out.toString()).code());
        assertFalse(Files.exists(out.resolve("charts")), "--no-charts draws none");
        assertFalse(Files.exists(out.resolve("stale.txt")));

        Path mine = Files.createDirectory(dir.resolve("mine"));
        Files.writeString(mine.resolve("notes.txt"), "keep");
        Run r = Run.of("demo", "--out", mine.toString());
        assertEquals(2, r.code());
        assertEquals("isorisk: error: " + mine + ": the output folder exists and was not written by isorisk, so it is "
                + "left alone; fix: choose another --out, or empty the folder\n", r.err());
        assertEquals("", r.out());
        assertEquals("keep", Files.readString(mine.resolve("notes.txt")));
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
