package org.isorisk.engine.support;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;

/**
 * The invented, illustrative sample fund's twelve asset classes with invented assumptions (not real data):
 * expected returns and volatilities, and correlations from three invented factors (growth, rates, inflation)
 * so that the matrix is positive definite by construction, {@code R = LL' + diag(1 − ‖l_i‖²)}.
 */
public final class SampleFund {
    private SampleFund() {
    }

    public static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    static final double[] MU = {0.020, 0.030, 0.032, 0.038, 0.052, 0.055, 0.065, 0.068, 0.080, 0.060, 0.058, 0.045};
    static final double[] VOL = {0.010, 0.055, 0.065, 0.070, 0.110, 0.120, 0.160, 0.170, 0.230, 0.190, 0.140, 0.200};
    static final double[][] LOADINGS = {
        {0.00, 0.10, 0.10}, {-0.20, 0.85, -0.10}, {-0.10, 0.60, 0.50}, {0.30, 0.70, 0.00},
        {0.65, 0.30, 0.10}, {0.60, 0.35, 0.15}, {0.85, -0.10, 0.10}, {0.82, -0.05, 0.12},
        {0.75, -0.05, 0.25}, {0.70, 0.25, 0.20}, {0.60, 0.30, 0.30}, {0.35, -0.20, 0.70},
    };

    /** The universe. */
    public static AssetUniverse universe() {
        int n = ASSETS.size();
        double[][] s = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double r = 1;
                if (i != j) {
                    r = 0;
                    for (int k = 0; k < 3; k++) {
                        r += LOADINGS[i][k] * LOADINGS[j][k];
                    }
                }
                s[i][j] = r * VOL[i] * VOL[j];
            }
        }
        return new AssetUniverse(ASSETS, MU, s);
    }

    /** Fully invested, long-only, every asset at most {@code max}. */
    public static Mandate longOnly(double max) {
        double[] lo = new double[ASSETS.size()];
        double[] hi = new double[ASSETS.size()];
        Arrays.fill(hi, max);
        return new Mandate(1.0, lo, hi, Map.of(), List.of(), List.of());
    }
}
