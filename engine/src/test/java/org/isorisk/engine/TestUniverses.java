package org.isorisk.engine;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.isorisk.engine.model.AssetUniverse;

/** Invented universes for tests (illustrative numbers from a fixed seed, not market data). */
public final class TestUniverses {
    private TestUniverses() {
    }

    /**
     * n assets with expected returns between 1 % and 9 % and a covariance from three random factors plus an
     * idiosyncratic variance between 0.2 % and 2.2 % (so positive definite).
     */
    public static AssetUniverse random(int n, long seed) {
        Random rnd = new Random(seed);
        double[][] f = new double[n][3];
        for (double[] row : f) {
            for (int k = 0; k < 3; k++) {
                row[k] = 0.1 * rnd.nextGaussian();
            }
        }
        double[][] s = new double[n][n];
        double[] mu = new double[n];
        List<String> names = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            names.add("Asset " + (i + 1));
            mu[i] = 0.01 + 0.08 * rnd.nextDouble();
            for (int j = 0; j < n; j++) {
                double v = 0;
                for (int k = 0; k < 3; k++) {
                    v += f[i][k] * f[j][k];
                }
                s[i][j] = v + (i == j ? 0.002 + 0.02 * rnd.nextDouble() : 0);
            }
        }
        return new AssetUniverse(names, mu, s);
    }
}
