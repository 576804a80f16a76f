package org.isorisk.engine.model;

import java.util.List;

/**
 * Which branch of the frontier a target portfolio lies on. The least variance {@code V*(m)} for a return target
 * {@code m} is convex in {@code m} with its minimum at the minimum-variance portfolio's return, so its slope, the
 * return target's shadow price {@code ∂V*∂m}, is negative exactly below that return: there the portfolio is on the
 * inefficient branch (another portfolio of the same mandate has the same risk and a higher expected return, and
 * raising the target lowers the risk). The test needs only the solution itself, so it holds for every method
 * (closed form, critical line, active-set QP) and for any assumptions, a stress scenario's included.
 */
public final class Branch {
    private Branch() {
    }

    /** What every output says of a target portfolio on the inefficient branch. */
    public static final String INEFFICIENT_NOTE = "This portfolio is on the inefficient branch of the frontier: its "
            + "return is below that of the minimum-variance portfolio.";

    /**
     * A return-target shadow price ({@code ∂V*∂m}, variance per unit of return) below {@code −TOLERANCE} counts as
     * negative. At the minimum-variance portfolio the price is zero up to round-off (of order 1e-15 on the sample
     * fund, by closed form and by the QP alike); 1e-9 is far above that and far below any price a target
     * distinguishable from the minimum-variance return has (with a curvature of V* of order 10, the price is 1e-9
     * about 1e-10 below that return, a millionth of a basis point).
     */
    public static final double TOLERANCE = 1e-9;

    /** True when {@code s} solves a return target that lies below the minimum-variance return. */
    public static boolean inefficient(Solution s) {
        return s.multiplier("target_return").map(m -> m.variancePerUnit() < -TOLERANCE).orElse(false);
    }

    /** {@code s} with {@link #INEFFICIENT_NOTE} among its notes when it is on the inefficient branch. */
    public static Solution annotated(Solution s) {
        return inefficient(s) && !s.notes().contains(INEFFICIENT_NOTE) ? s.withNotes(List.of(INEFFICIENT_NOTE)) : s;
    }
}
