package org.isorisk.engine.risk;

import java.util.List;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;

/**
 * What a risk analyst checks first in a set of assumptions: how many assets, the range of volatilities and
 * expected returns, and how well conditioned the covariance is.
 *
 * @param assets            number of assets
 * @param lowestVolatility  the asset with the lowest volatility {@code sqrt(Σii)} and its value
 * @param highestVolatility the asset with the highest volatility
 * @param lowestReturn      the asset with the lowest expected return
 * @param highestReturn     the asset with the highest expected return
 * @param smallestEigenvalue smallest eigenvalue of Σ
 * @param largestEigenvalue  largest eigenvalue of Σ
 * @param conditionNumber    {@code λmax/λmin}
 * @param exact              true when the eigenvalues come from a full eigendecomposition
 * @param names              asset names
 * @param expectedReturns    each asset's expected return, decimal (copied)
 * @param volatilities       each asset's volatility {@code sqrt(Σii)}, decimal (copied)
 */
public record AssumptionSummary(int assets, Extreme lowestVolatility, Extreme highestVolatility, Extreme lowestReturn,
                                Extreme highestReturn, double smallestEigenvalue, double largestEigenvalue,
                                double conditionNumber, boolean exact, List<String> names, double[] expectedReturns,
                                double[] volatilities) {

    public AssumptionSummary {
        names = List.copyOf(names);
        expectedReturns = expectedReturns.clone();
        volatilities = volatilities.clone();
    }

    @Override
    public double[] expectedReturns() {
        return expectedReturns.clone();
    }

    @Override
    public double[] volatilities() {
        return volatilities.clone();
    }

    /**
     * An asset and its value.
     *
     * @param asset asset name
     * @param value decimal, annualised
     */
    public record Extreme(String asset, double value) {
    }

    /** Summarises {@code u}; {@code spectrum} is Σ's (pass the one the loader computed, or null to compute it). */
    public static AssumptionSummary of(AssetUniverse u, Spectrum spectrum) {
        Spectrum sp = spectrum != null ? spectrum : Spectrum.of(u.covariance());
        List<String> names = u.assets();
        int n = u.size();
        int lv = 0;
        int hv = 0;
        int lr = 0;
        int hr = 0;
        for (int i = 1; i < n; i++) {
            if (u.covariance(i, i) < u.covariance(lv, lv)) {
                lv = i;
            }
            if (u.covariance(i, i) > u.covariance(hv, hv)) {
                hv = i;
            }
            if (u.expectedReturn(i) < u.expectedReturn(lr)) {
                lr = i;
            }
            if (u.expectedReturn(i) > u.expectedReturn(hr)) {
                hr = i;
            }
        }
        double[] vols = new double[n];
        for (int i = 0; i < n; i++) {
            vols[i] = Math.sqrt(u.covariance(i, i));
        }
        return new AssumptionSummary(n, new Extreme(names.get(lv), Math.sqrt(u.covariance(lv, lv))),
                new Extreme(names.get(hv), Math.sqrt(u.covariance(hv, hv))),
                new Extreme(names.get(lr), u.expectedReturn(lr)), new Extreme(names.get(hr), u.expectedReturn(hr)),
                sp.smallest(), sp.largest(), sp.conditionNumber(), sp.exact(), names, u.expectedReturns(), vols);
    }
}
