package org.isorisk.engine.estimate;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.TreeMap;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.linalg.Cholesky;

/**
 * Means and covariance of assets whose histories start at different dates, without throwing away the early part
 * of the long histories (Stambaugh 1997, "Analyzing Investments Whose Histories Differ in Length", Journal of
 * Financial Economics 45; the maximum-likelihood estimators of Anderson 1957 for a monotone pattern of missing
 * values).
 *
 * <p>Two blocks, the long histories (1, T returns) and the short ones (2, the last S returns): with the full-sample
 * moments {@code μ̂₁, Σ̂₁₁} of the long block and the moments over the common S periods ({@code μ₁ₛ, μ₂ₛ, Σ₁₁ₛ,
 * Σ₂₁ₛ, Σ₂₂ₛ}), the regression of the short block on the long one over the common period,
 * {@code B = Σ₂₁ₛ Σ₁₁ₛ⁻¹}, carries the long block's extra information over:
 * <pre>
 *   μ̂₂  = μ₂ₛ + B(μ̂₁ − μ₁ₛ)
 *   Σ̂₂₁ = Σ₂₁ₛ + B(Σ̂₁₁ − Σ₁₁ₛ)  (= B Σ̂₁₁)
 *   Σ̂₂₂ = Σ₂₂ₛ + B(Σ̂₁₁ − Σ₁₁ₛ)B'
 * </pre>
 * (the formulas of Stambaugh's section on the maximum-likelihood estimators, equation numbers not given here:
 * written from memory). Equivalently, with the regression's intercept {@code α = μ₂ₛ − Bμ₁ₛ} and residual
 * covariance {@code Σₑ = Σ₂₂ₛ − BΣ₁₁ₛB'}: {@code μ̂₂ = α + Bμ̂₁} and {@code Σ̂₂₂ = Σₑ + BΣ̂₁₁B'}, which is positive
 * semi-definite whenever Σ̂₁₁ and Σₑ are. With several start dates the rule is applied start by start: each group
 * of assets that start on the same row is regressed on all assets that start earlier, over its own period, with
 * the earlier assets' combined estimates in place of the long block's (the likelihood of a monotone pattern
 * factors into these regressions).
 *
 * <p>Divisors: {@link Divisor#MAXIMUM_LIKELIHOOD} uses T and S, as the paper; {@link Divisor#UNBIASED} uses
 * T − 1 and S − 1 in every moment, so that with histories of equal length the result is the project's sample
 * covariance. B is the same under both.
 */
public final class UnequalHistories {
    private UnequalHistories() {
    }

    /** The divisor of every sample moment. */
    public enum Divisor {
        /** T − 1 and S − 1: equals the sample covariance when every history is equally long. */
        UNBIASED,
        /** T and S, as Stambaugh's maximum-likelihood estimators. */
        MAXIMUM_LIKELIHOOD
    }

    /**
     * Combines histories that start at different rows.
     *
     * @param assets  asset names, one per column
     * @param rows    {@code rows[t][j]}, returns per period, oldest first; an asset's returns run without a gap
     *                from its first value to the last row, NaN before it (not modified)
     * @param divisor the divisor convention
     * @throws InputException when an asset's history has a gap or stops before the last row, or a common period is
     *                        too short for the regression on the assets that start earlier
     */
    public static CombinedMoments combine(List<String> assets, double[][] rows, Divisor divisor) {
        int n = assets.size();
        int len = rows.length;
        int[] first = new int[n];
        double[] ownMeans = new double[n];
        int[] counts = new int[n];
        for (int j = 0; j < n; j++) {
            first[j] = -1;
            for (int t = 0; t < len; t++) {
                if (rows[t].length != n) {
                    throw new IllegalArgumentException("row " + t + " has " + rows[t].length + " values for " + n);
                }
                double v = rows[t][j];
                if (Double.isNaN(v)) {
                    if (first[j] >= 0) {
                        throw InputException.of("the history has a gap after it starts (return " + (t + 1) + " of "
                                        + len + "); combining histories of unequal length needs each asset's returns "
                                        + "to run from its start to the last row")
                                .asset(assets.get(j)).fix("fill the gap, or start the asset's history after it")
                                .build();
                    }
                } else if (!Double.isFinite(v)) {
                    throw InputException.of("return " + (t + 1) + " is not finite").asset(assets.get(j)).value(v)
                            .build();
                } else if (first[j] < 0) {
                    first[j] = t;
                }
            }
            counts[j] = first[j] < 0 ? 0 : len - first[j];
            if (counts[j] < 2) {
                throw InputException.of("the asset has fewer than 2 returns").asset(assets.get(j)).value(counts[j])
                        .fix("give a longer history of this asset or leave it out").build();
            }
            double[] own = new double[counts[j]];
            for (int t = first[j]; t < len; t++) {
                own[t - first[j]] = rows[t][j];
            }
            ownMeans[j] = Moments.mean(own);
        }
        // Groups of assets by start row, earliest first.
        TreeMap<Integer, List<Integer>> groups = new TreeMap<>();
        for (int j = 0; j < n; j++) {
            groups.computeIfAbsent(first[j], k -> new ArrayList<>()).add(j);
        }
        double[] mean = new double[n];
        double[][] cov = new double[n][n];
        List<Integer> earlier = new ArrayList<>();
        for (var entry : groups.entrySet()) {
            int start = entry.getKey();
            List<Integer> g = entry.getValue();
            List<Integer> both = new ArrayList<>(earlier);
            both.addAll(g);
            double[][] x = columns(rows, both, start);
            double[] m = Moments.means(x);
            double[][] centred = Moments.centred(x, m);
            double[][] c = Moments.cross(centred, centred, divisor(divisor, len - start));
            int e = earlier.size();
            if (e == 0) {
                for (int a = 0; a < g.size(); a++) {
                    mean[g.get(a)] = m[a];
                    for (int b = 0; b < g.size(); b++) {
                        cov[g.get(a)][g.get(b)] = c[a][b];
                    }
                }
                earlier.addAll(g);
                continue;
            }
            int s = len - start;
            if (s < e + 2) {
                throw InputException.of(String.format(Locale.ROOT, "the history is too short to be regressed on the "
                                + "%d assets whose histories start earlier: %d returns in common, at least %d needed",
                                e, s, e + 2)).asset(assets.get(g.get(0)))
                        .fix("give a longer history of this asset, or fewer assets with longer histories").build();
            }
            // Common-period blocks: E (earlier assets) and G (this group).
            double[][] cEE = new double[e][];
            for (int a = 0; a < e; a++) {
                cEE[a] = java.util.Arrays.copyOf(c[a], a + 1);
            }
            Cholesky chol = Cholesky.factor(cEE, 1);
            if (chol == null) {
                throw InputException.of("the assets with longer histories are perfectly collinear over the common "
                                + "period, so this asset cannot be regressed on them").asset(assets.get(g.get(0)))
                        .fix("leave out one of the collinear assets").build();
            }
            int k = g.size();
            // B = Σ_GE,S Σ_EE,S⁻¹: row a of B solves Σ_EE,S b = Σ_EG,S(:, a).
            double[][] bMat = new double[k][];
            for (int a = 0; a < k; a++) {
                double[] rhs = new double[e];
                for (int i = 0; i < e; i++) {
                    rhs[i] = c[e + a][i];
                }
                bMat[a] = chol.solve(rhs);
            }
            // D = Σ̂_EE − Σ_EE,S and d = μ̂_E − μ_E,S.
            double[][] d = new double[e][e];
            double[] dm = new double[e];
            for (int i = 0; i < e; i++) {
                dm[i] = mean[earlier.get(i)] - m[i];
                for (int l = 0; l < e; l++) {
                    d[i][l] = cov[earlier.get(i)][earlier.get(l)] - c[i][l];
                }
            }
            for (int a = 0; a < k; a++) {
                int ga = g.get(a);
                double[] ba = bMat[a];
                mean[ga] = m[e + a] + dot(ba, dm);
                double[] bd = new double[e]; // row a of B·D
                for (int l = 0; l < e; l++) {
                    double v = 0;
                    for (int i = 0; i < e; i++) {
                        v += ba[i] * d[i][l];
                    }
                    bd[l] = v;
                }
                for (int l = 0; l < e; l++) {
                    double v = c[e + a][l] + bd[l];
                    cov[ga][earlier.get(l)] = v;
                    cov[earlier.get(l)][ga] = v;
                }
                for (int b = 0; b <= a; b++) {
                    double v = c[e + a][e + b] + dot(bd, bMat[b]);
                    cov[ga][g.get(b)] = v;
                    cov[g.get(b)][ga] = v;
                }
            }
            earlier.addAll(g);
        }
        return new CombinedMoments(assets, mean, cov, first, counts, ownMeans, divisor);
    }

    private static double divisor(Divisor d, int count) {
        return d == Divisor.UNBIASED ? count - 1 : count;
    }

    /** Columns {@code x[a][t]} of the listed assets over rows {@code from … end}. */
    private static double[][] columns(double[][] rows, List<Integer> assets, int from) {
        int len = rows.length - from;
        double[][] x = new double[assets.size()][len];
        for (int a = 0; a < assets.size(); a++) {
            int j = assets.get(a);
            for (int t = 0; t < len; t++) {
                x[a][t] = rows[from + t][j];
            }
        }
        return x;
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }
}
