package org.isorisk.engine.solve;

import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.Certificate;

/**
 * The whole frontier {@link ParametricQp} walked: corners in increasing target, and between each pair of
 * neighbouring corners a piece on which one working set holds, so that the weights and every multiplier are
 * affine in the target m and the objective is quadratic in m. Raw numbers only: rows are identified by their
 * index in {@link ParametricProblem#rows}, bounds by the asset's index, the return target by
 * {@link Kind#TARGET}.
 *
 * <p>Multipliers follow the one convention of the project, ∂V*∂limit of the objective {@code w'Σw − 2q'w}:
 * a row's price is ∂V*∂b_r ({@code ≤ 0} for a binding {@code <=} row, {@code ≥ 0} for {@code >=}, free for an
 * equality, 0 when not in the working set); the target's price is ∂V*∂m; a bound price
 * {@link Corner#boundPrices()}{@code [i]} is ∂V*∂(the bound asset i sits at): {@code ≥ 0} at a lower bound,
 * {@code ≤ 0} at an upper bound, either sign for a fixed weight ({@code lo = hi}), 0 for a free asset.
 *
 * @param problem     the problem walked
 * @param corners     corners in increasing target; the first and last are the ends of the walk
 * @param pieces      {@code pieces.get(j)} runs from corner j to corner j + 1
 * @param minimum     index of the corner at the minimum of the objective over all targets (the minimum-variance
 *                    portfolio for plain variance): the efficient branch runs from it upwards
 * @param threshold   the certificate threshold used (the settings' numerical tolerance)
 * @param counts      how much work the walk did
 */
record ParametricPath(ParametricProblem problem, List<Corner> corners, List<Piece> pieces, int minimum,
                      double threshold, Counts counts) {

    /**
     * The work of a walk, for benchmarks and tests.
     *
     * @param startChanges events (ratio tests ending in a change) while the linear term moved from the start
     *                     vertex's to the problem's
     * @param walkChanges  events along the target, both branches (the two ends included)
     * @param exchanges    joining constraints that were dependent on the working set (Best's exchange, or the end
     *                     of the range)
     * @param zeroSteps    events taken at the same point as the one before (degenerate corners)
     */
    record Counts(int startChanges, int walkChanges, int exchanges, int zeroSteps) {
    }

    /** What a constraint reference points at. */
    enum Kind {
        /** Row {@code index} of {@link ParametricProblem#rows}. */
        ROW,
        /** The lower bound of asset {@code index}. */
        LOWER,
        /** The upper bound of asset {@code index}. */
        UPPER,
        /** The return target ({@code index} is 0). */
        TARGET
    }

    /** A constraint of the problem, by kind and index (no names: the caller owns naming). */
    record ConstraintRef(Kind kind, int index) {
    }

    /**
     * A change of the working set at a corner, read in the direction of a rising target.
     *
     * @param constraint the row or bound
     * @param enters     true when it binds on the piece above the corner and not below (at the upper end of the
     *                   walk: it reaches its limit there), false for the reverse
     */
    record Change(ConstraintRef constraint, boolean enters) {
    }

    /**
     * A corner: the target, the point, the working set and the multipliers reported there (those of the piece the
     * walk leaves the corner by, away from the minimum; at the two ends those of the last piece walked, i.e. the
     * one-sided derivatives from inside the range), its changes, and the certificate of the point.
     *
     * @param target            m, decimal
     * @param weights           the portfolio
     * @param objective         {@code w'Σw − 2q'w}
     * @param variance          {@code w'Σw}
     * @param state             per asset {@link ParametricQp#FREE}, {@code LOWER}, {@code UPPER} or {@code FIXED}
     *                          in the reported working set
     * @param rowActive         per row: in the reported working set
     * @param rowPrices         per row ∂V*∂b_r (0 outside the working set)
     * @param targetPrice       ∂V*∂m
     * @param boundPrices       per asset, see the class comment
     * @param changes           the working set's changes here (empty at the minimum when nothing changes there)
     * @param multipliersUnique false at degenerate points, where other multipliers also satisfy the optimality
     *                          conditions (e.g. a binding group limit equal to its members' binding bounds, an end
     *                          of the range); the reported ones are one valid choice
     * @param certificate       the KKT certificate ({@link Kkt}) computed from Σ and these numbers
     */
    record Corner(double target, double[] weights, double objective, double variance, byte[] state,
                  boolean[] rowActive, double[] rowPrices, double targetPrice, double[] boundPrices,
                  List<Change> changes, boolean multipliersUnique, Certificate certificate) {
        Corner {
            changes = List.copyOf(changes);
        }

        /** Prices of the lower bounds (0 where the asset is not at its lower bound). */
        double[] lowerPrices() {
            return ParametricQp.split(state, boundPrices, true);
        }

        /** Prices of the upper bounds (0 where the asset is not at its upper bound). */
        double[] upperPrices() {
            return ParametricQp.split(state, boundPrices, false);
        }
    }

    /**
     * A piece: one working set from {@code from} to {@code to}; every quantity is {@code value + (m − anchor)·slope}
     * with the anchor at the corner the walk left it from.
     *
     * @param multipliersUnique false when the multipliers are not unique inside the piece (a constraint outside
     *                          the working set binds along it with a gradient in the working set's span)
     * @param condition         estimate of the condition number of the free block {@code Σ_FF} on the piece
     */
    record Piece(double from, double to, double anchor, byte[] state, boolean[] rowActive, double[] weights,
                 double[] weightSlopes, double[] rowPrices, double[] rowPriceSlopes, double targetPrice,
                 double targetPriceSlope, double[] boundPrices, double[] boundPriceSlopes, boolean multipliersUnique,
                 double condition) {

        /** The weights at m (exact on the piece). */
        double[] weightsAt(double m) {
            return affine(weights, weightSlopes, m - anchor);
        }

        /** The row prices at m. */
        double[] rowPricesAt(double m) {
            return affine(rowPrices, rowPriceSlopes, m - anchor);
        }

        /** ∂V*∂m at m. */
        double targetPriceAt(double m) {
            return targetPrice + (m - anchor) * targetPriceSlope;
        }

        /** The bound prices at m. */
        double[] boundPricesAt(double m) {
            return affine(boundPrices, boundPriceSlopes, m - anchor);
        }

        private static double[] affine(double[] v, double[] d, double h) {
            double[] out = new double[v.length];
            for (int i = 0; i < v.length; i++) {
                out[i] = v[i] + h * d[i];
            }
            return out;
        }
    }

    /**
     * A point of the frontier at a target, with its certificate.
     *
     * @param multipliersUnique as for a corner
     */
    record Point(double target, double[] weights, double objective, double variance, byte[] state,
                 boolean[] rowActive, double[] rowPrices, double targetPrice, double[] boundPrices,
                 boolean multipliersUnique, Certificate certificate) {

        double[] lowerPrices() {
            return ParametricQp.split(state, boundPrices, true);
        }

        double[] upperPrices() {
            return ParametricQp.split(state, boundPrices, false);
        }
    }

    ParametricPath {
        corners = List.copyOf(corners);
        pieces = List.copyOf(pieces);
        if (pieces.size() != Math.max(0, corners.size() - 1)) {
            throw new IllegalArgumentException(corners.size() + " corners need " + (corners.size() - 1) + " pieces");
        }
    }

    /** Lowest target walked. */
    double lowest() {
        return corners.get(0).target();
    }

    /** Highest target walked (the highest the mandate allows). */
    double highest() {
        return corners.get(corners.size() - 1).target();
    }

    /**
     * The exact frontier point at target m: a corner's own numbers when m is a corner's target, otherwise the
     * affine pieces' values, certified afresh against Σ.
     *
     * @throws NoSolutionException (INFEASIBLE) outside {@code [lowest(), highest()]}
     */
    Point at(double m) {
        double tol = ParametricQp.SAME_POINT * Math.max(1, Math.abs(m));
        if (m < lowest() - tol || m > highest() + tol) {
            throw new NoSolutionException(NoSolutionException.Reason.INFEASIBLE, String.format(Locale.ROOT,
                    "target %.10g is outside the walked range [%.10g, %.10g]", m, lowest(), highest()), List.of());
        }
        for (Corner c : corners) {
            if (Math.abs(c.target() - m) <= tol) {
                return new Point(c.target(), c.weights(), c.objective(), c.variance(), c.state(), c.rowActive(),
                        c.rowPrices(), c.targetPrice(), c.boundPrices(), c.multipliersUnique(), c.certificate());
            }
        }
        int j = 0;
        while (j + 1 < pieces.size() && pieces.get(j).to() < m) {
            j++;
        }
        return ParametricQp.point(this, pieces.get(j), m);
    }
}
