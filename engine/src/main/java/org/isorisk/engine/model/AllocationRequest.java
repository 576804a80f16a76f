package org.isorisk.engine.model;

/**
 * Everything one solve needs.
 *
 * @param universe  assets and assumptions
 * @param mandate   constraints; {@link Mandate#fullyInvested(int)} for the budget alone
 * @param objective minimum variance, a target return or the tangency portfolio
 * @param method    {@link Method#AUTO} to let the allocator choose
 * @param settings  tolerances and limits
 */
public record AllocationRequest(AssetUniverse universe, Mandate mandate, Objective objective, Method method,
                                SolverSettings settings) {
    public AllocationRequest {
        if (universe == null || mandate == null || objective == null) {
            throw new IllegalArgumentException("universe, mandate and objective are required");
        }
        if (mandate.size() != universe.size()) {
            throw new IllegalArgumentException("mandate covers " + mandate.size() + " assets, universe has " + universe.size());
        }
        method = method == null ? Method.AUTO : method;
        settings = settings == null ? SolverSettings.defaults() : settings;
    }

    /** A request with default method and settings. */
    public static AllocationRequest of(AssetUniverse u, Mandate m, Objective o) {
        return new AllocationRequest(u, m, o, Method.AUTO, SolverSettings.defaults());
    }

    public AllocationRequest withObjective(Objective o) {
        return new AllocationRequest(universe, mandate, o, method, settings);
    }

    public AllocationRequest withMethod(Method m) {
        return new AllocationRequest(universe, mandate, objective, m, settings);
    }
}
