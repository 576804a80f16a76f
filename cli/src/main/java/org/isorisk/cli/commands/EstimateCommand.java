package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.function.Function;
import org.isorisk.cli.files.AssumptionFiles;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.FormatOption;
import org.isorisk.cli.render.EstimateView;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.EstimationSettings;
import org.isorisk.engine.estimate.Estimator;
import org.isorisk.engine.estimate.Frequency;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.MeanSpec;
import org.isorisk.engine.estimate.MissingPolicy;
import org.isorisk.engine.estimate.ReturnType;
import org.isorisk.engine.estimate.ValueKind;
import org.isorisk.engine.io.AssumptionTables;
import org.isorisk.engine.io.DateFormat;
import org.isorisk.engine.io.HistoryReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code isorisk estimate}: a history of prices or returns becomes the assumption tables {@code solve} reads. */
@Command(name = "estimate", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Estimate the assumption tables from a history of prices or returns.",
        description = {"Estimate expected returns and a covariance matrix from a history of prices or returns, write "
                + "them to a folder in the layouts solve reads (with volatilities, correlations and a data-quality "
                + "report), and print the report."})
public final class EstimateCommand extends BaseCommand {

    @Option(names = "--history", required = true, paramLabel = "FILE",
            description = "History: CSV with a date column, then one column per asset; one row per date, oldest "
                    + "first; empty cells (or NA) are missing values.")
    Path history;

    @Option(names = "--kind", required = true, paramLabel = "KIND",
            description = "What the history holds: prices or returns (decimals, 0.01 is 1 %%).")
    String kind;

    @Option(names = "--returns", paramLabel = "TYPE", defaultValue = "simple",
            description = "simple (p_t/p_(t-1) - 1) or log (ln(p_t/p_(t-1))); with --kind returns, what the file "
                    + "holds (used as given). Default: ${DEFAULT-VALUE}.")
    String returns;

    @Option(names = "--date-format", paramLabel = "PATTERN", defaultValue = "yyyy-MM-dd",
            description = "yyyy-MM-dd or dd/MM/yyyy (slashed dates are never guessed). Default: ${DEFAULT-VALUE}.")
    String dateFormat;

    @Option(names = "--frequency", paramLabel = "FREQ", defaultValue = "auto",
            description = "auto (from the median interval between dates), daily, weekly, monthly or quarterly. "
                    + "Default: ${DEFAULT-VALUE}.")
    String frequency;

    @Option(names = "--periods-per-year", paramLabel = "N",
            description = "Annualisation factor for means and covariances alike (default: 252 daily, 52 weekly, "
                    + "12 monthly, 4 quarterly; e.g. 260 for weekday-based daily data).")
    Integer periodsPerYear;

    @Option(names = "--method", paramLabel = "METHOD", defaultValue = "sample",
            description = "sample, ewma, ledoit-wolf-identity or ledoit-wolf-constant-correlation. "
                    + "Default: ${DEFAULT-VALUE}.")
    String method;

    @Option(names = "--decay", paramLabel = "LAMBDA", converter = Decimal.class,
            description = "EWMA decay in (0, 1); daily data default to 0.94 (RiskMetrics Technical Document, 1996).")
    Double decay;

    @Option(names = "--half-life", paramLabel = "N", converter = Decimal.class,
            description = "EWMA half-life in periods, instead of --decay (decay = 0.5^(1/N)).")
    Double halfLife;

    @Option(names = "--mean", paramLabel = "SOURCE", defaultValue = "historical",
            description = "Expected returns: historical (arithmetic means, with a warning about their error), file "
                    + "(--expected-returns) or implied (by --reference-weights). Default: ${DEFAULT-VALUE}.")
    String mean;

    @Option(names = "--expected-returns", paramLabel = "FILE",
            description = "With --mean file: CSV asset,expected_return (annualised decimals), used as given.")
    Path expectedReturns;

    @Option(names = "--reference-weights", paramLabel = "FILE",
            description = "With --mean implied: CSV asset,weight of the reference portfolio; mu = r_f + delta * "
                    + "Sigma * w.")
    Path referenceWeights;

    @Option(names = "--risk-aversion", paramLabel = "DELTA", converter = Decimal.class,
            description = "With --mean implied: the risk aversion delta.")
    Double riskAversion;

    @Option(names = "--sharpe-ratio", paramLabel = "SR", converter = Decimal.class,
            description = "With --mean implied, instead of --risk-aversion: the reference portfolio's annualised "
                    + "Sharpe ratio; delta = SR / sigma_ref.")
    Double sharpeRatio;

    @Option(names = "--risk-free", paramLabel = "RATE", converter = Decimal.class,
            description = "With --mean implied: annualised risk-free rate added to the implied excess returns "
                    + "(default 0).")
    Double riskFree;

    @Option(names = "--missing", paramLabel = "POLICY", defaultValue = "listwise",
            description = "listwise (drop every return row with a missing value) or pairwise (sample covariance "
                    + "only; can break positive definiteness). Default: ${DEFAULT-VALUE}.")
    String missing;

    @Option(names = "--stale-run", paramLabel = "N", defaultValue = "5",
            description = "Report N or more consecutive zero returns of an asset as stale prices. "
                    + "Default: ${DEFAULT-VALUE}.")
    int staleRun;

    @OutputPath(RunFiles.Kind.FOLDER)
    @Option(names = "--out-dir", required = true, paramLabel = "DIR",
            description = "Folder for the tables and the report, written as a whole: a new or empty folder, or one "
                    + "isorisk wrote before (it is replaced); any other folder is left alone, and so is a folder that "
                    + "holds an input.")
    Path outDir;

    @Mixin
    FormatOption formatOption;

    @Override
    protected ExitCode execute() throws Exception {
        ValueKind k = choice(kind, ValueKind::fromLabel, "--kind", "prices, returns");
        ReturnType type = choice(returns, ReturnType::fromLabel, "--returns", "simple, log");
        DateFormat dates = choice(dateFormat, DateFormat::fromLabel, "--date-format", "yyyy-MM-dd, dd/MM/yyyy");
        Frequency freq = frequency.equalsIgnoreCase("auto") ? null
                : choice(frequency, Frequency::fromLabel, "--frequency", "auto, daily, weekly, monthly, quarterly");
        CovarianceMethod m = choice(method, CovarianceMethod::fromLabel, "--method",
                "sample, ewma, ledoit-wolf-identity, ledoit-wolf-constant-correlation");
        MissingPolicy miss = choice(missing, MissingPolicy::fromLabel, "--missing", "listwise, pairwise");
        if (periodsPerYear != null && periodsPerYear < 1) {
            throw InputException.of("--periods-per-year must be a positive whole number").value(periodsPerYear)
                    .fix("give e.g. 252 or 260 for daily data, 52, 12 or 4").build();
        }
        EstimationSettings s = new EstimationSettings(type, freq, periodsPerYear == null ? 0 : periodsPerYear, m,
                decay == null ? Double.NaN : decay, halfLife == null ? Double.NaN : halfLife, miss, staleRun,
                EstimationSettings.DEFAULT_FEW_PER_ASSET);

        long t0 = System.nanoTime();
        History h = HistoryReader.read(history, k, dates);
        MeanSpec meanSpec = meanSpec();
        long t1 = System.nanoTime();
        Estimate e = Estimator.estimate(h, s, meanSpec);
        long t2 = System.nanoTime();
        List<String> written = new ArrayList<>();
        files().folder(outDir, dir -> written.addAll(AssumptionFiles.estimate(dir, e)));
        long t3 = System.nanoTime();
        emit(new EstimateView(e, outDir, written, (t1 - t0) / 1e6, (t2 - t1) / 1e6, (t3 - t2) / 1e6), Optional.empty());
        return ExitCode.OK;
    }

    private MeanSpec meanSpec() {
        String which = mean.toLowerCase(java.util.Locale.ROOT);
        if (!which.equals("file") && expectedReturns != null) {
            throw InputException.of("--expected-returns is used with --mean file only").value(mean)
                    .fix("add --mean file, or drop --expected-returns").build();
        }
        if (!which.equals("implied") && (referenceWeights != null || riskAversion != null || sharpeRatio != null
                || riskFree != null)) {
            throw InputException.of("--reference-weights, --risk-aversion, --sharpe-ratio and --risk-free are used "
                    + "with --mean implied only").value(mean).fix("add --mean implied, or drop them").build();
        }
        switch (which) {
            case "historical":
                return new MeanSpec.Historical();
            case "file":
                if (expectedReturns == null) {
                    throw InputException.of("--mean file needs the table of expected returns")
                            .fix("give --expected-returns FILE (columns asset,expected_return)").build();
                }
                return new MeanSpec.Supplied(AssumptionTables.readColumn(expectedReturns, "expected-returns",
                        "expected_return"), expectedReturns.toString());
            case "implied":
                if (referenceWeights == null) {
                    throw InputException.of("--mean implied needs the reference portfolio")
                            .fix("give --reference-weights FILE (columns asset,weight)").build();
                }
                return new MeanSpec.Implied(AssumptionTables.readColumn(referenceWeights, "reference-weights",
                        "weight"), riskAversion == null ? Double.NaN : riskAversion,
                        sharpeRatio == null ? Double.NaN : sharpeRatio, riskFree == null ? 0 : riskFree,
                        referenceWeights.toString());
            default:
                throw InputException.of("unknown --mean").value(mean).fix("use one of historical, file, implied")
                        .build();
        }
    }

    private static <T> T choice(String value, Function<String, T> parse, String option, String allowed) {
        T t = value == null ? null : parse.apply(value.strip());
        if (t == null) {
            throw InputException.of("unknown value for " + option).value(value).fix("use one of " + allowed).build();
        }
        return t;
    }
}
