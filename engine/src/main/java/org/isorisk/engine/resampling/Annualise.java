package org.isorisk.engine.resampling;

import org.isorisk.engine.estimate.ReturnMoments;

/** Per-period moments to annualised assumptions: means and covariances both times the periods per year. */
final class Annualise {
    private Annualise() {
    }

    static DrawnAssumptions result(long index, ReturnMoments.Result r, int periodsPerYear) {
        double[] mu = r.means();
        double[][] cov = r.covariance();
        for (int i = 0; i < mu.length; i++) {
            mu[i] *= periodsPerYear;
            for (int j = 0; j < mu.length; j++) {
                cov[i][j] *= periodsPerYear;
            }
        }
        return new DrawnAssumptions(index, mu, cov, r.shrinkage());
    }
}
