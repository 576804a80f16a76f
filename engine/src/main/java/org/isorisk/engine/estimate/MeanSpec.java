package org.isorisk.engine.estimate;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Collections;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Checks;

/** Where the expected returns come from. */
public sealed interface MeanSpec {

    /** The arithmetic mean of the returns, annualised; noisy (the report says how noisy). */
    record Historical() implements MeanSpec {
    }

    /**
     * A table the user supplies, one annualised decimal expected return per asset, used as given.
     *
     * @param expectedReturns asset → expected return; must cover every asset of the history (copied)
     * @param source          name of the table, for messages
     */
    record Supplied(Map<String, Double> expectedReturns, String source) implements MeanSpec {
        public Supplied {
            expectedReturns = Collections.unmodifiableMap(new LinkedHashMap<>(expectedReturns));
            source = source == null ? "expected returns" : source;
            for (Map.Entry<String, Double> e : expectedReturns.entrySet()) {
                if (e.getValue() == null || !Double.isFinite(e.getValue())) {
                    throw InputException.of("expected return is not a finite number").file(source).asset(e.getKey())
                            .fix("give a decimal such as 0.065").build();
                }
            }
        }
    }

    /**
     * Returns implied by a reference portfolio (reverse optimisation): {@code π = δ Σ w_ref} are the excess
     * returns over the risk-free rate for which the reference portfolio maximises {@code w'μ − (δ/2) w'Σw};
     * the expected returns are {@code r_f + π}. The risk aversion δ is given, or implied by a market Sharpe ratio:
     * {@code δ = SR / σ_ref} with {@code σ_ref = sqrt(w_ref'Σw_ref)}, so that the reference portfolio's excess
     * return is {@code SR · σ_ref}. Exactly one of {@code riskAversion} and {@code sharpeRatio} is finite.
     *
     * @param weights      reference weights, asset → decimal weight; must cover every asset (copied)
     * @param riskAversion δ, positive, or NaN when the Sharpe ratio is given
     * @param sharpeRatio  annualised Sharpe ratio of the reference portfolio, positive, or NaN when δ is given
     * @param riskFree     annualised risk-free rate added to π, decimal
     * @param source       name of the weights table, for messages
     */
    record Implied(Map<String, Double> weights, double riskAversion, double sharpeRatio, double riskFree,
                   String source) implements MeanSpec {
        public Implied {
            weights = Collections.unmodifiableMap(new LinkedHashMap<>(weights));
            source = source == null ? "reference weights" : source;
            for (Map.Entry<String, Double> e : weights.entrySet()) {
                if (e.getValue() == null || !Double.isFinite(e.getValue())) {
                    throw InputException.of("reference weight is not a finite number").file(source).asset(e.getKey())
                            .fix("give a decimal weight such as 0.25").build();
                }
            }
            boolean hasDelta = !Double.isNaN(riskAversion);
            boolean hasSharpe = !Double.isNaN(sharpeRatio);
            if (hasDelta == hasSharpe) {
                throw InputException.of("implied returns need exactly one of the risk aversion and the market Sharpe "
                        + "ratio").fix("give --risk-aversion D or --sharpe-ratio S, not both").build();
            }
            if (hasDelta && !(riskAversion > 0 && Double.isFinite(riskAversion))) {
                throw InputException.of("the risk aversion must be a positive number").value(riskAversion)
                        .fix("give a value such as 2.5").build();
            }
            if (hasSharpe && !(sharpeRatio > 0 && Double.isFinite(sharpeRatio))) {
                throw InputException.of("the market Sharpe ratio must be a positive number").value(sharpeRatio)
                        .fix("give an annualised value such as 0.4").build();
            }
            Checks.finite(riskFree, "risk-free rate");
        }
    }
}
