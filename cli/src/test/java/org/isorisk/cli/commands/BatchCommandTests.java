package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.isorisk.cli.Run;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvRow;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code isorisk batch} as the outside checks use it: the contract's files and columns, each portfolio equal to
 * the single command's JSON, bad rows as rows with their messages, exit codes by status, and a run killed in the
 * middle that resumes to exactly the tables of an uninterrupted run.
 */
class BatchCommandTests {

    private static final Path BOOK = Run.SAMPLE.resolve("book");

    @TempDir
    Path dir;

    private static String[] sample(String job, Path out, String... more) {
        List<String> a = new ArrayList<>(List.of("batch", "--book", BOOK.resolve("book.csv").toString(),
                "--assumption-sets", BOOK.resolve("assumption_sets.csv").toString(), "--job", job, "--out-dir",
                out.toString(), "--quiet"));
        a.addAll(List.of(more));
        return a.toArray(new String[0]);
    }

    private static CsvTable table(Path file) {
        return Csv.read(file, "results");
    }

    @Test
    void theSampleBookWritesTheContractsTablesAndEachRowIsTheSolveCommandsAnswer() throws IOException {
        Path out = dir.resolve("out");
        Run r = Run.of(sample("solve", out));
        assertEquals(0, r.code(), r.toString());
        assertTrue(r.out().startsWith("isorisk batch: solve for 10 portfolios of book.csv\n  optimal"), r.out());
        assertTrue(r.out().contains("Caution: "), r.out());
        CsvTable book = Csv.read(BOOK.resolve("book.csv"), "book");
        CsvTable results = table(out.resolve("results.csv"));
        assertEquals(book.rows().size(), results.rows().size());
        assertEquals(List.of("row", "id", "status", "message"), results.header().subList(0, 4));
        CsvTable weights = table(out.resolve("weights.csv"));
        assertEquals(List.of("id", "asset", "weight"), weights.header());
        assertEquals(12 * book.rows().size(), weights.rows().size());
        // the first row (the main fund: ../policy.yaml, base assumptions, 5 %) against `isorisk solve`
        Run solve = Run.of("solve", "--expected-returns", Run.SAMPLE.resolve("expected_returns.csv").toString(),
                "--covariance", Run.SAMPLE.resolve("covariance.csv").toString(), "--policy",
                Run.SAMPLE.resolve("policy.yaml").toString(), "--target-return", "0.05", "--format", "json");
        assertEquals(0, solve.code(), solve.toString());
        JsonNode j = solve.json();
        CsvRow first = results.rows().get(0);
        assertEquals("fernhollow-main", first.cell(results.column("id")));
        assertEquals("optimal", first.cell(results.column("status")));
        assertEquals(j.get("method").asText(), first.cell(results.column("method")));
        assertEquals(j.get("volatility").doubleValue(),
                Double.parseDouble(first.cell(results.column("volatility"))), 0.0);
        double[] expected = new double[12];
        double[] got = new double[12];
        for (int i = 0; i < 12; i++) {
            CsvRow w = weights.rows().get(i);
            assertEquals("fernhollow-main", w.cell(0));
            expected[i] = j.get("weights").get(w.cell(1)).doubleValue();
            got[i] = Double.parseDouble(w.cell(2));
        }
        assertArrayEquals(expected, got, 0.0);
        for (JsonNode m : j.get("multipliers")) {
            if (m.get("constraint").asText().equals("target_return")) {
                assertEquals(m.get("variance_per_unit").doubleValue(),
                        Double.parseDouble(first.cell(results.column("target_variance_per_unit"))), 0.0);
            }
        }
        JsonNode summary = Run.json(out.resolve("summary.json"));
        assertEquals(10, summary.get("counts").get("optimal").asInt());
        assertEquals(Caution.TEXT, summary.get("caution").asText());
        assertTrue(Files.readString(out.resolve("README.txt")).contains(Caution.TEXT));
        assertFalse(Files.exists(out.resolve(".run")), "no unfinished-run state left behind");
    }

    @Test
    void badRowsAreRowsAndTheExitCodeSaysTheWorstStatus() throws IOException {
        Path in = Files.createDirectories(dir.resolve("in"));
        Files.writeString(in.resolve("p.yaml"), "budget: 1\nbounds:\n  default: {min: 0, max: 0.4}\n");
        String mu = Run.SAMPLE.resolve("expected_returns.csv").toString();
        String cov = Run.SAMPLE.resolve("covariance.csv").toString();
        Files.writeString(in.resolve("infeasible.csv"), "id,policy,target_return\na,p.yaml,0.05\nb,p.yaml,0.5\n");
        Run three = Run.of("batch", "--book", in.resolve("infeasible.csv").toString(), "--expected-returns", mu,
                "--covariance", cov, "--job", "solve", "--out-dir", dir.resolve("o3").toString(), "--quiet",
                "--format", "json");
        assertEquals(3, three.code(), three.toString());
        assertEquals("infeasible", three.json().get("status").asText());
        assertEquals(1, three.json().get("counts").get("infeasible").asInt());
        Files.writeString(in.resolve("both.csv"), "id,policy,target_return\na,p.yaml,0.05\nb,p.yaml,0.5\n"
                + "c,missing.yaml,0.05\n");
        Run two = Run.of("batch", "--book", in.resolve("both.csv").toString(), "--expected-returns", mu,
                "--covariance", cov, "--job", "solve", "--out-dir", dir.resolve("o2").toString(), "--quiet");
        assertEquals(2, two.code(), two.toString());
        CsvTable t = table(dir.resolve("o2/results.csv"));
        assertEquals(List.of("optimal", "infeasible", "invalid-input"), t.columnValues(t.column("status")));
        String missing = in.resolve("missing.yaml").toString();
        assertEquals(missing + ": cannot read the policy file: " + missing + "; fix: check the path given to "
                + "--policy", t.rows().get(2).cell(t.column("message")));
        // a book that cannot be read at all: exit 2 before any work, nothing written
        Files.writeString(in.resolve("broken.csv"), "id;policy;target_return\na;p.yaml;0.05\n");
        Run broken = Run.of("batch", "--book", in.resolve("broken.csv").toString(), "--expected-returns", mu,
                "--covariance", cov, "--job", "solve", "--out-dir", dir.resolve("o4").toString());
        assertEquals(2, broken.code());
        assertEquals("isorisk: error: " + in.resolve("broken.csv") + ", row 1: the file is separated by semicolons, "
                + "not commas (value 'id;policy;target_return'); fix: save it as CSV with commas between cells and a "
                + "decimal point in numbers (0.05, not 0,05)\n", broken.err());
        assertFalse(Files.exists(dir.resolve("o4")));
    }

    @Test
    void rebalanceAndStressWriteTheirOwnTablesAndJsonLinesOnRequest() throws IOException {
        Run r = Run.of(sample("rebalance", dir.resolve("r"), "--json"));
        assertEquals(0, r.code(), r.toString());
        CsvTable trades = table(dir.resolve("r/trades.csv"));
        assertEquals(List.of("id", "asset", "current", "target", "trade", "amount", "cost", "side"), trades.header());
        List<String> lines = Files.readAllLines(dir.resolve("r/portfolios.jsonl"));
        assertEquals(10, lines.size());
        assertTrue(lines.get(0).startsWith("{\"row\":4,\"id\":\"fernhollow-main\""), lines.get(0));
        Run s = Run.of(sample("stress", dir.resolve("s"), "--scenarios", Run.SAMPLE.resolve("scenarios.yaml")
                .toString()));
        assertEquals(0, s.code(), s.toString());
        assertEquals(50, table(dir.resolve("s/stress.csv")).rows().size()); // 10 portfolios × 5 scenarios
    }

    @Test
    void aFolderWithOtherFilesOrAnotherRunsStateIsRefused() throws IOException {
        Path other = Files.createDirectories(dir.resolve("other"));
        Files.writeString(other.resolve("notes.txt"), "mine");
        Run r = Run.of(sample("solve", other));
        assertEquals(2, r.code());
        // the command line's one check of outputs (cli.files.RunFiles), before any work
        assertEquals("isorisk: error: " + other + ": the output folder exists and was not written by isorisk, so it is "
                + "left alone; fix: choose another --out-dir, or empty the folder\n", r.err());
        assertEquals("mine", Files.readString(other.resolve("notes.txt")));
        Run usage = Run.of(sample("optimise", dir.resolve("x")));
        assertEquals(2, usage.code());
        assertTrue(usage.err().startsWith("isorisk: error: --job 'optimise' is not known; use solve, rebalance or "
                + "stress"), usage.err());
    }

    @Test
    void aRunKilledInTheMiddleResumesToTheTablesOfAnUninterruptedRun() throws Exception {
        // a book of 3,000 rows of the sample fund under the sample policy, targets spread over its range
        StringBuilder b = new StringBuilder("id,policy,target_return\n");
        for (int k = 0; k < 3000; k++) {
            b.append(String.format(java.util.Locale.ROOT, "acct-%05d,p.yaml,%.5f%n", k, 0.035 + 0.03 * (k % 97) / 96));
        }
        Path in = Files.createDirectories(dir.resolve("in"));
        Files.writeString(in.resolve("book.csv"), b.toString());
        Files.copy(Run.SAMPLE.resolve("policy.yaml"), in.resolve("p.yaml"));
        List<String> args = List.of("batch", "--book", in.resolve("book.csv").toString(), "--expected-returns",
                Run.SAMPLE.resolve("expected_returns.csv").toString(), "--covariance",
                Run.SAMPLE.resolve("covariance.csv").toString(), "--job", "solve", "--chunk-size", "7", "--threads",
                "1", "--quiet");
        Path killed = dir.resolve("killed");
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-cp", System.getProperty("java.class.path"), "org.isorisk.cli.Main"));
        cmd.addAll(args);
        cmd.addAll(List.of("--out-dir", killed.toString()));
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(dir.resolve("child.log").toFile())
                .start();
        Path journal = killed.resolve(".run").resolve("journal.json");
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        long rows = 0;
        while (System.nanoTime() < deadline && p.isAlive()) {
            if (Files.exists(journal)) {
                try {
                    rows = Run.json(journal).get("rows").asLong();
                } catch (RuntimeException e) {
                    rows = 0; // read while being replaced
                }
                if (rows >= 100) {
                    break;
                }
            }
            Thread.sleep(20);
        }
        assertTrue(p.isAlive(), "the child finished before it could be killed: " + Files.readString(
                dir.resolve("child.log")));
        p.destroyForcibly().waitFor(30, TimeUnit.SECONDS); // SIGKILL: no shutdown hook, no last write
        assertTrue(Files.exists(journal), "the killed run left its journal");
        long committed = Run.json(journal).get("rows").asLong();
        assertTrue(committed > 0 && committed < 3000, "killed in the middle: " + committed);

        List<String> again = new ArrayList<>(args);
        again.addAll(List.of("--out-dir", killed.toString()));
        Run resumed = Run.of(again.toArray(new String[0]));
        assertTrue(resumed.err().contains("resuming the unfinished run in " + killed + " after "), resumed.err());
        List<String> fresh = new ArrayList<>(args);
        fresh.addAll(List.of("--out-dir", dir.resolve("fresh").toString()));
        Run uninterrupted = Run.of(fresh.toArray(new String[0]));
        assertEquals(uninterrupted.code(), resumed.code(), resumed.toString());
        for (String f : List.of("results.csv", "weights.csv")) {
            assertEquals(Files.readString(dir.resolve("fresh").resolve(f), StandardCharsets.UTF_8),
                    Files.readString(killed.resolve(f), StandardCharsets.UTF_8), f);
        }
        assertEquals(3000, table(killed.resolve("results.csv")).rows().size());
        assertEquals(Run.json(dir.resolve("fresh/summary.json")).get("counts"),
                Run.json(killed.resolve("summary.json")).get("counts"));
    }
}
