package org.isorisk.engine.stress;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;

/** Applies a scenario's shocks to a universe and repairs a shocked correlation matrix that is no longer valid. */
public final class Shocks {
    private Shocks() {
    }

    /**
     * A correlation matrix whose smallest eigenvalue is at least {@code −PSD_TOLERANCE} counts as positive
     * semi-definite: 1e-12, the round-off of a symmetric eigendecomposition of a unit-diagonal matrix.
     */
    public static final double PSD_TOLERANCE = 1e-12;

    /**
     * Applies the shocks in order.
     *
     * @param base     the base assumptions (not modified)
     * @param scenario the shocks
     * @param repair   the nearest-correlation repair used when a shock breaks positive semi-definiteness
     */
    public static Shocked apply(AssetUniverse base, Scenario scenario, CorrelationRepair repair) {
        int n = base.size();
        double[] mu = base.expectedReturns();
        double[][] sigma = base.covariance();
        double[] vol = new double[n];
        double[][] corr = new double[n][n];
        split(sigma, vol, corr);
        boolean corrTouched = false;
        for (Shock s : scenario.shocks()) {
            if (s instanceof Shock.VolatilityMultiplier v) {
                for (int i : v.scope().members()) {
                    vol[i] *= v.factor();
                }
            } else if (s instanceof Shock.CorrelationShift c) {
                for (int i : c.scope().members()) {
                    for (int j : c.scope().members()) {
                        if (i != j) {
                            corr[i][j] += c.fraction() * (1 - corr[i][j]);
                        }
                    }
                }
                corrTouched = true;
            } else if (s instanceof Shock.CorrelationSet c) {
                for (int i : c.scope().members()) {
                    for (int j : c.scope().members()) {
                        if (i != j) {
                            corr[i][j] = c.value();
                        }
                    }
                }
                corrTouched = true;
            } else if (s instanceof Shock.ReturnShift r) {
                for (int i : r.scope().members()) {
                    mu[i] += r.delta();
                }
            } else if (s instanceof Shock.Covariance c) {
                if (c.matrix().length != n) {
                    throw InputException.of("scenario '" + scenario.name() + "': the replacement covariance has "
                            + c.matrix().length + " assets, the universe " + n).build();
                }
                split(c.matrix(), vol, corr);
                corrTouched = true;
            }
        }
        List<String> notes = new ArrayList<>();
        double smallest = Spectrum.of(corr).smallest();
        boolean repaired = false;
        double dist = 0;
        double largest = 0;
        if (smallest < -PSD_TOLERANCE) {
            if (repair == null) {
                throw new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, String.format(Locale.ROOT,
                        "scenario '%s' makes the correlation matrix invalid (smallest eigenvalue %.3g) and no "
                                + "nearest-correlation repair is available", scenario.name(), smallest), List.of());
            }
            double[][] fixed = repair.nearest(corr);
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    double d = fixed[i][j] - corr[i][j];
                    dist += d * d;
                    largest = Math.max(largest, Math.abs(d));
                }
            }
            dist = Math.sqrt(dist);
            corr = fixed;
            repaired = true;
            notes.add(String.format(Locale.ROOT, "The shocked correlation matrix of scenario '%s' was not positive "
                            + "semi-definite (smallest eigenvalue %.4g); it was replaced by the nearest valid correlation "
                            + "matrix (Higham 2002): Frobenius distance %.4g, largest change of one correlation %.4f.",
                    scenario.name(), smallest, dist, largest));
        } else if (corrTouched) {
            notes.add(String.format(Locale.ROOT, "The shocked correlation matrix of scenario '%s' is positive "
                    + "semi-definite (smallest eigenvalue %.4g): no repair needed.", scenario.name(), smallest));
        }
        double[][] out = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                out[i][j] = i == j ? vol[i] * vol[i] : corr[i][j] * vol[i] * vol[j];
            }
        }
        return new Shocked(base.withAssumptions(mu, out), repaired, smallest, dist, largest, notes);
    }

    /** Splits a covariance into volatilities and correlations (an asset without variance gets correlation 0). */
    static void split(double[][] sigma, double[] vol, double[][] corr) {
        int n = sigma.length;
        for (int i = 0; i < n; i++) {
            vol[i] = Math.sqrt(Math.max(0, sigma[i][i]));
        }
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                if (i == j) {
                    corr[i][j] = 1;
                } else {
                    double d = vol[i] * vol[j];
                    corr[i][j] = d > 0 ? 0.5 * (sigma[i][j] + sigma[j][i]) / d : 0;
                }
            }
        }
    }

    /** The correlation matrix of a covariance (for reports and tests). */
    public static double[][] correlation(double[][] sigma) {
        int n = sigma.length;
        double[][] c = new double[n][n];
        split(sigma, new double[n], c);
        return c;
    }
}
