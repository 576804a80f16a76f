package org.isorisk.notebooks.chart;

import org.isorisk.engine.error.InputException;

/**
 * One curve of the stress overlay: the minimum volatility the engine found at each return target under one set of
 * assumptions (e.g. a stress run's scenario points), without the portfolios themselves.
 *
 * @param name           legend text, e.g. "crisis-correlation"
 * @param volatility     minimum volatility at each target, decimal, annualised (copied)
 * @param expectedReturn the targets, decimal, annualised, not decreasing (copied)
 */
public record StressCurve(String name, double[] volatility, double[] expectedReturn) {
    public StressCurve {
        if (name == null || name.isBlank()) {
            throw InputException.of("each curve of a stress overlay needs a name").build();
        }
        if (volatility == null || expectedReturn == null || volatility.length != expectedReturn.length) {
            throw InputException.of("curve '" + name + "' needs one volatility per target").build();
        }
        if (volatility.length < 2) {
            throw InputException.of("curve '" + name + "' has " + (volatility.length == 0 ? "no points" : "a single "
                    + "point") + ", so it cannot be drawn as a curve")
                    .fix("compute at least two frontier points for every scenario").build();
        }
        volatility = volatility.clone();
        expectedReturn = expectedReturn.clone();
        for (int i = 0; i < volatility.length; i++) {
            if (!Double.isFinite(volatility[i]) || !Double.isFinite(expectedReturn[i]) || volatility[i] < 0) {
                throw InputException.of("curve '" + name + "' has a point that is not a finite volatility and return")
                        .row(i + 1).value(volatility[i] + ", " + expectedReturn[i])
                        .fix("leave infeasible targets out of the curve").build();
            }
            // a kink of the frontier lists one return twice, the two copies equal only up to rounding
            if (i > 0 && expectedReturn[i] < expectedReturn[i - 1] - 1e-12 * Math.max(1, Math.abs(expectedReturn[i]))) {
                throw InputException.of("curve '" + name + "' must have targets in increasing order").row(i + 1).build();
            }
        }
    }

    @Override
    public double[] volatility() {
        return volatility.clone();
    }

    @Override
    public double[] expectedReturn() {
        return expectedReturn.clone();
    }
}
