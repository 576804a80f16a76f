package org.isorisk.cli.commands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.isorisk.cli.Run;
import org.isorisk.cli.files.AtomicWrite;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.engine.io.SourceFile;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * No output of a run replaces one of its inputs: every command that writes, through every output option (result
 * files, charts, folders), against every input option, with the input named the same way, through {@code ./} and
 * {@code ../} spellings, a symbolic link and a hard link, and (for folders) a folder that holds the input. Each
 * attempt exits 2 with one line naming both files, before any work, and leaves every file of the folder exactly as
 * it was (bytes and modification time).
 */
class OutputNeverReplacesInputTests {

    @TempDir
    Path dir;

    private static final FileTime OLD = FileTime.fromMillis(1_000_000_000_000L);

    /** The inputs of the cases, in {@code dir}: the sample fund, a history, a portfolio, a policy and a pack file. */
    private void inputs() throws IOException {
        Run.sample(dir);
        for (String f : List.of("policy.yaml", "scenarios.yaml", "pack.yaml", "benchmark.csv")) {
            Files.copy(Run.SAMPLE.resolve(f), dir.resolve(f));
        }
        Files.writeString(dir.resolve("weights.csv"), "asset,weight\nCash,0.5\nGovernment Bonds,0.5\n");
        Files.writeString(dir.resolve("prices.csv"), "date,A,B\n2024-01-31,100,50\n2024-02-29,101,51\n");
    }

    private String in(String name) {
        return dir.resolve(name).toString();
    }

    /**
     * One writing command: its arguments without the output, the output option and kind, the input under test
     * (its file in {@code dir} and its option), and whether the output is a chart file.
     */
    private record Case(List<String> args, String output, RunFiles.Kind kind, String input, String inputOption) {
    }

    private List<Case> fileCases() {
        String mu = in("expected_returns.csv");
        String cov = in("covariance.csv");
        List<String> base = List.of("--expected-returns", mu, "--covariance", cov);
        List<Case> c = new ArrayList<>();
        c.add(new Case(with("solve", base), "--out", RunFiles.Kind.FILE, "expected_returns.csv", "--expected-returns"));
        c.add(new Case(with("solve", base), "--out", RunFiles.Kind.FILE, "covariance.csv", "--covariance"));
        c.add(new Case(with("solve", base, "--policy", in("policy.yaml")), "--out", RunFiles.Kind.FILE, "policy.yaml",
                "--policy"));
        c.add(new Case(with("frontier", base, "--policy", in("policy.yaml")), "--out", RunFiles.Kind.FILE,
                "policy.yaml", "--policy"));
        c.add(new Case(with("frontier", base), "--chart", RunFiles.Kind.CHART, "expected_returns.csv",
                "--expected-returns"));
        c.add(new Case(with("risk", List.of("--covariance", cov), "--weights", in("weights.csv")), "--out",
                RunFiles.Kind.FILE, "weights.csv", "--weights"));
        c.add(new Case(with("risk", List.of("--covariance", cov), "--weights", in("weights.csv"), "--benchmark",
                in("benchmark.csv")), "--out", RunFiles.Kind.FILE, "benchmark.csv", "--benchmark"));
        c.add(new Case(with("rebalance", base, "--holdings", in("holdings.csv")), "--out", RunFiles.Kind.FILE,
                "holdings.csv", "--holdings"));
        c.add(new Case(with("stress", base, "--targets", "0.04:0.05:0.01", "--scenarios", in("scenarios.yaml")),
                "--out", RunFiles.Kind.FILE, "scenarios.yaml", "--scenarios"));
        c.add(new Case(with("stress", base, "--targets", "0.04:0.05:0.01", "--scenarios", in("scenarios.yaml")),
                "--chart", RunFiles.Kind.CHART, "scenarios.yaml", "--scenarios"));
        c.add(new Case(with("check", List.of("--covariance", cov)), "--out", RunFiles.Kind.FILE, "covariance.csv",
                "--covariance"));
        c.add(new Case(with("chart", List.of("frontier"), base, "--current", in("holdings.csv")), "--out",
                RunFiles.Kind.CHART, "holdings.csv", "--current"));
        c.add(new Case(with("chart", List.of("weights"), base, "--policy", in("policy.yaml")), "--out",
                RunFiles.Kind.CHART, "policy.yaml", "--policy"));
        c.add(new Case(with("chart", List.of("marginal-risk"), base), "--out", RunFiles.Kind.CHART,
                "expected_returns.csv", "--expected-returns"));
        c.add(new Case(with("chart", List.of("risk-contributions"), List.of("--covariance", cov), "--weights",
                in("weights.csv"), "--current", in("holdings.csv")), "--out", RunFiles.Kind.CHART, "weights.csv",
                "--weights"));
        return c;
    }

    private List<Case> folderCases(Path own) {
        String mu = in("expected_returns.csv");
        String cov = in("covariance.csv");
        List<Case> c = new ArrayList<>();
        c.add(new Case(with("estimate", List.of("--history", own.resolve("prices.csv").toString(), "--kind", "prices")),
                "--out-dir", RunFiles.Kind.FOLDER, "prices.csv", "--history"));
        c.add(new Case(with("estimate", List.of("--history", in("prices.csv"), "--kind", "prices", "--mean", "file",
                "--expected-returns", own.resolve("expected_returns.csv").toString())), "--out-dir",
                RunFiles.Kind.FOLDER, "expected_returns.csv", "--expected-returns"));
        c.add(new Case(with("estimate", List.of("--history", in("prices.csv"), "--kind", "prices", "--mean", "implied",
                "--reference-weights", own.resolve("weights.csv").toString())), "--out-dir", RunFiles.Kind.FOLDER,
                "weights.csv", "--reference-weights"));
        c.add(new Case(with("check", List.of("--repair", "--covariance", own.resolve("covariance.csv").toString())),
                "--out-dir", RunFiles.Kind.FOLDER, "covariance.csv", "--covariance"));
        c.add(new Case(with("pack", List.of("--expected-returns", mu, "--covariance", cov, "--pack-file",
                in("pack.yaml"), "--holdings", own.resolve("holdings.csv").toString())), "--out", RunFiles.Kind.FOLDER,
                "holdings.csv", "--holdings"));
        c.add(new Case(with("pack", List.of("--expected-returns", mu, "--covariance", cov, "--pack-file",
                own.resolve("pack.yaml").toString())), "--out", RunFiles.Kind.FOLDER, "pack.yaml", "--pack-file"));
        // the demo reads every file directly inside --data; the first of them by name is named
        c.add(new Case(with("demo", List.of("--data", own.toString())), "--out", RunFiles.Kind.FOLDER,
                "covariance.csv", "--data"));
        return c;
    }

    private static List<String> with(String command, List<String> base, String... more) {
        return with(command, List.of(), base, more);
    }

    private static List<String> with(String command, List<String> sub, List<String> base, String... more) {
        List<String> a = new ArrayList<>();
        a.add(command);
        a.addAll(sub);
        a.addAll(base);
        a.addAll(List.of(more));
        return a;
    }

    /** Every file and link under {@code d}: its bytes' SHA-256 and modification time, or where a link points. */
    private static Map<String, String> snapshot(Path d) {
        Map<String, String> m = new TreeMap<>();
        try (Stream<Path> s = Files.walk(d)) {
            for (Path p : s.toList()) {
                String key = d.relativize(p).toString();
                if (Files.isSymbolicLink(p)) {
                    m.put(key, "-> " + Files.readSymbolicLink(p));
                } else if (Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS)) {
                    m.put(key, SourceFile.sha256(Files.readAllBytes(p)) + " "
                            + Files.getLastModifiedTime(p, LinkOption.NOFOLLOW_LINKS).toMillis());
                } else {
                    m.put(key, "folder");
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return m;
    }

    private static void age(Path d) throws IOException {
        try (Stream<Path> s = Files.walk(d)) {
            for (Path p : s.filter(x -> Files.isRegularFile(x, LinkOption.NOFOLLOW_LINKS)).toList()) {
                Files.setLastModifiedTime(p, OLD);
            }
        }
    }

    /** Runs {@code c} writing to {@code target}; checks the exact refusal and that nothing under {@code dir} moved. */
    private void refused(Case c, String target, String expected) throws IOException {
        age(dir);
        Map<String, String> before = snapshot(dir);
        List<String> args = new ArrayList<>(c.args());
        args.add(c.output());
        args.add(target);
        Run r = Run.of(args.toArray(String[]::new));
        assertEquals(2, r.code(), args + "\n" + r);
        assertEquals("isorisk: error: " + expected + "\n", r.err(), args.toString());
        assertEquals("", r.out(), "nothing is printed but the error");
        assertEquals(before, snapshot(dir), "every file is left as it was, bytes and time: " + args);
    }

    private static String names(Case c, String target, String input, String how) {
        return target + ": " + c.output() + " names the " + c.inputOption() + " file " + input + how + "; "
                + RunFiles.RULE + "; fix: choose another " + c.output();
    }

    private static String holds(Case c, String target, String input) {
        return target + ": the " + c.output() + " folder holds the " + c.inputOption() + " file " + input
                + ", and would be replaced as a whole; " + RunFiles.RULE + "; fix: choose another " + c.output()
                + " folder that holds none of the inputs";
    }

    /** The same file by name, by {@code ./} and {@code ../} spellings, through a symbolic link and a hard link. */
    private void sameFileVariants(Case c, Path folder) throws IOException {
        String input = folder.resolve(c.input()).toString();
        String ext = c.kind() == RunFiles.Kind.CHART ? ".png" : c.input().substring(c.input().lastIndexOf('.'));
        Path sub = Files.createDirectories(folder.resolve("sub"));
        Path link = folder.resolve("link" + ext);
        Path hard = folder.resolve("hard" + ext);
        Files.deleteIfExists(link);
        Files.deleteIfExists(hard);
        Files.createSymbolicLink(link, Path.of(c.input()));
        Files.createLink(hard, folder.resolve(c.input()));
        refused(c, input, names(c, input, input, ""));
        String dot = folder + "/./" + c.input();
        refused(c, dot, names(c, dot, input, ""));
        String up = sub + "/../" + c.input();
        refused(c, up, names(c, up, input, ""));
        refused(c, link.toString(), names(c, link.toString(), input, " (through a symbolic link)"));
        refused(c, hard.toString(), names(c, hard.toString(), input, " (a hard link to it)"));
        Files.delete(link);
        Files.delete(hard);
    }

    @Test
    void noResultFileOrChartReplacesAnInputHoweverItIsNamed() throws IOException {
        inputs();
        for (Case c : fileCases()) {
            sameFileVariants(c, dir);
        }
    }

    @Test
    void noOutputFolderIsAnInputNorHoldsOneHoweverItIsNamed() throws IOException {
        inputs();
        Path own = Files.createDirectories(dir.resolve("own"));
        for (Case c : folderCases(own)) {
            for (String f : List.of("prices.csv", "expected_returns.csv", "covariance.csv", "holdings.csv",
                    "weights.csv", "pack.yaml")) {
                Files.copy(dir.resolve(f), own.resolve(f), java.nio.file.StandardCopyOption.REPLACE_EXISTING);
            }
            String input = own.resolve(c.input()).toString();
            if (!c.inputOption().equals("--data")) {
                sameFileVariants(c, own);
            }
            refused(c, own.toString(), holds(c, own.toString(), input));
            refused(c, dir.resolve("own/../own").toString(), holds(c, dir.resolve("own/../own").toString(), input));
            Path link = dir.resolve("own-link");
            Files.createSymbolicLink(link, own);
            refused(c, link.toString(), holds(c, link.toString(), input));
            Files.delete(link);
        }
    }

    @Test
    void anEarlierOutputHoldingAHardLinkToAnInputIsNotReplaced() throws IOException {
        inputs();
        Path earlier = Files.createDirectories(dir.resolve("earlier"));
        Files.writeString(earlier.resolve(AtomicWrite.MARKER), "written by isorisk\n");
        Path link = earlier.resolve("kept-history.csv");
        Files.createLink(link, dir.resolve("prices.csv"));
        Case c = new Case(with("estimate", List.of("--history", in("prices.csv"), "--kind", "prices")), "--out-dir",
                RunFiles.Kind.FOLDER, "prices.csv", "--history");
        refused(c, earlier.toString(), earlier + ": the --out-dir folder holds " + link + ", a hard link to the "
                + "--history file " + in("prices.csv") + ", and would be replaced as a whole; " + RunFiles.RULE
                + "; fix: choose another --out-dir folder that holds none of the inputs");
    }

    @Test
    void filesNamedInsideInputsAreInputsToo() throws IOException {
        inputs();
        // a policy's bounds table, resolved against the policy's folder
        Files.writeString(dir.resolve("bounds.csv"), "asset,min,max\nCash,0,0.2\n");
        Files.writeString(dir.resolve("with-bounds.yaml"), "budget: 1.0\nbounds_file: bounds.csv\n");
        Case solve = new Case(with("solve", List.of("--expected-returns", in("expected_returns.csv"), "--covariance",
                in("covariance.csv"), "--policy", in("with-bounds.yaml"))), "--out", RunFiles.Kind.FILE, "", "");
        String bounds = dir.toAbsolutePath().resolve("bounds.csv").toString();
        refused(solve, in("bounds.csv"), in("bounds.csv") + ": --out names the bounds file named in --policy " + bounds
                + "; " + RunFiles.RULE + "; fix: choose another --out");

        // a stress scenario's replacement covariance, resolved against the scenario file's folder
        Files.writeString(dir.resolve("crisis.yaml"), "scenarios:\n  - name: crisis\n    shocks:\n"
                + "      - covariance: {file: covariance.csv}\n");
        Files.copy(dir.resolve("covariance.csv"),
                Files.createDirectories(dir.resolve("base")).resolve("covariance.csv"));
        Case stress = new Case(with("stress", List.of("--expected-returns", in("expected_returns.csv"), "--covariance",
                in("base/covariance.csv"), "--targets", "0.04:0.05:0.01", "--scenarios", in("crisis.yaml"))), "--out",
                RunFiles.Kind.FILE, "", "");
        String crisis = dir.toAbsolutePath().resolve("covariance.csv").toString();
        refused(stress, in("covariance.csv"), in("covariance.csv") + ": --out names the covariance file named in "
                + "--scenarios " + crisis + "; " + RunFiles.RULE + "; fix: choose another --out");

        // the scenarios a pack file names, here through a link into the output folder
        Path out = Files.createDirectories(dir.resolve("out"));
        Files.writeString(out.resolve(AtomicWrite.MARKER), "written by isorisk\n"); // an earlier pack, --force given
        Files.move(dir.resolve("scenarios.yaml"), out.resolve("scenarios.yaml"));
        Files.createSymbolicLink(dir.resolve("scenarios.yaml"), out.resolve("scenarios.yaml"));
        Case pack = new Case(with("pack", List.of("--expected-returns", in("expected_returns.csv"), "--covariance",
                in("covariance.csv"), "--holdings", in("holdings.csv"), "--pack-file", in("pack.yaml"), "--force")),
                "--out", RunFiles.Kind.FOLDER, "", "");
        String scenarios = dir.toAbsolutePath().resolve("scenarios.yaml").toString();
        refused(pack, out.toString(), out + ": the --out folder holds the scenarios file named in --pack-file "
                + scenarios + ", and would be replaced as a whole; " + RunFiles.RULE + "; fix: choose another --out "
                + "folder that holds none of the inputs");
    }

    @Test
    void everyOutputIsCheckedBeforeAnyInputIsRead() throws IOException {
        inputs();
        // broken inputs: were they read first, the error would be theirs
        String broken = Run.file(dir, "broken.csv", "not,a,table;\n");
        String brokenPack = Run.file(dir, "broken.yaml", "fund: [unclosed\n");
        Path mine = Files.createDirectories(dir.resolve("mine"));
        Files.writeString(mine.resolve("notes.txt"), "keep");
        Run r = Run.of("pack", "--expected-returns", broken, "--covariance", broken, "--pack-file", brokenPack,
                "--out", mine.toString());
        assertEquals("isorisk: error: " + mine + ": the output folder exists and was not written by isorisk, so it is "
                + "left alone; fix: choose another --out, or empty the folder\n", r.err());
        Path earlier = Files.createDirectories(dir.resolve("earlier"));
        Files.writeString(earlier.resolve(AtomicWrite.MARKER), "written by isorisk\n");
        Files.writeString(earlier.resolve("old.txt"), "old");
        r = Run.of("pack", "--expected-returns", broken, "--covariance", broken, "--pack-file", brokenPack,
                "--out", earlier.toString());
        assertEquals("isorisk: error: " + earlier + ": the output folder exists and is not empty; fix: choose another "
                + "--out, or add --force to replace the earlier output\n", r.err());
        Path missing = dir.resolve("no-such-folder");
        r = Run.of("solve", "--expected-returns", broken, "--covariance", broken, "--out",
                missing.resolve("r.json").toString());
        assertEquals("isorisk: error: " + missing + ": the folder of --out does not exist; fix: create it first, or "
                + "choose another --out\n", r.err());
        r = Run.of("frontier", "--expected-returns", broken, "--covariance", broken, "--chart", in("chart.txt"));
        assertEquals("isorisk: error: " + in("chart.txt") + ": the chart format 'txt' is not supported; fix: end the "
                + "file name in .png, .svg or .pdf\n", r.err());
        r = Run.of("estimate", "--history", broken, "--kind", "prices", "--out-dir", in("expected_returns.csv"));
        assertEquals("isorisk: error: " + in("expected_returns.csv") + ": the output folder is an existing file; fix: "
                + "choose another --out-dir\n", r.err());
        r = Run.of("check", "--covariance", broken, "--out", dir.toString());
        assertEquals("isorisk: error: " + dir + ": the output path is a folder; fix: give a file name, e.g. "
                + dir.resolve("result.json") + "\n", r.err());
        r = Run.of("frontier", "--expected-returns", broken, "--covariance", broken, "--out", in("same.png"),
                "--chart", in("same.png"));
        assertEquals("isorisk: error: " + in("same.png") + ": --chart and --out name the same file; fix: give --out "
                + "another name\n", r.err());
        assertFalse(Files.exists(dir.resolve("same.png")));
        assertEquals(List.of("notes.txt"), list(mine));
        assertEquals(List.of(".isorisk-output", "old.txt"), list(earlier));
    }

    @Test
    void everyOptionThatNamesAPlaceToWriteIsDeclaredAsAnOutput() {
        // Path options are inputs unless marked @OutputPath; an output option left unmarked would be read as an
        // input and its target refused at publication. Walk every command and subcommand.
        java.util.ArrayDeque<picocli.CommandLine> todo = new java.util.ArrayDeque<>();
        java.io.PrintWriter sink = new java.io.PrintWriter(new java.io.StringWriter());
        todo.add(org.isorisk.cli.Cli.commandLine(sink, sink, true));
        List<String> outputs = new ArrayList<>();
        while (!todo.isEmpty()) {
            picocli.CommandLine cl = todo.poll();
            todo.addAll(cl.getSubcommands().values());
            for (picocli.CommandLine.Model.OptionSpec o : cl.getCommandSpec().options()) {
                boolean marked = o.userObject() instanceof java.lang.reflect.Field f
                        && f.isAnnotationPresent(org.isorisk.cli.files.OutputPath.class);
                boolean writes = o.longestName().matches("--out(-dir)?|--chart");
                assertEquals(writes, marked, cl.getCommandSpec().qualifiedName() + " " + o.longestName());
                if (marked) {
                    assertEquals(Path.class, o.type(), o.longestName());
                    outputs.add(cl.getCommandSpec().qualifiedName() + " " + o.longestName());
                }
            }
        }
        assertTrue(outputs.containsAll(List.of("isorisk solve --out", "isorisk frontier --chart", "isorisk pack --out",
                "isorisk demo --out", "isorisk estimate --out-dir", "isorisk check --out-dir",
                "isorisk chart frontier --out")), outputs.toString());
    }

    private static List<String> list(Path d) throws IOException {
        try (Stream<Path> s = Files.list(d)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }
}
