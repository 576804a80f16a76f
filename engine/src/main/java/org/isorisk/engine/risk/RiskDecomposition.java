package org.isorisk.engine.risk;

import java.util.ArrayList;
import java.util.List;

/**
 * A portfolio's volatility split into per-asset contributions.
 *
 * @param assets         asset names, in the order of the arrays
 * @param weights        the weights decomposed, decimal (copied)
 * @param expectedReturn {@code μ'w}, decimal, annualised
 * @param variance       {@code w'Σw}
 * @param volatility     {@code σ = sqrt(w'Σw)}
 * @param marginal       {@code (Σw)_i/σ} (copied)
 * @param component      {@code w_i (Σw)_i/σ} (copied)
 * @param eulerResidual  {@code |Σ_i component_i − σ|}, the Euler check (zero up to rounding)
 */
public record RiskDecomposition(List<String> assets, double[] weights, double expectedReturn, double variance,
                                double volatility, double[] marginal, double[] component, double eulerResidual) {

    public RiskDecomposition {
        assets = List.copyOf(assets);
        weights = weights.clone();
        marginal = marginal.clone();
        component = component.clone();
        int n = assets.size();
        if (weights.length != n || marginal.length != n || component.length != n) {
            throw new IllegalArgumentException("one weight and contribution per asset");
        }
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }

    @Override
    public double[] marginal() {
        return marginal.clone();
    }

    @Override
    public double[] component() {
        return component.clone();
    }

    /** Share of risk of asset i: component over volatility. */
    public double share(int i) {
        return component[i] / volatility;
    }

    /** One record per asset, in universe order. */
    public List<Contribution> contributions() {
        List<Contribution> out = new ArrayList<>();
        for (int i = 0; i < assets.size(); i++) {
            out.add(new Contribution(assets.get(i), weights[i], marginal[i], component[i], share(i)));
        }
        return out;
    }

    /** Sum of the weights. */
    public double totalWeight() {
        double s = 0;
        for (double w : weights) {
            s += w;
        }
        return s;
    }
}
