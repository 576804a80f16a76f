package org.isorisk.engine.model;

import org.isorisk.engine.error.InputException;

/**
 * One linear constraint {@code a'w (=|<=|>=) limit} over all assets.
 *
 * @param name         the name used in output and JSON, e.g. {@code budget}, {@code group:Equity:max}
 * @param coefficients one coefficient per asset (copied)
 * @param relation     equality or inequality direction
 * @param limit        the right-hand side; the constraint's shadow price is ∂V*∂limit
 */
public record LinearConstraint(String name, double[] coefficients, Relation relation, double limit) {

    public LinearConstraint {
        if (name == null || name.isBlank()) {
            throw InputException.of("a constraint has no name").build();
        }
        if (coefficients == null || coefficients.length == 0) {
            throw InputException.of("constraint '" + name + "' has no coefficients").build();
        }
        coefficients = coefficients.clone();
        for (double c : coefficients) {
            Checks.finite(c, "coefficient of constraint '" + name + "'");
        }
        if (relation == null) {
            throw InputException.of("constraint '" + name + "' has no relation").build();
        }
        Checks.finite(limit, "limit of constraint '" + name + "'");
    }

    @Override
    public double[] coefficients() {
        return coefficients.clone();
    }

    /** Coefficient of asset i without copying. */
    public double coefficient(int i) {
        return coefficients[i];
    }

    /** Number of coefficients (the number of assets). */
    public int size() {
        return coefficients.length;
    }

    /** {@code a'w}. */
    public double evaluate(double[] w) {
        double s = 0;
        for (int i = 0; i < coefficients.length; i++) {
            s += coefficients[i] * w[i];
        }
        return s;
    }

    /** How far {@code w} violates the constraint (0 when satisfied). */
    public double violation(double[] w) {
        double v = evaluate(w) - limit;
        return switch (relation) {
            case EQUAL -> Math.abs(v);
            case AT_MOST -> Math.max(0, v);
            case AT_LEAST -> Math.max(0, -v);
        };
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof LinearConstraint c && c.name.equals(name) && c.relation == relation
                && Double.compare(c.limit, limit) == 0 && java.util.Arrays.equals(c.coefficients, coefficients);
    }

    @Override
    public int hashCode() {
        return name.hashCode();
    }

    @Override
    public String toString() {
        return name + " " + relation.symbol() + " " + limit;
    }
}
