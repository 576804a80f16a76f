package org.isorisk.bench;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.isorisk.engine.model.AssetUniverse;

/**
 * Dense factor-model problems for benchmarks: {@code Σ = B F B' + D} with k factors, and expected returns that
 * combine factor premia with an asset-specific part. Fixed seeds make every run see the same matrices.
 */
public final class FactorModel {
    private FactorModel() {
    }

    /** Default number of factors. */
    public static final int FACTORS = 10;

    /**
     * A universe of n assets with {@link #FACTORS} factors: loadings N(0, 1) scaled per factor (factor
     * volatilities 16 % for the first, falling to 4 %), idiosyncratic volatilities uniform in 10–30 %,
     * expected returns 2 % plus the exposures times factor premia (a Sharpe ratio of 0.25 per factor) plus an
     * asset-specific N(0, 1 %). Invented for speed measurement only.
     */
    public static AssetUniverse universe(int n, long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        int k = FACTORS;
        double[] factorVol = new double[k];
        for (int f = 0; f < k; f++) {
            factorVol[f] = 0.16 - 0.12 * f / Math.max(1, k - 1);
        }
        double[][] b = new double[n][k];
        for (double[] row : b) {
            for (int f = 0; f < k; f++) {
                row[f] = gaussian(r) * factorVol[f];
            }
        }
        double[][] sigma = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double s = 0;
                for (int f = 0; f < k; f++) {
                    s += b[i][f] * b[j][f];
                }
                sigma[i][j] = s;
                sigma[j][i] = s;
            }
            double idio = 0.10 + 0.20 * r.nextDouble();
            sigma[i][i] += idio * idio;
        }
        double[] mu = new double[n];
        for (int i = 0; i < n; i++) {
            double premium = 0;
            for (int f = 0; f < k; f++) {
                premium += b[i][f] * 0.25 * factorVol[f]; // exposure × factor premium (a Sharpe ratio of 0.25)
            }
            mu[i] = 0.02 + premium + 0.01 * gaussian(r);
        }
        List<String> names = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            names.add("Asset " + (i + 1));
        }
        return new AssetUniverse(names, mu, sigma);
    }

    private static double gaussian(SplittableRandom r) {
        double u = 1 - r.nextDouble();
        double v = r.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    }
}
