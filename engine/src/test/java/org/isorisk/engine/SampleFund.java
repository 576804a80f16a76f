package org.isorisk.engine;

import java.util.List;
import org.isorisk.engine.model.AssetUniverse;

/**
 * The sample fund's twelve asset classes with capital-market assumptions for tests. INVENTED AND ILLUSTRATIVE:
 * round numbers chosen to look plausible (annualised expected returns, volatilities and correlations), from no
 * source and describing no real fund.
 */
public final class SampleFund {
    private SampleFund() {
    }

    public static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    private static final double[] MU = {0.020, 0.030, 0.032, 0.038, 0.050, 0.055, 0.065, 0.068, 0.080, 0.060,
            0.058, 0.045};
    private static final double[] VOL = {0.005, 0.050, 0.060, 0.060, 0.100, 0.110, 0.160, 0.155, 0.220, 0.180,
            0.130, 0.200};
    /** Correlations by pair class: 0 cash, 1 safe bonds, 2 credit, 3 equity-like, 4 commodities. */
    private static final int[] KIND = {0, 1, 1, 2, 2, 2, 3, 3, 3, 3, 3, 4};
    private static final double[][] RHO = {
            {1.00, 0.10, 0.05, 0.00, 0.00},
            {0.10, 0.80, 0.50, -0.10, -0.05},
            {0.05, 0.50, 0.65, 0.45, 0.25},
            {0.00, -0.10, 0.45, 0.75, 0.35},
            {0.00, -0.05, 0.25, 0.35, 1.00}};

    public static AssetUniverse universe() {
        int n = ASSETS.size();
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double r = i == j ? 1.0 : RHO[KIND[i]][KIND[j]];
                s[i][j] = r * VOL[i] * VOL[j];
            }
        }
        return new AssetUniverse(ASSETS, MU, s);
    }
}
