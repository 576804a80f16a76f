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
                "--out", out.toString(), "--quiet"));
        a.addAll(List.of(more));
        return a.toArray(String[]::new);
    }

    /** The sample pack file without its fund_size line, with the sample scenarios beside it; its path. */
    private Path packFileWithoutFundSize() throws IOException {
        Files.copy(Run.SAMPLE.resolve("scenarios.yaml"), dir.resolve("scenarios.yaml"));
        String text = Files.readString(Run.SAMPLE.resolve("pack.yaml"));
        assertTrue(text.contains("\nfund_size: "), "the sample pack file sets a fund size");
        return Path.of(Run.file(dir, "pack.yaml", text.replaceAll("\nfund_size: [^\n]*", "")));
    }

    private static void set(String[] a, String option, String value) {
        for (int i = 0; i < a.length; i++) {
            if (a[i].equals(option)) {
                a[i + 1] = value;
                return;
            }
        }
        throw new AssertionError("no " + option);
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
        set(a, "--holdings", held.toString());
        // the pack file's fund size is the total of every row: without Commodities they disagree (see below)
        set(a, "--pack-file", packFileWithoutFundSize().toString());
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
        assertTrue(stress.get(2).startsWith("scenario,target,status,volatility,change"), stress.get(2));
        assertEquals(3 + 5 * 3, stress.size(), "two comment lines, the header, 5 scenarios x 3 targets");
        assertTrue(stress.stream().skip(3).allMatch(l -> l.contains(",optimal,")), "every point solved");
        // the proposal under each scenario: today's assumptions, then the five scenarios
        assertEquals(3 + 1 + 5, Files.readAllLines(out.resolve(PackLayout.table("stress_proposal"))).size());
        assertEquals(0.05, m.at("/parameters/proposed").asDouble());
        assertEquals("holdings.csv", m.at("/parameters/holdings").asText());
        assertEquals(inputsBefore, listing(Run.SAMPLE), "inputs are never modified");
    }

    @Test
    void underThePolicyTheMandateIsInWordsAndItsBindingLimitsHaveSentences() throws IOException {
        Path out = dir.resolve("pack");
        Run r = Run.of(args(out, "--policy", Run.SAMPLE.resolve("policy.yaml").toString()));
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("  Trades: The trade list is the least-risk move from the current holdings that "
                + "reaches the 5.00 % target after costs within the policy's trading limits, with turnover "), r.out());
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
        assertEquals("# table: Trades from the current holdings to the proposal", csv.get(1));
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
        // the full move to the target portfolio (49.97 %) would break the sample's 20 % turnover limit, and costs apply
        assertTrue(summary.get(5).startsWith("Proposed (after trading limits and costs),"), summary.get(5));
        // one story: the pack's proposal (weights table, risk table) is the rebalance command's proposal
        List<String> weights = Files.readAllLines(out.resolve(PackLayout.table("weights")));
        List<String> risk = Files.readAllLines(out.resolve(PackLayout.table("risk")));
        List<String> wHead = List.of(weights.get(2).split(","));
        List<String> rHead = List.of(risk.get(2).split(","));
        JsonNode w = expected.at("/proposal/weights");
        for (int k = 0; k < w.size(); k++) {
            String[] wr = weights.get(3 + k).split(",");
            String[] rr = risk.get(3 + k).split(",");
            String asset = wr[0];
            assertEquals(w.get(asset).asDouble(), Double.parseDouble(wr[wHead.indexOf("proposed")]), 0.0, asset);
            assertEquals(w.get(asset).asDouble(), Double.parseDouble(rr[rHead.indexOf("weight")]), 0.0, asset);
        }
    }

    @Test
    void withoutAPolicyTheTradeListIsTheFullMoveAndTheSummarySaysSo() throws IOException {
        Path out = dir.resolve("pack");
        Run r = Run.of(args(out));
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().contains("  Trades: No trading limit or cost applies (the policy sets none), so the trade "
                + "list is the full move from the current holdings to the least-risk portfolio at the 5.00 % target: "
                + "turnover "), r.out());
        assertFalse(r.out().contains("side by side"), "the trades reach the target portfolio: one portfolio shown");
        assertTrue(Files.readAllLines(out.resolve(PackLayout.table("trades"))).get(1).contains("the full move"));
    }

    @Test
    void aFundSizeThatContradictsTheHoldingsIsRefusedAsRebalanceRefusesIt() throws IOException {
        // sample holdings: market values adding up to 2,417,050,000 CU; the pack file says 2,400,000,000 (0.7 % off)
        Files.copy(Run.SAMPLE.resolve("scenarios.yaml"), dir.resolve("scenarios.yaml"));
        Path pack = Path.of(Run.file(dir, "pack.yaml", Files.readString(Run.SAMPLE.resolve("pack.yaml"))
                .replace("fund_size: 2417050000", "fund_size: 2400000000")));
        Path out = dir.resolve("out");
        String[] a = args(out);
        set(a, "--pack-file", pack.toString());
        Run r = Run.of(a);
        String holdings = Run.SAMPLE.resolve("holdings.csv").toString();
        assertEquals(2, r.code(), r.toString());
        assertEquals("isorisk: error: " + holdings + ": the market values add up to 2417050000.00 but fund_size in "
                + "pack.yaml is 2400000000.00; fix: cash is an asset: add the cash balance as a row, or remove "
                + "fund_size from pack.yaml\n", r.err());
        assertEquals("", r.out());
        assertFalse(Files.exists(out), "nothing is written");
        // the same rule, the same message shape, through 'isorisk rebalance --fund-size'
        Run rb = Run.of("rebalance", "--expected-returns", Run.SAMPLE.resolve("expected_returns.csv").toString(),
                "--covariance", Run.SAMPLE.resolve("covariance.csv").toString(), "--holdings", holdings,
                "--target-return", "0.05", "--fund-size", "2400000000");
        assertEquals(2, rb.code(), rb.toString());
        assertEquals("isorisk: error: " + holdings + ": the market values add up to 2417050000.00 but --fund-size is "
                + "2400000000.00; fix: cash is an asset: add the cash balance as a row, or drop --fund-size\n",
                rb.err());
        // within the tolerance (5e-4 of the size, Holdings.SUM_TOLERANCE) the holdings' total is taken
        Files.writeString(pack, Files.readString(Run.SAMPLE.resolve("pack.yaml"))
                .replace("fund_size: 2417050000", "fund_size: 2418000000"));
        assertEquals(0, Run.of(a).code());
        assertTrue(Files.readAllLines(out.resolve(PackLayout.table("trades"))).get(2).contains(",amount,"));
    }

    @Test
    void progressGoesToStderrOnlyAndNeverToStdout() throws IOException {
        Path out = dir.resolve("pack");
        List<String> a = new ArrayList<>(List.of(args(out, "--policy", Run.SAMPLE.resolve("policy.yaml").toString())));
        a.remove("--quiet");
        Run r = Run.of(a.toArray(String[]::new));
        assertEquals(0, r.code(), r.toString());
        // a step is shown only after a second, so on a fast machine stderr may be empty: every line it has is a
        // plain progress line (no carriage return: stderr is not a terminal here), and stdout has none
        for (String line : r.err().lines().toList()) {
            assertTrue(line.matches("pack: [a-z ]+( \\.\\.\\.|: \\d+ of \\d+ solves done \\(\\d+ %\\)| done in "
                    + "\\d+\\.\\d s)"), line);
        }
        assertFalse(r.err().contains("\r"));
        assertTrue(r.out().startsWith("Committee pack: "), r.out());
        assertTrue(r.out().lines().noneMatch(l -> l.startsWith("pack: ")), r.out());
        assertFalse(r.out().contains("solves done"), r.out());
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
                out.toString(), "--quiet");
        assertEquals(3, r.code(), r.toString());
        // the inputs' warning, printed as soon as the file is read, says why before the error does
        assertTrue(r.err().startsWith("isorisk: warning: " + mu + ": every asset has the same expected return (0.04)"),
                r.err());
        assertTrue(r.err().contains("\nisorisk: error: target return 5.00 % of the pack file: "), r.err());
        assertFalse(Files.exists(out), "no partial output");
    }

    @Test
    void thePackFileAndTheOutFolderAreRequired() {
        Run r = Run.of("pack", "--expected-returns", "x.csv", "--covariance", "y.csv");
        assertEquals(2, r.code());
        assertTrue(r.err().contains("--out") && r.err().contains("--pack-file"), r.err());
    }
}
