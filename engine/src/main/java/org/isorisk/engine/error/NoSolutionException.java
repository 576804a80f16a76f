package org.isorisk.engine.error;

import java.util.List;

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

    public NoSolutionException(Reason reason, String message, List<String> constraints) {
        super(message);
        this.reason = reason;
        this.constraints = List.copyOf(constraints);
    }

    public Reason reason() {
        return reason;
    }

    /** Names of the constraints involved, in the JSON contract's naming ({@code budget}, {@code upper:Cash}, ...). */
    public List<String> constraints() {
        return constraints;
    }
}
