package org.isorisk.engine.estimate;

import java.util.List;

/**
 * Means and covariance of assets whose histories start at different dates, combined by
 * {@link UnequalHistories#combine}. Per period; vectors and matrices follow {@code assets}.
 *
 * @param assets       asset names, in the order of the history's columns
 * @param means        combined means (copied)
 * @param covariance   combined covariance, symmetric positive semi-definite by construction (copied)
 * @param firstRows    for each asset its first row with a value, zero-based (copied)
 * @param observations for each asset the number of returns it has (copied)
 * @param ownMeans     each asset's plain mean over its own history, for comparison (copied)
 * @param divisor      the divisor convention used
 */
public record CombinedMoments(List<String> assets, double[] means, double[][] covariance, int[] firstRows,
                              int[] observations, double[] ownMeans, UnequalHistories.Divisor divisor) {

    public CombinedMoments {
        assets = List.copyOf(assets);
        means = means.clone();
        covariance = copy(covariance);
        firstRows = firstRows.clone();
        observations = observations.clone();
        ownMeans = ownMeans.clone();
    }

    @Override
    public double[] means() {
        return means.clone();
    }

    @Override
    public double[][] covariance() {
        return copy(covariance);
    }

    @Override
    public int[] firstRows() {
        return firstRows.clone();
    }

    @Override
    public int[] observations() {
        return observations.clone();
    }

    @Override
    public double[] ownMeans() {
        return ownMeans.clone();
    }

    private static double[][] copy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }
}
