package org.isorisk.engine.model;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.isorisk.engine.error.InputException;

/**
 * The investable assets with their capital-market assumptions.
 *
 * @param assets          asset names, unique, in the order every vector and matrix follows
 * @param expectedReturns expected returns, decimal, annualised (0.065 is 6.5 %); copied, not modified
 * @param covariance      covariance matrix of annualised returns, symmetric; copied, not modified
 */
public record AssetUniverse(List<String> assets, double[] expectedReturns, double[][] covariance) {

    public AssetUniverse {
        if (assets == null || assets.isEmpty()) {
            throw InputException.of("the asset universe is empty").fix("give at least one asset").build();
        }
        assets = List.copyOf(assets);
        Map<String, Integer> seen = new HashMap<>();
        for (int i = 0; i < assets.size(); i++) {
            String a = assets.get(i);
            if (a == null || a.isBlank()) {
                throw InputException.of("an asset name is blank").row(i + 2).fix("name every asset").build();
            }
            Integer before = seen.put(a, i);
            if (before != null) {
                throw InputException.of("asset named twice").asset(a).fix("give each asset one row").build();
            }
        }
        int n = assets.size();
        expectedReturns = Checks.finiteCopy(expectedReturns, n, "expected returns");
        covariance = Checks.squareCopy(covariance, n, "covariance");
    }

    /** Number of assets. */
    public int size() {
        return assets.size();
    }

    /** Position of {@code name} in {@link #assets()}, if present. */
    public Optional<Integer> indexOf(String name) {
        int i = assets.indexOf(name);
        return i < 0 ? Optional.empty() : Optional.of(i);
    }

    @Override
    public double[] expectedReturns() {
        return expectedReturns.clone();
    }

    @Override
    public double[][] covariance() {
        return Checks.deepCopy(covariance);
    }

    /**
     * The lower triangle of the covariance by rows, row i holding entries 0..i: a fresh copy (half the size
     * of {@link #covariance()}), e.g. to be factored in place.
     */
    public double[][] covarianceLowerRows() {
        int n = covariance.length;
        double[][] out = new double[n][];
        for (int i = 0; i < n; i++) {
            out[i] = java.util.Arrays.copyOf(covariance[i], i + 1);
        }
        return out;
    }

    /**
     * {@code Σx} without copying the matrix, summed as {@code Σ_j x_j · (row j of Σ)} (the same order as
     * {@code linalg.Dense.multiplySymmetric}); {@code x} is not modified.
     */
    public double[] covarianceTimes(double[] x) {
        int n = covariance.length;
        if (x.length != n) {
            throw new IllegalArgumentException("vector of length " + x.length + " for " + n + " assets");
        }
        double[] y = new double[n];
        for (int j = 0; j < n; j++) {
            double xj = x[j];
            if (xj == 0) {
                continue;
            }
            double[] r = covariance[j];
            for (int i = 0; i < n; i++) {
                y[i] += xj * r[i];
            }
        }
        return y;
    }

    /** Covariance entry (i, j) without copying the matrix. */
    public double covariance(int i, int j) {
        return covariance[i][j];
    }

    /** Expected return of asset i without copying. */
    public double expectedReturn(int i) {
        return expectedReturns[i];
    }

    /** The same assets with other assumptions (e.g. a stress scenario). */
    public AssetUniverse withAssumptions(double[] mu, double[][] sigma) {
        return new AssetUniverse(assets, mu, sigma);
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof AssetUniverse other)) {
            return false;
        }
        return assets.equals(other.assets) && java.util.Arrays.equals(expectedReturns, other.expectedReturns)
                && java.util.Arrays.deepEquals(covariance, other.covariance);
    }

    @Override
    public int hashCode() {
        return assets.hashCode() * 31 + java.util.Arrays.hashCode(expectedReturns);
    }

    @Override
    public String toString() {
        return "AssetUniverse" + assets;
    }
}
