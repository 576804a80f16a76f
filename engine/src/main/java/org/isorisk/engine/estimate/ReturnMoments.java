package org.isorisk.engine.estimate;

import java.util.ArrayList;
import java.util.List;
import org.isorisk.engine.error.InputException;

/**
 * The estimators of {@link Estimator} applied to a sample of returns given as plain arrays, for callers that
 * re-estimate many samples (draws of assumption sets): the same code paths ({@code Moments},
 * {@code LedoitWolf}, the EWMA of {@code Estimator}) without dates, frequency detection or data-quality checks.
 * Per-period units in, per-period units out.
 */
public final class ReturnMoments {
    private ReturnMoments() {
    }

    /**
     * Sample moments of returns, per period.
     *
     * @param means      arithmetic mean of each asset's returns
     * @param covariance the estimate: sample (divisor T − 1), Ledoit–Wolf (divisor T, as both papers), or EWMA
     * @param shrinkage  Ledoit–Wolf intensity in [0, 1]; NaN for the other estimators
     */
    public record Result(double[] means, double[][] covariance, double shrinkage) {
        public Result {
            means = means.clone();
            covariance = copy(covariance);
        }

        @Override
        public double[] means() {
            return means.clone();
        }

        @Override
        public double[][] covariance() {
            return copy(covariance);
        }

        /** Covariance entry (i, j) without copying. */
        public double covariance(int i, int j) {
            return covariance[i][j];
        }

        /** Mean of asset i without copying. */
        public double mean(int i) {
            return means[i];
        }
    }

    /**
     * Estimates the mean and covariance of complete return columns.
     *
     * @param columns {@code columns[j][t]}: return of asset j in period t (oldest first), every column of the same
     *                length T ≥ 2, finite; not modified
     * @param method  the covariance estimator
     * @param decay   the EWMA decay λ in (0, 1) for {@link CovarianceMethod#EWMA}; ignored (NaN) otherwise
     */
    public static Result of(double[][] columns, CovarianceMethod method, double decay) {
        if (columns == null || columns.length == 0) {
            throw new IllegalArgumentException("no return columns");
        }
        int len = columns[0].length;
        if (len < 2) {
            throw new IllegalArgumentException("at least 2 returns per asset are needed, got " + len);
        }
        for (double[] c : columns) {
            if (c.length != len) {
                throw new IllegalArgumentException("return columns of different lengths: " + c.length + " and " + len);
            }
            for (double v : c) {
                if (!Double.isFinite(v)) {
                    throw new IllegalArgumentException("a return is not finite: " + v);
                }
            }
        }
        double[] means = Moments.means(columns);
        if (method == CovarianceMethod.EWMA) {
            if (!(decay > 0 && decay < 1)) {
                throw InputException.of("the EWMA decay must lie strictly between 0 and 1").value(decay)
                        .fix("give e.g. 0.94 for daily data").build();
            }
            return new Result(means, Estimator.ewma(columns, decay), Double.NaN);
        }
        double[][] c = Moments.centred(columns, means);
        double[][] gram = Moments.cross(c, c, 1.0);
        return switch (method) {
            case SAMPLE -> new Result(means, Estimator.scaled(gram, 1.0 / (len - 1)), Double.NaN);
            case LEDOIT_WOLF_IDENTITY -> {
                LedoitWolf.Result lw = LedoitWolf.identity(c, Estimator.scaled(gram, 1.0 / len));
                yield new Result(means, lw.covariance(), lw.intensity());
            }
            case LEDOIT_WOLF_CONSTANT_CORRELATION -> {
                LedoitWolf.Result lw = LedoitWolf.constantCorrelation(c, Estimator.scaled(gram, 1.0 / len));
                yield new Result(means, lw.covariance(), lw.intensity());
            }
            default -> throw new IllegalStateException("unknown method " + method);
        };
    }

    /**
     * The complete return rows of a history, per period: prices become simple or log returns as
     * {@link Estimator} computes them, and rows with a missing return are dropped (listwise deletion), as the
     * estimator's default does. For resampling the rows of a history (each row one date).
     *
     * @return {@code rows[t][j]}, oldest first
     */
    public static double[][] completeReturnRows(History h, ReturnType type) {
        double[][] r = Estimator.returns(h, type);
        List<double[]> keep = new ArrayList<>(r.length);
        for (double[] row : r) {
            boolean ok = true;
            for (double v : row) {
                ok &= !Double.isNaN(v);
            }
            if (ok) {
                keep.add(row.clone());
            }
        }
        return keep.toArray(new double[0][]);
    }

    private static double[][] copy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }
}
