package org.isorisk.engine.resampling;

import java.util.Arrays;
import org.isorisk.engine.error.InputException;

/**
 * Exact sample quantiles with linear interpolation between order statistics: Hyndman &amp; Fan's type 7
 * ("Sample quantiles in statistical packages", The American Statistician 50(4), 1996), the default of numpy's
 * {@code quantile} and R's {@code quantile}. For sorted values {@code x_0 ≤ … ≤ x_{N−1}} and a probability p, with
 * {@code h = (N − 1)p}, {@code k = ⌊h⌋} and {@code γ = h − k}: {@code Q(p) = x_k + γ(x_{k+1} − x_k)}, and
 * {@code x_{N−1}} when {@code h ≥ N − 1}.
 *
 * <p>The interpolation is evaluated as numpy 1.22 and later evaluate it, {@code x_k + (x_{k+1} − x_k)γ} for
 * {@code γ < ½} and {@code x_{k+1} − (x_{k+1} − x_k)(1 − γ)} otherwise (exact at both ends and monotone in p),
 * so that the results agree with numpy's bit for bit.
 */
public final class Quantiles {
    private Quantiles() {
    }

    /** The p-quantile of {@code values} (not modified). */
    public static double of(double[] values, double p) {
        return of(values, new double[] {p})[0];
    }

    /**
     * Several quantiles of {@code values} (not modified), sorting a copy once.
     *
     * @param ps probabilities in [0, 1]
     * @return one quantile per probability, in the order of {@code ps}
     * @throws InputException        when a probability lies outside [0, 1]
     * @throws IllegalArgumentException when {@code values} is empty or holds NaN (a draw that did not reach a
     *                                  target must be counted and left out by the caller, not passed as NaN)
     */
    public static double[] of(double[] values, double... ps) {
        double[] sorted = values.clone();
        for (double v : sorted) {
            if (Double.isNaN(v)) {
                throw new IllegalArgumentException("a value is NaN: leave out (and count) what did not reach a value");
            }
        }
        Arrays.sort(sorted);
        double[] out = new double[ps.length];
        for (int k = 0; k < ps.length; k++) {
            out[k] = ofSorted(sorted, ps[k]);
        }
        return out;
    }

    /**
     * The p-quantile of values already sorted in ascending order (not checked, not modified), for callers that
     * sort once in place and read several quantiles.
     */
    public static double ofSorted(double[] sorted, double p) {
        int n = sorted.length;
        if (n == 0) {
            throw new IllegalArgumentException("no values");
        }
        if (!(p >= 0 && p <= 1)) {
            throw InputException.of("a quantile's probability must lie between 0 and 1").value(p)
                    .fix("give e.g. 0.05 for the 5 % quantile").build();
        }
        double h = (n - 1) * p;
        if (h >= n - 1) {
            return sorted[n - 1];
        }
        int k = (int) Math.floor(h);
        double gamma = h - k;
        double a = sorted[k];
        double b = sorted[k + 1];
        double diff = b - a;
        return gamma >= 0.5 ? b - diff * (1 - gamma) : a + diff * gamma;
    }
}
