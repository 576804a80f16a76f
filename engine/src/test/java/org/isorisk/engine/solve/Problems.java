package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.SolverSettings;

/** Test problems built in the tests from fixed seeds: factor-model covariances and spread-out expected returns. */
final class Problems {
    private Problems() {
    }

    /**
     * A universe of n assets: Σ = B B' + D with k factors (loadings N(0, 0.12²)) and idiosyncratic variances
     * uniform in [0.002, 0.03]; expected returns uniform in [0.01, 0.09].
     */
    static AssetUniverse universe(int n, long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        int k = Math.min(3, n);
        double[][] b = new double[n][k];
        for (double[] row : b) {
            for (int f = 0; f < k; f++) {
                row[f] = 0.12 * gaussian(r);
            }
        }
        double[][] sigma = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double v = 0;
                for (int f = 0; f < k; f++) {
                    v += b[i][f] * b[j][f];
                }
                sigma[i][j] = v;
                sigma[j][i] = v;
            }
            sigma[i][i] += 0.002 + 0.028 * r.nextDouble();
        }
        double[] mu = new double[n];
        for (int i = 0; i < n; i++) {
            mu[i] = 0.01 + 0.08 * r.nextDouble();
        }
        return new AssetUniverse(names(n), mu, sigma);
    }

    static List<String> names(int n) {
        List<String> names = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            names.add("Asset " + (i + 1));
        }
        return names;
    }

    static double gaussian(SplittableRandom r) {
        // Box–Muller; enough for test data.
        double u = 1 - r.nextDouble();
        double v = r.nextDouble();
        return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    }

    /** A random symmetric positive definite matrix G G' + n·δ I with G uniform in [−1, 1]. */
    static double[][] spd(int n, long seed, double delta) {
        SplittableRandom r = new SplittableRandom(seed);
        double[][] g = new double[n][n];
        for (double[] row : g) {
            for (int j = 0; j < n; j++) {
                row[j] = 2 * r.nextDouble() - 1;
            }
        }
        double[][] a = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double s = 0;
                for (int p = 0; p < n; p++) {
                    s += g[i][p] * g[j][p];
                }
                a[i][j] = s;
                a[j][i] = s;
            }
            a[i][i] += n * delta;
        }
        return a;
    }

    static Mandate budget(int n, double b) {
        return Mandate.budgetOnly(n, b);
    }

    /** Budget b, asset {@code fixedAsset} fixed at {@code fixedWeight}, and group "Core" (first half) at {@code groupTotal}. */
    static Mandate withFixedAndGroup(int n, double b, int fixedAsset, double fixedWeight, double groupTotal) {
        List<Integer> members = new ArrayList<>();
        for (int i = 0; i < n / 2; i++) {
            if (i != fixedAsset) {
                members.add(i);
            }
        }
        Mandate free = budget(n, b);
        return new Mandate(b, free.lower(), free.upper(), Map.of(fixedAsset, fixedWeight),
                List.of(new Group("Core", members, groupTotal, groupTotal)), List.of());
    }

    static AllocationRequest request(AssetUniverse u, Mandate m, Objective o) {
        return new AllocationRequest(u, m, o, Method.AUTO, SolverSettings.defaults());
    }
}
