package org.isorisk.engine.estimate;

import java.util.Locale;
import org.isorisk.engine.error.InputException;

/**
 * How to turn a history into assumptions, with documented defaults ({@link #defaults()}).
 *
 * @param returnType     simple or log returns; default simple (the mean-variance model's returns are simple)
 * @param frequency      the observation frequency, or null to detect it from the dates (the default)
 * @param periodsPerYear periods per year used to annualise, or 0 for the frequency's convention (the default:
 *                       252 daily, 52 weekly, 12 monthly, 4 quarterly); e.g. 260 for weekday-based daily data
 * @param method         covariance estimator; default {@link CovarianceMethod#SAMPLE}
 * @param decay          EWMA decay λ in (0, 1), or NaN for unset; with neither decay nor half-life, daily data use
 *                       {@link #RISKMETRICS_DAILY_DECAY}
 * @param halfLife       EWMA half-life in periods (λ = 0.5^(1/h)), or NaN for unset
 * @param missing        listwise (default) or pairwise deletion of missing values
 * @param staleRun       a run of at least this many consecutive zero returns of one asset is reported as stale
 *                       prices; default 5 (common practice, no source)
 * @param fewPerAsset    fewer than this many returns per asset is reported as few observations; default 10
 *                       (common practice, no source)
 */
public record EstimationSettings(ReturnType returnType, Frequency frequency, int periodsPerYear,
                                 CovarianceMethod method, double decay, double halfLife, MissingPolicy missing,
                                 int staleRun, int fewPerAsset) {

    /** RiskMetrics Technical Document (1996): the decay factor 0.94 for daily data (a published standard value). */
    public static final double RISKMETRICS_DAILY_DECAY = 0.94;
    /** Default stale-price threshold: 5 consecutive zero returns (common practice, no source). */
    public static final int DEFAULT_STALE_RUN = 5;
    /** Default "few observations" threshold: 10 returns per asset (common practice, no source). */
    public static final int DEFAULT_FEW_PER_ASSET = 10;

    public EstimationSettings {
        returnType = returnType == null ? ReturnType.SIMPLE : returnType;
        method = method == null ? CovarianceMethod.SAMPLE : method;
        missing = missing == null ? MissingPolicy.LISTWISE : missing;
        if (periodsPerYear < 0) {
            throw InputException.of("periods per year must be positive").value(periodsPerYear)
                    .fix("give e.g. 252 or 260 for daily data, 52, 12 or 4").build();
        }
        if (!Double.isNaN(decay) && !(decay > 0 && decay < 1)) {
            throw InputException.of("the EWMA decay must lie strictly between 0 and 1").value(decay)
                    .fix("give e.g. --decay 0.94 (RiskMetrics daily)").build();
        }
        if (!Double.isNaN(halfLife) && !(halfLife > 0 && Double.isFinite(halfLife))) {
            throw InputException.of("the EWMA half-life must be a positive number of periods").value(halfLife)
                    .fix("give e.g. --half-life 60").build();
        }
        if (!Double.isNaN(decay) && !Double.isNaN(halfLife)) {
            throw InputException.of("give the EWMA decay or its half-life, not both")
                    .fix("drop --decay or --half-life").build();
        }
        if ((!Double.isNaN(decay) || !Double.isNaN(halfLife)) && method != CovarianceMethod.EWMA) {
            throw InputException.of("a decay or half-life applies to --method ewma only")
                    .value(method.label()).fix("use --method ewma or drop --decay/--half-life").build();
        }
        if (missing == MissingPolicy.PAIRWISE && method != CovarianceMethod.SAMPLE) {
            throw InputException.of("pairwise deletion is available with the sample covariance only")
                    .value(method.label()).fix("use --missing listwise or --method sample").build();
        }
        if (staleRun < 2) {
            throw InputException.of("the stale-price threshold must be at least 2 zero returns").value(staleRun)
                    .build();
        }
        if (fewPerAsset < 1) {
            throw new IllegalArgumentException("fewPerAsset must be at least 1");
        }
    }

    /** Simple returns, detected frequency and its convention, sample covariance, listwise deletion. */
    public static EstimationSettings defaults() {
        return new EstimationSettings(ReturnType.SIMPLE, null, 0, CovarianceMethod.SAMPLE, Double.NaN, Double.NaN,
                MissingPolicy.LISTWISE, DEFAULT_STALE_RUN, DEFAULT_FEW_PER_ASSET);
    }

    public EstimationSettings withReturnType(ReturnType t) {
        return new EstimationSettings(t, frequency, periodsPerYear, method, decay, halfLife, missing, staleRun,
                fewPerAsset);
    }

    public EstimationSettings withFrequency(Frequency f) {
        return new EstimationSettings(returnType, f, periodsPerYear, method, decay, halfLife, missing, staleRun,
                fewPerAsset);
    }

    public EstimationSettings withPeriodsPerYear(int p) {
        return new EstimationSettings(returnType, frequency, p, method, decay, halfLife, missing, staleRun,
                fewPerAsset);
    }

    /** Another estimator; decay and half-life are cleared. */
    public EstimationSettings withMethod(CovarianceMethod m) {
        return new EstimationSettings(returnType, frequency, periodsPerYear, m, Double.NaN, Double.NaN, missing,
                staleRun, fewPerAsset);
    }

    /** EWMA with decay λ. */
    public EstimationSettings withDecay(double lambda) {
        return new EstimationSettings(returnType, frequency, periodsPerYear, CovarianceMethod.EWMA, lambda, Double.NaN,
                missing, staleRun, fewPerAsset);
    }

    /** EWMA with a half-life in periods. */
    public EstimationSettings withHalfLife(double h) {
        return new EstimationSettings(returnType, frequency, periodsPerYear, CovarianceMethod.EWMA, Double.NaN, h,
                missing, staleRun, fewPerAsset);
    }

    public EstimationSettings withMissing(MissingPolicy p) {
        return new EstimationSettings(returnType, frequency, periodsPerYear, method, decay, halfLife, p, staleRun,
                fewPerAsset);
    }

    public EstimationSettings withStaleRun(int run) {
        return new EstimationSettings(returnType, frequency, periodsPerYear, method, decay, halfLife, missing, run,
                fewPerAsset);
    }

    /**
     * The EWMA decay to use for data of frequency {@code f}: the given decay, {@code 0.5^(1/h)} for a half-life
     * h, or the RiskMetrics daily 0.94 for daily data.
     *
     * @throws InputException for non-daily data without a decay or half-life
     */
    public double resolvedDecay(Frequency f) {
        if (!Double.isNaN(decay)) {
            return decay;
        }
        if (!Double.isNaN(halfLife)) {
            return Math.pow(0.5, 1.0 / halfLife);
        }
        if (f == Frequency.DAILY) {
            return RISKMETRICS_DAILY_DECAY;
        }
        throw InputException.of(String.format(Locale.ROOT, "the EWMA preset 0.94 is the RiskMetrics (1996) value for "
                        + "daily data, but the history is %s", f.label()))
                .fix("give --decay L or --half-life N for " + f.label() + " data").build();
    }
}
