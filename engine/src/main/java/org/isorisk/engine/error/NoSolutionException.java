package org.isorisk.engine.error;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * The inputs are valid but the problem has no (unique, meaningful) solution: the constraints contradict each
 * other, a target lies outside what the mandate allows, the constraint qualification fails, or an iterative
 * method did not converge. Names the constraints involved.
 */
public final class NoSolutionException extends IsoriskException {
    private static final long serialVersionUID = 1L;

    /** Why there is no solution. */
    public enum Reason {
        /** No portfolio satisfies every constraint. */
        INFEASIBLE,
        /** Constraint gradients are linearly dependent, so multipliers are not unique. */
        CONSTRAINT_QUALIFICATION,
        /** The problem is not convex or not bounded (e.g. Σ not positive semi-definite). */
        NOT_CONVEX,
        /** An iterative method stopped before meeting its tolerance. */
        NOT_CONVERGED
    }

    private final Reason reason;
    private final List<String> constraints;
    private final double[] achievableReturns;
    private final Map<String, Double> endPortfolio;

    public NoSolutionException(Reason reason, String message, List<String> constraints) {
        this(reason, message, constraints, null, null);
    }

    /**
     * A target-return failure that also reports what the mandate allows.
     *
     * @param achievableReturns {@code {min, max}} expected return over the mandate, decimal; null when not known
     * @param endPortfolio      weights by asset name of the portfolio at the end of the range nearest the target
     */
    public NoSolutionException(Reason reason, String message, List<String> constraints, double[] achievableReturns,
                               Map<String, Double> endPortfolio) {
        super(message);
        this.reason = reason;
        this.constraints = List.copyOf(constraints);
        this.achievableReturns = achievableReturns == null ? null : achievableReturns.clone();
        this.endPortfolio = endPortfolio == null ? null : Collections.unmodifiableMap(new LinkedHashMap<>(endPortfolio));
    }

    public Reason reason() {
        return reason;
    }

    /** Names of the constraints involved, in the JSON contract's naming ({@code budget}, {@code upper:Cash}, ...). */
    public List<String> constraints() {
        return constraints;
    }

    /** The expected returns the mandate allows, {@code {min, max}}, when the failure concerns a return target. */
    public Optional<double[]> achievableReturns() {
        return Optional.ofNullable(achievableReturns).map(double[]::clone);
    }

    /** The portfolio at the end of the achievable range nearest the requested target (asset name → weight). */
    public Optional<Map<String, Double>> endPortfolio() {
        return Optional.ofNullable(endPortfolio);
    }
}
