package org.isorisk.cli.commands;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;
import org.isorisk.cli.files.BatchFolder;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.json.BookJson;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.cli.options.Fingerprint;
import org.isorisk.cli.options.Format;
import org.isorisk.cli.options.FormatOption;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.render.ProgressLine;
import org.isorisk.cli.render.Text;
import org.isorisk.engine.batch.BatchSettings;
import org.isorisk.engine.book.Book;
import org.isorisk.engine.book.BookJob;
import org.isorisk.engine.book.BookRunner;
import org.isorisk.engine.book.BookSpec;
import org.isorisk.engine.book.BookSummary;
import org.isorisk.engine.book.BookTables;
import org.isorisk.engine.book.Job;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.InputFile;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.engine.model.Status;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine;

/**
 * {@code isorisk batch}: one job ({@code solve}, {@code rebalance} or {@code stress}) for every portfolio of a book,
 * in process on all cores. The work is the engine's ({@link BookRunner} with {@link BookJob}, the same code the Spark
 * module runs); this command parses the options, gives the runner its threads, commits each chunk of results to the
 * output folder ({@link BatchFolder}: a stopped run resumes) and prints the counts by status.
 */
@Command(name = "batch", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Run one job for every portfolio of a book: solve, rebalance or stress; tables of results.",
        description = {"Run one job for every portfolio of a book file (one row per portfolio: id, policy, "
                + "target_return and optional holdings, fund size, assumption set, exclusions and bound overrides; "
                + "see the README, section Book file) and write long tables to --out-dir: results.csv (one row per "
                + "book row: status, message, figures, binding constraints with shadow prices, certificate), "
                + "weights.csv (id,asset,weight), trades.csv (rebalance) or stress.csv (stress), and with --json "
                + "portfolios.jsonl (one JSON object per portfolio).",
                "A row with bad input or no solution becomes a row with its status and the single command's message; "
                        + "the others go on. Results are committed in chunks: run the same command again after a "
                        + "crash or Ctrl-C and it resumes after the last complete chunk.",
                "Exit code: 0 when every portfolio is optimal, 3 when some have no solution (or were not solved), "
                        + "2 when some had invalid input (2 wins over 3). Progress goes to stderr."})
public final class BatchCommand extends BaseCommand {

    @Option(names = "--book", paramLabel = "FILE", required = true,
            description = "The book: CSV with columns id, policy, target_return (see the README, section Book file).")
    Path book;

    @Option(names = "--job", paramLabel = "JOB", required = true,
            description = "solve, rebalance or stress.")
    String job;

    @Mixin
    InputOptions inputs;

    @Option(names = "--assumption-sets", paramLabel = "FILE",
            description = "Named assumption sets the book's assumptions column may name: CSV name,expected_returns,"
                    + "covariance (paths relative to this file).")
    Path assumptionSets;

    // Not PolicyOption's mixin: here a policy is shared by the rows whose policy cell is blank; a row without any
    // policy fails instead of running under the budget alone.
    @Option(names = "--policy", paramLabel = "FILE",
            description = "Shared policy (YAML, as for 'isorisk solve') for the rows whose policy cell is blank; a row "
                    + "with neither fails.")
    Path policy;

    @Option(names = "--scenarios", paramLabel = "FILE",
            description = "Stress scenarios (YAML, as for 'isorisk stress'); the stress job runs each row's target "
                    + "under each.")
    Path scenarios;

    @OutputPath(RunFiles.Kind.FOLDER)
    @Option(names = "--out-dir", paramLabel = "DIR", required = true,
            description = "Folder for the tables (created; an unfinished run there of the same book and options is "
                    + "resumed).")
    Path outDir;

    @Option(names = "--json", description = "Also write portfolios.jsonl: each portfolio's JSON object, one per line.")
    boolean json;

    @Option(names = "--threads", paramLabel = "N",
            description = "Portfolios solved at once (default: the processors); each solve runs on one thread.")
    Integer threads;

    @Option(names = "--chunk-size", paramLabel = "N", defaultValue = "4096",
            description = "Portfolios per committed chunk (default: ${DEFAULT-VALUE}).")
    int chunkSize;

    @Option(names = "--restart", description = "Drop an unfinished run of another book or other options in --out-dir.")
    boolean restart;

    @Option(names = "--quiet", description = "No progress on stderr.")
    boolean quiet;

    @Mixin
    FormatOption formatOption;

    @Override
    protected ExitCode execute() throws IOException {
        Job kind = Job.of(job);
        if (kind == null) {
            throw new CommandLine.ParameterException(spec.commandLine(), "--job '" + job + "' is not known; use solve, "
                    + "rebalance or stress");
        }
        if (formatOption.format() == Format.CSV) {
            throw new CommandLine.ParameterException(spec.commandLine(), "batch writes its tables to --out-dir; "
                    + "--format chooses how the summary is printed: table or json");
        }
        if (chunkSize < 1 || (threads != null && threads < 1)) {
            throw new CommandLine.ParameterException(spec.commandLine(), "--chunk-size and --threads must be at "
                    + "least 1");
        }
        if (scenarios != null && kind != Job.STRESS) {
            throw new CommandLine.ParameterException(spec.commandLine(), "--scenarios is for --job stress");
        }
        Book b = Book.scan(InputFile.of(book));
        warn(b.warnings());
        BookSpec bookSpec = new BookSpec(kind, book.toString(), text(inputs.expectedReturns().orElse(null)),
                text(inputs.covariance().orElse(null)), text(inputs.volatilities().orElse(null)),
                text(inputs.correlation().orElse(null)), text(assumptionSets), text(policy), text(scenarios),
                inputs.units(), json);
        BookJob bookJob = BookJob.open(bookSpec, b.columns(), p -> InputFile.of(Path.of(p)), false);
        warn(bookJob.warnings());
        List<Path> given = new ArrayList<>(List.of(book));
        List<SourceFile> sources = new ArrayList<>();
        sources.add(new SourceFile("book", book.toString(), InputFile.of(book).name(), b.sha256(),
                InputFile.of(book).size().orElse(0)));
        addSource(sources, given, "expected-returns", inputs.expectedReturns().orElse(null), "--expected-returns");
        addSource(sources, given, "covariance", inputs.covariance().orElse(null), "--covariance");
        addSource(sources, given, "volatilities", inputs.volatilities().orElse(null), "--volatilities");
        addSource(sources, given, "correlation", inputs.correlation().orElse(null), "--correlation");
        addSource(sources, given, "assumption-sets", assumptionSets, "--assumption-sets");
        addSource(sources, given, "policy", policy, "--policy");
        addSource(sources, given, "scenarios", scenarios, "--scenarios");
        List<BookTables.Table> tables = new ArrayList<>(List.of(BookTables.RESULTS, BookTables.WEIGHTS));
        tables.addAll(BookTables.extra(kind));
        BatchFolder folder = BatchFolder.open(outDir, fingerprint(kind, sources), tables, json, restart, given);
        if (folder.resumed()) {
            err().println("isorisk: resuming the unfinished run in " + outDir + " after " + folder.committed()
                    + " of " + b.size() + " portfolios");
        }
        int n = threads != null ? threads : Runtime.getRuntime().availableProcessors();
        AtomicInteger count = new AtomicInteger();
        ExecutorService pool = Executors.newFixedThreadPool(n, r -> {
            Thread t = new Thread(r, "isorisk-book-" + count.incrementAndGet());
            t.setDaemon(true);
            return t;
        });
        long t0 = System.nanoTime();
        BookRunner.Outcome outcome;
        try (ProgressLine bar = new ProgressLine(err(), ProgressLine.stderrIsTerminal(), "batch")) {
            java.util.function.Function<org.isorisk.engine.book.BookRow, org.isorisk.engine.book.PortfolioResult> work =
                    json ? row -> BookJson.withJson(bookJob.apply(row), kind) : bookJob;
            outcome = BookRunner.run(b, work, folder.committed(), pool,
                    new BatchSettings(n, BatchSettings.DEFAULT_BATCH, chunkSize, -1), folder::commit,
                    quiet ? null : bar, null);
        } catch (RuntimeException e) {
            folder.close();
            throw e;
        } finally {
            pool.shutdownNow();
        }
        double seconds = (System.nanoTime() - t0) / 1e9;
        BookSummary total = folder.counts();
        ObjectNode summary = summary(kind, b, total, folder, outcome, n, seconds);
        folder.finish(summary, readme(kind, folder.files()));
        if (formatOption.format() == Format.JSON) {
            ResultJson.write(ResultJson.finish(summary, elapsedMillis()), out());
        } else {
            out().print(table(kind, b, total, folder, outcome, n, seconds));
        }
        out().flush();
        Status worst = total.worst();
        return worst == Status.OPTIMAL ? ExitCode.OK : worst == Status.INVALID_INPUT ? ExitCode.BAD_INPUT
                : ExitCode.NO_SOLUTION;
    }

    private static String text(Path p) {
        return p == null ? null : p.toString();
    }

    private static void addSource(List<SourceFile> sources, List<Path> given, String role, Path file, String option) {
        if (file != null) {
            sources.add(Fingerprint.of(role, file, option));
            given.add(file);
        }
    }

    /** What a resumed run must share with the one it resumes: the job, the options and every input's SHA-256. */
    private String fingerprint(Job kind, List<SourceFile> sources) {
        StringBuilder s = new StringBuilder("isorisk batch 1\n").append(kind.label()).append('\n')
                .append(inputs.units().label()).append('\n').append(json).append('\n');
        for (SourceFile f : sources) {
            s.append(f.role()).append(' ').append(f.sha256()).append('\n');
        }
        return SourceFile.sha256(s.toString().getBytes(StandardCharsets.UTF_8));
    }

    private ObjectNode summary(Job kind, Book b, BookSummary total, BatchFolder folder, BookRunner.Outcome outcome,
                               int n, double seconds) {
        ObjectNode o = ResultJson.object();
        o.put("status", total.worst().label());
        o.put("job", kind.label());
        inputs.asOf().ifPresent(d -> o.put("as_of", d));
        ObjectNode bk = o.putObject("book");
        bk.put("name", InputFile.of(book).name());
        bk.put("sha256", b.sha256());
        bk.put("portfolios", b.size());
        ObjectNode counts = o.putObject("counts");
        for (Status s : Status.values()) {
            counts.put(s.label(), total.count(s));
        }
        o.put("resumed_after", folder.resumed() ? folder.committed() - outcome.done() : 0);
        o.put("solved_by_this_run", outcome.done());
        o.put("threads", n);
        ResultJson.number(o, "portfolios_per_second", outcome.done() / Math.max(seconds, 1e-9));
        o.set("files", ResultJson.strings(folder.files()));
        ObjectNode t = o.putObject("timing_ms");
        ResultJson.number(t, "run", seconds * 1000);
        o.put("caution", Caution.TEXT);
        return o;
    }

    private String table(Job kind, Book b, BookSummary total, BatchFolder folder, BookRunner.Outcome outcome, int n,
                         double seconds) {
        StringBuilder s = new StringBuilder();
        s.append(String.format(Locale.ROOT, "isorisk batch: %s for %d portfolios of %s%n", kind.label(), b.size(),
                InputFile.of(book).name()));
        for (Status st : Status.values()) {
            s.append(String.format(Locale.ROOT, "  %-14s %,10d%n", st.label(), total.count(st)));
        }
        if (folder.resumed() && folder.committed() > outcome.done()) {
            s.append(String.format(Locale.ROOT, "resumed after %,d portfolios of an earlier run%n",
                    folder.committed() - outcome.done()));
        }
        s.append(String.format(Locale.ROOT, "%,d portfolios in %.1f s (%,.0f a second) on %d thread%s%n",
                outcome.done(), seconds, outcome.done() / Math.max(seconds, 1e-9), n, n == 1 ? "" : "s"));
        s.append("wrote ").append(outDir).append(": ").append(String.join(", ", folder.files()))
                .append(", summary.json, README.txt\n");
        s.append(Text.caution());
        return s.toString();
    }

    private static String readme(Job kind, List<String> files) {
        StringBuilder s = new StringBuilder();
        s.append("Written by 'isorisk batch --job ").append(kind.label()).append("'.\n\n");
        s.append("results.csv      one row per book row: row, id, status (optimal, infeasible, invalid-input, "
                + "not-solved),\n                 message (the single command's one-line message when it failed), the "
                + "figures,\n                 binding constraints as name=shadow price (dV*/dlimit), certificate "
                + "residuals\n");
        s.append("weights.csv      id,asset,weight for every portfolio with a solution\n");
        if (files.contains("trades.csv")) {
            s.append("trades.csv       the rebalance trades: id, asset, current, target, trade, amount, cost, side\n");
        }
        if (files.contains("stress.csv")) {
            s.append("stress.csv       each portfolio's target under each scenario\n");
        }
        if (files.contains(BatchFolder.JSON_LINES)) {
            s.append("portfolios.jsonl each portfolio's JSON object, one per line\n");
        }
        s.append("summary.json     counts by status, the book's SHA-256, timing\n\n");
        s.append("Numbers are decimals (0.05 is 5 %), annualised. Text cells that a spreadsheet would run as a formula "
                + "(starting with = + - @) carry a leading apostrophe.\n\n");
        s.append("Caution: ").append(Caution.TEXT).append('\n');
        return s.toString();
    }
}
