package org.isorisk.cli.commands;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.isorisk.cli.files.PackFiles;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.PackFolder;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.PolicyOption;
import org.isorisk.cli.render.ProgressLine;
import org.isorisk.cli.render.StepProgress;
import org.isorisk.cli.usecase.FundSize;
import org.isorisk.cli.usecase.PackAnalysis;
import org.isorisk.cli.usecase.PackSpecReader;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.ScenarioFile;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.notebooks.PackContent;
import org.isorisk.notebooks.PackLayout;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.pack.ChartMaker;
import org.isorisk.notebooks.pack.PackCharts;
import org.isorisk.notebooks.pack.PackComposer;
import org.isorisk.notebooks.pack.PackResults;
import org.isorisk.notebooks.pack.PackSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/**
 * {@code isorisk pack}: the committee pack of a fund, from its input tables and a pack file, into one folder
 * (notebook, charts, CSV tables, copies of the inputs, manifest), written atomically. Reading and printing only:
 * the analyses are {@link PackAnalysis}'s, the layout {@link PackComposer}'s, the folder {@link PackFolder}'s.
 */
@Command(name = "pack", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Write a fund's investment committee pack (notebook, charts, tables, manifest) into one folder.",
        description = {"Write the investment committee pack of a fund into one folder: a Jupyter notebook with the "
                + "assumptions, the mandate in words, the minimum-variance and proposed portfolios, the frontier, the "
                + "risk of the proposal, every binding constraint with its shadow price, the trades (within the policy's "
                + "trading limits when it sets any: turnover, per-asset trade limits, minimum trade, no-trade list; "
                + "else the full move) and a run record; the charts, the CSV tables, copies of the inputs and manifest.json (SHA-256 of every file). The "
                + "folder appears complete or not at all."})
public final class PackCommand extends BaseCommand {


    @Mixin
    InputOptions inputs;

    @Mixin
    PolicyOption policyOption;

    @Option(names = "--holdings", paramLabel = "FILE",
            description = "Current holdings: CSV asset,weight or asset,market_value; adds the trade list (within the "
                    + "policy's trading limits when it sets any).")
    Path holdings;

    @Option(names = "--pack-file", paramLabel = "FILE", required = true,
            description = "The pack file (YAML): fund name and currency, as-of date, targets, proposal, charts "
                    + "(see the README, 'The pack file').")
    Path packFile;

    @OutputPath(value = RunFiles.Kind.FOLDER, force = "--force")
    @Option(names = "--out", paramLabel = "DIR", required = true,
            description = "The folder to create. It must not exist or be empty, unless --force is given.")
    Path out;

    @Option(names = "--force",
            description = "Replace an existing earlier pack in --out (never a folder that is not an isorisk pack).")
    boolean force;

    @Option(names = "--quiet", description = "No progress on stderr (by default a step that runs longer than a second "
            + "is shown there).")
    boolean quiet;

    @Override
    protected ExitCode execute() {
        LoadedUniverse u = inputs.load(true);
        Made made;
        try (StepProgress progress = progress(quiet)) {
            made = make(files(), u, policyOption, holdings, packFile, inputs.units(), out, force, List.of(),
                    toolVersion(), progress, this::warn);
        }
        out().print(made.summary());
        out().flush();
        err().flush();
        return ExitCode.OK;
    }

    /** Progress on stderr for the steps of a pack, or none when {@code quiet}. */
    StepProgress progress(boolean quiet) {
        return quiet ? null : new StepProgress(err(), ProgressLine.stderrIsTerminal(), spec.name());
    }

    /**
     * What a pack run made.
     *
     * @param folder  the pack folder
     * @param content what the notebook says
     * @param files   number of files written (manifest included)
     * @param summary  the terminal summary (also written as {@code summary.txt})
     * @param warnings the warnings of reading the inputs (assumptions, holdings), for stderr
     */
    public record Made(Path folder, PackContent content, int files, String summary, List<String> warnings) {
        public Made {
            warnings = List.copyOf(warnings);
        }
    }

    /**
     * Reads the policy, holdings and pack file, runs the analysis and writes the folder; shared with {@code demo}.
     *
     * @param files       the run's files: {@code out} is one of its declared outputs
     * @param extraInputs further files to record and copy (e.g. the demo's README), as role and path
     * @param version     isorisk's version, for the manifest and the run record ({@link BaseCommand#toolVersion})
     * @param progress    where the steps are shown (stderr); null for none
     * @param warnings    prints the inputs' warnings as soon as they are read (stderr)
     */
    static Made make(RunFiles files, LoadedUniverse read, PolicyOption policyOption, Path holdings, Path packFile,
                     Units units, Path out, boolean force, List<PackFolder.Input> extraInputs, String version,
                     StepProgress progress, java.util.function.Consumer<List<String>> warnings) {
        PackAnalysis.Steps steps = progress == null ? PackAnalysis.Steps.NONE : new PackAnalysis.Steps() {
            @Override
            public void step(String what) {
                progress.step(what);
            }

            @Override
            public org.isorisk.engine.stress.StressProgress counted(String what) {
                return progress.counted(what);
            }
        };
        steps.step("reading the inputs");
        PackSpec spec = PackSpecReader.read(packFile);
        PolicyOption.Loaded loaded = policyOption.load(read);
        LoadedUniverse u = loaded.inputs(); // with the policy file in its provenance
        Path policy = policyOption.path().orElse(null);
        List<String> notes = new ArrayList<>(u.warnings());
        List<String> shown = new ArrayList<>(u.warnings());
        Mandate mandate = loaded.mandate();
        Optional<Policy> pol = loaded.policy();
        // the policy's trading limits shape the trade list (PackAnalysis: the full move when they restrict nothing)
        TradingLimits trading = pol.map(TradingLimits::of).orElse(null);
        Optional<double[]> weights = Optional.empty();
        List<SourceFile> sources = new ArrayList<>(u.provenance().inputs());
        if (holdings != null) {
            PortfolioFile h = PortfolioReader.read(holdings, "holdings", u.assets(), units);
            weights = Optional.of(h.weights());
            notes.addAll(h.warnings());
            shown.addAll(h.warnings());
            sources.add(h.source());
            // the one rule 'rebalance --fund-size' follows: a fund size that contradicts the market values is refused
            java.util.OptionalDouble size = FundSize.resolve(h, holdings, spec.fundSize()
                            .map(java.util.OptionalDouble::of).orElse(java.util.OptionalDouble.empty()),
                    "fund_size in " + packFile.getFileName(), "remove fund_size from " + packFile.getFileName());
            if (size.isPresent()) {
                spec = spec.withFundSize(size.getAsDouble());
            }
        }
        warnings.accept(shown);
        java.time.LocalDate asOf = spec.asOf();
        u.provenance().asOfDate().filter(d -> !d.equals(asOf)).ifPresent(d -> notes.add(
                "The pack file's as-of date differs from the inputs' (" + d + "); the pack shows the pack file's."));

        OffsetDateTime now = OffsetDateTime.now(ZoneOffset.UTC).truncatedTo(ChronoUnit.SECONDS);
        PackFolder folder = new PackFolder(version, now);
        List<PackContent.InputFile> recorded = new ArrayList<>();
        for (SourceFile s : sources) {
            recorded.add(new PackContent.InputFile(s.role(), s.name(), s.sha256()));
            folder.input(s.role(), Path.of(s.path()));
        }
        List<PackFolder.Input> more = new ArrayList<>();
        more.add(new PackFolder.Input("pack-file", packFile));
        List<Scenario> scenarios = new ArrayList<>();
        if (spec.scenarios().isPresent()) {
            Path file = packFile.toAbsolutePath().getParent().resolve(spec.scenarios().get());
            scenarios.addAll(ScenarioFile.read(RunFiles.reading("scenarios file named in --pack-file", file),
                    u.assets(), loaded.groups(), null));
            more.add(new PackFolder.Input("scenarios", file));
        }
        more.addAll(extraInputs);
        for (PackFolder.Input in : more) {
            folder.input(in.role(), in.path());
        }
        java.util.Map<String, String> hashes = folder.inputHashes();
        for (PackFolder.Input in : more) {
            recorded.add(new PackContent.InputFile(in.role(), in.path().getFileName().toString(), hashes.get(in.role())));
        }

        List<PackContent.Parameter> parameters = new ArrayList<>();
        parameters.add(new PackContent.Parameter("Policy", policy == null
                ? "none: only the budget applies, short positions allowed" : policy.getFileName().toString()));
        parameters.add(new PackContent.Parameter("Units of the inputs", units.label()));
        org.isorisk.engine.io.Provenance prov = u.provenance();
        for (SourceFile s : sources) {
            if (!prov.inputs().contains(s)) {
                prov = prov.withInput(s); // the holdings too, so the charts' input hash covers every input
            }
        }
        ChartMaker charts = new PackCharts(ChartContext.of(prov, spec.fund()), ChartSettings.defaults());
        PackResults results = PackAnalysis.run(new PackAnalysis.Request(u.universe(), mandate, spec, weights,
                scenarios, trading), steps);
        if (!spec.charts().isEmpty()) {
            ChartMaker drawing = charts;
            charts = res -> {
                steps.step("drawing the charts");
                return drawing.draw(res);
            };
        }
        PackContent content = PackComposer.compose(results, new PackComposer.Request(
                u.provenance().scenario() == null ? "" : "Inputs: " + u.provenance().scenario() + ".", version, now,
                parameters, recorded, notes, charts));

        com.fasterxml.jackson.databind.node.ObjectNode params = spec.toJson();
        params.put("policy", policy == null ? null : policy.getFileName().toString());
        params.put("holdings", holdings == null ? null : holdings.getFileName().toString());
        params.put("units", units.label());
        params.put("force", force);
        folder.parameters(params);
        steps.step("writing the pack folder");
        PackFiles.addTo(folder, content);
        java.util.Set<String> copied = new java.util.HashSet<>();
        for (SourceFile s : sources) {
            copy(folder, s.role(), Path.of(s.path()), copied);
        }
        for (PackFolder.Input in : more) {
            copy(folder, in.role(), in.path(), copied);
        }
        String summary = summary(content, out, notes);
        folder.add("summary.txt", os -> os.write(summary.getBytes(java.nio.charset.StandardCharsets.UTF_8)));
        PackFolder.Result r = folder.commit(files, out);
        return new Made(r.folder(), content, r.files().size(), summary, shown);
    }

    /** A copy of an input under {@code inputs/}, by its file name (prefixed with its role if two names clash). */
    private static void copy(PackFolder folder, String role, Path file, java.util.Set<String> taken) {
        String name = safeName(file);
        if (!taken.add(name)) {
            name = role.replaceAll("[^a-zA-Z0-9_-]", "_") + "-" + name;
            taken.add(name);
        }
        folder.add("inputs/" + name, os -> Files.copy(file, os));
    }

    private static String safeName(Path file) {
        String n = file.getFileName().toString().replaceAll("[^a-zA-Z0-9._-]", "_");
        return n.isEmpty() || !Character.isLetterOrDigit(n.charAt(0)) ? "input_" + n : n;
    }

    /**
     * The short terminal summary: fund, the summary's key points (the same lines as the notebook's summary, so the
     * terminal and the pack tell one story), the notes a reader must see, where the notebook is, the caution.
     */
    static String summary(PackContent c, Path out, List<String> warnings) {
        StringBuilder b = new StringBuilder();
        b.append("Committee pack: ").append(c.heading().fund()).append(", as of ").append(c.heading().asOf()).append('\n');
        for (PackContent.KeyPoint k : c.keyPoints()) {
            b.append("  ").append(k.label()).append(": ").append(k.attention() ? "ATTENTION: " : "").append(k.text())
                    .append('\n');
        }
        for (String n : c.run().notes()) {
            if (n.equals(Allocator.SHORTS_NOTE) || warnings.contains(n)) {
                b.append("  Note: ").append(n).append('\n');
            }
        }
        b.append("  The run record in the notebook lists every note of the run (").append(c.run().notes().size())
                .append(").\n");
        b.append("  Notebook: ").append(out.resolve(PackLayout.NOTEBOOK)).append('\n');
        b.append("  Folder: ").append(out).append(" (charts, tables, inputs, manifest.json with SHA-256 of every file)\n");
        b.append('\n').append("Caution: ").append(Caution.TEXT).append('\n');
        return b.toString();
    }
}
