package org.isorisk.cli.commands;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.PackFolder;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.ProgressLine;
import org.isorisk.cli.render.StepProgress;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code isorisk demo}: the committee pack of the invented sample fund (a fictional pension scheme, illustrative
 * numbers), made exactly as {@code isorisk pack} makes one, with a short summary, the notebook's path and the
 * caution on the terminal.
 */
@Command(name = "demo", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Make the committee pack of the invented sample fund.",
        description = {"Make the committee pack of the invented sample fund (a fictional pension scheme, illustrative "
                + "numbers, not market data), as 'isorisk pack' would: notebook, charts, CSV tables, copies of the "
                + "inputs and manifest.json, in one folder written atomically."})
public final class DemoCommand extends BaseCommand {

    /** The sample files, bundled in the jar from the repository's {@code sample-data/} folder. */
    public static final List<String> SAMPLE_FILES = List.of("expected_returns.csv", "covariance.csv",
            "holdings.csv", "policy.yaml", "scenarios.yaml", "pack.yaml", "README.md");

    private static final List<String> REQUIRED = List.of("expected_returns.csv", "covariance.csv", "holdings.csv");

    @OutputPath(RunFiles.Kind.FOLDER)
    @Option(names = "--out", paramLabel = "DIR", defaultValue = "isorisk-demo",
            description = "Folder for the pack (default: ${DEFAULT-VALUE}); an earlier pack there is replaced, any "
                    + "other non-empty folder is refused.")
    Path out;

    @Option(names = "--data", paramLabel = "DIR",
            description = "Run on the scenario in DIR instead (expected_returns.csv, covariance.csv, holdings.csv and "
                    + "optionally policy.yaml and pack.yaml, in the layouts of the README); default: the bundled sample "
                    + "fund.")
    Path data;

    @Option(names = "--quiet", description = "No progress on stderr (by default a step that runs longer than a second "
            + "is shown there).")
    boolean quiet;

    @Override
    protected ExitCode execute() throws IOException {
        Path in = Files.createTempDirectory("isorisk-demo-inputs-");
        try {
            Sources src = inputs(in);
            Path dir = src.data();
            LoadedUniverse u = UniverseLoader.load(UniverseFiles.of(dir.resolve("expected_returns.csv"),
                    dir.resolve("covariance.csv")));
            List<PackFolder.Input> extra = new ArrayList<>();
            Path readme = src.packFile().resolveSibling("README.md");
            if (Files.isRegularFile(readme)) {
                extra.add(new PackFolder.Input("sample-data-readme", readme));
            }
            // An earlier pack in --out is the demo's own output and is replaced; PackFolder still refuses
            // any folder that is not an isorisk pack.
            PolicyOption policy = PolicyOption.of(Files.isRegularFile(dir.resolve("policy.yaml"))
                    ? dir.resolve("policy.yaml") : null);
            PackCommand.Made made;
            try (StepProgress progress = quiet ? null
                    : new StepProgress(err(), ProgressLine.stderrIsTerminal(), spec.name())) {
                made = PackCommand.make(files(), u, policy, dir.resolve("holdings.csv"), src.packFile(),
                        Units.DECIMAL, out, true, extra, toolVersion(), progress, this::warn);
            }
            out().print(made.summary());
            out().flush();
            err().flush();
            return ExitCode.OK;
        } finally {
            delete(in);
        }
    }

    /**
     * Where the demo reads its files.
     *
     * @param data     the folder of the assumptions, the holdings and the policy: {@code --data} itself (so that
     *                 errors name the user's files), or the extracted sample
     * @param packFile the pack file; the scenario file it names is read beside it
     */
    private record Sources(Path data, Path packFile) {
    }

    /**
     * The files to read: {@code --data}, with the bundled pack file (and beside it the folder's scenario file, or
     * the bundled one) extracted into {@code temp} when the folder has no pack file; or the bundled sample.
     */
    private Sources inputs(Path temp) throws IOException {
        if (data != null) {
            for (String name : REQUIRED) {
                if (!Files.isRegularFile(data.resolve(name))) {
                    throw InputException.of("the demo data folder has no " + name).file(data.toString())
                            .fix("put " + String.join(", ", REQUIRED) + " in the folder, or leave out --data").build();
                }
            }
            if (Files.isRegularFile(data.resolve("pack.yaml"))) {
                return new Sources(data, data.resolve("pack.yaml"));
            }
            // the bundled pack file names scenarios.yaml beside it
            if (Files.isRegularFile(data.resolve("scenarios.yaml"))) {
                Files.copy(data.resolve("scenarios.yaml"), temp.resolve("scenarios.yaml"));
            } else {
                extract("scenarios.yaml", temp);
            }
            // The bundled pack file's fund size is the sample holdings' total; the folder's holdings set their own
            // (a fund size that contradicts the holdings' market values is refused, as 'rebalance' refuses it).
            extract("pack.yaml", temp, text -> text.replaceAll("(?m)^fund_size:.*\\R", ""));
            return new Sources(data, temp.resolve("pack.yaml"));
        }
        for (String name : SAMPLE_FILES) {
            extract(name, temp);
        }
        return new Sources(temp, temp.resolve("pack.yaml"));
    }

    private static void extract(String name, Path dir) throws IOException {
        extract(name, dir, text -> text);
    }

    /** Copies the bundled sample file {@code name} into {@code dir}, its text changed by {@code edit}. */
    private static void extract(String name, Path dir, java.util.function.UnaryOperator<String> edit)
            throws IOException {
        try (InputStream s = DemoCommand.class.getResourceAsStream("/org/isorisk/cli/sample-data/" + name)) {
            if (s == null) {
                throw new IllegalStateException("the sample file " + name + " is missing from the build");
            }
            byte[] bytes = s.readAllBytes();
            String text = new String(bytes, java.nio.charset.StandardCharsets.UTF_8);
            String edited = edit.apply(text);
            Files.copy(new java.io.ByteArrayInputStream(edited.equals(text) ? bytes
                    : edited.getBytes(java.nio.charset.StandardCharsets.UTF_8)), dir.resolve(name));
        }
    }

    private static void delete(Path dir) {
        try (Stream<Path> s = Files.walk(dir)) {
            for (Path p : s.sorted(Comparator.reverseOrder()).toList()) {
                Files.deleteIfExists(p);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("could not remove the temporary copy of the sample inputs " + dir, e);
        }
    }
}
