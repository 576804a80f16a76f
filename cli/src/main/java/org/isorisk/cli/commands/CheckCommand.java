package org.isorisk.cli.commands;

import org.isorisk.cli.ExitCode;
import org.isorisk.cli.options.Format;
import org.isorisk.cli.options.FormatOption;
import org.isorisk.cli.options.InputOptions;
import org.isorisk.cli.options.OutOption;
import org.isorisk.cli.render.CheckView;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.risk.AssumptionSummary;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

/** {@code isorisk check}: validate the assumption files and report their conditioning. */
@Command(name = "check", mixinStandardHelpOptions = true, sortOptions = false,
        header = "Validate the assumption files and report their conditioning.",
        description = {"Validate the assumption files (names, numbers, symmetry, positive definiteness) and report "
                + "the number of assets, the ranges of expected returns and volatilities, the extreme eigenvalues and "
                + "the condition number of the covariance, and any warnings."})
public final class CheckCommand extends BaseCommand {

    @Mixin
    InputOptions inputs;

    @Mixin
    FormatOption formatOption;

    @Mixin
    OutOption outOption;

    @Override
    protected Format format() {
        return formatOption == null ? Format.TABLE : formatOption.format();
    }

    @Override
    protected ExitCode execute() {
        LoadedUniverse u = inputs.load(false, "check");
        emit(new CheckView(u, AssumptionSummary.of(u.universe(), u.spectrum())), outOption.out());
        return ExitCode.OK;
    }
}
