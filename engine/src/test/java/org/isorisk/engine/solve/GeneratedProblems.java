package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Relation;

/**
 * Generated test problems (fixed seeds): a dense factor-model covariance {@code Σ = B F B' + D} with a few
 * factors and specific risk, expected returns loosely tied to the factor exposures, and long-only mandates with
 * upper bounds {@code max(5 %, 3/n)}, optional groups and a general linear constraint. Invented numbers, no data.
 */
public final class GeneratedProblems {
    private GeneratedProblems() {
    }

    /** A universe of n assets named A001..; {@code factors} factors. */
    public static AssetUniverse universe(int n, long seed) {
        Random rnd = new Random(seed);
        int f = Math.min(5, Math.max(1, n / 4));
        double[][] b = new double[n][f];
        for (int i = 0; i < n; i++) {
            b[i][0] = 0.6 + 0.8 * rnd.nextDouble();
            for (int k = 1; k < f; k++) {
                b[i][k] = rnd.nextGaussian() * 0.5;
            }
        }
        double[] fv = new double[f];
        for (int k = 0; k < f; k++) {
            fv[k] = k == 0 ? 0.16 * 0.16 : 0.05 * 0.05 * (1 + rnd.nextDouble());
        }
        double[][] s = new double[n][n];
        double[] mu = new double[n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j <= i; j++) {
                double v = 0;
                for (int k = 0; k < f; k++) {
                    v += b[i][k] * fv[k] * b[j][k];
                }
                s[i][j] = v;
                s[j][i] = v;
            }
            double spec = 0.05 + 0.25 * rnd.nextDouble();
            s[i][i] += spec * spec;
            mu[i] = 0.01 + 0.04 * b[i][0] + 0.01 * rnd.nextGaussian();
        }
        List<String> names = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            names.add(String.format(java.util.Locale.ROOT, "A%04d", i + 1));
        }
        return new AssetUniverse(names, mu, s);
    }

    /** Long-only with upper bounds max(5 %, 3/n), fully invested. */
    public static Mandate longOnly(int n) {
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(hi, Math.max(0.05, 3.0 / n));
        return new Mandate(1.0, lo, hi, Map.of(), List.of(), List.of());
    }

    /**
     * Long-only plus two groups (the first third between 20 % and 45 %, the last quarter at most 25 %) and a
     * general constraint (a weighted sum of the middle assets at most 30 %).
     */
    public static Mandate withGroups(int n) {
        Mandate base = longOnly(n);
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
        List<Group> groups = List.of(new Group("First", first, 0.20, 0.45), new Group("Last", last,
                Double.NEGATIVE_INFINITY, 0.25));
        return new Mandate(1.0, base.lower(), base.upper(), Map.of(), groups,
                List.of(new LinearConstraint("middle_tilt", c, Relation.AT_MOST, 0.30)));
    }
}
