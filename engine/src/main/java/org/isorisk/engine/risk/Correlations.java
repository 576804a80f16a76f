package org.isorisk.engine.risk;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;

/**
 * The correlation matrix implied by a covariance matrix, {@code ρ_ij = Σ_ij / sqrt(Σ_ii Σ_jj)}, with the
 * summary a reader of assumptions looks at first: the least and the most correlated pair and the average
 * pairwise correlation.
 *
 * @param assets  asset names, in the matrix's order
 * @param matrix  the correlations (copied); 1 on the diagonal
 * @param lowest  the pair with the lowest correlation (null with a single asset)
 * @param highest the pair with the highest correlation (null with a single asset)
 * @param average mean of the correlations above the diagonal (NaN with a single asset)
 */
public record Correlations(java.util.List<String> assets, double[][] matrix, Pair lowest, Pair highest,
                           double average) {

    /**
     * Two assets and their correlation.
     *
     * @param first       the asset earlier in the universe
     * @param second      the later one
     * @param correlation between −1 and 1
     */
    public record Pair(String first, String second, double correlation) {
    }

    public Correlations {
        assets = java.util.List.copyOf(assets);
        double[][] c = new double[matrix.length][];
        for (int i = 0; i < matrix.length; i++) {
            c[i] = matrix[i].clone();
        }
        matrix = c;
    }

    @Override
    public double[][] matrix() {
        double[][] c = new double[matrix.length][];
        for (int i = 0; i < matrix.length; i++) {
            c[i] = matrix[i].clone();
        }
        return c;
    }

    /** Correlation of assets i and j without copying. */
    public double get(int i, int j) {
        return matrix[i][j];
    }

    /**
     * Correlations of the universe's covariance.
     *
     * @throws InputException when an asset has zero variance (its correlations are undefined)
     */
    public static Correlations of(AssetUniverse u) {
        int n = u.size();
        double[] sd = new double[n];
        for (int i = 0; i < n; i++) {
            double v = u.covariance(i, i);
            if (!(v > 0)) {
                throw InputException.of("the asset has zero variance, so its correlations are undefined")
                        .asset(u.assets().get(i)).value(v).fix("give every asset a positive variance").build();
            }
            sd[i] = Math.sqrt(v);
        }
        double[][] r = new double[n][n];
        Pair lo = null;
        Pair hi = null;
        double sum = 0;
        int count = 0;
        for (int i = 0; i < n; i++) {
            r[i][i] = 1.0;
            for (int j = i + 1; j < n; j++) {
                double c = u.covariance(i, j) / (sd[i] * sd[j]);
                r[i][j] = c;
                r[j][i] = c;
                sum += c;
                count++;
                if (lo == null || c < lo.correlation()) {
                    lo = new Pair(u.assets().get(i), u.assets().get(j), c);
                }
                if (hi == null || c > hi.correlation()) {
                    hi = new Pair(u.assets().get(i), u.assets().get(j), c);
                }
            }
        }
        return new Correlations(u.assets(), r, lo, hi, count == 0 ? Double.NaN : sum / count);
    }
}
