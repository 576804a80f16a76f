package org.isorisk.cli.options;

import java.nio.file.Path;
import java.time.LocalDate;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.UniverseFiles;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import picocli.CommandLine;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** The assumption files and their units, shared by every command that reads them. */
public final class InputOptions {

    /** The command these options are mixed into, whose name the "needs the expected returns" message gives. */
    @Spec(Spec.Target.MIXEE)
    CommandSpec command;

    @Option(names = "--expected-returns", paramLabel = "FILE",
            description = "Expected returns: CSV with columns asset,expected_return (annualised; more columns allowed).")
    Path expectedReturns;

    @Option(names = "--covariance", paramLabel = "FILE",
            description = "Covariance matrix of annualised returns: CSV with 'asset' in the top-left cell and the asset "
                    + "names down the first column and across the header, in any order.")
    Path covariance;

    @Option(names = "--volatilities", paramLabel = "FILE",
            description = "Instead of --covariance: CSV asset,volatility (annualised), used with --correlation.")
    Path volatilities;

    @Option(names = "--correlation", paramLabel = "FILE",
            description = "Instead of --covariance: correlation matrix laid out like the covariance.")
    Path correlation;

    @Option(names = "--units", paramLabel = "UNITS", defaultValue = "decimal", converter = UnitsConverter.class,
            description = "Units of the numbers in the input files and numeric options: decimal (0.05 is 5 %%) or "
                    + "percent (5 is 5 %%; covariances in percent squared). Default: ${DEFAULT-VALUE}.")
    Units units = Units.DECIMAL;

    @Option(names = "--as-of", paramLabel = "YYYY-MM-DD",
            description = "Date the assumptions are as of, recorded with the results (default: the files' own "
                    + "'# as_of:' line, if any).")
    String asOf;

    /** The {@code --as-of} date as given, if given (commands that do not load the files record it as text). */
    public java.util.Optional<String> asOf() {
        return java.util.Optional.ofNullable(asOf);
    }

    /** The expected-returns file, if given. */
    public java.util.Optional<Path> expectedReturns() {
        return java.util.Optional.ofNullable(expectedReturns);
    }

    /** The volatilities file, if given. */
    public java.util.Optional<Path> volatilities() {
        return java.util.Optional.ofNullable(volatilities);
    }

    /** The covariance file, if given. */
    public java.util.Optional<Path> covariance() {
        return java.util.Optional.ofNullable(covariance);
    }

    /** The correlation file, if given. */
    public java.util.Optional<Path> correlation() {
        return java.util.Optional.ofNullable(correlation);
    }

    /** The units chosen. */
    public Units units() {
        return units;
    }

    /**
     * Reads and validates the files.
     *
     * @param needReturns true when the command cannot work without expected returns (the message when they are
     *                    missing names the command, e.g. {@code 'isorisk chart frontier'})
     */
    public LoadedUniverse load(boolean needReturns) {
        if (needReturns && expectedReturns == null) {
            throw InputException.of("'" + command.qualifiedName() + "' needs the expected returns")
                    .fix("give --expected-returns FILE (columns asset,expected_return)").build();
        }
        LocalDate date = asOf == null ? null : Provenance.parseDate(asOf, null, 0);
        return UniverseLoader.load(new UniverseFiles(expectedReturns, covariance, volatilities, correlation, units, date));
    }

    /**
     * Reads another covariance file in the layout of {@code --covariance}, matched by name to the assets of the
     * expected-returns file (used by stress scenarios that replace the covariance).
     *
     * @param warnings where the reading's warnings about {@code file} itself are added (the ones about the
     *                 expected-returns file are those of {@link #load}, already known)
     * @return the covariance in the universe's asset order
     */
    public double[][] covarianceFor(Path file, java.util.List<String> warnings) {
        LoadedUniverse u = UniverseLoader.load(new UniverseFiles(expectedReturns, file, null, null, units, null));
        String about = file + ": ";
        for (String w : u.warnings()) {
            if (w.startsWith(about) && !warnings.contains(w)) {
                warnings.add(w);
            }
        }
        return u.universe().covariance();
    }

    /** Reads {@code decimal} or {@code percent}. */
    public static final class UnitsConverter implements CommandLine.ITypeConverter<Units> {
        @Override
        public Units convert(String value) {
            for (Units u : Units.values()) {
                if (u.label().equals(value.strip().toLowerCase(Locale.ROOT))) {
                    return u;
                }
            }
            throw new CommandLine.TypeConversionException("'" + value + "' is not a unit; use decimal or percent");
        }
    }
}
