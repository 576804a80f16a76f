package org.isorisk.engine.stress;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Checks;

/**
 * One change to the assumptions. Shocks of a scenario apply in order to volatilities, correlations and expected
 * returns ({@code Σ = D R D} with D the volatilities, R the correlations).
 */
public sealed interface Shock {

    /** A plain description, e.g. "volatility of group Equity × 1.50". */
    String describe();

    /**
     * Volatilities of the scope multiplied by {@code factor} (correlations unchanged).
     *
     * @param factor positive multiplier, e.g. 1.5
     */
    record VolatilityMultiplier(Scope scope, double factor) implements Shock {
        public VolatilityMultiplier {
            if (!(factor > 0) || !Double.isFinite(factor)) {
                throw InputException.of("a volatility multiplier must be a positive number").value(factor)
                        .fix("give e.g. 1.5 for volatilities 50 % higher").build();
            }
        }

        @Override
        public String describe() {
            return String.format(java.util.Locale.ROOT, "volatility of %s × %.4g", scope.describe(), factor);
        }
    }

    /**
     * Correlations between assets of the scope moved towards 1 by {@code fraction}: {@code ρ + f(1 − ρ)}
     * (crisis correlation). Over all assets this is the convex combination {@code (1 − f)R + f·11'} of two
     * positive semi-definite matrices, so it stays valid; within a group it may not, and is then repaired.
     *
     * @param fraction between 0 and 1
     */
    record CorrelationShift(Scope scope, double fraction) implements Shock {
        public CorrelationShift {
            if (!(fraction >= 0 && fraction <= 1)) {
                throw InputException.of("a correlation shift must be a fraction between 0 and 1").value(fraction)
                        .fix("give e.g. 0.3 to move every correlation 30 % of the way towards 1").build();
            }
        }

        @Override
        public String describe() {
            return String.format(java.util.Locale.ROOT, "correlations within %s moved %.0f %% of the way towards 1",
                    scope.describe(), fraction * 100);
        }
    }

    /**
     * Every correlation between two assets of the scope set to {@code value}.
     *
     * @param value between −1 and 1
     */
    record CorrelationSet(Scope scope, double value) implements Shock {
        public CorrelationSet {
            if (!(value >= -1 && value <= 1)) {
                throw InputException.of("a correlation must lie between -1 and 1").value(value)
                        .fix("give e.g. 0.9").build();
            }
        }

        @Override
        public String describe() {
            return String.format(java.util.Locale.ROOT, "correlations within %s set to %.2f", scope.describe(), value);
        }
    }

    /**
     * Expected returns of the scope shifted by {@code delta} (decimal: −0.02 lowers them by 2 percentage points).
     */
    record ReturnShift(Scope scope, double delta) implements Shock {
        public ReturnShift {
            Checks.finite(delta, "return shift");
        }

        @Override
        public String describe() {
            return String.format(java.util.Locale.ROOT, "expected return of %s %+.2f %%", scope.describe(),
                    delta * 100);
        }
    }

    /**
     * The covariance replaced by another one, e.g. estimated over a historical window (crisis period).
     *
     * @param label  where it comes from, e.g. "history 2008-01-01..2009-06-30"
     * @param matrix the covariance, in the universe's asset order (copied)
     */
    record Covariance(String label, double[][] matrix) implements Shock {
        public Covariance {
            if (matrix == null || matrix.length == 0) {
                throw InputException.of("a replacement covariance is empty").build();
            }
            matrix = Checks.squareCopy(matrix, matrix.length, "replacement covariance");
        }

        @Override
        public double[][] matrix() {
            return Checks.squareCopy(matrix, matrix.length, "replacement covariance");
        }

        @Override
        public String describe() {
            return "covariance from " + label;
        }
    }
}
