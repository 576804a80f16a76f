package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.isorisk.cli.files.AssumptionFiles;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.cli.options.Decimal;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.OutputOptions;
import org.isorisk.cli.render.CheckView;
import org.isorisk.cli.render.RepairView;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.Repair;
import org.isorisk.engine.estimate.RepairResult;
import org.isorisk.engine.estimate.RepairSettings;
import org.isorisk.engine.io.AssumptionTables;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.risk.AssumptionSummary;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code isorisk check}: validate the assumption files and report their conditioning. */
@Command(name = "check", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Validate the assumption files and report their conditioning.",
        description = {"Validate the assumption files (names, numbers, symmetry, positive definiteness) and report "
                + "the number of assets, the ranges of expected returns and volatilities, the extreme eigenvalues and "
                + "the condition number of the covariance, and any warnings.",
                "With --repair: replace a covariance or correlation matrix that is not positive definite by the "
                        + "nearest correlation matrix (Higham 2002), volatilities kept, write it to --out-dir and "
                        + "report the distance and the largest changes."})
public final class CheckCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Mixin
    OutputOptions output;

    @Option(names = "--repair",
            description = "Repair the --covariance or --correlation matrix if it is not positive definite: nearest "
                    + "correlation matrix by alternating projections with Dykstra's correction (Higham 2002), "
                    + "volatilities kept. Writes to --out-dir; never changes the input.")
    boolean repair;

    @OutputPath(RunFiles.Kind.FOLDER)
    @Option(names = "--out-dir", paramLabel = "DIR",
            description = "With --repair: folder for the repaired matrix and the report, written as a whole (a new "
                    + "or empty folder, or one isorisk wrote before).")
    Path outDir;

    @Option(names = "--min-eigenvalue", paramLabel = "E", converter = Decimal.class,
            description = "With --repair: smallest eigenvalue of the repaired correlation matrix (default 1e-4, so "
                    + "that solve gets a well-conditioned matrix; 0 gives the nearest positive semi-definite matrix).")
    Double minEigenvalue;

    @Override
    protected ExitCode execute() throws Exception {
        if (repair) {
            return repair();
        }
        if (outDir != null || minEigenvalue != null) {
            throw InputException.of("--out-dir and --min-eigenvalue go with --repair")
                    .fix("add --repair, or drop them").build();
        }
        LoadedUniverse u = inputs.load(false);
        emit(new CheckView(u, AssumptionSummary.of(u.universe(), u.spectrum())), output.out());
        return ExitCode.OK;
    }

    private ExitCode repair() throws Exception {
        Optional<Path> cov = inputs.covariance();
        Optional<Path> corr = inputs.correlation();
        if (cov.isPresent() == corr.isPresent()) {
            throw InputException.of("--repair takes one matrix")
                    .fix("give --covariance FILE or --correlation FILE, not both").build();
        }
        if (outDir == null) {
            throw InputException.of("--repair writes the repaired matrix to a folder")
                    .fix("give --out-dir DIR").build();
        }
        Path file = cov.orElseGet(corr::get);
        RepairSettings settings = minEigenvalue == null ? RepairSettings.defaults()
                : RepairSettings.defaults().withMinEigenvalue(minEigenvalue);
        if (minEigenvalue != null && !(minEigenvalue >= 0 && minEigenvalue < 1)) {
            throw InputException.of("--min-eigenvalue must lie in [0, 1)").value(minEigenvalue)
                    .fix("give e.g. 1e-8, or 0").build();
        }
        AssumptionTables.Matrix m = AssumptionTables.readMatrix(file, cov.isPresent() ? "covariance" : "correlation");
        RepairResult r = cov.isPresent()
                ? Repair.covariance(m.assets(), m.matrix(), settings, m.source())
                : Repair.correlation(m.assets(), m.matrix(), settings, m.source());
        List<String> written = new ArrayList<>();
        if (r.changed()) {
            files().folder(outDir, dir -> written.addAll(AssumptionFiles.repair(dir, r, m.source())));
        }
        emit(new RepairView(r, m.source(), outDir, written), output.out());
        return ExitCode.OK;
    }
}
