package org.isorisk.engine.model;

/**
 * The expected returns a mandate allows: the lowest and highest {@code μ'w} over every portfolio that meets the
 * budget, bounds, fixed weights, groups and general constraints (a linear program), with the portfolios at the two
 * ends.
 *
 * @param min          lowest expected return, decimal, annualised; {@code -Infinity} when unbounded
 * @param max          highest expected return; {@code +Infinity} when unbounded
 * @param minPortfolio weights at the low end (copied); null when unbounded
 * @param maxPortfolio weights at the high end (copied); null when unbounded
 */
public record ReturnRange(double min, double max, double[] minPortfolio, double[] maxPortfolio) {
    public ReturnRange {
        if (Double.isNaN(min) || Double.isNaN(max) || min > max) {
            throw new IllegalArgumentException("return range needs min <= max: " + min + ", " + max);
        }
        minPortfolio = minPortfolio == null ? null : minPortfolio.clone();
        maxPortfolio = maxPortfolio == null ? null : maxPortfolio.clone();
    }

    @Override
    public double[] minPortfolio() {
        return minPortfolio == null ? null : minPortfolio.clone();
    }

    @Override
    public double[] maxPortfolio() {
        return maxPortfolio == null ? null : maxPortfolio.clone();
    }

    /** True when {@code target} lies within the range, allowing {@code tol} relative slack. */
    public boolean contains(double target, double tol) {
        double slack = tol * Math.max(1, Math.max(Math.abs(min), Math.abs(max)));
        return target >= min - slack && target <= max + slack;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ReturnRange r && Double.compare(r.min, min) == 0 && Double.compare(r.max, max) == 0;
    }

    @Override
    public int hashCode() {
        return Double.hashCode(min) * 31 + Double.hashCode(max);
    }

    @Override
    public String toString() {
        return "ReturnRange[" + min + ", " + max + "]";
    }
}
