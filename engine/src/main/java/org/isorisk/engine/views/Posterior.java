package org.isorisk.engine.views;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.isorisk.engine.model.AssetUniverse;

/**
 * The result of blending views with a prior ({@link Blend#posterior}). Vectors and matrices follow the prior's
 * asset order; returns are annualised decimals.
 *
 * @param prior               the prior blended with
 * @param tau                 τ used
 * @param views               every view in the order given, with how it entered and its implied returns
 * @param excessReturns       μ̄, the posterior excess returns over the risk-free rate (copied)
 * @param meanUncertainty     {@code M = τΣ − τΣP'(PτΣP' + Ω)⁻¹PτΣ}, the posterior uncertainty of the mean
 *                            (copied)
 * @param optimalWeights      {@code w* = (δ(Σ + M))⁻¹μ̄}, the unconstrained optimum under the posterior, or null
 *                            when the prior has no risk aversion (copied)
 * @param priorOptimalWeights {@code (δΣ)⁻¹Π}, the unconstrained optimum under the prior (the reference weights
 *                            when the prior is implied from them), or null without a risk aversion (copied)
 * @param method              how the views' system was solved
 * @param dependentViews      views held with full confidence whose portfolios are linearly dependent (consistent,
 *                            else the blend is refused); empty when there are none
 * @param viewWeightsUnique   false when dependent views make the view weights one valid choice among many (the
 *                            optimum itself is unique)
 */
public record Posterior(Prior prior, double tau, List<BlendedView> views, double[] excessReturns,
                        double[][] meanUncertainty, double[] optimalWeights, double[] priorOptimalWeights,
                        Method method, List<String> dependentViews, boolean viewWeightsUnique) {

    /** How the views' linear system was solved. */
    public enum Method {
        /** {@code PτΣP' + Ω} positive definite: Cholesky factor. */
        CHOLESKY("Cholesky factor"),
        /**
         * Full-confidence views with linearly dependent portfolios but consistent returns: symmetric
         * eigendecomposition (rank-revealing) and the pseudo-inverse on its range, which gives the same posterior as
         * dropping the redundant views.
         */
        EIGEN_PSEUDO_INVERSE("eigendecomposition and pseudo-inverse (dependent full-confidence views)");

        private final String description;

        Method(String description) {
            this.description = description;
        }

        /** Words for reports. */
        public String description() {
            return description;
        }
    }

    public Posterior {
        int n = prior.size();
        views = List.copyOf(views);
        excessReturns = excessReturns.clone();
        meanUncertainty = copy(meanUncertainty);
        optimalWeights = optimalWeights == null ? null : optimalWeights.clone();
        priorOptimalWeights = priorOptimalWeights == null ? null : priorOptimalWeights.clone();
        dependentViews = List.copyOf(dependentViews);
        if (excessReturns.length != n || meanUncertainty.length != n) {
            throw new IllegalArgumentException("posterior of the wrong size for " + n + " assets");
        }
    }

    /** Asset names. */
    public List<String> assets() {
        return prior.assets();
    }

    @Override
    public double[] excessReturns() {
        return excessReturns.clone();
    }

    @Override
    public double[][] meanUncertainty() {
        return copy(meanUncertainty);
    }

    /** The posterior expected total returns {@code r_f + μ̄}. */
    public double[] expectedReturns() {
        double[] mu = excessReturns.clone();
        for (int i = 0; i < mu.length; i++) {
            mu[i] += prior.riskFree();
        }
        return mu;
    }

    /** The posterior covariance of returns {@code Σ + M} (Σ plus the uncertainty of the mean). */
    public double[][] covariance() {
        double[][] c = prior.covariance();
        for (int i = 0; i < c.length; i++) {
            for (int j = 0; j < c.length; j++) {
                c[i][j] += meanUncertainty[i][j];
            }
        }
        return c;
    }

    /** {@code (δ(Σ + M))⁻¹μ̄}, when the prior has a risk aversion. */
    @Override
    public double[] optimalWeights() {
        return optimalWeights == null ? null : optimalWeights.clone();
    }

    /** {@code (δΣ)⁻¹Π}, when the prior has a risk aversion. */
    @Override
    public double[] priorOptimalWeights() {
        return priorOptimalWeights == null ? null : priorOptimalWeights.clone();
    }

    /** The view weights Λ in the order of {@link #views()}, if the prior has a risk aversion. */
    public Optional<double[]> viewWeights() {
        if (optimalWeights == null) {
            return Optional.empty();
        }
        double[] l = new double[views.size()];
        for (int v = 0; v < l.length; v++) {
            l[v] = views.get(v).viewWeight();
        }
        return Optional.of(l);
    }

    /** The table of prior and posterior total returns per asset. */
    public List<AssetLine> assetLines() {
        List<AssetLine> out = new ArrayList<>();
        double[] before = prior.expectedReturns();
        double[] after = expectedReturns();
        for (int i = 0; i < before.length; i++) {
            out.add(new AssetLine(assets().get(i), before[i], after[i]));
        }
        return out;
    }

    /**
     * The posterior as assumptions to optimise: the posterior expected total returns with the posterior
     * covariance {@code Σ + M} ({@code withMeanUncertainty}) or the prior's Σ.
     */
    public AssetUniverse universe(boolean withMeanUncertainty) {
        return new AssetUniverse(assets(), expectedReturns(), withMeanUncertainty ? covariance() : prior.covariance());
    }

    private static double[][] copy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }
}
