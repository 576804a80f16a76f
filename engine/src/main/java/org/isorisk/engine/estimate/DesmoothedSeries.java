package org.isorisk.engine.estimate;

import java.util.List;

/**
 * One asset's returns after desmoothing ({@link Desmoothing}), per period.
 *
 * @param asset                the asset's name
 * @param phi                  the smoothing coefficient φ used, |φ| &lt; 1
 * @param estimated            true when φ is the series' first-order autocorrelation, false when given
 * @param returns              the desmoothed returns, one fewer than observed (the first observation has no
 *                             predecessor) (copied)
 * @param observedVolatility   standard deviation of the observed returns (divisor T − 1), per period
 * @param desmoothedVolatility standard deviation of the desmoothed returns (divisor T − 2), per period
 * @param notes                things worth saying (a short series, a negative φ), each one sentence
 */
public record DesmoothedSeries(String asset, double phi, boolean estimated, double[] returns,
                               double observedVolatility, double desmoothedVolatility, List<String> notes) {

    public DesmoothedSeries {
        returns = returns.clone();
        notes = List.copyOf(notes);
    }

    @Override
    public double[] returns() {
        return returns.clone();
    }

    /**
     * {@code desmoothedVolatility / observedVolatility}; for white-noise true returns it tends to
     * {@code sqrt((1 + φ)/(1 − φ))}.
     */
    public double volatilityRatio() {
        return desmoothedVolatility / observedVolatility;
    }
}
