package org.isorisk.engine.estimate;

import java.time.LocalDate;
import java.util.List;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Checks;

/**
 * Assumptions estimated from a history, with everything the data-quality report states about how.
 *
 * @param source          name of the history
 * @param assets          asset names, in the order of every vector and matrix
 * @param expectedReturns expected returns, decimal, annualised (copied)
 * @param covariance      covariance of returns, annualised (copied)
 * @param kind            what the history held (prices or returns)
 * @param returnType      simple or log returns
 * @param frequency       the frequency used
 * @param frequencyDetected true when detected from the dates, false when given
 * @param medianGapDays   median interval between consecutive dates, calendar days
 * @param periodsPerYear  periods per year used to annualise both means and covariances
 * @param method          covariance estimator
 * @param decay           EWMA decay λ used, or NaN for other methods
 * @param shrinkage       the Ledoit–Wolf target and intensity, or null for other methods
 * @param mean            how the expected returns were obtained
 * @param observations    counts of rows, returns and deleted rows
 * @param before          extreme eigenvalues of the annualised sample covariance (n − 1), before shrinkage
 * @param after           extreme eigenvalues of the estimate
 * @param issues          data-quality findings (warnings and notes; errors stop the estimate)
 */
public record Estimate(String source, List<String> assets, double[] expectedReturns, double[][] covariance,
                       ValueKind kind, ReturnType returnType, Frequency frequency, boolean frequencyDetected,
                       double medianGapDays, int periodsPerYear, CovarianceMethod method, double decay,
                       Shrinkage shrinkage, MeanInfo mean, Observations observations, Spectrum before,
                       Spectrum after, List<Issue> issues) {

    public Estimate {
        assets = List.copyOf(assets);
        expectedReturns = expectedReturns.clone();
        covariance = Checks.squareCopy(covariance, assets.size(), "estimated covariance");
        issues = List.copyOf(issues);
    }

    /**
     * The Ledoit–Wolf shrinkage applied.
     *
     * @param target    "scaled identity" or "constant correlation"
     * @param intensity weight δ on the target, in [0, 1], estimated from the data
     */
    public record Shrinkage(String target, double intensity) {
    }

    /**
     * How the expected returns were obtained.
     *
     * @param kind                "historical", "supplied" or "implied"
     * @param source              table they came from (supplied returns, reference weights), or null
     * @param standardErrors      historical: standard error of each annualised mean, {@code σ_i/sqrt(years)};
     *                            null otherwise (copied)
     * @param years               length of the history used, in years ({@code returns / periodsPerYear})
     * @param riskAversion        implied: the δ used (given or {@code SR/σ_ref}); NaN otherwise
     * @param sharpeRatio         implied: the market Sharpe ratio given, or NaN
     * @param riskFree            implied: the risk-free rate added to π; NaN otherwise
     * @param referenceVolatility implied: {@code σ_ref = sqrt(w_ref'Σw_ref)}, annualised; NaN otherwise
     */
    public record MeanInfo(String kind, String source, double[] standardErrors, double years, double riskAversion,
                           double sharpeRatio, double riskFree, double referenceVolatility) {
        public MeanInfo {
            standardErrors = standardErrors == null ? null : standardErrors.clone();
        }

        @Override
        public double[] standardErrors() {
            return standardErrors == null ? null : standardErrors.clone();
        }
    }

    /**
     * Counts behind the estimate.
     *
     * @param rows         data rows read (dates)
     * @param returns      return rows (rows − 1 for prices)
     * @param used         return rows used (after listwise deletion; all rows with pairwise deletion)
     * @param dropped      return rows dropped by listwise deletion
     * @param missingCells empty cells in the history
     * @param first        date of the first return used
     * @param last         date of the last return used
     */
    public record Observations(int rows, int returns, int used, int dropped, int missingCells, LocalDate first,
                               LocalDate last) {
    }

    /** Number of assets. */
    public int size() {
        return assets.size();
    }

    @Override
    public double[] expectedReturns() {
        return expectedReturns.clone();
    }

    @Override
    public double[][] covariance() {
        double[][] c = new double[covariance.length][];
        for (int i = 0; i < c.length; i++) {
            c[i] = covariance[i].clone();
        }
        return c;
    }

    /** Covariance entry (i, j) without copying. */
    public double covariance(int i, int j) {
        return covariance[i][j];
    }

    /** Annualised volatilities {@code sqrt(Σ_ii)}. */
    public double[] volatilities() {
        double[] v = new double[covariance.length];
        for (int i = 0; i < v.length; i++) {
            v[i] = Math.sqrt(covariance[i][i]);
        }
        return v;
    }

    /** Correlation matrix {@code Σ_ij / (σ_i σ_j)}, with an exact unit diagonal. */
    public double[][] correlation() {
        int n = covariance.length;
        double[] v = volatilities();
        double[][] c = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                c[i][j] = i == j ? 1.0 : covariance[i][j] / (v[i] * v[j]);
            }
        }
        return c;
    }

    /** Findings of the given severity. */
    public List<Issue> issues(Issue.Severity s) {
        return issues.stream().filter(i -> i.severity() == s).toList();
    }

    /** The estimate as an asset universe for the solvers. */
    public AssetUniverse universe() {
        return new AssetUniverse(assets, expectedReturns, covariance);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Estimate e && e.assets.equals(assets) && java.util.Arrays.equals(e.expectedReturns,
                expectedReturns) && java.util.Arrays.deepEquals(e.covariance, covariance) && e.method == method;
    }

    @Override
    public int hashCode() {
        return assets.hashCode() * 31 + java.util.Arrays.hashCode(expectedReturns);
    }

    @Override
    public String toString() {
        return "Estimate[" + source + ", " + assets.size() + " assets, " + method.label() + "]";
    }
}
