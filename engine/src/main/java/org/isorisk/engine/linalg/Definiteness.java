package org.isorisk.engine.linalg;

/**
 * When a symmetric covariance (or correlation) matrix counts as positive definite, and the usual reason when it
 * does not: a pair of variables whose implied correlation {@code Σij / sqrt(Σii Σjj)} is ±1 (or outside
 * [−1, 1]). The one set of thresholds for every place that refuses such a matrix; the callers word the message
 * (the file reader names the file, the solver the assets it reports as involved). No I/O.
 *
 * <p>Two definiteness thresholds, on purpose. An assumption file is refused from a condition number of
 * {@code 1/}{@link #INPUT}, where a double-precision solve keeps only about four correct digits of the
 * six the outputs show (and the reader already warns from a condition number of 1e8): such a file is almost
 * always a typing or rounding error, best named on the file. A matrix built in code (an estimate, a stress
 * scenario, a repaired matrix, an API caller's universe) is refused by the solver only when it is singular to
 * working precision, {@code 1/}{@link #SINGULAR}, where its inverse keeps no correct digit; refusing it
 * earlier would turn a usable if sensitive problem into an error with no file to fix.
 */
public final class Definiteness {
    private Definiteness() {
    }

    /**
     * An assumption file's matrix counts as not positive definite when {@code λmin ≤ INPUT · λmax}: at a
     * condition number of 1e12, double precision leaves about four correct digits in a solve.
     */
    public static final double INPUT = 1e-12;

    /**
     * Σ counts as singular to working precision when {@code λmin ≤ SINGULAR · λmax}: its inverse would then
     * carry no correct digit (condition number beyond 1/(n·ε) for n up to a few thousand assets).
     */
    public static final double SINGULAR = 1e-13;

    /**
     * An implied correlation within this of ±1 counts as perfect, and beyond it outside [−1, 1]: well above the
     * rounding of {@code Σij / sqrt(Σii Σjj)} (a few ε), well below any correlation anyone types
     * (common practice, no source).
     */
    public static final double CORRELATION_TOLERANCE = 1e-10;

    /**
     * True when the spectrum's smallest eigenvalue exceeds {@code threshold} times its largest (false for a NaN
     * eigenvalue).
     *
     * @param threshold {@link #INPUT} or {@link #SINGULAR}
     */
    public static boolean positiveDefinite(Spectrum sp, double threshold) {
        return sp.smallest() > threshold * sp.largest();
    }

    /**
     * Two variables and their implied correlation, at least {@code 1 − }{@link #CORRELATION_TOLERANCE} in
     * absolute value.
     *
     * @param first       index of the first variable
     * @param second      index of the second, above {@code first}
     * @param correlation {@code Σij / sqrt(Σii Σjj)}
     */
    public record Pair(int first, int second, double correlation) {
        public Pair {
            if (first < 0 || second <= first || !(Math.abs(correlation) >= 1 - CORRELATION_TOLERANCE)) {
                throw new IllegalArgumentException("not a perfectly correlated pair: " + first + ", " + second + ", "
                        + correlation);
            }
        }

        /** True when the correlation lies outside [−1, 1] by more than {@link #CORRELATION_TOLERANCE}. */
        public boolean outsideRange() {
            return Math.abs(correlation) > 1 + CORRELATION_TOLERANCE;
        }
    }

    /**
     * The first pair {@code (i, j)}, {@code i < j} in row order, whose implied correlation is ±1 within
     * {@link #CORRELATION_TOLERANCE} or outside [−1, 1]; null when there is none. A pair whose
     * {@code Σii Σjj} is not positive (a zero variance, or variances of opposite signs) has no implied correlation
     * and is skipped. O(n²); reads the diagonal and the upper triangle only.
     *
     * @param a symmetric matrix (not modified)
     */
    public static Pair perfectlyCorrelatedPair(double[][] a) {
        int n = a.length;
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                double d = Math.sqrt(a[i][i] * a[j][j]);
                double rho = d > 0 ? a[i][j] / d : 0;
                if (Math.abs(rho) >= 1 - CORRELATION_TOLERANCE) {
                    return new Pair(i, j, rho);
                }
            }
        }
        return null;
    }
}
