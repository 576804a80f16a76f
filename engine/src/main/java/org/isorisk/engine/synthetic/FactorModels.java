package org.isorisk.engine.synthetic;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;

/**
 * Synthetic asset universes with a dense factor-model covariance {@code Σ = B F B' + D} and expected returns
 * that reward factor exposure, {@code μ = r₀ + B π + ε}: k factors (a market factor every asset loads on, and
 * style factors), diagonal factor variances F and idiosyncratic variances D. The same {@code (n, seed)} always
 * gives the same universe ({@link Random} is specified to the bit), so tests and benchmarks can quote results.
 * Typical scale: volatilities 8–35 %, expected returns 1–12 %, annualised decimals.
 */
public final class FactorModels {
    private FactorModels() {
    }

    /** Seed used by the benchmarks and the cross-check tests unless they say otherwise. */
    public static final long DEFAULT_SEED = 20_240_601L;

    /**
     * A universe of {@code n} assets named {@code A0001 ...}.
     *
     * @param n    number of assets, at least 2
     * @param seed random seed
     */
    public static AssetUniverse universe(int n, long seed) {
        if (n < 2) {
            throw new IllegalArgumentException("need at least 2 assets");
        }
        Random rnd = new Random(seed);
        int k = Math.max(2, Math.min(10, n / 20 + 2));
        double[][] b = new double[n][k];
        double[] fvar = new double[k];
        double[] premium = new double[k];
        fvar[0] = 0.16 * 0.16;
        premium[0] = 0.04;
        for (int j = 1; j < k; j++) {
            fvar[j] = Math.pow(0.04 + 0.08 * rnd.nextDouble(), 2);
            premium[j] = 0.01 * rnd.nextGaussian();
        }
        double[] idio = new double[n];
        double[] mu = new double[n];
        for (int i = 0; i < n; i++) {
            b[i][0] = 0.2 + 1.1 * rnd.nextDouble();
            for (int j = 1; j < k; j++) {
                b[i][j] = rnd.nextGaussian() * 0.6;
            }
            idio[i] = Math.pow(0.05 + 0.20 * rnd.nextDouble(), 2);
            double m = 0.01;
            for (int j = 0; j < k; j++) {
                m += b[i][j] * premium[j];
            }
            mu[i] = m + 0.01 * rnd.nextGaussian();
        }
        double[][] sigma = new double[n][n];
        for (int i = 0; i < n; i++) {
            double[] bi = b[i];
            for (int j = 0; j <= i; j++) {
                double[] bj = b[j];
                double s = 0;
                for (int q = 0; q < k; q++) {
                    s += bi[q] * fvar[q] * bj[q];
                }
                if (i == j) {
                    s += idio[i];
                }
                sigma[i][j] = s;
                sigma[j][i] = s;
            }
        }
        List<String> names = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            names.add(String.format(java.util.Locale.ROOT, "A%04d", i + 1));
        }
        return new AssetUniverse(names, mu, sigma);
    }

    /** The benchmark mandate: fully invested, long-only, each asset at most {@code max(5 %, 3/n)}. */
    public static Mandate longOnlyCapped(int n) {
        return boxed(n, 0.0, Math.max(0.05, 3.0 / n));
    }

    /** Fully invested with every asset in {@code [lo, hi]}. */
    public static Mandate boxed(int n, double lo, double hi) {
        double[] l = new double[n];
        double[] h = new double[n];
        Arrays.fill(l, lo);
        Arrays.fill(h, hi);
        return new Mandate(1.0, l, h, Map.of(), List.of(), List.of());
    }
}
