package org.isorisk.engine.estimate;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;

/**
 * Desmoothing of appraisal-based returns (Geltner 1993, "Estimating Market Values from Appraised Values without
 * Assuming an Efficient Market", Journal of Real Estate Research 8(3)). Appraisers blend today's evidence with
 * the last valuation, so an observed (appraisal) return is {@code r*_t = (1 − φ) r_t + φ r*_{t−1}} of the true
 * return r_t (Geltner writes the weight on the new information as a = 1 − φ). Inverting it,
 * <pre>
 *   r_t = (r*_t − φ r*_{t−1}) / (1 − φ),   t = 1 … T − 1,
 * </pre>
 * with φ given or estimated as the observed series' first-order autocorrelation (the coefficient of the
 * smoothing when true returns are serially uncorrelated). Smoothing hides volatility: for serially uncorrelated
 * true returns the observed variance is {@code (1 − φ)/(1 + φ)} times the true one, so desmoothing raises the
 * volatility by about {@code sqrt((1 + φ)/(1 − φ))} and leaves the mean unchanged.
 */
public final class Desmoothing {
    private Desmoothing() {
    }

    /**
     * Below this many returns the report notes that the estimated φ is imprecise (its standard error is about
     * 1/√T, so 0.22 at 20): common practice, no source.
     */
    public static final int SHORT_SERIES = 20;

    /**
     * The sample first-order autocorrelation, as in Box &amp; Jenkins and R's {@code acf}:
     * {@code ρ₁ = Σ_{t≥1}(x_t − x̄)(x_{t−1} − x̄) / Σ_t (x_t − x̄)²}.
     *
     * @param x at least 3 finite values, not all equal (not modified)
     */
    public static double firstOrderAutocorrelation(double[] x) {
        int n = x.length;
        double mean = Moments.mean(x);
        double num = 0;
        double den = 0;
        for (int t = 0; t < n; t++) {
            double d = x[t] - mean;
            den += d * d;
            if (t > 0) {
                num += d * (x[t - 1] - mean);
            }
        }
        return num / den;
    }

    /**
     * Desmooths one asset's observed returns.
     *
     * @param asset    the asset's name, for messages
     * @param observed the observed (appraisal-based) returns per period, oldest first, at least 3, finite (not
     *                 modified)
     * @param phi      φ with |φ| &lt; 1, or NaN to estimate it as the first-order autocorrelation
     * @throws InputException when the series is too short or constant, or |φ| ≥ 1
     */
    public static DesmoothedSeries desmooth(String asset, double[] observed, double phi) {
        int n = observed.length;
        if (n < 3) {
            throw InputException.of("desmoothing needs at least 3 returns").asset(asset).value(n)
                    .fix("give a longer history of this asset or do not desmooth it").build();
        }
        for (double v : observed) {
            if (!Double.isFinite(v)) {
                throw InputException.of("a return to desmooth is missing or not finite").asset(asset).value(v)
                        .fix("give a complete history of this asset").build();
            }
        }
        double observedVol = Math.sqrt(variance(observed));
        boolean estimated = Double.isNaN(phi);
        if (estimated) {
            if (!(observedVol > 0)) {
                throw InputException.of("the returns do not vary, so their autocorrelation is undefined")
                        .asset(asset).fix("give the smoothing coefficient or do not desmooth this asset").build();
            }
            phi = firstOrderAutocorrelation(observed);
        }
        if (!(Math.abs(phi) < 1)) {
            throw InputException.of("the smoothing coefficient must lie strictly between -1 and 1 (at 1 the "
                            + "desmoothed returns (r*_t - φ r*_(t-1))/(1 - φ) divide by zero)")
                    .asset(asset).key("phi").value(phi).fix("give a coefficient such as 0.5, or let it be estimated")
                    .build();
        }
        double[] r = new double[n - 1];
        for (int t = 1; t < n; t++) {
            r[t - 1] = (observed[t] - phi * observed[t - 1]) / (1 - phi);
        }
        List<String> notes = new ArrayList<>();
        if (estimated && n < SHORT_SERIES) {
            notes.add(String.format(Locale.ROOT, "%s: φ is estimated from only %d returns (standard error about %.2f)",
                    asset, n, 1 / Math.sqrt(n)));
        }
        if (phi < 0) {
            notes.add(String.format(Locale.ROOT, "%s: φ = %.3f is negative, which is no sign of appraisal smoothing; "
                    + "desmoothing with it lowers the volatility (give φ = 0 to leave the series as it is)", asset,
                    phi));
        }
        return new DesmoothedSeries(asset, phi, estimated, r, observedVol, Math.sqrt(variance(r)), notes);
    }

    private static double variance(double[] x) {
        double m = Moments.mean(x);
        double s = 0;
        for (double v : x) {
            s += (v - m) * (v - m);
        }
        return s / (x.length - 1);
    }
}
