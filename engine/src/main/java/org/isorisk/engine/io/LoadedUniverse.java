package org.isorisk.engine.io;

import java.util.List;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;

/**
 * An asset universe read and validated from files, with what the reading found.
 *
 * @param universe           names, expected returns and covariance, in decimals, in the order of the
 *                           expected-returns file (or of the risk file when there is none)
 * @param hasExpectedReturns false when no expected-returns file was given (every expected return is then 0)
 * @param spectrum           extreme eigenvalues of the covariance (positive definite once loaded)
 * @param provenance         the files read and the as-of date
 * @param warnings           things worth a look that did not stop the reading (values that look like percent,
 *                           a matrix symmetrised within tolerance, poor conditioning, dates that disagree)
 */
public record LoadedUniverse(AssetUniverse universe, boolean hasExpectedReturns, Spectrum spectrum,
                             Provenance provenance, List<String> warnings) {
    public LoadedUniverse {
        warnings = List.copyOf(warnings);
    }

    /** Asset names in universe order. */
    public List<String> assets() {
        return universe.assets();
    }
}
