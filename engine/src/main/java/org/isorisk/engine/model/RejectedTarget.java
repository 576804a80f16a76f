package org.isorisk.engine.model;

/**
 * A requested frontier target that the mandate cannot reach, kept so that a grid never loses points silently.
 *
 * @param target the requested expected return, decimal, annualised
 * @param reason why it was refused, naming the achievable range
 */
public record RejectedTarget(double target, String reason) {
    public RejectedTarget {
        if (reason == null || reason.isBlank()) {
            throw new IllegalArgumentException("a rejected target needs its reason");
        }
    }
}
