package org.isorisk.engine.resampling;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.CovarianceMethod;

/**
 * The estimator applied to every drawn sample: the same one that produced the base assumptions, so that the
 * draws carry that estimator's error. Expected returns are always the sample's arithmetic mean.
 *
 * @param method the covariance estimator
 * @param decay  the EWMA decay λ in (0, 1) for {@link CovarianceMethod#EWMA}; NaN for the other methods
 */
public record Reestimation(CovarianceMethod method, double decay) {

    public Reestimation {
        if (method == null) {
            throw new IllegalArgumentException("a covariance method is required");
        }
        if (method == CovarianceMethod.EWMA) {
            if (!(decay > 0 && decay < 1)) {
                throw InputException.of("the EWMA decay must lie strictly between 0 and 1").key("decay").value(decay)
                        .fix("give e.g. 0.94 for daily data").build();
            }
        } else if (!Double.isNaN(decay)) {
            throw InputException.of("a decay applies to the EWMA estimator only").key("decay").value(decay)
                    .fix("drop the decay or choose the EWMA estimator").build();
        }
    }

    /** Sample mean and covariance (divisor T − 1). */
    public static Reestimation sample() {
        return new Reestimation(CovarianceMethod.SAMPLE, Double.NaN);
    }

    /** The given method; for EWMA use {@link #ewma(double)}. */
    public static Reestimation of(CovarianceMethod method) {
        return new Reestimation(method, Double.NaN);
    }

    /** Exponentially weighted covariance with decay λ. */
    public static Reestimation ewma(double decay) {
        return new Reestimation(CovarianceMethod.EWMA, decay);
    }
}
