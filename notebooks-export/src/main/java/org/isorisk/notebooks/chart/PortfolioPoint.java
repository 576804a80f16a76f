package org.isorisk.notebooks.chart;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Solution;

/**
 * A portfolio drawn as one highlighted point on a frontier chart (the current or the proposed portfolio).
 *
 * @param name           legend and label text, e.g. "Current"
 * @param volatility     {@code sqrt(w'Σw)}, decimal, annualised, as the engine computed it
 * @param expectedReturn {@code μ'w}, decimal, annualised
 */
public record PortfolioPoint(String name, double volatility, double expectedReturn) {
    public PortfolioPoint {
        if (name == null || name.isBlank()) {
            throw InputException.of("a highlighted portfolio needs a name").build();
        }
        if (!Double.isFinite(volatility) || volatility < 0 || !Double.isFinite(expectedReturn)) {
            throw InputException.of("portfolio '" + name + "' has no finite volatility and return to draw")
                    .value(volatility + ", " + expectedReturn).build();
        }
    }

    /** The point of a solved portfolio. */
    public static PortfolioPoint of(String name, Solution s) {
        return new PortfolioPoint(name, s.volatility(), s.expectedReturn());
    }
}
