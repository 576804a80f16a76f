package org.isorisk.engine.resampling;

import org.isorisk.engine.error.InputException;
import org.isorisk.engine.estimate.ReturnMoments;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;

/**
 * Parametric draws: each draw simulates T periods of returns from the normal distribution with the base
 * assumptions, {@code r_t = μ/P + L z_t} with {@code L L' = Σ/P} (P periods per year, z_t standard normal from
 * the draw's own stream), and re-estimates the assumptions from that sample with the given estimator,
 * annualised again by P. The spread of the draws is the estimation error of T observations.
 *
 * <p>The normal numbers of a draw are consumed period by period, asset by asset ({@code z_t} for t = 0, 1, ...).
 * Immutable and thread-safe.
 */
public final class ParametricDraws implements AssumptionDraws {
    private final RandomStreams streams;
    private final int observations;
    private final int periodsPerYear;
    private final Reestimation estimator;
    private final double[] meanPerPeriod;
    /** Row i holds L[i][0..i], the factor of Σ/P. */
    private final double[][] factor;

    private ParametricDraws(RandomStreams streams, int observations, int periodsPerYear, Reestimation estimator,
                            double[] meanPerPeriod, double[][] factor) {
        this.streams = streams;
        this.observations = observations;
        this.periodsPerYear = periodsPerYear;
        this.estimator = estimator;
        this.meanPerPeriod = meanPerPeriod;
        this.factor = factor;
    }

    /**
     * Draws around the given assumptions.
     *
     * @param expectedReturns annualised expected returns, decimal (not modified)
     * @param covariance      annualised covariance, symmetric positive definite (not modified; the lower
     *                        triangle is read). A matrix singular only by rounding may pass: simulating needs
     *                        just a factor, and perfectly correlated assets then move together in every period.
     * @param observations    T, the number of periods each drawn sample holds (the length of history the
     *                        assumptions stand for), at least 2
     * @param periodsPerYear  P, e.g. 12 for monthly observations
     * @param estimator       the estimator applied to each sample
     * @param seed            the seed of the draws' streams
     * @throws InputException when T or P is out of range or the covariance has a negative pivot (not positive
     *                        semi-definite)
     */
    public static ParametricDraws of(double[] expectedReturns, double[][] covariance, int observations,
                                     int periodsPerYear, Reestimation estimator, long seed) {
        int n = expectedReturns.length;
        if (n == 0) {
            throw new IllegalArgumentException("no assets");
        }
        if (observations < 2) {
            throw InputException.of("a drawn sample needs at least 2 observations").key("observations")
                    .value(observations).fix("give the length of history the assumptions stand for, e.g. 120 months")
                    .build();
        }
        if (periodsPerYear < 1) {
            throw InputException.of("the periods per year must be at least 1").key("periods_per_year")
                    .value(periodsPerYear).fix("give e.g. 12 for monthly observations").build();
        }
        if (covariance.length != n) {
            throw new IllegalArgumentException("covariance of size " + covariance.length + " for " + n + " assets");
        }
        double[] m = new double[n];
        double[][] perPeriod = new double[n][];
        for (int i = 0; i < n; i++) {
            if (!Double.isFinite(expectedReturns[i])) {
                throw InputException.of("an expected return is not finite").value(expectedReturns[i]).build();
            }
            m[i] = expectedReturns[i] / periodsPerYear;
            perPeriod[i] = new double[i + 1];
            for (int j = 0; j <= i; j++) {
                perPeriod[i][j] = covariance[i][j] / periodsPerYear;
            }
        }
        Cholesky chol = Cholesky.factor(perPeriod, 1);
        if (chol == null) {
            throw InputException.of("the covariance matrix is not positive definite, so returns cannot be simulated "
                    + "from it").fix("check or repair the covariance matrix").build();
        }
        double[][] l = new double[n][];
        for (int i = 0; i < n; i++) {
            l[i] = chol.copyOfRow(i);
        }
        return new ParametricDraws(new RandomStreams(seed), observations, periodsPerYear, estimator, m, l);
    }

    @Override
    public DrawnAssumptions draw(long index) {
        ReturnMoments.Result r = ReturnMoments.of(simulatedReturns(index), estimator.method(), estimator.decay());
        return Annualise.result(index, r, periodsPerYear);
    }

    /**
     * The simulated sample of draw {@code index}, per period: {@code columns[j][t]} is asset j's return in
     * period t. The same numbers {@link #draw(long)} re-estimates from.
     */
    public double[][] simulatedReturns(long index) {
        int n = meanPerPeriod.length;
        Xoshiro256PlusPlus g = streams.stream(index);
        double[][] x = new double[n][observations];
        double[] z = new double[n];
        for (int t = 0; t < observations; t++) {
            g.nextGaussians(z);
            for (int i = 0; i < n; i++) {
                double[] li = factor[i];
                double s = 0;
                for (int k = 0; k <= i; k++) {
                    s += li[k] * z[k];
                }
                x[i][t] = meanPerPeriod[i] + s;
            }
        }
        return x;
    }

    @Override
    public long seed() {
        return streams.seed();
    }

    @Override
    public int observations() {
        return observations;
    }

    @Override
    public int periodsPerYear() {
        return periodsPerYear;
    }

    /** The estimator applied to each draw. */
    public Reestimation estimator() {
        return estimator;
    }
}
