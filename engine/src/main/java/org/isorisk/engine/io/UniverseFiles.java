package org.isorisk.engine.io;

import java.nio.file.Path;
import java.time.LocalDate;
import org.isorisk.engine.error.InputException;

/**
 * Which files hold the assumptions: expected returns and either a covariance matrix or volatilities with a
 * correlation matrix.
 *
 * @param expectedReturns {@code asset,expected_return[,...]}; null when only risk is needed (then every
 *                        expected return is taken as 0 and results say so)
 * @param covariance      square matrix, {@code asset} down the first column and across the header; or null
 * @param volatilities    {@code asset,volatility}; with {@code correlation}, instead of {@code covariance}
 * @param correlation     square matrix like the covariance, ones on the diagonal
 * @param units           units of every number in these files ({@link Units#DECIMAL} when null)
 * @param asOf            the as-of date to record; null to take the files' own {@code # as_of:} line
 */
public record UniverseFiles(Path expectedReturns, Path covariance, Path volatilities, Path correlation, Units units,
                            LocalDate asOf) {

    public UniverseFiles {
        units = units == null ? Units.DECIMAL : units;
        boolean split = volatilities != null || correlation != null;
        if (covariance != null && split) {
            throw InputException.of("both a covariance matrix and volatilities/correlation were given")
                    .fix("give --covariance FILE, or --volatilities FILE with --correlation FILE, not both").build();
        }
        if (covariance == null && !split) {
            throw InputException.of("no risk inputs were given")
                    .fix("give --covariance FILE, or --volatilities FILE with --correlation FILE").build();
        }
        if (split && (volatilities == null || correlation == null)) {
            throw InputException.of(volatilities == null ? "--correlation was given without --volatilities"
                            : "--volatilities was given without --correlation")
                    .fix("give both --volatilities FILE and --correlation FILE (or --covariance FILE instead)").build();
        }
    }

    /** Expected returns and a covariance matrix, decimals, as-of date from the files. */
    public static UniverseFiles of(Path expectedReturns, Path covariance) {
        return new UniverseFiles(expectedReturns, covariance, null, null, Units.DECIMAL, null);
    }
}
