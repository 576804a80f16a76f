package org.isorisk.engine.rebalance;

import org.isorisk.engine.model.Checks;

/** What the proposal aims at; every objective respects the mandate and the trading limits. */
public sealed interface RebalanceObjective {

    /**
     * Minimum risk with the expected return after trading costs at least {@code target}:
     * {@code μ'w − Σ c_i|w_i − w0_i| ≥ target}.
     *
     * @param target decimal, annualised
     */
    record TargetReturn(double target) implements RebalanceObjective {
        public TargetReturn {
            Checks.finite(target, "target return");
        }
    }

    /**
     * The efficient portfolio at today's risk: the highest expected return after costs whose volatility does not
     * exceed today's. Found along the return target by a safeguarded Newton iteration on the minimum variance
     * {@code V*(m) = σ0²}, using the target's shadow price {@code ∂V*∂m} as the exact slope; V* is convex in m, so
     * Newton from above never overshoots the root, and a bisection step takes over whenever it would leave the
     * bracket.
     */
    record SameRisk() implements RebalanceObjective {
    }

    /**
     * The efficient portfolio nearest to today's, in tracking error {@code sqrt((w − w0)'Σ(w − w0))}: the efficient
     * branch of the frontier under the mandate and the trading limits is scanned on a grid of targets and the best
     * bracket refined by golden-section search.
     */
    record Nearest() implements RebalanceObjective {
    }

    /** The label used on the command line and in JSON: {@code target}, {@code same-risk}, {@code nearest}. */
    default String label() {
        if (this instanceof TargetReturn) {
            return "target";
        }
        return this instanceof SameRisk ? "same-risk" : "nearest";
    }
}
