package org.isorisk.engine.model;

/** What the allocation minimises or aims at; all minimise variance {@code w'Σw} subject to the mandate. */
public sealed interface Objective {

    /** The minimum-variance portfolio under the mandate. */
    record MinimumVariance() implements Objective {
    }

    /**
     * Minimum variance with expected return equal to {@code target}; the return-target constraint is named
     * {@code target_return} and its shadow price is the marginal risk of tightening the target.
     *
     * @param target decimal, annualised
     */
    record TargetReturn(double target) implements Objective {
        public TargetReturn {
            Checks.finite(target, "target return");
        }
    }

    /**
     * The tangency (maximum Sharpe ratio) portfolio for a risk-free rate.
     *
     * @param riskFree decimal, annualised
     */
    record Tangency(double riskFree) implements Objective {
        public Tangency {
            Checks.finite(riskFree, "risk-free rate");
        }
    }

    static Objective minimumVariance() {
        return new MinimumVariance();
    }

    static Objective targetReturn(double m) {
        return new TargetReturn(m);
    }

    static Objective tangency(double rf) {
        return new Tangency(rf);
    }
}
