package org.isorisk.notebooks.chart;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Solution;

/**
 * What the efficient-frontier chart draws: the assets, the mandate frontier with its corners, the unconstrained
 * (closed-form) frontier from Merton's scalars, and optionally the tangency portfolio with its capital market line
 * and the current and proposed portfolios. Every number comes from the engine; the chart only draws it.
 *
 * @param universe      assets, each drawn at (sqrt(Σ_ii), μ_i)
 * @param frontier      the mandate frontier (corners and sampled points); its {@code unconstrained} scalars, when
 *                      present, give the closed-form curve
 * @param riskFree      risk-free rate (decimal) for the capital market line; NaN for none
 * @param tangency      the tangency portfolio for {@code riskFree}; null for none
 * @param current       the current portfolio; null for none
 * @param proposed      the proposed portfolio; null for none
 */
public record FrontierChartData(AssetUniverse universe, Frontier frontier, double riskFree, Solution tangency,
                                PortfolioPoint current, PortfolioPoint proposed) {

    public FrontierChartData {
        if (universe == null || frontier == null) {
            throw InputException.of("a frontier chart needs the assets and a frontier").build();
        }
        if ((tangency == null) != Double.isNaN(riskFree)) {
            throw InputException.of("the capital market line needs both the risk-free rate and the tangency "
                    + "portfolio").fix("give both or neither").build();
        }
    }

    /** Assets and frontier only. */
    public static FrontierChartData of(AssetUniverse universe, Frontier frontier) {
        return new FrontierChartData(universe, frontier, Double.NaN, null, null, null);
    }

    /** With the tangency portfolio for risk-free rate {@code rf} and its capital market line. */
    public FrontierChartData withTangency(double rf, Solution t) {
        return new FrontierChartData(universe, frontier, rf, t, current, proposed);
    }

    /** With the current portfolio highlighted. */
    public FrontierChartData withCurrent(PortfolioPoint p) {
        return new FrontierChartData(universe, frontier, riskFree, tangency, p, proposed);
    }

    /** With the proposed portfolio highlighted. */
    public FrontierChartData withProposed(PortfolioPoint p) {
        return new FrontierChartData(universe, frontier, riskFree, tangency, current, p);
    }

    /** Merton's scalars of the unconstrained frontier, or null. */
    MertonScalars unconstrained() {
        return frontier.unconstrained();
    }
}
