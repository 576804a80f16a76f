package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.isorisk.cli.Run;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.notebooks.PackLayout;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class PackCommandTests {

    @TempDir
    Path dir;

    private String[] args(Path out, String... more) {
        List<String> a = new ArrayList<>(List.of("pack", "--expected-returns", Run.SAMPLE.resolve("expected_returns.csv")
                        .toString(), "--covariance", Run.SAMPLE.resolve("covariance.csv").toString(), "--holdings",
                Run.SAMPLE.resolve("holdings.csv").toString(), "--pack-file", Run.SAMPLE.resolve("pack.yaml").toString(),
                "--out", out.toString()));
        a.addAll(List.of(more));
        return a.toArray(String[]::new);
    }

    private static List<String> listing(Path d) throws IOException {
        try (Stream<Path> s = Files.walk(d)) {
            return s.map(p -> d.relativize(p) + (Files.isRegularFile(p) ? " " + SourceFile.sha256(read(p)) : ""))
                    .sorted().toList();
        }
    }

    private static byte[] read(Path p) {
        try {
            return Files.readAllBytes(p);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    @Test
    void theHoldingsFilesWarningsAreRepeatedOnStderrAsByEveryCommandWritingAFileOrFolder() throws IOException {
        // the sample holdings without their Commodities row: PortfolioReader warns that it counts as weight 0
        List<String> lines = new ArrayList<>(Files.readAllLines(Run.SAMPLE.resolve("holdings.csv")));
        assertTrue(lines.remove(lines.size() - 1).startsWith("Commodities,"));
        Path held = Path.of(Run.file(dir, "holdings.csv", String.join("\n", lines) + "\n"));
        Path out = dir.resolve("pack");
        String[] a = args(out);
        a[6] = held.toString();
        Run r = Run.of(a);
        assertEquals(0, r.code(), r.toString());
        String warning = held + ": 1 asset is not listed and counts as weight 0: Commodities";
        assertEquals("isorisk: warning: " + warning + "\n", r.err());
        assertTrue(r.out().contains("  Note: " + warning + "\n"), r.out());
    }

    @Test
    void thePackFolderHoldsTheNotebookTablesInputsAndAManifestWhoseHashesMatch() throws IOException {
        Path out = dir.resolve("pack");
        List<String> inputsBefore = listing(Run.SAMPLE);
        Run r = Run.of(args(out));
        assertEquals(0, r.code(), r.toString());
        assertEquals("", r.err());
        JsonNode m = Run.json(out.resolve(PackLayout.MANIFEST));
        int listed = 0;
        for (JsonNode f : m.get("files")) {
            Path p = out.resolve(f.get("path").asText());
            assertEquals(SourceFile.sha256(read(p)), f.get("sha256").asText(), f.get("path").asText());
            listed++;
        }
        try (Stream<Path> s = Files.walk(out)) {
            assertEquals(listed + 1, s.filter(Files::isRegularFile).count(), "every file but the manifest is listed");
        }
        List<String> roles = new ArrayList<>();
        for (JsonNode in : m.get("inputs")) {
            roles.add(in.get("role").asText());
            String name = in.get("name").asText();
            assertEquals(SourceFile.sha256(read(Run.SAMPLE.resolve(name))), in.get("sha256").asText(), name);
            assertEquals(in.get("sha256").asText(), SourceFile.sha256(read(out.resolve("inputs").resolve(name))),
                    "the copy of " + name + " is the input");
        }
        assertEquals(List.of("expected-returns", "covariance", "holdings", "pack-file", "scenarios"), roles);
        // the sample pack file names the invented scenarios: one stress row per scenario and target
        List<String> stress = Files.readAllLines(out.resolve(PackLayout.table("stress")));
        assertTrue(stress.get(2).startsWith("scenario,target,volatility,change"), stress.get(2));
        assertEquals(3 + 5 * 3, stress.size(), "two comment lines, the header, 5 scenarios x 3 targets");
        assertEquals(0.05, m.at("/parameters/proposed").asDouble());
        assertEquals("holdings.csv", m.at("/parameters/holdings").asText());
        assertEquals(inputsBefore, listing(Run.SAMPLE), "inputs are never modified");
    }

    @Test
    void underThePolicyTheMandateIsInWordsAndItsBindingLimitsHaveSentences() throws IOException {
        Path out = dir.resolve("pack");
        Run r = Run.of(args(out, "--policy", Run.SAMPLE.resolve("policy.yaml").toString()));
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("  Trades: The trade list keeps to the policy's trading limits: "), r.out());
        assertTrue(r.out().contains("(limit 20.00 %)"), r.out());
        JsonNode nb = Run.json(out.resolve(PackLayout.NOTEBOOK));
        StringBuilder text = new StringBuilder();
        for (JsonNode cell : nb.get("cells")) {
            cell.get("source").forEach(l -> text.append(l.asText()));
        }
        String all = text.toString();
        assertTrue(all.contains("Group Equity (Domestic Equity, Foreign Developed Equity, Emerging Equity): between "
                + "30.00 % and 60.00 % in total."), "mandate in words");
        assertTrue(all.contains("Raising the return target by 0.10 % raises volatility by"), "shadow price sentence");
        assertTrue(all.contains("Raising the upper limit of ") || all.contains("Raising the lower limit of "),
                "a bound binds under the policy");
        JsonNode m = Run.json(out.resolve(PackLayout.MANIFEST));
        assertEquals("policy.yaml", m.at("/parameters/policy").asText());
    }

    @Test
    void underThePolicysTurnoverLimitThePacksTradesAreThoseOfTheRebalanceCommand() throws IOException {
        Path out = dir.resolve("pack");
        String policy = Run.SAMPLE.resolve("policy.yaml").toString();
        assertEquals(0, Run.of(args(out, "--policy", policy)).code());
        // the same inputs through `isorisk rebalance` at the pack file's proposed target (sample pack.yaml: 0.05)
        Run rb = Run.of("rebalance", "--expected-returns", Run.SAMPLE.resolve("expected_returns.csv").toString(),
                "--covariance", Run.SAMPLE.resolve("covariance.csv").toString(), "--policy", policy, "--holdings",
                Run.SAMPLE.resolve("holdings.csv").toString(), "--target-return", "0.05", "--format", "json");
        assertEquals(0, rb.code(), rb.toString());
        JsonNode expected = rb.json();
        List<String> csv = Files.readAllLines(out.resolve(PackLayout.table("trades")));
        assertTrue(csv.get(1).contains("within the policy's trading limits"), csv.get(1));
        List<String> head = List.of(csv.get(2).split(","));
        double turnover = 0;
        for (int k = 0; k < expected.get("trades").size(); k++) {
            JsonNode t = expected.get("trades").get(k);
            String[] row = csv.get(3 + k).split(",");
            assertEquals(t.get("asset").asText(), row[0]);
            double change = Double.parseDouble(row[head.indexOf("change")]);
            assertEquals(t.get("trade_weight").asDouble(), change, 1e-15, t.get("asset").asText());
            turnover += Math.abs(change);
        }
        assertEquals(expected.at("/turnover/two_way").asDouble(), turnover, 1e-12);
        assertTrue(turnover <= 0.20 + 1e-7, "the policy's turnover.max: " + turnover);
        List<String> summary = Files.readAllLines(out.resolve(PackLayout.table("trade_summary")));
        assertTrue(summary.get(0).startsWith("# caution: "), summary.get(0));
        assertTrue(summary.get(5).startsWith("Within the trading limits,"), summary.get(5));
    }

    @Test
    void withoutAPolicyTheTradeListIsTheFullMoveAndTheSummarySaysSo() throws IOException {
        Path out = dir.resolve("pack");
        Run r = Run.of(args(out));
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("  Trades: No trading limit applies (the policy sets none), so the trade list is "
                + "the full move from the current holdings to the proposal: turnover "), r.out());
        assertTrue(Files.readAllLines(out.resolve(PackLayout.table("trades"))).get(1).contains("the full move"));
    }

    @Test
    void anExistingNonEmptyFolderWithoutForceExitsTwoAndIsLeftAsItWas() throws IOException {
        Path out = dir.resolve("pack");
        assertEquals(0, Run.of(args(out)).code());
        List<String> before = listing(dir);
        Run r = Run.of(args(out));
        assertEquals(2, r.code());
        assertEquals("isorisk: error: " + out + ": the output folder exists and is not empty; fix: choose another --out, "
                + "or add --force to replace the earlier output\n", r.err());
        assertEquals("", r.out());
        assertEquals(before, listing(dir), "nothing changed, nothing added beside it");
        assertEquals(0, Run.of(args(out, "--force")).code(), "with --force the earlier pack is replaced");
        Path mine = Files.createDirectory(dir.resolve("mine"));
        Files.writeString(mine.resolve("notes.txt"), "keep");
        Run foreign = Run.of(args(mine, "--force"));
        assertEquals(2, foreign.code());
        assertEquals("isorisk: error: " + mine + ": the output folder exists and was not written by isorisk, so it is "
                + "left alone; fix: choose another --out, or empty the folder\n", foreign.err());
        assertEquals("keep", Files.readString(mine.resolve("notes.txt")));
    }

    @Test
    void aBrokenPackFileIsNamedWithItsLineAndNothingIsWritten() throws IOException {
        Path pack = dir.resolve("pack.yaml");
        Files.writeString(pack, Files.readString(Run.SAMPLE.resolve("pack.yaml")).replace("proposed: 0.050",
                "proposed: 5%"));
        Path out = dir.resolve("out");
        String[] a = args(out);
        for (int i = 0; i < a.length; i++) {
            if (a[i].equals("--pack-file")) {
                a[i + 1] = pack.toString();
            }
        }
        Run r = Run.of(a);
        assertEquals(2, r.code());
        assertTrue(r.err().startsWith("isorisk: error: " + pack + ", row 18, column 'proposed': not a number (value '5%')"),
                r.err());
        assertFalse(Files.exists(out));
    }

    @Test
    void aTargetWithoutASolutionExitsThreeNamingTheTarget() throws IOException {
        // Every expected return equal: the return target's gradient μ is parallel to the budget's, so the
        // constraint qualification fails for any target (DESIGN.md) and no target portfolio exists.
        String mu = Run.file(dir, "mu.csv", "asset,expected_return\nA,0.04\nB,0.04\n");
        String cov = Run.file(dir, "cov.csv", "asset,A,B\nA,0.04,0.01\nB,0.01,0.09\n");
        String pack = Run.file(dir, "p.yaml", "fund: {name: Flat Fund, currency: EUR}\nas_of: 2025-06-30\n"
                + "targets: [0.05]\n");
        Path out = dir.resolve("out");
        Run r = Run.of("pack", "--expected-returns", mu, "--covariance", cov, "--pack-file", pack, "--out",
                out.toString());
        assertEquals(3, r.code(), r.toString());
        assertTrue(r.err().startsWith("isorisk: error: target return 5.00 % of the pack file: "), r.err());
        assertFalse(Files.exists(out), "no partial output");
    }

    @Test
    void thePackFileAndTheOutFolderAreRequired() {
        Run r = Run.of("pack", "--expected-returns", "x.csv", "--covariance", "y.csv");
        assertEquals(2, r.code());
        assertTrue(r.err().contains("--out") && r.err().contains("--pack-file"), r.err());
    }
}
