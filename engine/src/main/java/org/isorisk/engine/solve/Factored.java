package org.isorisk.engine.solve;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.linalg.Cholesky;
import org.isorisk.engine.linalg.Spectrum;
import org.isorisk.engine.model.AssetUniverse;

/**
 * An asset universe with its covariance factored once, so that many closed-form solves (a frontier sweep,
 * several constraint sets) share one O(n³) factorisation.
 */
public final class Factored {
    private final AssetUniverse universe;
    private final double[][] sigma;
    private final Cholesky chol;
    private volatile Spectrum spectrum;

    private Factored(AssetUniverse universe, double[][] sigma, Cholesky chol, Spectrum spectrum) {
        this.universe = universe;
        this.sigma = sigma;
        this.chol = chol;
        this.spectrum = spectrum;
    }

    /**
     * Factors the universe's covariance.
     *
     * @throws NoSolutionException (NOT_CONVEX) when Σ is not positive definite, naming the smallest eigenvalue
     *                             and, when there is one, a pair of perfectly correlated assets
     */
    public static Factored of(AssetUniverse u) {
        double[][] sigma = u.covariance();
        Cholesky chol = Cholesky.factor(sigma);
        if (chol == null) {
            Spectrum sp = Spectrum.of(sigma);
            throw notPositiveDefinite(u, sigma, sp);
        }
        return new Factored(u, sigma, chol, null);
    }

    static NoSolutionException notPositiveDefinite(AssetUniverse u, double[][] sigma, Spectrum sp) {
        int n = sigma.length;
        List<String> involved = new ArrayList<>();
        String pair = "";
        outer:
        for (int i = 0; i < n; i++) {
            for (int j = i + 1; j < n; j++) {
                double d = Math.sqrt(sigma[i][i] * sigma[j][j]);
                if (d > 0 && Math.abs(sigma[i][j] / d) >= 1 - 1e-10) {
                    involved.add(u.assets().get(i));
                    involved.add(u.assets().get(j));
                    pair = String.format(Locale.ROOT, "; assets '%s' and '%s' are perfectly correlated (%.6f)",
                            u.assets().get(i), u.assets().get(j), sigma[i][j] / d);
                    break outer;
                }
            }
        }
        for (int i = 0; i < n && pair.isEmpty(); i++) {
            if (!(sigma[i][i] > 0)) {
                involved.add(u.assets().get(i));
                pair = String.format(Locale.ROOT, "; asset '%s' has variance %s", u.assets().get(i), sigma[i][i]);
            }
        }
        String msg = String.format(Locale.ROOT,
                "the covariance matrix is not positive definite (smallest eigenvalue %.6g)%s, so the minimum-variance "
                        + "portfolio is not unique; fix: remove one of a perfectly correlated pair, or repair the "
                        + "matrix to the nearest valid one (isorisk check --repair)", sp.smallest(), pair);
        return new NoSolutionException(NoSolutionException.Reason.NOT_CONVEX, msg, involved);
    }

    public AssetUniverse universe() {
        return universe;
    }

    /** The covariance (shared, do not modify). */
    double[][] sigma() {
        return sigma;
    }

    public Cholesky cholesky() {
        return chol;
    }

    /** Extreme eigenvalues of Σ, computed on first use (an iterative estimate above a few hundred assets). */
    public Spectrum spectrum() {
        Spectrum sp = spectrum;
        if (sp == null) {
            sp = Spectrum.of(sigma, chol);
            spectrum = sp;
        }
        return sp;
    }

    /** Solves {@code Σ x = b}. */
    public double[] solve(double[] b) {
        return chol.solve(b);
    }
}
