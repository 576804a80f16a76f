package org.isorisk.engine.resampling;

/**
 * One drawn assumption set, annualised.
 *
 * @param index           the draw number (its random stream's index)
 * @param expectedReturns expected returns, decimal, annualised (copied)
 * @param covariance      covariance of annualised returns (copied)
 * @param shrinkage       the Ledoit–Wolf intensity of this draw's estimate, NaN for other estimators
 */
public record DrawnAssumptions(long index, double[] expectedReturns, double[][] covariance, double shrinkage) {

    public DrawnAssumptions {
        int n = expectedReturns.length;
        if (covariance.length != n) {
            throw new IllegalArgumentException("covariance of size " + covariance.length + " for " + n + " assets");
        }
        expectedReturns = expectedReturns.clone();
        covariance = copy(covariance);
    }

    @Override
    public double[] expectedReturns() {
        return expectedReturns.clone();
    }

    @Override
    public double[][] covariance() {
        return copy(covariance);
    }

    /** Number of assets. */
    public int size() {
        return expectedReturns.length;
    }

    private static double[][] copy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }
}
