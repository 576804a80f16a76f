package org.isorisk.engine.synthetic;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.SplittableRandom;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;

/**
 * Synthetic asset universes with a dense factor-model covariance {@code Σ = B F B' + D} and expected returns
 * that reward factor exposure, {@code μ = r₀ + B π + ε}, from one of two recipes that differ on purpose:
 * <ul>
 *   <li>{@link #universe} (the market recipe): k factors, a market factor every asset loads on positively plus
 *       style factors, diagonal factor variances F and idiosyncratic variances D. Long-only frontiers hold few
 *       assets. Typical scale: volatilities 8–35 %, expected returns 1–12 %.</li>
 *   <li>{@link #signedUniverse} (the signed recipe): {@link #SIGNED_FACTORS} factors with loadings of either
 *       sign and no common market factor, so near the minimum-variance end nearly every asset is held and the
 *       free set grows to n. Typical scale: volatilities 15–75 %, expected returns −4 to 7 %.</li>
 * </ul>
 * All figures are annualised decimals, invented for tests and speed measurement only. The same
 * {@code (n, seed)} always gives the same universe, so tests and benchmarks can quote results.
 */
public final class FactorModels {
    private FactorModels() {
    }

    /** Seed used by the benchmarks and the cross-check tests unless they say otherwise. */
    public static final long DEFAULT_SEED = 20_240_601L;

    /** Number of factors of the signed recipe ({@link #signedUniverse}). */
    public static final int SIGNED_FACTORS = 10;

    /**
     * A universe of {@code n} assets named {@code A0001 ...} from the market recipe ({@link Random} is specified
     * to the bit).
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

    /**
     * A universe of {@code n} assets named {@code Asset 1 ...} from the signed recipe: {@link #SIGNED_FACTORS}
     * factors with loadings N(0, 1) scaled per factor (factor volatilities 16 % for the first, falling evenly to
     * 4 % for the last), idiosyncratic volatilities uniform in 10–30 %, expected returns 2 % plus the exposures
     * times factor premia (a Sharpe ratio of 0.25 per factor) plus an asset-specific N(0, 1 %). The normals come
     * from the Box–Muller transform on {@link SplittableRandom}; the benchmark figures were measured on exactly
     * these numbers, so the arithmetic and its order are pinned by a test and must not change.
     *
     * @param n    number of assets, at least 2
     * @param seed random seed
     */
    public static AssetUniverse signedUniverse(int n, long seed) {
        if (n < 2) {
            throw new IllegalArgumentException("need at least 2 assets");
        }
        SplittableRandom r = new SplittableRandom(seed);
        int k = SIGNED_FACTORS;
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

    /** A standard normal by the Box–Muller transform (the cosine branch only; one normal per two uniforms). */
    private static double gaussian(SplittableRandom r) {
        double u = 1 - r.nextDouble();
        double v = r.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    }

    /** The benchmark mandate: fully invested, long-only, each asset at most {@code max(5 %, 3/n)}. */
    public static Mandate longOnlyCapped(int n) {
        return boxed(n, 0.0, Math.max(0.05, 3.0 / n));
    }

    /**
     * The benchmark mandate with groups: {@link #longOnlyCapped}, the first third of the assets between 20 % and
     * 45 % together, the last quarter at most 25 %, and a general row: a weighted sum of the middle assets (weights
     * 0.5, 0.75, 1 in turn) at most 30 %. Needs at least 4 assets.
     */
    public static Mandate grouped(int n) {
        if (n < 4) {
            throw new IllegalArgumentException("need at least 4 assets");
        }
        Mandate base = longOnlyCapped(n);
        List<Integer> first = new ArrayList<>();
        for (int i = 0; i < n / 3; i++) {
            first.add(i);
        }
        List<Integer> last = new ArrayList<>();
        for (int i = n - n / 4; i < n; i++) {
            last.add(i);
        }
        double[] c = new double[n];
        for (int i = n / 3; i < n - n / 4; i++) {
            c[i] = 0.5 + (i % 3) * 0.25;
        }
        return new Mandate(1.0, base.lower(), base.upper(), Map.of(),
                List.of(new Group("First", first, 0.20, 0.45), new Group("Last", last, Double.NEGATIVE_INFINITY, 0.25)),
                List.of(new LinearConstraint("middle_tilt", c, Relation.AT_MOST, 0.30)));
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
