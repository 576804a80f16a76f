package org.isorisk.notebooks.pack;

import java.util.List;
import java.util.Optional;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Solution;

/**
 * The engine results of one pack run, before they are laid out: what the charts are drawn from.
 *
 * @param spec          what the pack file asked for
 * @param universe      the assets and assumptions
 * @param mandate       the mandate every portfolio obeys
 * @param minimum       the minimum-variance portfolio
 * @param targets       one portfolio per target of {@code spec.targets()}, in order
 * @param proposal      the proposed portfolio (one of {@code targets})
 * @param tangency      the tangency portfolio for {@code spec.riskFree()}, when it exists
 * @param frontier      the efficient frontier under the mandate, sampled increasing in expected return
 * @param marginal      marginal risk {@code (Σw)_i/σ} of the proposal, per asset
 * @param contribution  risk contribution {@code w_i (Σw)_i/σ} of the proposal, per asset
 * @param holdings      current weights, when given
 */
public record PackResults(PackSpec spec, AssetUniverse universe, Mandate mandate, Solution minimum,
                          List<Solution> targets, Solution proposal, Optional<Solution> tangency,
                          Frontier frontier, double[] marginal, double[] contribution,
                          Optional<double[]> holdings) {
    public PackResults {
        targets = List.copyOf(targets);
        marginal = marginal.clone();
        contribution = contribution.clone();
        holdings = holdings == null ? Optional.empty() : holdings.map(double[]::clone);
    }

    @Override
    public double[] marginal() {
        return marginal.clone();
    }

    @Override
    public double[] contribution() {
        return contribution.clone();
    }

    @Override
    public Optional<double[]> holdings() {
        return holdings.map(double[]::clone);
    }
}
